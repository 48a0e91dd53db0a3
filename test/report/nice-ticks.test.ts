import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/index.js';
import { niceNumber, niceTicks } from '../../src/report/index.js';

// Source of the algorithm and of the two worked examples: P. S. Heckbert,
// "Nice numbers for graph labels", Graphics Gems (A. S. Glassner, ed.),
// Academic Press, 1990, pp. 61-63. The paper's text: data 105..543 is plotted
// from 100 to 600 with ticks every 100; data 2.03..2.17 from 2.00 to 2.20 with
// a spacing of 0.05 (both with its default of 5 ticks, loose labelling). The
// examples are taken from the paper's introduction as quoted in the docs of a
// published port of the algorithm; pages 61-63 from that citation.

describe('niceNumber', () => {
  it('rounds to 1, 2, 5 or 10 times a power of ten with the thresholds 1.5, 3, 7 (Heckbert 1990, nicenum)', () => {
    expect(niceNumber(1.49, true)).toBe(1);
    expect(niceNumber(1.5, true)).toBe(2);
    expect(niceNumber(2.99, true)).toBe(2);
    expect(niceNumber(3, true)).toBe(5);
    expect(niceNumber(6.99, true)).toBe(5);
    expect(niceNumber(7, true)).toBe(10);
    expect(niceNumber(125, true)).toBe(100);
    expect(niceNumber(0.05, true)).toBeCloseTo(0.05, 15);
  });

  it('takes the ceiling among 1, 2, 5, 10 without rounding (Heckbert 1990, nicenum)', () => {
    expect(niceNumber(1, false)).toBe(1);
    expect(niceNumber(1.01, false)).toBe(2);
    expect(niceNumber(2.01, false)).toBe(5);
    expect(niceNumber(5.01, false)).toBe(10);
    expect(niceNumber(438, false)).toBe(500);
    expect(niceNumber(0.14, false)).toBeCloseTo(0.2, 15);
  });
});

describe('niceTicks', () => {
  it('reproduces Heckbert\'s example 105..543 -> 100..600 step 100', () => {
    const t = niceTicks(105, 543);
    expect(t.min).toBe(100);
    expect(t.max).toBe(600);
    expect(t.step).toBe(100);
    expect(t.values).toEqual([100, 200, 300, 400, 500, 600]);
  });

  it("reproduces Heckbert's example 2.03..2.17 -> 2.00..2.20 step 0.05, with exact decimals", () => {
    const t = niceTicks(2.03, 2.17);
    expect(t.min).toBe(2);
    expect(t.max).toBe(2.2);
    expect(t.step).toBeCloseTo(0.05, 15);
    expect(t.values).toEqual([2, 2.05, 2.1, 2.15, 2.2]);
  });

  it('in tight mode keeps the data range and gives the multiples of the step inside it (derived)', () => {
    const t = niceTicks(0, 0.093, 6, 'tight');
    expect([t.min, t.max]).toEqual([0, 0.093]);
    expect(t.values).toEqual([0, 0.02, 0.04, 0.06, 0.08]);
  });

  it('widens a zero-width range instead of failing', () => {
    expect(niceTicks(0, 0).values.length).toBeGreaterThan(1);
    const t = niceTicks(1.6, 1.6);
    expect(t.min).toBeLessThan(1.6);
    expect(t.max).toBeGreaterThan(1.6);
  });

  it('always gives a 1/2/5 x 10^k step, covers the data (loose), and stays near the asked count (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e9, max: 1e9, noNaN: true }),
        fc.double({ min: 1e-9, max: 1e9, noNaN: true }),
        fc.integer({ min: 2, max: 12 }),
        (lo, width, count) => {
          const hi = lo + width;
          fc.pre(hi > lo && width / Math.max(Math.abs(lo), Math.abs(hi)) > 1e-9);
          const t = niceTicks(lo, hi, count);
          const mantissa = t.step / 10 ** Math.floor(Math.log10(t.step));
          expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-9 || Math.abs(mantissa - 10 * m) < 1e-9)).toBe(true);
          // covering up to 1e-9 of a tick spacing: the slack niceTicks allows so that
          // 0.3 / 0.1 = 2.9999999999999996 still counts as the tick 3; plus a few ulps
          // of the bound itself, below which the comparison cannot be exact (derived)
          const slack = (x: number): number => 1e-9 * t.step + 4 * Number.EPSILON * Math.abs(x);
          expect(t.min).toBeLessThanOrEqual(lo + slack(lo));
          expect(t.max).toBeGreaterThanOrEqual(hi - slack(hi));
          // Heckbert's loose labels give at most about 2.5x the asked count (ceil of a 1-2-5 range / rounded step)
          expect(t.values.length).toBeGreaterThanOrEqual(2);
          expect(t.values.length).toBeLessThanOrEqual(Math.ceil(2.5 * count) + 2);
          for (let k = 1; k < t.values.length; k++) {
            expect((t.values[k] as number) - (t.values[k - 1] as number)).toBeCloseTo(t.step, 6);
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('niceTicks input checks', () => {
  it('rejects a non-finite range with a typed error', () => {
    expect(() => niceTicks(0, Infinity)).toThrow(expect.objectContaining({ code: 'report-bad-range' }));
    expect(() => niceTicks(NaN, 1)).toThrow(InputError);
  });
});
