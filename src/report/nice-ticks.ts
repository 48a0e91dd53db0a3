// Axis ticks at "nice" numbers: 1, 2 or 5 times a power of ten.
// Source: P. S. Heckbert, "Nice numbers for graph labels", in A. S. Glassner
// (ed.), Graphics Gems, Academic Press, 1990, pp. 61-63. `niceNumber` is the
// paper's nicenum(); the loose mode is its "loose labeling" (range rounded
// outwards to multiples of the tick spacing); the tight mode keeps the data
// range and places the ticks at multiples of the spacing inside it.
import { InputError } from '../errors.js';

/**
 * Ticks chosen by {@link niceTicks}.
 *
 * @example
 * ```ts
 * const { min, max, step, values } = niceTicks(105, 543); // 100, 600, 100, [100, 200, ..., 600]
 * ```
 */
export interface NiceTicks {
  /** Lower end of the axis (a tick in loose mode). */
  readonly min: number;
  /** Upper end of the axis (a tick in loose mode). */
  readonly max: number;
  /** Tick spacing: 1, 2 or 5 times a power of ten. */
  readonly step: number;
  /** Tick positions, ascending, rounded to the step's decimals. */
  readonly values: readonly number[];
}

/**
 * Heckbert's nicenum: a number 1, 2, 5 or 10 times a power of ten near `x`
 * (x > 0). With `round`, the nearest such number (thresholds 1.5, 3, 7 on the
 * mantissa); without, the smallest one not below `x`.
 *
 * @example
 * ```ts
 * niceNumber(438, false); // 500
 * niceNumber(125, true);  // 100
 * ```
 */
export function niceNumber(x: number, round: boolean): number {
  const exponent = Math.floor(Math.log10(x));
  const power = 10 ** exponent;
  const fraction = x / power;
  let nice: number;
  if (round) nice = fraction < 1.5 ? 1 : fraction < 3 ? 2 : fraction < 7 ? 5 : 10;
  else nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
  return nice * power;
}

/**
 * Nice ticks for the data range [lo, hi], aiming at about `count` ticks
 * (Heckbert 1990). `loose` (default) widens the range outwards to the
 * nearest ticks, as for a y axis; `tight` keeps [lo, hi] and returns the ticks
 * inside it, as for a time axis. A zero-width range is widened around its
 * value first (by 10 % of its magnitude, or by 1 around zero).
 *
 * @throws InputError (`report-bad-range`) when `lo` or `hi` is not finite.
 *
 * @example
 * ```ts
 * niceTicks(2.03, 2.17).values;                   // [2, 2.05, 2.1, 2.15, 2.2]
 * niceTicks(0, 0.093, 6, 'tight').values;         // [0, 0.02, 0.04, 0.06, 0.08]
 * ```
 */
export function niceTicks(lo: number, hi: number, count = 5, mode: 'loose' | 'tight' = 'loose'): NiceTicks {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) {
    throw new InputError('report-bad-range', `niceTicks: range [${lo}, ${hi}] must be finite; give finite numbers`, ['niceTicks']);
  }
  let a = Math.min(lo, hi);
  let b = Math.max(lo, hi);
  if (a === b) {
    const pad = a === 0 ? 1 : Math.abs(a) * 0.1;
    a -= pad;
    b += pad;
  }
  const n = Math.max(2, Math.round(count));
  const range = niceNumber(b - a, false);
  const step = niceNumber(range / (n - 1), true);
  // k * step carries rounding noise (0.30000000000000004): 12 significant
  // digits remove it at any magnitude (Heckbert prints with nfrac decimals)
  const snap = (v: number): number => (v === 0 ? 0 : Number(v.toPrecision(12)));
  // a relative slack keeps a tick that sits on the range end despite rounding
  const slack = step * 1e-9;
  const first = mode === 'loose' ? Math.floor(a / step + 1e-9) : Math.ceil(a / step - 1e-9);
  const last = mode === 'loose' ? Math.ceil(b / step - 1e-9) : Math.floor(b / step + 1e-9);
  const values: number[] = [];
  for (let k = first; k <= last; k++) {
    const v = snap(k * step);
    if (mode === 'tight' && (v < a - slack || v > b + slack)) continue;
    values.push(v);
  }
  return mode === 'loose'
    ? { min: snap(first * step), max: snap(last * step), step, values }
    : { min: a, max: b, step, values };
}
