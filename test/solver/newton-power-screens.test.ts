import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cannotConverge, surelyAbove } from '../../src/solver/collocation-newton.js';

/**
 * The screens that spare the simplified Newton iteration its powers must take
 * radau5's decisions exactly (Hairer and Wanner II, sect. IV.8, eq. 8.15 and
 * the FACCON^0.8 carry-over of radau5): checked against the tests written
 * with the power, on random values spanning many decades.
 */
const decades = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((e) => 10 ** e);

describe('Newton power screens', () => {
  it('surelyAbove(x, dyno, fnewt) implies x^0.8 dyno > fnewt', () => {
    fc.assert(
      fc.property(decades(-16, 3), decades(-20, 5), decades(-12, 0), (x, dyno, fnewt) => {
        if (surelyAbove(x, dyno, fnewt)) expect(x ** 0.8 * dyno > fnewt).toBe(true);
      }),
      { numRuns: 50000 },
    );
  });

  it('surelyAbove decides most cases far from the threshold', () => {
    // Not a correctness condition, but the point of the screen: a clear miss needs no power.
    expect(surelyAbove(0.05, 1, 1e-3)).toBe(true);
    expect(surelyAbove(5, 1, 1e-3)).toBe(true);
    expect(surelyAbove(0.05, 1e-6, 1e-3)).toBe(false);
  });

  it('cannotConverge equals faccon dyno theta^k / fnewt >= 1 (the power form)', () => {
    fc.assert(
      fc.property(decades(-16, 3), decades(-20, 5), fc.double({ min: 0, max: 0.99, noNaN: true }), fc.integer({ min: 0, max: 5 }), decades(-12, 0), (faccon, dyno, theta, k, fnewt) => {
        expect(cannotConverge(faccon, dyno, theta, k, fnewt)).toBe((faccon * dyno * theta ** k) / fnewt >= 1);
      }),
      { numRuns: 50000 },
    );
  });

  it('cannotConverge at the threshold itself and with theta^k underflowing', () => {
    for (const [f, d, th, k, fn] of [
      [1, 1, 0.5, 2, 0.25],
      [1, 1, 0.5, 2, 0.25 * (1 + 1e-15)],
      [1e300, 1e10, 1e-80, 4, 1e-6],
      [0.3, 0.2, 0, 3, 0.01],
    ] as const) {
      expect(cannotConverge(f, d, th, k, fn)).toBe((f * d * th ** k) / fn >= 1);
    }
  });
});
