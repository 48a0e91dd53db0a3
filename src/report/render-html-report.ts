// One self-contained HTML page: title block, caution, sections with
// interactive uPlot charts, metric tables and the network listing. uPlot's
// code and CSS are inlined (read from node_modules), plot data travel as JSON
// in a non-executed <script type="application/json">, and a Content Security
// Policy allows only this page's two scripts (by SHA-256 hash) and no network
// access at all.
import { createHash } from 'node:crypto';
import { InputError } from '../errors.js';
import { escapeMarkup as esc, jsonForScript } from './escape.js';
import { formatNumber } from './format-number.js';
import { REPORT_SCRIPT } from './html-report-script.js';
import { REPORT_CSS } from './html-report-style.js';
import { preparePlot, type PreparedPlot } from './prepare-plot.js';
import {
  DEFAULT_CAUTION,
  type MetricTable,
  type NetworkTable,
  type PlotGroup,
  type ReportData,
  type ReportSection,
} from './report-data.js';
import { loadUplotAssets } from './uplot-assets.js';
import { validateReportData } from './validate-report-data.js';

/**
 * Options of {@link renderHtmlReport}.
 *
 * @example
 * ```ts
 * const html = renderHtmlReport(data, { displayBuckets: 1500, significantDigits: 6, plotHeight: 280 });
 * ```
 */
export interface HtmlReportOptions {
  /**
   * Number of x buckets per plot for min/max decimation (see
   * {@link decimateMinMax}); a series longer than 4 buckets' worth is cut to
   * at most first/last/min/max per bucket. Default 2000, about two samples per
   * pixel column on a wide screen, so a 2x zoom still shows every extreme.
   */
  readonly displayBuckets?: number;
  /** Significant digits of the plotted values stored in the page (time keeps the same resolution relative to the plotted span). Default 7. */
  readonly significantDigits?: number;
  /** Height of each chart in CSS px. Default 320. */
  readonly plotHeight?: number;
}

const sha256 = (text: string): string => createHash('sha256').update(text, 'utf8').digest('base64');

function paragraphs(text: string): string {
  return text
    .split(/\n\s*\n/)
    .map((p) => p.trim())
    .filter((p) => p !== '')
    .map((p) => `<p>${esc(p).replace(/\n/g, '<br>')}</p>`)
    .join('');
}

function formatDate(value: Date | string): string {
  if (typeof value === 'string') return value;
  const iso = value.toISOString();
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

function formatCount(n: number): string {
  return n.toString().replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

function valueText(value: number | string, digits: number | undefined): string {
  return typeof value === 'number' ? formatNumber(value, digits ?? 4) : value;
}

function withUnit(value: string, unit: string | undefined): string {
  return unit ? `${value} ${unit}` : value;
}

const STATUS_TEXT = { ok: 'OK', warning: 'Warning', alert: 'Alert' } as const;

function metricTableHtml(table: MetricTable): string {
  const rows = table.rows
    .map((r) => {
      // validateReportData admits only the three statuses; look them up by own key and escape anyway.
      const status = r.status !== undefined && Object.hasOwn(STATUS_TEXT, r.status) ? r.status : undefined;
      const badge = status ? `<span class="badge badge-${esc(status)}">${esc(STATUS_TEXT[status])}</span>` : '';
      return (
        `<tr><td>${esc(r.name)}</td><td class="num">${esc(valueText(r.value, r.digits))}</td>` +
        `<td class="unit">${esc(r.unit ?? '')}</td><td class="note">${badge}${esc(r.note ?? '')}</td></tr>`
      );
    })
    .join('\n');
  return (
    `<div class="table-wrap"><table class="metrics">` +
    (table.title ? `<caption>${esc(table.title)}</caption>` : '') +
    `<thead><tr><th>Quantity</th><th class="num">Value</th><th>Unit</th><th>Note</th></tr></thead>` +
    `<tbody>\n${rows || '<tr><td colspan="4" class="empty">No figures</td></tr>'}\n</tbody></table></div>`
  );
}

function networkTableHtml(table: NetworkTable): string {
  const hasConn = table.rows.some((r) => r.connections);
  const hasNote = table.rows.some((r) => r.note);
  const rows = table.rows
    .map((r) => {
      const params = r.parameters
        .map(
          (p) =>
            `<span class="param"><span class="pname">${esc(p.name)}</span> = ${esc(withUnit(valueText(p.value, p.digits), p.unit))}</span>`,
        )
        .join('');
      return (
        `<tr><td class="element">${esc(r.element)}</td><td>${esc(r.kind)}</td>` +
        (hasConn ? `<td>${esc(r.connections ?? '')}</td>` : '') +
        `<td><div class="params">${params || '<span class="empty">none</span>'}</div></td>` +
        (hasNote ? `<td class="note">${esc(r.note ?? '')}</td>` : '') +
        '</tr>'
      );
    })
    .join('\n');
  const head =
    '<tr><th>Element</th><th>Kind</th>' + (hasConn ? '<th>Connections</th>' : '') + '<th>Parameters</th>' + (hasNote ? '<th>Note</th>' : '') + '</tr>';
  const cols = 3 + (hasConn ? 1 : 0) + (hasNote ? 1 : 0);
  return (
    `<div class="table-wrap"><table class="network"><caption>${esc(table.title ?? 'Network')}</caption>` +
    `<thead>${head}</thead><tbody>\n${rows || `<tr><td colspan="${cols}" class="empty">No elements</td></tr>`}\n</tbody></table></div>`
  );
}

function extremaTableHtml(plot: PreparedPlot): string {
  const xUnit = plot.xUnit;
  const cell = (v: number | null, unit?: string): string => (v === null ? 'n/a' : withUnit(formatNumber(v, 5), unit));
  const rows = plot.series
    .map(
      (s) =>
        `<tr><td>${esc(s.label)}</td><td class="num">${esc(cell(s.min, s.unit))}</td><td class="num">${esc(cell(s.tMin, xUnit))}</td>` +
        `<td class="num">${esc(cell(s.max, s.unit))}</td><td class="num">${esc(cell(s.tMax, xUnit))}</td><td class="num">${formatCount(s.samples)}</td></tr>`,
    )
    .join('\n');
  const at = esc(`at ${plot.xLabel.toLowerCase()}`);
  return (
    `<details><summary>Extrema of the full-resolution data</summary><div class="table-wrap"><table class="extrema">` +
    `<thead><tr><th>Series</th><th class="num">Minimum</th><th class="num">${at}</th><th class="num">Maximum</th><th class="num">${at}</th><th class="num">Samples</th></tr></thead>` +
    `<tbody>\n${rows}\n</tbody></table></div></details>`
  );
}

function figureHtml(plot: PreparedPlot, id: string, index: number): string {
  const refs =
    plot.references.length === 0
      ? ''
      : `<p class="plot-refs">Dashed lines: ${plot.references
          .map(
            (r) =>
              `<span class="ref"><span class="ref-swatch" style="border-color:${esc(r.color)}"></span>${esc(
                withUnit(`${r.label} = ${formatNumber(r.value)}`, plot.units[r.axis]),
              )}</span>`,
          )
          .join(' &nbsp; ')}</p>`;
  const meta =
    plot.shownPoints < plot.inputPoints
      ? `Shown: ${formatCount(plot.shownPoints)} of ${formatCount(plot.inputPoints)} samples, reduced to first, last, minimum and maximum per display column, so every peak is kept. Zoomed views show these samples only.`
      : `All ${formatCount(plot.inputPoints)} samples shown.`;
  return (
    `<figure class="plot" id="${id}">` +
    `<figcaption><h3>${esc(plot.title)}</h3>${plot.description ? `<p class="plot-desc">${esc(plot.description)}</p>` : ''}</figcaption>` +
    `<p class="plot-hint">Drag across the plot to zoom \u00B7 double-click to reset \u00B7 click a legend entry to hide or show its curve</p>` +
    `<div class="plot-area" data-plot-index="${index}"></div>` +
    refs +
    `<p class="plot-meta">${esc(meta)}</p>` +
    extremaTableHtml(plot) +
    `</figure>`
  );
}

function sectionHtml(section: ReportSection, s: number, plots: PreparedPlot[], firstIndex: number): string {
  const parts: string[] = [`<section class="report-section" id="section-${s + 1}">`, `<h2>${esc(section.title)}</h2>`];
  if (section.description) parts.push(`<div class="section-desc">${paragraphs(section.description)}</div>`);
  plots.forEach((plot, j) => parts.push(figureHtml(plot, `plot-${s + 1}-${j + 1}`, firstIndex + j)));
  for (const table of section.metrics ?? []) parts.push(metricTableHtml(table));
  if (section.network) parts.push(networkTableHtml(section.network));
  parts.push('</section>');
  return parts.join('\n');
}

function plotJson(plot: PreparedPlot): unknown {
  return {
    title: plot.title,
    xLabel: plot.xLabel,
    xUnit: plot.xUnit,
    units: plot.units,
    axisLabels: plot.axisLabels,
    series: plot.series.map((s) => ({ label: s.label, unit: s.unit, color: s.color, axis: s.axis })),
    references: plot.references,
    xGroups: plot.xGroups,
  };
}

function checkOptions(o: HtmlReportOptions): void {
  const integer = (v: number | undefined, name: string, min: number, max: number): void => {
    if (v !== undefined && !(Number.isInteger(v) && v >= min && v <= max)) {
      throw new InputError('report-bad-option', `renderHtmlReport: ${name} ${v} must be an integer from ${min} to ${max}`, [name]);
    }
  };
  integer(o.displayBuckets, 'displayBuckets', 10, 1_000_000);
  integer(o.significantDigits, 'significantDigits', 3, 17);
  integer(o.plotHeight, 'plotHeight', 120, 4000);
}

/**
 * Render a report as ONE self-contained HTML file that opens offline in any
 * current browser: uPlot (MIT licence, inlined with its licence text) draws
 * an interactive chart per plot group (drag to zoom, double-click to reset,
 * live cursor read-out in the legend, click a legend entry to hide or show a
 * curve, cursor synchronised between plots with the same x quantity, optional
 * linked zoom), reference lines dashed with their label, then metric tables
 * and the network listing with units. The caution
 * ({@link ReportData.caution}, default {@link DEFAULT_CAUTION}) stands at the
 * top and again at the foot.
 *
 * Plot data are embedded as JSON with values rounded to 7 significant digits
 * (option `significantDigits`) and long series decimated for display with the
 * min/max-per-bucket method of {@link decimateMinMax}, so peaks survive; the
 * "extrema" tables under each plot come from the full-resolution data. All
 * text is escaped, and a Content Security Policy lets only the page's own two
 * scripts run and forbids any network access.
 *
 * @throws InputError for malformed data (codes `report-*`, see docs/report.md).
 *
 * @example
 * ```ts
 * import { writeFileSync } from 'node:fs';
 * import { renderHtmlReport } from 'fluxstate/report';
 * writeFileSync('out/report.html', renderHtmlReport({
 *   title: 'Energisation study',
 *   sections: [{ title: 'Waveforms', plots: [{ title: 'Primary current', series: [{ label: 'i1', unit: 'A', t, values: i1 }] }] }],
 * }));
 * ```
 */
export function renderHtmlReport(data: ReportData, options: HtmlReportOptions = {}): string {
  validateReportData(data);
  checkOptions(options);
  const buckets = options.displayBuckets ?? 2000;
  const digits = options.significantDigits ?? 7;
  const plotHeight = options.plotHeight ?? 320;
  const caution = data.caution !== undefined && data.caution.trim() !== '' ? data.caution.trim() : DEFAULT_CAUTION;
  const uplot = loadUplotAssets();

  // prepare all plots (global index order = document order)
  const prepared: PreparedPlot[][] = data.sections.map((section) =>
    (section.plots ?? []).map((group: PlotGroup) => preparePlot(group, { buckets, significantDigits: digits })),
  );
  const allPlots = prepared.flat();

  const sections: string[] = [];
  let index = 0;
  data.sections.forEach((section, s) => {
    const plots = prepared[s] ?? [];
    sections.push(sectionHtml(section, s, plots, index));
    index += plots.length;
  });

  const uplotScript =
    `/*! uPlot ${uplot.version}, embedded unchanged. Licence:\n${uplot.license.replace(/\*\//g, '* /')}*/\n` +
    uplot.js.replace(/<\/(script)/gi, '<\\/$1');
  const appScript = REPORT_SCRIPT;
  // our own text only (no quote, '<' or '&'), so it goes into the attribute unescaped
  const csp = [
    "default-src 'none'",
    `script-src 'sha256-${sha256(uplotScript)}' 'sha256-${sha256(appScript)}'`,
    "style-src 'unsafe-inline'",
    'img-src data:',
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');

  const header: string[] = ['<header class="report-header">', `<h1>${esc(data.title)}</h1>`];
  if (data.subtitle) header.push(`<p class="subtitle">${esc(data.subtitle)}</p>`);
  const info = [
    ...(data.generatedAt !== undefined ? [{ label: 'Generated', value: formatDate(data.generatedAt) }] : []),
    ...(data.info ?? []),
  ];
  if (info.length > 0) {
    header.push(`<dl>${info.map((i) => `<dt>${esc(i.label)}</dt><dd>${esc(i.value)}</dd>`).join('')}</dl>`);
  }
  header.push('</header>');

  const toc =
    data.sections.length > 0 || allPlots.length > 1
      ? `<nav class="toc" aria-label="Contents"><span class="toc-label">Contents</span><ol>${data.sections
          .map((sec, s) => `<li><a href="#section-${s + 1}">${esc(sec.title)}</a></li>`)
          .join('')}</ol>` +
        (allPlots.length > 1
          ? `<span class="controls"><label><input type="checkbox" id="link-zoom" checked> Zoom plots with the same x axis together</label></span>`
          : '') +
        '</nav>'
      : '';

  const dataJson = jsonForScript({ plotHeight, plots: allPlots.map(plotJson) });

  return [
    '<!doctype html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="${csp}">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    '<meta name="generator" content="fluxstate report">',
    `<title>${esc(data.title)}</title>`,
    `<style>${uplot.css}</style>`,
    `<style>${REPORT_CSS}</style>`,
    '</head>',
    '<body>',
    '<div class="page">',
    header.join('\n'),
    `<aside class="caution" role="note" aria-label="Caution"><div class="caution-icon" aria-hidden="true">!</div>` +
      `<div><p class="caution-title">Caution</p><p class="caution-text">${esc(caution)}</p></div></aside>`,
    toc,
    '<noscript><p>The interactive plots need JavaScript. The tables (including each plot\'s extrema) are complete without it.</p></noscript>',
    '<main>',
    sections.join('\n'),
    '</main>',
    '<footer>',
    `<p class="caution-repeat"><strong>Caution.</strong> ${esc(caution)}</p>`,
    `<p>Plot data are stored with ${digits} significant digits; series longer than ${formatCount(4 * buckets)} samples are reduced for display to the first, last, minimum and maximum sample of each of ${formatCount(buckets)} time buckets (M4 aggregation, Jugel et al., PVLDB 7(10), 2014), so peaks are kept. Tables are computed from the full-resolution data.</p>`,
    `<p>Generated by the fluxstate report renderer. Charts by uPlot ${esc(uplot.version)} (MIT licence, embedded). This file loads nothing from the network.</p>`,
    '</footer>',
    '</div>',
    `<script type="application/json" id="fluxstate-report-data">${dataJson}</script>`,
    `<script>${uplotScript}</script>`,
    `<script>${appScript}</script>`,
    '</body>',
    '</html>',
    '',
  ].join('\n');
}
