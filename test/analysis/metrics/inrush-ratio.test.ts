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
});
