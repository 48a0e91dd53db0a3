import { checkPoints, checkSeries, resolveCycles, type CycleOptions } from './series-options.js';
import { identity, windowIntegral } from './window-integral.js';

/**
 * Per-cycle averages of a series.
 *
 * @example
 * ```ts
 * const { midTimes, means } = cycleMeans(t, iMag, { period: 0.02 });
 * ```
 */
export interface CycleMeans {
  /** Start time of each full cycle, s. */
  readonly starts: Float64Array;
  /** Mid time of each cycle (start + T/2), s. */
  readonly midTimes: Float64Array;
  /** Mean of the series over each cycle (its DC offset in that cycle). */
  readonly means: Float64Array;
}

/**
 * Mean of a series over each full cycle `[start + kT, start + (k+1)T]`
 * inside the data: the DC offset per cycle (of a winding current, a flux, a
 * flux density). Cycle boundaries are computed as `start + k*T`; each mean is
 * a window integral (trapezoid on the samples, or Gauss-Legendre on `at`)
 * divided by T. A partial cycle at the end is dropped.
 *
 * @example
 * ```ts
 * const t = Float64Array.from({ length: 4001 }, (_, i) => i * 1e-5); // 40 ms, two 50 Hz cycles
 * const b = t.map((s) => 0.2 + Math.sin(2 * Math.PI * 50 * s));
 * cycleMeans(t, b, { period: 0.02 }).means; // [0.2, 0.2]
 * ```
 */
export function cycleMeans(t: ArrayLike<number>, x: ArrayLike<number>, options: CycleOptions): CycleMeans {
  const name = options.name ?? 'series';
  checkSeries(t, x, name);
  const points = checkPoints(options.pointsPerInterval ?? 4, name);
  const { start, count } = resolveCycles(t, options, name);
  const T = options.period;
  const last = t[t.length - 1] ?? 0;
  const starts = new Float64Array(count);
  const midTimes = new Float64Array(count);
  const means = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const a = start + k * T;
    const b = Math.min(start + (k + 1) * T, last);
    starts[k] = a;
    midTimes[k] = a + 0.5 * T;
    means[k] = windowIntegral(t, x, a, b, identity, options.at, points) / T;
  }
  return { starts, midTimes, means };
}
