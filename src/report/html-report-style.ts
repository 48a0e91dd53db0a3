// Stylesheet of the HTML report (after uPlot's own CSS). System fonts only:
// the page must look right offline, with nothing fetched.

/**
 * CSS of the HTML report page.
 *
 * @example
 * ```ts
 * const html = `<style>${REPORT_CSS}</style>`;
 * ```
 */
export const REPORT_CSS = `
:root {
  --fg: #111827; --muted: #4b5563; --faint: #6b7280; --border: #e5e7eb; --page: #f5f6f8;
  --card: #ffffff; --accent: #0b5cad; --head: #f3f4f6;
  --caution-bg: #fff7e8; --caution-border: #f2c46d; --caution-edge: #b45309; --caution-fg: #7c2d12;
  --font: system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, "Noto Sans", sans-serif;
}
* { box-sizing: border-box; }
html { -webkit-text-size-adjust: 100%; }
body { margin: 0; background: var(--page); color: var(--fg); font: 15px/1.55 var(--font); }
.page { max-width: 1200px; margin: 0 auto; padding: 16px 24px 40px; }
a { color: var(--accent); text-decoration: none; }
a:hover { text-decoration: underline; }

.report-header h1 { font-size: 25px; line-height: 1.2; margin: 0 0 2px; letter-spacing: -0.01em; font-weight: 700; }
.report-header .subtitle { font-size: 16px; color: var(--muted); margin: 0 0 6px; }
/* The run's facts on one wrapping line, so that the first plot starts on the first screen. */
.report-header dl { display: flex; flex-wrap: wrap; gap: 2px 6px; margin: 0; font-size: 13.5px; }
.report-header dt::after { content: ':'; }
.report-header dt { color: var(--faint); }
.report-header dd { margin: 0 16px 0 0; font-variant-numeric: tabular-nums; }

.caution { display: flex; gap: 12px; align-items: flex-start; margin: 12px 0; padding: 9px 16px;
  background: var(--caution-bg); border: 1px solid var(--caution-border); border-left: 6px solid var(--caution-edge);
  border-radius: 8px; color: var(--fg); }
.caution-icon { flex: none; width: 26px; height: 26px; border-radius: 50%; background: var(--caution-edge); color: #fff;
  font-weight: 800; font-size: 17px; line-height: 26px; text-align: center; }
.caution-title { margin: 0 0 2px; font-size: 12.5px; font-weight: 700; letter-spacing: 0.06em; text-transform: uppercase; color: var(--caution-fg); }
.caution-text { margin: 0; font-size: 14px; line-height: 1.45; }

nav.toc { display: flex; flex-wrap: wrap; align-items: center; gap: 6px 18px; margin: 0 0 8px; font-size: 14px; }
nav.toc .toc-label { color: var(--faint); font-size: 12.5px; text-transform: uppercase; letter-spacing: 0.06em; }
nav.toc ol { display: flex; flex-wrap: wrap; gap: 4px 18px; list-style: none; margin: 0; padding: 0; }
.controls { margin-left: auto; color: var(--muted); font-size: 13px; }
.controls label { cursor: pointer; user-select: none; }

.report-section { background: var(--card); border: 1px solid var(--border); border-radius: 10px;
  padding: 14px 26px 10px; margin: 12px 0; box-shadow: 0 1px 2px rgba(17, 24, 39, 0.04); }
.report-section > h2 { font-size: 19px; line-height: 1.3; margin: 0 0 4px; font-weight: 650; }
.section-desc p { margin: 0 0 10px; color: var(--muted); max-width: 80ch; }

figure.plot { margin: 8px 0 26px; }
figure.plot h3 { font-size: 16.5px; margin: 0; font-weight: 600; }
.plot-desc { margin: 2px 0 0; color: var(--muted); font-size: 14px; max-width: 80ch; }
.plot-hint { margin: 2px 0 4px; color: var(--faint); font-size: 12.5px; }
.plot-area { width: 100%; min-height: 120px; }
.plot-error { padding: 16px; border: 1px solid #fca5a5; background: #fef2f2; color: #991b1b; border-radius: 6px; }
.plot-meta { margin: 6px 0 0; color: var(--faint); font-size: 12.5px; }
.plot-refs { margin: 2px 0 0; font-size: 13px; color: var(--muted); }
.ref-swatch { display: inline-block; width: 22px; height: 0; margin: 0 6px 3px 0; vertical-align: middle; border-top: 2px dashed; }
figure.plot details { margin-top: 8px; font-size: 13.5px; }
figure.plot summary { cursor: pointer; color: var(--accent); }
figure.plot details table { margin-top: 6px; }

.uplot { font-family: var(--font); width: 100%; }
.uplot .u-legend { font-size: 13px; text-align: left; margin: 6px 0 0 4px; }
.uplot .u-legend .u-series > * { padding: 2px 4px; }
.uplot .u-legend .u-series th { font-weight: 500; }
.uplot .u-legend .u-value { font-variant-numeric: tabular-nums; min-width: 9ch; }
.uplot .u-legend .u-marker { width: 20px; height: 0; margin-right: 6px; border-width: 2.5px 0 0 0 !important;
  border-radius: 0; background: transparent !important; }
.uplot .u-select { background: rgba(11, 92, 173, 0.10); }

.table-wrap { overflow-x: auto; margin: 14px 0 20px; }
.table-wrap table { border-collapse: collapse; width: 100%; font-size: 14px; font-variant-numeric: tabular-nums; }
.table-wrap caption { caption-side: top; text-align: left; font-weight: 600; font-size: 16px; padding: 0 0 8px; }
.table-wrap th, .table-wrap td { padding: 7px 12px; text-align: left; vertical-align: top; border-bottom: 1px solid var(--border); }
.table-wrap thead th { background: var(--head); color: var(--muted); font-size: 12px; font-weight: 600; text-transform: uppercase;
  letter-spacing: 0.05em; border-bottom: 1px solid #d1d5db; white-space: nowrap; }
.table-wrap tbody tr:nth-child(even) td { background: #fafbfc; }
.table-wrap td.num, .table-wrap th.num { text-align: right; white-space: nowrap; }
.table-wrap td.unit { color: var(--muted); white-space: nowrap; }
.table-wrap td.note { color: var(--muted); }
.table-wrap td.element { font-weight: 600; }
.params { display: flex; flex-wrap: wrap; gap: 2px 16px; }
.param { white-space: nowrap; }
.param .pname { color: var(--muted); }
.badge { display: inline-block; padding: 1px 8px; margin-right: 6px; border-radius: 999px; font-size: 11.5px; font-weight: 700;
  letter-spacing: 0.03em; text-transform: uppercase; border: 1px solid; }
.badge-ok { color: #065f46; background: #ecfdf5; border-color: #6ee7b7; }
.badge-warning { color: #92400e; background: #fffbeb; border-color: #fcd34d; }
.badge-alert { color: #991b1b; background: #fef2f2; border-color: #fca5a5; }
.empty { color: var(--faint); font-style: italic; }

footer { margin-top: 28px; padding-top: 14px; border-top: 1px solid var(--border); color: var(--faint); font-size: 12.5px; }
footer p { margin: 0 0 6px; }
footer .caution-repeat { color: var(--muted); }
noscript p { padding: 10px 14px; background: #fef2f2; border: 1px solid #fca5a5; border-radius: 6px; }

@media (max-width: 640px) {
  .page { padding: 16px 12px 28px; }
  .report-section { padding: 16px 14px 8px; }
  .controls { margin-left: 0; }
}
@media print {
  body { background: #fff; font-size: 11pt; }
  .page { max-width: none; padding: 0; }
  .report-section { border: none; box-shadow: none; padding: 0; }
  .plot-hint, .controls { display: none; }
  figure.plot, table, .caution { break-inside: avoid; }
}
`;
