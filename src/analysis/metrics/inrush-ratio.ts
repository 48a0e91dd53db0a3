import { InputError } from '../../errors.js';
import { seriesPeak } from './series-peak.js';
import { checkSeries } from './series-options.js';
import { seriesMean } from './series-mean.js';

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
  /**
   * Largest change of the cycle peak across the steady window (and the
   * cycle before it, with one steady cycle), and largest DC part of a steady
   * cycle, as fractions of the steady peak, for the window to count as
   * steady. Default 0.02.
   */
  readonly steadyTolerance?: number;
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
  /** Whether the steady window looks steady (cycle peaks and DC part within `steadyTolerance`). */
  readonly steady: boolean;
  /** Plain-language warnings when the assumption of a steady window does not hold. Empty when none. */
  readonly warnings: readonly string[];
}

/**
 * Inrush ratio of a winding current: the largest |i| over the whole series
 * divided by the steady-state peak, taken as the largest |i| over the last
 * `steadyCycles` periods of the data (`[end - steadyCycles*T, end]`). Run
 * the simulation long enough for the transient to have died out there; if it
 * has not, the steady-state peak is overestimated and the ratio
 * underestimated. The result says so: `steady` is false and `warnings`
 * explains when the cycle peaks in the window still change, or a cycle still
 * carries a DC part, by more than `steadyTolerance` of the steady peak
 * (compare with a longer run, check {@link dcOffsetDecay}, or start from a
 * periodic steady state).
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
  if (steady.peak === 0) {
    throw new InputError('bad-series', `${name}: the current is zero over the last ${cycles} cycles; there is no steady-state peak to compare with`, [name]);
  }
  const tolerance = options.steadyTolerance ?? 0.02;
  if (!(tolerance > 0)) throw new InputError('bad-option', `${name}: steadyTolerance ${tolerance} must be positive`, [name]);
  // Is the window steady? Compare the peaks of its cycles (with the cycle before it when it has only one), and
  // look for a DC part (a decaying offset) in each cycle.
  const firstCycle = cycles >= 2 || steadyFrom - period < first ? steadyFrom : steadyFrom - period;
  const cyclePeaks: number[] = [];
  let dcPart = 0;
  for (let from = firstCycle; from < last - 0.5 * period; from += period) {
    const to = Math.min(last, from + period);
    cyclePeaks.push(seriesPeak(t, i, { name, from, to, ...at }).peak);
    dcPart = Math.max(dcPart, Math.abs(seriesMean(t, i, { name, from, to })));
  }
  const warnings: string[] = [];
  const change = cyclePeaks.length >= 2 ? Math.abs(cyclePeaks[cyclePeaks.length - 1]! - cyclePeaks[0]!) / steady.peak : 0;
  if (change > tolerance) {
    warnings.push(
      `${name}: the current is not steady in the last ${cycles} cycle(s): the cycle peak goes from ${cyclePeaks[0]!.toPrecision(4)} to ` +
        `${cyclePeaks[cyclePeaks.length - 1]!.toPrecision(4)} (${(100 * change).toFixed(1)} % of the steady peak), so the ratio to the true steady state differs; ` +
        'simulate more cycles (dcOffsetDecay gives the time constant) or start from periodicSteadyState',
    );
  }
  if (dcPart / steady.peak > tolerance) {
    warnings.push(
      `${name}: a cycle of the steady window still has a DC part of ${(100 * dcPart / steady.peak).toFixed(1)} % of its peak (a decaying offset); ` +
        'the steady peak is overestimated and the ratio understated: simulate more cycles',
    );
  }
  return {
    peak: all.peak,
    peakTime: all.peakTime,
    steadyPeak: steady.peak,
    steadyFrom,
    ratio: all.peak / steady.peak,
    steady: warnings.length === 0,
    warnings,
  };
}
