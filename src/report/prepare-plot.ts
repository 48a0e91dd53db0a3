// Turns a PlotGroup into display data shared by the HTML and SVG renderers:
// series grouped by their time vector, each group decimated (min/max per
// bucket), values optionally rounded, extrema of the full data, axis layout.
import { decimateMinMax } from './decimate.js';
import { roundSignificant } from './format-number.js';
import { REFERENCE_COLOR, SERIES_PALETTE } from './palette.js';
import type { NumericArray, PlotGroup } from './report-data.js';
import { groupUnits } from './validate-report-data.js';

/**
 * A series as displayed: its legend data and the extrema of its full-resolution samples.
 *
 * @example
 * ```ts
 * const { label, min, max } = preparePlot(group, { buckets: 720 }).series[0];
 * ```
 */
export interface PreparedSeries {
  readonly label: string;
  readonly unit: string;
  readonly color: string;
  /** 0: left axis, 1: right axis. */
  readonly axis: 0 | 1;
  /** Smallest / largest finite value of the full data (null if none is finite). */
  readonly min: number | null;
  readonly max: number | null;
  /** Instants of the extrema. */
  readonly tMin: number | null;
  readonly tMax: number | null;
  /** Number of input samples. */
  readonly samples: number;
}

/**
 * Series sharing one time vector, after decimation.
 *
 * @example
 * ```ts
 * for (const g of prepared.xGroups) for (const c of g.columns) draw(g.x, c.values, prepared.series[c.index]);
 * ```
 */
export interface PreparedXGroup {
  readonly x: (number | null)[];
  /** `index` is the position of the series in the group's `series`. */
  readonly columns: { readonly index: number; readonly values: (number | null)[] }[];
}

/**
 * A reference line on its axis.
 *
 * @example
 * ```ts
 * const yPx = scaleY[ref.axis](ref.value);
 * ```
 */
export interface PreparedReference {
  readonly label: string;
  readonly value: number;
  readonly axis: 0 | 1;
  readonly color: string;
}

/**
 * Display form of a plot group.
 *
 * @example
 * ```ts
 * const prepared: PreparedPlot = preparePlot(group, { buckets: 2000, significantDigits: 7 });
 * ```
 */
export interface PreparedPlot {
  readonly title: string;
  readonly description?: string;
  readonly xLabel: string;
  readonly xUnit: string;
  /** Distinct y units: `[left]` or `[left, right]`. */
  readonly units: string[];
  /** Axis titles, one per unit, e.g. "Flux density (T)". */
  readonly axisLabels: string[];
  readonly series: PreparedSeries[];
  readonly xGroups: PreparedXGroup[];
  readonly references: PreparedReference[];
  /** Full x range of all series. */
  readonly xRange: [number, number];
  /** Per axis, the range of finite data and reference values (null: nothing finite). */
  readonly yRanges: ([number, number] | null)[];
  /** Samples in the input, summed over series sharing no time vector counted once per vector. */
  readonly inputPoints: number;
  /** Samples kept for display, counted the same way. */
  readonly shownPoints: number;
}

/**
 * Options of {@link preparePlot}.
 *
 * @example
 * ```ts
 * const options: PreparePlotOptions = { buckets: 720 }; // SVG: one bucket per pixel, no rounding
 * ```
 */
export interface PreparePlotOptions {
  /** Number of x buckets for min/max decimation (about the plot's width in pixels). */
  readonly buckets: number;
  /** Round y values to this many significant digits (x to enough to keep the same relative resolution of the x span). Absent: no rounding. */
  readonly significantDigits?: number;
}

function sameSamples(a: NumericArray, b: NumericArray): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/**
 * Axis title for one unit: the series' quantities ("Flux density (T)"); with
 * none given, the label of a lone series; else the unit alone.
 */
function axisLabel(group: PlotGroup, unit: string): string {
  const onAxis = group.series.filter((s) => s.unit === unit);
  const quantities = [...new Set(onAxis.map((s) => s.quantity).filter((q): q is string => !!q))];
  const name = quantities.length > 0 ? quantities.join(', ') : onAxis.length === 1 ? (onAxis[0]?.label ?? '') : '';
  if (unit === '') return name;
  return name === '' ? unit : `${name} (${unit})`;
}

/**
 * Display data for one plot group (validated beforehand with
 * `validatePlotGroup`).
 *
 * @example
 * ```ts
 * const shown = preparePlot(group, { buckets: 2000, significantDigits: 7 });
 * shown.xGroups[0].x.length; // at most (2 + 3 * series) * 2000
 * ```
 */
export function preparePlot(group: PlotGroup, options: PreparePlotOptions): PreparedPlot {
  const units = groupUnits(group);
  const digits = options.significantDigits;

  let x0 = Infinity;
  let x1 = -Infinity;
  for (const s of group.series) {
    x0 = Math.min(x0, s.t[0] as number);
    x1 = Math.max(x1, s.t[s.t.length - 1] as number);
  }

  const series: PreparedSeries[] = group.series.map((s, k) => {
    let min: number | null = null;
    let max: number | null = null;
    let tMin: number | null = null;
    let tMax: number | null = null;
    for (let i = 0; i < s.values.length; i++) {
      const v = s.values[i] as number;
      if (!Number.isFinite(v)) continue;
      if (min === null || v < min) {
        min = v;
        tMin = s.t[i] as number;
      }
      if (max === null || v > max) {
        max = v;
        tMax = s.t[i] as number;
      }
    }
    return {
      label: s.label,
      unit: s.unit,
      color: s.color ?? (SERIES_PALETTE[k % SERIES_PALETTE.length] as string),
      axis: units.indexOf(s.unit) === 1 ? 1 : 0,
      min,
      max,
      tMin,
      tMax,
      samples: s.t.length,
    };
  });

  // group series by time vector (same array or same samples)
  const clusters: { t: NumericArray; members: number[] }[] = [];
  group.series.forEach((s, k) => {
    const home = clusters.find((c) => sameSamples(c.t, s.t));
    if (home) home.members.push(k);
    else clusters.push({ t: s.t, members: [k] });
  });

  // x keeps `digits` significant digits of the span, not of the value:
  // t = 1000.0001 s in a 1 ms window needs more than 7 digits
  const span = x1 - x0;
  const maxAbsX = Math.max(Math.abs(x0), Math.abs(x1));
  const xDigits =
    digits === undefined
      ? undefined
      : Math.min(17, digits + (span > 0 && maxAbsX > span ? Math.ceil(Math.log10(maxAbsX / span)) : 0));
  const round = (v: number, d: number | undefined): number | null =>
    d === undefined ? (Number.isFinite(v) ? v : null) : roundSignificant(v, d);

  let inputPoints = 0;
  let shownPoints = 0;
  const xGroups: PreparedXGroup[] = clusters.map((c) => {
    const cols = c.members.map((k) => (group.series[k] as { values: NumericArray }).values);
    const keep = decimateMinMax(c.t, cols, options.buckets, [x0, x1]);
    inputPoints += c.t.length;
    shownPoints += keep.length;
    return {
      x: Array.from(keep, (i) => round(c.t[i] as number, xDigits)),
      columns: c.members.map((k, j) => ({
        index: k,
        values: Array.from(keep, (i) => round((cols[j] as NumericArray)[i] as number, digits)),
      })),
    };
  });

  const references: PreparedReference[] = (group.references ?? []).map((r) => ({
    label: r.label,
    value: r.value,
    axis: units.indexOf(r.unit ?? (units[0] as string)) === 1 ? 1 : 0,
    color: r.color ?? REFERENCE_COLOR,
  }));

  const yRanges = units.map((_, axis): [number, number] | null => {
    let lo = Infinity;
    let hi = -Infinity;
    for (const s of series) {
      if (s.axis !== axis || s.min === null || s.max === null) continue;
      lo = Math.min(lo, s.min);
      hi = Math.max(hi, s.max);
    }
    for (const r of references) {
      if (r.axis !== axis) continue;
      lo = Math.min(lo, r.value);
      hi = Math.max(hi, r.value);
    }
    return lo <= hi ? [lo, hi] : null;
  });

  return {
    title: group.title,
    ...(group.description !== undefined ? { description: group.description } : {}),
    xLabel: group.xLabel ?? 'Time',
    xUnit: group.xUnit ?? 's',
    units,
    axisLabels: units.map((u) => axisLabel(group, u)),
    series,
    xGroups,
    references,
    xRange: [x0, x1],
    yRanges,
    inputPoints,
    shownPoints,
  };
}
