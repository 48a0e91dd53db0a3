import { checkPoints, checkSeries, resolveWindow, type WindowOptions } from './series-options.js';
import { square, windowIntegral } from './window-integral.js';

/**
 * Root-mean-square value of a sampled series over `[from, to]`:
 * `sqrt((1 / (to - from)) * integral of x^2 dt)`. Without `at` the integral
 * is the trapezoidal rule applied to x^2 at the samples (second order in the
 * spacing); with `at`, Gauss-Legendre on at(t)^2 per sample interval.
 *
 * @example
 * ```ts
 * const t = Float64Array.from({ length: 2001 }, (_, i) => i * 1e-5);
 * const i = t.map((s) => 10 * Math.sin(2 * Math.PI * 50 * s));
 * seriesRms(t, i); // 7.0711 (10 / sqrt 2)
 * ```
 */
export function seriesRms(t: ArrayLike<number>, x: ArrayLike<number>, options: WindowOptions = {}): number {
  const name = options.name ?? 'series';
  checkSeries(t, x, name);
  const [a, b] = resolveWindow(t, options, name);
  return Math.sqrt(windowIntegral(t, x, a, b, square, options.at, checkPoints(options.pointsPerInterval ?? 4, name)) / (b - a));
}
