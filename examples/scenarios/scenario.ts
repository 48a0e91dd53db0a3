// Shared shape of the demo scenarios and a small table printer.
import type { ReportData } from '../../src/report/index.js';

/** What a scenario hands back to the demo: a printed table, a report and CSV files. */
export interface ScenarioOutcome {
  /** Short name, used for file names in out/. */
  readonly slug: string;
  readonly title: string;
  /** Column headers and rows of the printed summary. */
  readonly table: { readonly head: readonly string[]; readonly rows: readonly (readonly string[])[] };
  /** Lines printed under the table. */
  readonly notes: readonly string[];
  readonly report: ReportData;
  /** CSV files to write: name -> text. */
  readonly csv: Readonly<Record<string, string>>;
}

/** Progress of a scenario: fraction 0..1 and what it is doing. */
export type ScenarioProgress = (fraction: number, label: string) => void;

/** Format a table with aligned columns (numbers right-aligned). */
export function formatTable(head: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = head.map((h, c) => Math.max(h.length, ...rows.map((r) => (r[c] ?? '').length)));
  const line = (cells: readonly string[]): string =>
    cells.map((x, c) => (/^[-+0-9.,e% ]+$/.test(x) ? x.padStart(widths[c]!) : x.padEnd(widths[c]!))).join('  ');
  return [line(head), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

/** A number with a fixed count of significant digits, for tables. */
export function sig(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a >= 1e5 || a < 1e-3 ? x.toExponential(digits - 1) : x.toPrecision(digits).replace(/\.?0+$/, (m) => (m.startsWith('.') ? '' : m));
}
