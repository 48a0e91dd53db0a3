import { InputError } from '../../errors.js';
import { seriesPeak } from './series-peak.js';
import { checkSeries } from './series-options.js';

/**
 * Options of {@link inrushRatio}.
 *
 * @example
 * ```ts
 * inrushRatio(t, i, { period: 0.02, steadyCycles: 5, name: 'primary' });
 * ```
 */
export interface InrushRatioOptions {
  /** Period of the supply, s (> 0). */
  readonly period: number;
  /** Number of cycles at the end of the data taken as steady state. Default 3. */
  readonly steadyCycles?: number;
  /** Dense output of the current, to refine the peaks (see {@link seriesPeak}). */
  readonly at?: (t: number) => number;
  /** Name of the current for messages. Default `'current'`. */
  readonly name?: string;
}

/**
 * Inrush peak and its ratio to the steady-state peak.
 *
 * @example
 * ```ts
 * const { peak, peakTime, ratio } = inrushRatio(t, i, { period: 0.02 });
 * ```
 */
export interface InrushRatio {
  /** Largest |i| over the whole series, A. */
  readonly peak: number;
  /** Time of that peak, s. */
  readonly peakTime: number;
  /** Largest |i| over the last `steadyCycles` periods, A. */
  readonly steadyPeak: number;
  /** Start of the steady-state window (end - steadyCycles * period), s. */
  readonly steadyFrom: number;
  /** peak / steadyPeak. */
  readonly ratio: number;
}

/**
 * Inrush ratio of a winding current: the largest |i| over the whole series
 * divided by the steady-state peak, taken as the largest |i| over the last
 * `steadyCycles` periods of the data (`[end - steadyCycles*T, end]`). Run
 * the simulation long enough for the transient to have died out there; if it
 * has not, the steady-state peak is overestimated and the ratio
 * underestimated (compare with a longer run, or check
 * {@link dcOffsetDecay}).
 *
 * Caution: the inrush peak is an engineering estimate from a model (core
 * data, remanence, switching instant, source impedance). Do not set
 * protection or rate equipment on it alone; local codes, standards and
 * licensed engineering practice govern.
 *
 * @example
 * ```ts
 * const r = inrushRatio(t, iPrimary, { period: 0.02, steadyCycles: 3 });
 * console.log(`inrush ${r.peak.toFixed(1)} A at ${r.peakTime} s, ${r.ratio.toFixed(1)} x steady peak`);
 * ```
 */
export function inrushRatio(t: ArrayLike<number>, i: ArrayLike<number>, options: InrushRatioOptions): InrushRatio {
  const name = options.name ?? 'current';
  checkSeries(t, i, name);
  const { period } = options;
  const cycles = options.steadyCycles ?? 3;
  if (!Number.isFinite(period) || period <= 0) {
    throw new InputError('bad-option', `${name}: period ${period} s must be positive and finite`, [name]);
  }
  if (!Number.isInteger(cycles) || cycles < 1) {
    throw new InputError('bad-option', `${name}: steadyCycles ${cycles} must be a positive integer`, [name]);
  }
  const first = t[0] ?? 0;
  const last = t[t.length - 1] ?? 0;
  const steadyFrom = last - cycles * period;
  if (steadyFrom <= first) {
    throw new InputError(
      'bad-window',
      `${name}: the data span ${last - first} s is not longer than ${cycles} steady-state cycles of ${period} s; simulate longer or lower steadyCycles`,
      [name],
    );
  }
  const at = options.at !== undefined ? { at: options.at } : {};
  const all = seriesPeak(t, i, { name, ...at });
  const steady = seriesPeak(t, i, { name, from: steadyFrom, ...at });
  if (steady.maxAbs === 0) {
    throw new InputError('bad-series', `${name}: the current is zero over the last ${cycles} cycles; there is no steady-state peak to compare with`, [name]);
  }
  return { peak: all.maxAbs, peakTime: all.timeOfMaxAbs, steadyPeak: steady.maxAbs, steadyFrom, ratio: all.maxAbs / steady.maxAbs };
}
