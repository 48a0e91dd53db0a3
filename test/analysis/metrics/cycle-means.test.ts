import { describe, expect, it } from 'vitest';
import { cycleMeans, InputError } from '../../../src/index.js';
import { jitteredGrid, sample } from './grids.js';

// Derived: the mean of c + A sin(wt + phi) over any whole period is c; the mean of
// a exp(-t/tau) over [s, s + T] is a (tau/T) (exp(-s/tau) - exp(-(s+T)/tau)).

describe('cycleMeans', () => {
  const f = 60;
  const T = 1 / f;
  const w = 2 * Math.PI * f;

  it('gives the offset of an offset sine in every full cycle, dropping the partial last cycle', () => {
    const t = jitteredGrid(0.001, 0.001 + 4.6 * T, 4600);
    const x = sample(t, (s) => 0.3 + 1.2 * Math.sin(w * s + 1));
    const m = cycleMeans(t, x, { period: T, start: 0.002 });
    expect(m.means.length).toBe(4);
    for (let k = 0; k < 4; k++) {
      expect(m.starts[k]).toBeCloseTo(0.002 + k * T, 15);
      expect(m.midTimes[k]).toBeCloseTo(0.002 + (k + 0.5) * T, 15);
      expect(m.means[k]).toBeCloseTo(0.3, 5);
    }
  });

  it('gives the exact per-cycle mean of a decaying offset on a sine, with the dense evaluator', () => {
    const a = 3;
    const tau = 0.05;
    const x = (s: number): number => Math.sin(w * s) + a * Math.exp(-s / tau);
    const t = jitteredGrid(0, 10 * T, 400);
    const m = cycleMeans(t, sample(t, x), { period: T, at: x });
    expect(m.means.length).toBe(10);
    for (let k = 0; k < 10; k++) {
      const s = k * T;
      const exact = ((a * tau) / T) * (Math.exp(-s / tau) - Math.exp(-(s + T) / tau));
      expect(m.means[k]).toBeCloseTo(exact, 9);
    }
  });

  it('rejects a non-positive period and a start before the data', () => {
    const t = Float64Array.of(0, 1, 2);
    const x = Float64Array.of(0, 1, 0);
    expect(() => cycleMeans(t, x, { period: 0, name: 'phi' })).toThrow(/phi: period 0 s must be positive/);
    expect(() => cycleMeans(t, x, { period: 1, start: -1, name: 'phi' })).toThrow(InputError);
  });
});
