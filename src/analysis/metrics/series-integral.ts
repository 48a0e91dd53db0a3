import { checkPoints, checkSeries, resolveWindow, type WindowOptions } from './series-options.js';
import { identity, windowIntegral } from './window-integral.js';

/**
 * Integral of a sampled series over `[from, to]` (default: the whole
 * series): trapezoidal rule on the samples, or Gauss-Legendre on the dense
 * output when `at` is given (see {@link WindowOptions}).
 *
 * @example
 * ```ts
 * const t = Float64Array.from({ length: 101 }, (_, i) => i / 100);
 * const x = t.map((s) => 2 * s);
 * seriesIntegral(t, x); // 1 (exact for a linear signal)
 * seriesIntegral(t, x, { from: 0.5 }); // 0.75
 * ```
 */
export function seriesIntegral(t: ArrayLike<number>, x: ArrayLike<number>, options: WindowOptions = {}): number {
  const name = options.name ?? 'series';
  checkSeries(t, x, name);
  const [a, b] = resolveWindow(t, options, name);
  return windowIntegral(t, x, a, b, identity, options.at, checkPoints(options.pointsPerInterval ?? 4, name));
}
