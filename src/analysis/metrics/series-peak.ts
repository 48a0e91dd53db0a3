import { checkSeries, resolveWindow, type WindowOptions } from './series-options.js';
import { interpolateAt, intervalIndex } from './window-integral.js';

/**
 * Extremes of a series over a window, each with its time. Names follow the
 * metrics' one style: a figure and `<figure>Time` (`peak`/`peakTime` here,
 * in {@link inrushRatio} and {@link fluxDensityMargin}).
 *
 * @example
 * ```ts
 * const { peak, peakTime } = seriesPeak(t, i);
 * ```
 */
export interface SeriesPeak {
  /** Largest |x|. */
  readonly peak: number;
  /** Time of the largest |x|, s. */
  readonly peakTime: number;
  /** Largest x. */
  readonly max: number;
  /** Time of the largest x, s. */
  readonly maxTime: number;
  /** Smallest x. */
  readonly min: number;
  /** Time of the smallest x, s. */
  readonly minTime: number;
  /** Largest |x|. @deprecated Use `peak`; this alias goes in the next minor version. */
  readonly maxAbs: number;
  /** Time of the largest |x|, s. @deprecated Use `peakTime`; this alias goes in the next minor version. */
  readonly timeOfMaxAbs: number;
  /** Time of the largest x, s. @deprecated Use `maxTime`; this alias goes in the next minor version. */
  readonly timeOfMax: number;
  /** Time of the smallest x, s. @deprecated Use `minTime`; this alias goes in the next minor version. */
  readonly timeOfMin: number;
}

const INV_PHI = (Math.sqrt(5) - 1) / 2;

/** Golden-section search for the maximum of f on [a, b] (f assumed unimodal there). */
function goldenMax(f: (s: number) => number, a: number, b: number): { t: number; v: number } {
  let lo = a;
  let hi = b;
  let c = hi - INV_PHI * (hi - lo);
  let d = lo + INV_PHI * (hi - lo);
  let fc = f(c);
  let fd = f(d);
  for (let k = 0; k < 80 && hi - lo > 1e-14 * Math.max(Math.abs(lo), Math.abs(hi), 1e-300); k++) {
    if (fc >= fd) {
      hi = d;
      d = c;
      fd = fc;
      c = hi - INV_PHI * (hi - lo);
      fc = f(c);
    } else {
      lo = c;
      c = d;
      fc = fd;
      d = lo + INV_PHI * (hi - lo);
      fd = f(d);
    }
  }
  return fc >= fd ? { t: c, v: fc } : { t: d, v: fd };
}

/**
 * Largest and smallest value of a sampled series, and largest magnitude,
 * with their times, over `[from, to]` (default: the whole series; window
 * ends are linearly interpolated).
 *
 * Accuracy: on samples alone a smooth peak between two samples is missed by
 * up to about `|x''| h^2 / 8` (h the local spacing). With `at` (the dense
 * output of the same quantity), each extreme is refined by a golden-section
 * search over the two sample intervals around the sampled extreme, which
 * finds the true local extreme there (assumed unique); a peak the sampling
 * missed entirely cannot be recovered.
 *
 * @example
 * ```ts
 * const t = Float64Array.from({ length: 1001 }, (_, i) => i * 2e-5);
 * const i = t.map((s) => 3 * Math.sin(2 * Math.PI * 50 * s));
 * const p = seriesPeak(t, i); // p.max 3 near t = 5 ms (p.maxTime), p.min -3 near 15 ms, p.peak 3
 * ```
 */
export function seriesPeak(t: ArrayLike<number>, x: ArrayLike<number>, options: WindowOptions = {}): SeriesPeak {
  const name = options.name ?? 'series';
  checkSeries(t, x, name, 1);
  const n = t.length;
  let a: number;
  let b: number;
  if (n === 1) {
    a = t[0] ?? 0;
    b = a;
  } else {
    [a, b] = resolveWindow(t, options, name);
  }

  let max = -Infinity;
  let tMax = a;
  let iMax = 0;
  let min = Infinity;
  let tMin = a;
  let iMin = 0;
  const visit = (s: number, v: number, i: number): void => {
    if (v > max) {
      max = v;
      tMax = s;
      iMax = i;
    }
    if (v < min) {
      min = v;
      tMin = s;
      iMin = i;
    }
  };
  const i0 = intervalIndex(t, a);
  visit(a, n === 1 ? (x[0] ?? 0) : interpolateAt(t, x, i0, a), i0);
  for (let i = i0; i < n; i++) {
    const ti = t[i] ?? 0;
    if (ti > b) break;
    if (ti > a) visit(ti, x[i] ?? 0, i);
  }
  if (n > 1) visit(b, interpolateAt(t, x, intervalIndex(t, b), b), intervalIndex(t, b));

  const at = options.at;
  if (at !== undefined && n > 1) {
    const around = (i: number): [number, number] => [Math.max(a, t[Math.max(0, i - 1)] ?? a), Math.min(b, t[Math.min(n - 1, i + 1)] ?? b)];
    const [lo1, hi1] = around(iMax);
    if (hi1 > lo1) {
      const r = goldenMax(at, lo1, hi1);
      if (r.v > max) {
        max = r.v;
        tMax = r.t;
      }
    }
    const [lo2, hi2] = around(iMin);
    if (hi2 > lo2) {
      const r = goldenMax((s) => -at(s), lo2, hi2);
      if (-r.v < min) {
        min = -r.v;
        tMin = r.t;
      }
    }
  }
  const absMaxIsMax = Math.abs(max) >= Math.abs(min);
  const peak = absMaxIsMax ? Math.abs(max) : Math.abs(min);
  const peakTime = absMaxIsMax ? tMax : tMin;
  return {
    peak,
    peakTime,
    max,
    maxTime: tMax,
    min,
    minTime: tMin,
    maxAbs: peak,
    timeOfMaxAbs: peakTime,
    timeOfMax: tMax,
    timeOfMin: tMin,
  };
}
