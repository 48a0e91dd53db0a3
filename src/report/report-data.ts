/*
 * The plain-data input of the report renderers. It knows nothing about
 * networks or simulation results: an adapter (or a user script) fills it with
 * titles, numeric arrays and strings, and the renderers turn it into an HTML
 * page or SVG plots. Every field is JSON-friendly except the numeric arrays,
 * which may be `Float64Array` (as simulation results hold them) or `number[]`.
 *
 * All text is plain text: the renderers escape it, so user-chosen names such
 * as `<script>` appear literally and are never interpreted as markup.
 */

/**
 * A read-only array of numbers: `Float64Array` (simulation output), another typed array or `number[]`.
 *
 * @example
 * ```ts
 * const t: NumericArray = new Float64Array([0, 1e-3, 2e-3]);
 * const v: NumericArray = [0, 0.5, 1];
 * ```
 */
export type NumericArray = ArrayLike<number>;

/**
 * The default caution printed at the top and foot of every HTML report (and, in
 * a short form, under every SVG plot). Reports may replace its wording through
 * {@link ReportData.caution}, but never remove it: a blank caution falls back to
 * this text.
 *
 * @example
 * ```ts
 * const data: ReportData = { title: 'Energisation study', sections: [], caution: DEFAULT_CAUTION };
 * ```
 */
export const DEFAULT_CAUTION =
  'Engineering estimate. Inrush, saturation and voltage figures in this report come from a model and ' +
  'its inputs, not from measurements. Verify them against measurements before relying on them, and let ' +
  'local codes, standards and licensed professional practice govern protection settings and every ' +
  'safety decision.';

/**
 * One-line form of {@link DEFAULT_CAUTION}, used under static SVG plots.
 *
 * @example
 * ```ts
 * renderSvgPlot(group, { cautionText: SHORT_CAUTION });
 * ```
 */
export const SHORT_CAUTION =
  'Model estimate: verify against measurements; local codes, standards and licensed practice govern.';

/**
 * A whole report: a title block, the caution, and sections of plots and tables.
 *
 * @example
 * ```ts
 * const data: ReportData = {
 *   title: 'Inrush of a single-phase transformer',
 *   subtitle: 'Energised at a voltage zero with 0.6 T remanence',
 *   generatedAt: new Date(),
 *   info: [{ label: 'Solver', value: 'Radau IIA, rtol 1e-6' }],
 *   sections: [{ title: 'Waveforms', plots: [fluxGroup] }],
 * };
 * writeReport('out/inrush.html', data);
 * ```
 */
export interface ReportData {
  /** Report title (plain text). */
  readonly title: string;
  /** One line under the title (plain text). */
  readonly subtitle?: string;
  /**
   * When the report was generated. A `Date` is printed as UTC
   * (`YYYY-MM-DD HH:MM UTC`), a string as given. Absent: no date is printed,
   * so the same data always renders the same bytes.
   */
  readonly generatedAt?: Date | string;
  /** Key/value lines under the title: model name, solver settings, author... */
  readonly info?: readonly ReportInfoItem[];
  /**
   * Caution printed prominently at the top and again at the foot. Absent or
   * blank: {@link DEFAULT_CAUTION}. Reword it if you must; do not empty it.
   */
  readonly caution?: string;
  /** The body, in order. */
  readonly sections: readonly ReportSection[];
}

/**
 * One key/value line of the title block.
 *
 * @example
 * ```ts
 * const item: ReportInfoItem = { label: 'Model', value: 'core-2leg, 230 V, 50 Hz' };
 * ```
 */
export interface ReportInfoItem {
  readonly label: string;
  readonly value: string;
}

/**
 * A section of the report: an optional description, then its plot groups,
 * metric tables and network listing, in that order.
 *
 * @example
 * ```ts
 * const section: ReportSection = {
 *   title: 'Energisation at t = 0',
 *   description: 'Primary switched on at a voltage zero.',
 *   plots: [currentGroup, fluxGroup],
 *   metrics: [{ title: 'Key figures', rows: [{ name: 'Inrush peak', value: 41.2, unit: 'A' }] }],
 *   network: { rows: [{ element: 'core', kind: 'flux tube', parameters: [{ name: 'length', value: 0.42, unit: 'm' }] }] },
 * };
 * ```
 */
export interface ReportSection {
  /** Section heading (plain text). */
  readonly title: string;
  /** Plain text; blank lines separate paragraphs. */
  readonly description?: string;
  /** Interactive plots (HTML) of time series, one per group. */
  readonly plots?: readonly PlotGroup[];
  /** Tables of figures (peak, RMS, margins...). */
  readonly metrics?: readonly MetricTable[];
  /** Listing of the network's elements with their parameters. */
  readonly network?: NetworkTable;
}

/**
 * One plot: series sharing an x axis (usually time) and at most two y units
 * (left and right axis), with optional dashed horizontal reference lines.
 *
 * @example
 * ```ts
 * const fluxGroup: PlotGroup = {
 *   title: 'Flux density in the legs',
 *   xLabel: 'Time', xUnit: 's',
 *   series: [
 *     { label: 'B leg 1', quantity: 'Flux density', unit: 'T', t, values: bLeg1 },
 *     { label: 'B leg 2', quantity: 'Flux density', unit: 'T', t, values: bLeg2 },
 *   ],
 *   references: [
 *     { label: '+B_sat', value: 1.6, unit: 'T' },
 *     { label: '-B_sat', value: -1.6, unit: 'T' },
 *   ],
 * };
 * ```
 */
export interface PlotGroup {
  /** Plot title (plain text). */
  readonly title: string;
  /** Plain text shown under the title. */
  readonly description?: string;
  /** Name of the x quantity. Default `'Time'`. */
  readonly xLabel?: string;
  /** Unit of x. Default `'s'`. */
  readonly xUnit?: string;
  /** The curves; at least one. Their units may take at most two distinct values. */
  readonly series: readonly PlotSeries[];
  /** Horizontal lines drawn dashed with a label (limits such as +-B_sat). */
  readonly references?: readonly ReferenceLine[];
}

/**
 * One curve: samples `values[i]` at `t[i]`. `t` must be finite and
 * non-decreasing (repeated instants, as at a breakpoint, are allowed); a
 * non-finite value is drawn as a gap. Series of one group may have different
 * `t` arrays; series that share a `t` array are stored once in the HTML.
 *
 * @example
 * ```ts
 * const s: PlotSeries = { label: 'i primary', quantity: 'Current', unit: 'A', t: result.t, values: iPrimary };
 * ```
 */
export interface PlotSeries {
  /** Legend entry (plain text). */
  readonly label: string;
  /** Unit of the values, e.g. `'T'`, `'A'`, `'V'`, `'Wb'`; `''` when dimensionless. */
  readonly unit: string;
  /** Name of the quantity, used for the axis label (e.g. `'Flux density'`). */
  readonly quantity?: string;
  /** Sample instants (same length as `values`). */
  readonly t: NumericArray;
  /** Sample values. */
  readonly values: NumericArray;
  /** CSS colour (`#rrggbb`, `#rgb`, a colour name or `rgb()/hsl()`); default from a colour-blind-safe palette. */
  readonly color?: string;
}

/**
 * A horizontal reference line (drawn dashed, with its label), e.g. the
 * saturation flux density. It is kept inside the plotted range.
 *
 * @example
 * ```ts
 * const sat: ReferenceLine = { label: '+B_sat', value: 1.6, unit: 'T' };
 * ```
 */
export interface ReferenceLine {
  /** Text drawn beside the line (plain text). */
  readonly label: string;
  /** Height of the line, in `unit`. */
  readonly value: number;
  /** Which y axis the value belongs to: one of the group's series units. Default: the first series' unit. */
  readonly unit?: string;
  /** CSS colour; default a dark red. */
  readonly color?: string;
}

/**
 * A table of figures.
 *
 * @example
 * ```ts
 * const table: MetricTable = {
 *   title: 'Saturation',
 *   rows: [
 *     { name: 'Peak |B|, leg 1', value: 1.71, unit: 'T', status: 'alert', note: 'above B_sat = 1.6 T' },
 *     { name: 'Margin to B_sat', value: -0.11, unit: 'T' },
 *   ],
 * };
 * ```
 */
export interface MetricTable {
  /** Table caption (plain text). */
  readonly title?: string;
  readonly rows: readonly MetricRow[];
}

/**
 * One figure: a number (formatted to `digits` significant digits) or a text.
 *
 * @example
 * ```ts
 * const row: MetricRow = { name: 'Inrush peak', value: 41.23, unit: 'A', digits: 3, note: 'first cycle' };
 * ```
 */
export interface MetricRow {
  readonly name: string;
  readonly value: number | string;
  readonly unit?: string;
  readonly note?: string;
  /** Significant digits for a numeric value (1 to 15). Default 4. */
  readonly digits?: number;
  /** A flag shown as a labelled badge (text, not colour alone). */
  readonly status?: 'ok' | 'warning' | 'alert';
}

/**
 * The network listing: one row per element.
 *
 * @example
 * ```ts
 * const net: NetworkTable = {
 *   rows: [
 *     { element: 'primary', kind: 'winding', connections: 'line -> ground on wound leg',
 *       parameters: [{ name: 'turns', value: 240 }, { name: 'R', value: 0.35, unit: 'ohm' }] },
 *   ],
 * };
 * ```
 */
export interface NetworkTable {
  /** Table caption. Default `'Network'`. */
  readonly title?: string;
  readonly rows: readonly NetworkRow[];
}

/**
 * One element of the network listing.
 *
 * @example
 * ```ts
 * const row: NetworkRow = { element: 'gap', kind: 'air gap', parameters: [{ name: 'length', value: 0.5e-3, unit: 'm' }] };
 * ```
 */
export interface NetworkRow {
  /** Element name as the user gave it. */
  readonly element: string;
  /** Kind of element in words (`'winding'`, `'flux tube'`, `'voltage source'`...). */
  readonly kind: string;
  /** Where it is connected, in words (`'a -> gnd'`, `'n1 -> n2'`). */
  readonly connections?: string;
  readonly parameters: readonly NetworkParameter[];
  readonly note?: string;
}

/**
 * A named parameter value with its unit. Numbers are printed with 4
 * significant digits unless `digits` says otherwise.
 *
 * @example
 * ```ts
 * const p: NetworkParameter = { name: 'area', value: 1.2e-3, unit: 'm^2' };
 * ```
 */
export interface NetworkParameter {
  readonly name: string;
  readonly value: number | string;
  readonly unit?: string;
  /** Significant digits for a numeric value (1 to 15). Default 4. */
  readonly digits?: number;
}
