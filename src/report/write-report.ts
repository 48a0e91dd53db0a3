import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { renderHtmlReport, type HtmlReportOptions } from './render-html-report.js';
import type { ReportData } from './report-data.js';

/**
 * Render `data` with {@link renderHtmlReport} and write it to `path` (UTF-8),
 * creating the folder if needed. Returns the absolute path written, ready to
 * print or to open as `file://`.
 *
 * @throws InputError for malformed data; the usual `node:fs` errors when the file cannot be written.
 *
 * @example
 * ```ts
 * import { writeReport } from 'fluxstate/report';
 * const file = writeReport('out/inrush/report.html', data);
 * console.log(`report: ${file}`);
 * ```
 */
export function writeReport(path: string, data: ReportData, options: HtmlReportOptions = {}): string {
  const html = renderHtmlReport(data, options);
  const target = resolve(path);
  mkdirSync(dirname(target), { recursive: true });
  writeFileSync(target, html, 'utf8');
  return target;
}
