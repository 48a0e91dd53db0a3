import { checkPoints, checkSeries, resolveCycles, type CycleOptions } from './series-options.js';
import { identity, windowIntegral } from './window-integral.js';

/**
 * Volt-seconds of each half of each period.
 *
 * @example
 * ```ts
 * const { positive, negative, net } = voltSecondsPerHalfCycle(t, v, { period: 10e-6 });
 * ```
 */
export interface VoltSeconds {
  /** Start time of each full period, s. */
  readonly starts: Float64Array;
  /** Integral of v over the first half `[start + kT, start + kT + T/2]`, V s. */
  readonly positive: Float64Array;
  /** Integral of v over the second half `[start + kT + T/2, start + (k+1)T]`, V s. */
  readonly negative: Float64Array;
  /** positive + negative: the net volt-seconds per period (the flux-linkage walk per period), V s. */
  readonly net: Float64Array;
}

/**
 * Volt-seconds (integral of v dt) over each half of each full period,
 * `[start + kT, start + kT + T/2]` ("positive" half) and
 * `[start + kT + T/2, start + (k+1)T]` ("negative" half), and their sum.
 * The halves are fixed by time, not by the sign of v: set `start` to the
 * beginning of the positive conduction interval (for a
 * {@link BipolarSquareSpec}, its `delay`). A winding with N turns sees its
 * flux change by `(positive + negative) / N` per period (less its resistive
 * drop): a non-zero `net` means flux walk.
 *
 * Integrals as in {@link seriesIntegral}: a trapezoid across a jump of v
 * that falls between samples smears it, so sample at the switching instants
 * (the solver lands on source breakpoints) or pass `at`.
 *
 * @example
 * ```ts
 * // a +-10 V square wave of period 1 ms sampled on both sides of each edge
 * const t = Float64Array.of(0, 0.5e-3, 0.5e-3, 1e-3);
 * const v = Float64Array.of(10, 10, -10, -10);
 * voltSecondsPerHalfCycle(t, v, { period: 1e-3 }); // positive [0.005], negative [-0.005], net [0]
 * ```
 */
export function voltSecondsPerHalfCycle(t: ArrayLike<number>, v: ArrayLike<number>, options: CycleOptions): VoltSeconds {
  const name = options.name ?? 'voltage';
  checkSeries(t, v, name);
  const points = checkPoints(options.pointsPerInterval ?? 4, name);
  const { start, count } = resolveCycles(t, options, name);
  const T = options.period;
  const last = t[t.length - 1] ?? 0;
  const starts = new Float64Array(count);
  const positive = new Float64Array(count);
  const negative = new Float64Array(count);
  const net = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const a = start + k * T;
    const m = a + 0.5 * T;
    const b = Math.min(start + (k + 1) * T, last);
    starts[k] = a;
    positive[k] = windowIntegral(t, v, a, m, identity, options.at, points);
    negative[k] = windowIntegral(t, v, m, b, identity, options.at, points);
    net[k] = (positive[k] ?? 0) + (negative[k] ?? 0);
  }
  return { starts, positive, negative, net };
}
