import { checkPoints, checkSeries, type WindowOptions } from './series-options.js';
import { gaussLegendre } from './gauss-legendre.js';

/**
 * Options of {@link cumulativeIntegral}.
 *
 * @example
 * ```ts
 * cumulativeIntegral(t, v, { at: (s) => solution.at(s)[k], pointsPerInterval: 4 });
 * ```
 */
export interface CumulativeOptions {
  /** Evaluator of the same quantity at any time (dense output); see {@link WindowOptions.at}. */
  readonly at?: (t: number) => number;
  /** Gauss-Legendre points per sample interval when `at` is given, 1 to 5. Default 4. */
  readonly pointsPerInterval?: number;
  /** Name of the series for messages. Default `'series'`. */
  readonly name?: string;
}

/**
 * Running integral `F[i] = integral from t[0] to t[i] of x dt` at every
 * sample (so `F[0] = 0`), by the trapezoidal rule, or Gauss-Legendre on
 * `at` per interval. The sum is compensated (Kahan-Babuska-Neumaier), so a
 * million small increments lose no more than rounding of the total.
 *
 * @example
 * ```ts
 * const t = Float64Array.of(0, 1, 3);
 * cumulativeIntegral(t, Float64Array.of(2, 2, 4)); // Float64Array [0, 2, 8]
 * ```
 */
export function cumulativeIntegral(t: ArrayLike<number>, x: ArrayLike<number>, options: CumulativeOptions = {}): Float64Array {
  const name = options.name ?? 'series';
  checkSeries(t, x, name, 1);
  const points = checkPoints(options.pointsPerInterval ?? 4, name);
  const at = options.at;
  const out = new Float64Array(t.length);
  let sum = 0;
  let comp = 0; // Neumaier compensation
  for (let i = 1; i < t.length; i++) {
    const t0 = t[i - 1] ?? 0;
    const t1 = t[i] ?? 0;
    let inc = 0;
    if (t1 > t0) inc = at === undefined ? 0.5 * (t1 - t0) * ((x[i - 1] ?? 0) + (x[i] ?? 0)) : gaussLegendre(at, t0, t1, points);
    const s = sum + inc;
    comp += Math.abs(sum) >= Math.abs(inc) ? sum - s + inc : inc - s + sum;
    sum = s;
    out[i] = sum + comp;
  }
  return out;
}
