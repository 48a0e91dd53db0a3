import { checkPoints, checkSeries, resolveWindow, type WindowOptions } from './series-options.js';
import { identity, windowIntegral } from './window-integral.js';

/**
 * Time average of a sampled series over `[from, to]`:
 * `(1 / (to - from)) * integral of x dt`, with the integral of
 * {@link seriesIntegral} (trapezoid on the samples, or Gauss-Legendre on
 * `at`). Non-uniform sampling is weighted by time, not by sample count.
 *
 * @example
 * ```ts
 * const t = Float64Array.from({ length: 2001 }, (_, i) => i * 1e-5); // 20 ms
 * const v = t.map((s) => 5 + 10 * Math.sin(2 * Math.PI * 50 * s));
 * seriesMean(t, v); // 5 (one full 50 Hz period)
 * ```
 */
export function seriesMean(t: ArrayLike<number>, x: ArrayLike<number>, options: WindowOptions = {}): number {
  const name = options.name ?? 'series';
  checkSeries(t, x, name);
  const [a, b] = resolveWindow(t, options, name);
  return windowIntegral(t, x, a, b, identity, options.at, checkPoints(options.pointsPerInterval ?? 4, name)) / (b - a);
}
