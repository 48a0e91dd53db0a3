import { describe, expect, it } from 'vitest';
import { seriesPeak } from '../../../src/index.js';
import { jitteredGrid, sample } from './grids.js';

// References derived: A sin(wt + phi) + c has max c + A at wt + phi = pi/2, min c - A at 3 pi/2.

describe('seriesPeak', () => {
  const f = 50;
  const w = 2 * Math.PI * f;
  const T = 1 / f;
  const A = 2;
  const c = 0.5;
  const x = (s: number): number => c + A * Math.sin(w * s);

  it('finds max, min and max |x| with their times among the samples (within the sampling error)', () => {
    const t = jitteredGrid(0, T, 200);
    const p = seriesPeak(t, sample(t, x));
    const h = T / 200;
    const sampleErr = A * (1 - Math.cos(w * 0.7 * h)); // jitter makes spacing up to 1.4 h; half of it
    expect(p.max).toBeLessThanOrEqual(c + A);
    expect(c + A - p.max).toBeLessThan(sampleErr);
    expect(Math.abs(p.timeOfMax - T / 4)).toBeLessThan(0.7 * h);
    expect(p.min - (c - A)).toBeLessThan(sampleErr);
    expect(Math.abs(p.timeOfMin - (3 * T) / 4)).toBeLessThan(0.7 * h);
    expect(p.maxAbs).toBe(p.max);
    expect(p.timeOfMaxAbs).toBe(p.timeOfMax);
  });

  it('refines the extremes on the dense evaluator to rounding accuracy', () => {
    const t = jitteredGrid(0, T, 24);
    const p = seriesPeak(t, sample(t, x), { at: x });
    expect(p.max).toBeCloseTo(c + A, 13);
    expect(p.min).toBeCloseTo(c - A, 13);
    expect(Math.abs(p.timeOfMax - T / 4)).toBeLessThan(1e-6 * T); // a flat maximum fixes t only to ~sqrt(eps)
    expect(Math.abs(p.timeOfMin - (3 * T) / 4)).toBeLessThan(1e-6 * T);
  });

  it('reports max |x| from the negative side when that is larger, and respects the window', () => {
    const t = Float64Array.of(0, 1, 2, 3, 4);
    const v = Float64Array.of(1, -5, 2, 3, 0);
    const p = seriesPeak(t, v);
    expect(p).toEqual({ peak: 5, peakTime: 1, maxTime: 3, minTime: 1, maxAbs: 5, timeOfMaxAbs: 1, max: 3, timeOfMax: 3, min: -5, timeOfMin: 1 });
    const q = seriesPeak(t, v, { from: 1.5, to: 3.5 });
    expect(q.min).toBe(-1.5); // interpolated at the window start
    expect(q.timeOfMin).toBe(1.5);
    expect(q.max).toBe(3);
  });
});

describe('one naming style for a peak and its time (old names kept as deprecated aliases)', () => {
  it('seriesPeak, fluxDensityMargin and inrushRatio all say peak / peakTime', async () => {
    const { fluxDensityMargin, inrushRatio } = await import('../../../src/index.js');
    const t = Float64Array.from({ length: 4001 }, (_, i) => i * 1e-5);
    const x = t.map((s) => (s < 0.005 ? -3 : 1) * Math.sin(2 * Math.PI * 50 * s));
    const p = seriesPeak(t, x);
    expect([p.peak, p.peakTime, p.maxTime, p.minTime]).toEqual([p.maxAbs, p.timeOfMaxAbs, p.timeOfMax, p.timeOfMin]);
    const m = fluxDensityMargin(t, x, { saturation: 4 });
    expect([m.peak, m.peakTime]).toEqual([p.peak, p.peakTime]);
    expect(m.time).toBe(m.peakTime);
    const r = inrushRatio(t, x, { period: 0.02, steadyCycles: 1 });
    expect([r.peak, r.peakTime]).toEqual([p.peak, p.peakTime]);
  });
});
