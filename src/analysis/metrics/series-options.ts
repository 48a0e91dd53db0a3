import { InputError } from '../../errors.js';
import { GAUSS_LEGENDRE } from './gauss-legendre.js';

/**
 * Options shared by the metrics that work over a time window of one sampled
 * series `(t, x)`.
 *
 * Accuracy: without `at`, integrals use the trapezoidal rule on the samples
 * (linear interpolation between them), second order in the sample spacing
 * for a smooth signal; the result is only as good as the sampling. When the
 * solver's dense output is available, pass it as `at`: each sample interval
 * is then integrated with a Gauss-Legendre rule on `at` (default 4 points,
 * exact for polynomials up to degree 7, which covers the square of the
 * cubic collocation polynomial of Radau IIA when `t` are the solver's step
 * ends).
 *
 * @example
 * ```ts
 * seriesRms(t, i, { from: 0.1, to: 0.2 }); // samples only, trapezoid
 * seriesRms(t, i, { from: 0.1, to: 0.2, at: (s) => solution.at(s)[k] }); // dense output, Gauss-Legendre
 * ```
 */
export interface WindowOptions {
  /** Start of the window, s. Default: the first sample time. */
  readonly from?: number;
  /** End of the window, s. Default: the last sample time. */
  readonly to?: number;
  /** Evaluator of the same quantity at any time in the data's span (dense output). */
  readonly at?: (t: number) => number;
  /** Gauss-Legendre points per sample interval when `at` is given, 1 to 5. Default 4. */
  readonly pointsPerInterval?: number;
  /** Name of the series for messages. Default `'series'`. */
  readonly name?: string;
}

/**
 * Options of the per-cycle metrics: cycles `[start + kT, start + (k+1)T]`
 * that lie entirely inside the data (partial cycles at the end are
 * dropped).
 *
 * @example
 * ```ts
 * cycleMeans(t, phi, { period: 0.02, start: 0.005 });
 * ```
 */
export interface CycleOptions {
  /** The period T, s (> 0). */
  readonly period: number;
  /** Start of the first cycle, s. Default: the first sample time. */
  readonly start?: number;
  /** Evaluator of the same quantity at any time (dense output); see {@link WindowOptions.at}. */
  readonly at?: (t: number) => number;
  /** Gauss-Legendre points per sample interval when `at` is given, 1 to 5. Default 4. */
  readonly pointsPerInterval?: number;
  /** Name of the series for messages. Default `'series'`. */
  readonly name?: string;
}

/**
 * Check that `(t, x)` is a usable series: equal lengths, at least
 * `minLength` samples, finite values, non-decreasing times (repeated times,
 * as at a breakpoint, are allowed).
 *
 * @internal
 */
export function checkSeries(t: ArrayLike<number>, x: ArrayLike<number>, name: string, minLength = 2): void {
  if (t.length !== x.length) {
    throw new InputError('bad-series', `${name}: ${t.length} times but ${x.length} values; give one value per time`, [name]);
  }
  if (t.length < minLength) {
    throw new InputError('bad-series', `${name}: ${t.length} samples; need at least ${minLength}`, [name]);
  }
  for (let i = 0; i < t.length; i++) {
    const ti = t[i] ?? Number.NaN;
    const xi = x[i] ?? Number.NaN;
    if (!Number.isFinite(ti) || !Number.isFinite(xi)) {
      throw new InputError('bad-series', `${name}: sample ${i} (t = ${ti}, value ${xi}) is not finite; give finite samples`, [name]);
    }
    if (i > 0 && ti < (t[i - 1] ?? ti)) {
      throw new InputError('bad-series', `${name}: time ${ti} s at sample ${i} is before ${t[i - 1]} s; times must not decrease`, [name]);
    }
  }
}

/**
 * The window `[from, to]` of a metric, checked to lie inside the data.
 *
 * @internal
 */
export function resolveWindow(t: ArrayLike<number>, options: Pick<WindowOptions, 'from' | 'to'>, name: string): [number, number] {
  const first = t[0] ?? 0;
  const last = t[t.length - 1] ?? 0;
  const from = options.from ?? first;
  const to = options.to ?? last;
  if (!Number.isFinite(from) || !Number.isFinite(to) || !(to > from)) {
    throw new InputError('bad-window', `${name}: window [${from}, ${to}] s is empty or not finite; give from < to`, [name]);
  }
  const slack = 1e-12 * Math.max(1, Math.abs(first), Math.abs(last));
  if (from < first - slack || to > last + slack) {
    throw new InputError('bad-window', `${name}: window [${from}, ${to}] s reaches outside the data [${first}, ${last}] s; narrow it`, [name]);
  }
  return [Math.max(from, first), Math.min(to, last)];
}

/**
 * Validate the Gauss-Legendre point count.
 *
 * @internal
 */
export function checkPoints(points: number, name: string): number {
  if (!Number.isInteger(points) || GAUSS_LEGENDRE[points - 1] === undefined) {
    throw new InputError('bad-option', `${name}: pointsPerInterval ${points} must be an integer from 1 to ${GAUSS_LEGENDRE.length}`, [name]);
  }
  return points;
}

/**
 * Validate a period and return the first cycle start and the number of full
 * cycles inside the data.
 *
 * @internal
 */
export function resolveCycles(t: ArrayLike<number>, options: CycleOptions, name: string): { start: number; count: number } {
  const { period } = options;
  const first = t[0] ?? 0;
  const last = t[t.length - 1] ?? 0;
  if (!Number.isFinite(period) || period <= 0) {
    throw new InputError('bad-option', `${name}: period ${period} s must be positive and finite`, [name]);
  }
  const start = options.start ?? first;
  const slack = 1e-9 * period;
  if (!Number.isFinite(start) || start < first - slack) {
    throw new InputError('bad-window', `${name}: cycle start ${start} s is before the data starts (${first} s)`, [name]);
  }
  // Allow the last cycle to end within a rounding slack of the data end.
  const count = Math.max(0, Math.floor((last - start + slack) / period));
  return { start: Math.max(start, first), count };
}
