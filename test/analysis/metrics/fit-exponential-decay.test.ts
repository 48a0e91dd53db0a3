import { describe, expect, it } from 'vitest';
import { dcOffsetDecay, fitExponentialDecay, InputError } from '../../../src/index.js';
import { jitteredGrid, sample } from './grids.js';

describe('fitExponentialDecay', () => {
  it('recovers tau and amplitude of exact exponential data, with R^2 = 1 (log-linear least squares)', () => {
    const t = [0.1, 0.3, 0.35, 0.8, 1.4];
    const fit = fitExponentialDecay(t, t.map((s) => -4 * Math.exp(-(s - 0.1) / 0.25)));
    expect(fit.tau).toBeCloseTo(0.25, 12);
    expect(fit.amplitude).toBeCloseTo(-4, 12);
    expect(fit.referenceTime).toBe(0.1);
    expect(fit.rSquared).toBeCloseTo(1, 12);
    expect(fit.rmsLogResidual).toBeLessThan(1e-12);
  });

  it('fits towards a given asymptote, and reports a poorer R^2 for data that are not exponential', () => {
    const t = [0, 1, 2, 3, 4];
    expect(fitExponentialDecay(t, t.map((s) => 7 + 2 * Math.exp(-s / 1.5)), { asymptote: 7 }).tau).toBeCloseTo(1.5, 12);
    const linear = fitExponentialDecay(t, t.map((s) => 10 - 2 * s));
    expect(linear.rSquared).toBeLessThan(0.95);
  });

  it('rejects values that cross the asymptote and too few points', () => {
    expect(() => fitExponentialDecay([0, 1, 2], [1, -1, 0.5], { name: 'dc' })).toThrow(/dc: y - asymptote at point 1 .* one side of the asymptote/);
    expect(() => fitExponentialDecay([0], [1])).toThrow(InputError);
    expect(() => fitExponentialDecay([1, 1], [1, 2])).toThrow(/two distinct times/);
  });
});

describe('dcOffsetDecay', () => {
  // Derived: with x = A sin(wt) + c exp(-t/tau), the cycle means are exactly proportional to
  // exp(-s_k/tau), so the log-linear fit of the means recovers tau exactly (up to quadrature error).
  const f = 50;
  const T = 1 / f;
  const w = 2 * Math.PI * f;
  const tau = 0.045;
  const x = (s: number): number => 100 * Math.sin(w * s + 0.7) + 30 * Math.exp(-s / tau);

  it('recovers the decay time constant of a DC offset under a sine, on non-uniform samples', () => {
    const t = jitteredGrid(0, 12 * T, 12 * 400);
    const r = dcOffsetDecay(t, sample(t, x), { period: T, name: 'i_primary' });
    expect(r.cycles.means.length).toBe(12);
    expect(r.fit.points).toBe(12);
    expect(Math.abs(r.fit.tau / tau - 1)).toBeLessThan(1e-3);
    expect(r.fit.rSquared).toBeGreaterThan(0.999999);
  });

  it('converges at second order in the sample spacing, and to rounding level with the dense evaluator', () => {
    const err = (n: number): number => {
      const t = jitteredGrid(0, 12 * T, 12 * n, 7);
      return dcOffsetDecay(t, sample(t, x), { period: T }).fit.tau / tau - 1;
    };
    const e1 = err(200);
    const e2 = err(400);
    expect(Math.log2(Math.abs(e1 / e2))).toBeGreaterThan(1.5);
    const t = jitteredGrid(0, 12 * T, 12 * 50);
    const dense = dcOffsetDecay(t, sample(t, x), { period: T, at: x, skipCycles: 2 });
    expect(dense.fit.points).toBe(10);
    expect(Math.abs(dense.fit.tau / tau - 1)).toBeLessThan(1e-11);
  });

  it("skips the fast first cycles by default ('auto') and warns about a poor fit when told to keep them (derived)", () => {
    // Two decays: a fast one (tau 5 ms, as while the core saturates) and the slow one (45 ms). After the fast part
    // has gone (a few cycles), the cycle means are exp(-t / 45 ms) again.
    const two = (s: number): number => 100 * Math.sin(w * s + 0.7) + 30 * Math.exp(-s / tau) + 400 * Math.exp(-s / 0.005);
    const t = jitteredGrid(0, 12 * T, 12 * 400);
    const auto = dcOffsetDecay(t, sample(t, two), { period: T, name: 'B' });
    expect(auto.skippedCycles).toBeGreaterThan(0);
    expect(auto.fit.rSquared).toBeGreaterThanOrEqual(0.99);
    expect(Math.abs(auto.fit.tau / tau - 1)).toBeLessThan(0.02);
    expect(auto.warnings).toEqual([]);
    const all = dcOffsetDecay(t, sample(t, two), { period: T, name: 'B', skipCycles: 0, warnBelowRSquared: 0.999 });
    expect(all.skippedCycles).toBe(0);
    expect(all.fit.rSquared).toBeLessThan(0.999);
    expect(all.warnings[0]).toMatch(/^B: the per-cycle DC offset is not a single exponential decay \(R\^2 0\.\d+ over 12 cycles after skipping 0\)/);
    // A clean exponential needs no skipping.
    expect(dcOffsetDecay(t, sample(t, x), { period: T }).skippedCycles).toBe(0);
  });

  it('needs at least two fitted cycles', () => {
    const t = jitteredGrid(0, 2.5 * T, 250);
    expect(() => dcOffsetDecay(t, sample(t, x), { period: T, skipCycles: 1, name: 'i' })).toThrow(/2 full cycles .* 1 left after skipping 1/);
  });
});
