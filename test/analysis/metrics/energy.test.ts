import { describe, expect, it } from 'vitest';
import { cumulativeIntegral, energyIntegral, lossTotals } from '../../../src/index.js';
import { jitteredGrid, sample } from './grids.js';

describe('energyIntegral and cumulativeIntegral', () => {
  // Derived: the energy of p(t) = P0 exp(-t/tau) up to t is P0 tau (1 - exp(-t/tau)).
  const P0 = 250;
  const tau = 2e-3;
  const p = (s: number): number => P0 * Math.exp(-s / tau);
  const exact = (s: number): number => P0 * tau * (1 - Math.exp(-s / tau));

  it('tracks the exact running energy at every sample (second order), and exactly with the dense evaluator', () => {
    const t = jitteredGrid(0, 10e-3, 2000);
    const e = energyIntegral(t, sample(t, p));
    expect(e.cumulative[0]).toBe(0);
    let worst = 0;
    for (let k = 0; k < t.length; k++) worst = Math.max(worst, Math.abs((e.cumulative[k] ?? 0) - exact(t[k] ?? 0)));
    expect(worst / exact(10e-3)).toBeLessThan(1e-5);
    expect(e.total).toBe(e.cumulative[t.length - 1]);
    const dense = energyIntegral(t, sample(t, p), { at: p });
    expect(dense.total).toBeCloseTo(exact(10e-3), 14);
  });

  it('sums a million increments without drift (compensated summation)', () => {
    const n = 1_000_000;
    const t = Float64Array.from({ length: n + 1 }, (_, i) => i * 1e-7);
    const ones = new Float64Array(n + 1).fill(1);
    const c = cumulativeIntegral(t, ones);
    // the increments telescope to t[n] - t[0]; compensated summation keeps that to a few ulps
    expect(Math.abs((c[n] ?? 0) - (t[n] ?? 0))).toBeLessThan(4 * Number.EPSILON * (t[n] ?? 0));
  });
});

describe('lossTotals', () => {
  it('gives the energy per element over the window, their total and the average loss power', () => {
    const t = Float64Array.of(0, 1e-3, 2e-3, 3e-3);
    const r = lossTotals(
      t,
      { Rload: Float64Array.of(10, 10, 10, 10), Rwinding: Float64Array.of(0, 1, 2, 3) },
      { from: 1e-3, to: 3e-3 },
    );
    expect(Object.keys(r.energies)).toEqual(['Rload', 'Rwinding']);
    expect(r.energies.Rload).toBeCloseTo(0.02, 15);
    expect(r.energies.Rwinding).toBeCloseTo(0.004, 15); // integral of 1000 t from 1 ms to 3 ms
    expect(r.total).toBeCloseTo(0.024, 15);
    expect(r.duration).toBeCloseTo(2e-3, 15);
    expect(r.averagePower).toBeCloseTo(12, 12);
  });

  it('rejects an empty set and names a malformed series', () => {
    expect(() => lossTotals([0, 1], {})).toThrow(/no loss series/);
    expect(() => lossTotals([0, 1], { Rcore: [1] })).toThrow(/Rcore: 2 times but 1 values/);
  });
});
