/**
 * `fluxstate/report`: an offline, self-contained HTML report with interactive
 * plots, and static SVG plots for documents, built from a neutral plain-data
 * {@link ReportData}. Separate from the core import so that simulating never
 * loads the plotting code.
 *
 * @example
 * ```ts
 * import { writeReport, renderSvgPlot, type ReportData } from 'fluxstate/report';
 * const data: ReportData = { title: 'Inrush study', sections: [{ title: 'Waveforms', plots: [group] }] };
 * writeReport('out/report.html', data);
 * ```
 *
 * @packageDocumentation
 * @module fluxstate/report
 */
export {
  DEFAULT_CAUTION,
  SHORT_CAUTION,
  type NumericArray,
  type ReportData,
  type ReportInfoItem,
  type ReportSection,
  type PlotGroup,
  type PlotSeries,
  type ReferenceLine,
  type MetricTable,
  type MetricRow,
  type NetworkTable,
  type NetworkRow,
  type NetworkParameter,
} from './report-data.js';
export { renderHtmlReport, type HtmlReportOptions } from './render-html-report.js';
export { renderSvgPlot, type SvgPlotOptions } from './render-svg-plot.js';
export { writeReport } from './write-report.js';
export { decimateMinMax } from './decimate.js';
export { niceTicks, niceNumber, type NiceTicks } from './nice-ticks.js';
export { formatNumber } from './format-number.js';
export { SERIES_PALETTE } from './palette.js';
export { resultReport, type ResultReportOptions, type ResultPlot } from './result-report.js';
