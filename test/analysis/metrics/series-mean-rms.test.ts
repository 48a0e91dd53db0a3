import { describe, expect, it } from 'vitest';
import { seriesMean, seriesRms } from '../../../src/index.js';
import { jitteredGrid, sample, stretchedGrid } from './grids.js';

// Reference values (derived, elementary calculus over whole periods):
//   sine A sin(wt): mean 0, RMS A / sqrt 2;
//   offset sine c + A sin(wt): mean c, RMS sqrt(c^2 + A^2 / 2);
//   symmetric triangle of peak A: RMS A / sqrt 3.

const f = 50;
const T = 1 / f;
const w = 2 * Math.PI * f;

/** Symmetric triangle of peak A and period T: 0 at t = 0, A at T/4, 0 at T/2, -A at 3T/4. */
function triangle(A: number, t: number): number {
  const u = (((t / T) % 1) + 1) % 1;
  if (u < 0.25) return 4 * A * u;
  if (u < 0.75) return A * (2 - 4 * u);
  return A * (4 * u - 4);
}

describe('seriesMean and seriesRms', () => {
  it('give mean 0 and RMS A/sqrt 2 for a sine over whole periods on a non-uniform grid', () => {
    const A = 325;
    const t = jitteredGrid(0, 3 * T, 3000);
    const x = sample(t, (s) => A * Math.sin(w * s));
    expect(Math.abs(seriesMean(t, x))).toBeLessThan(1e-4 * A);
    expect(seriesRms(t, x) / (A / Math.SQRT2)).toBeCloseTo(1, 5);
  });

  it('give mean = offset and RMS sqrt(c^2 + A^2/2) for an offset sine, over a window of two periods', () => {
    const A = 10;
    const c = 2.5;
    const t = stretchedGrid(0, 5 * T, 5000);
    const x = sample(t, (s) => c + A * Math.sin(w * s + 0.4));
    const win = { from: 1.3 * T, to: 3.3 * T };
    expect(seriesMean(t, x, win)).toBeCloseTo(c, 4);
    expect(seriesRms(t, x, win)).toBeCloseTo(Math.sqrt(c * c + (A * A) / 2), 4);
  });

  it('give RMS A/sqrt 3 for a triangle: error within C h^2 on samples, exact with the dense evaluator', () => {
    const A = 4;
    const exact = A / Math.sqrt(3);
    // The corners fall between samples, so the error ratio under refinement is irregular;
    // check the second-order bound |error| <= C / n^2 with one C over a 64x refinement instead.
    for (const n of [100, 200, 400, 800, 1600, 3200, 6400]) {
      const t = stretchedGrid(0, 2 * T, n);
      const e = seriesRms(t, sample(t, (s) => triangle(A, s))) - exact;
      expect(Math.abs(e) * n * n).toBeLessThan(50);
    }
    // grid through the triangle's corners: x^2 is quadratic on every interval, 2 Gauss points are exact
    const corners = Float64Array.from({ length: 9 }, (_, i) => (i * T) / 4);
    const tri = (s: number): number => triangle(A, s);
    expect(seriesRms(corners, sample(corners, tri), { at: tri, pointsPerInterval: 2 })).toBeCloseTo(exact, 13);
  });

  it('weight by time, not by sample count: dense samples in one part do not bias the mean', () => {
    // x = 1 on [0, 1] sampled densely, x = 3 on [1, 2] sampled sparsely; jump represented by a repeated time
    const t = Float64Array.from([...Array.from({ length: 101 }, (_, i) => i / 100), 1, 2]);
    const x = Float64Array.from([...Array.from({ length: 101 }, () => 1), 3, 3]);
    expect(seriesMean(t, x)).toBeCloseTo(2, 14);
    expect(seriesRms(t, x)).toBeCloseTo(Math.sqrt(5), 14);
  });
});
