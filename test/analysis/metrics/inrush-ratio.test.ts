import { describe, expect, it } from 'vitest';
import { inrushRatio, InputError } from '../../../src/index.js';

describe('inrushRatio', () => {
  // A current whose cycle k is a sine of amplitude 1 + 5 * 0.5^k, sampled so that every crest
  // (t = (k + 1/4) T) is a sample: the peak, the steady-state peak and the ratio follow exactly (derived).
  const T = 0.02;
  const cycles = 10;
  const n = 400; // samples per cycle, a multiple of 4
  const t = Float64Array.from({ length: cycles * n + 1 }, (_, i) => (i * T) / n);
  const i = t.map((s) => {
    const k = Math.min(cycles - 1, Math.floor(s / T + 1e-9));
    return (1 + 5 * 0.5 ** k) * Math.sin((2 * Math.PI * s) / T);
  });

  it('divides the largest |i| by the largest |i| of the last N cycles', () => {
    const r = inrushRatio(t, i, { period: T, steadyCycles: 3 });
    expect(r.peak).toBeCloseTo(6, 12);
    expect(r.peakTime).toBeCloseTo(T / 4, 12);
    expect(r.steadyFrom).toBeCloseTo(7 * T, 12);
    expect(r.steadyPeak).toBeCloseTo(1 + 5 * 0.5 ** 7, 12);
    expect(r.ratio).toBeCloseTo(6 / (1 + 5 * 0.5 ** 7), 12);
  });

  it('uses 3 steady-state cycles by default and rejects data shorter than them', () => {
    expect(inrushRatio(t, i, { period: T }).steadyPeak).toBeCloseTo(1 + 5 * 0.5 ** 7, 12);
    expect(() => inrushRatio(t, i, { period: T, steadyCycles: 10, name: 'i_prim' })).toThrow(/i_prim: .* simulate longer/);
    expect(() => inrushRatio(t, i, { period: -1 })).toThrow(InputError);
  });

  it('warns when the steady window is not steady: cycle peaks still falling, or a DC part left (derived)', () => {
    // The last 3 cycles of the test current have peaks 1 + 5 * 0.5^k, k = 7, 8, 9: 1.039, 1.020, 1.010, a change of
    // 2.8 % of the steady peak, above the default 2 %.
    const r = inrushRatio(t, i, { period: T, steadyCycles: 3, name: 'primary' });
    expect(r.steady).toBe(false);
    expect(r.warnings.join('\n')).toMatch(/^primary: the current is not steady in the last 3 cycle\(s\): the cycle peak goes from 1\.039 to 1\.010 \(2\.8 %/);
    expect(inrushRatio(t, i, { period: T, steadyCycles: 3, steadyTolerance: 0.05 }).steady).toBe(true);
    // A steady sine: no warning, with one steady cycle too (compared with the cycle before).
    const sineOnly = t.map((s) => 2 * Math.sin((2 * Math.PI * s) / T) * (s < T ? 3 : 1));
    const steady = inrushRatio(t, sineOnly, { period: T, steadyCycles: 1 });
    expect(steady.warnings).toEqual([]);
    expect(steady.ratio).toBeCloseTo(3, 9);
    // A decaying DC offset under a sine (tau 60 ms): the last cycle's mean is 3.5 % of its peak.
    const offset = t.map((s) => Math.sin((2 * Math.PI * s) / T) + 1.3 * Math.exp(-s / 0.06));
    const r2 = inrushRatio(t, offset, { period: T, steadyCycles: 1 });
    expect(r2.steady).toBe(false);
    expect(r2.warnings.some((w) => /DC part of \d+\.\d %/.test(w))).toBe(true);
  });
});
