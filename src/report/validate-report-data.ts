// Checks on report input. Bad input throws InputError with a stable code,
// naming the plot/series/row and the fix (codes listed in docs/report.md).
import { InputError } from '../errors.js';
import { isSafeColor } from './palette.js';
import type { NumericArray, PlotGroup, ReportData } from './report-data.js';

function isNumericArray(a: unknown): a is NumericArray {
  return (
    ArrayBuffer.isView(a) ||
    Array.isArray(a) ||
    (typeof a === 'object' && a !== null && typeof (a as { length?: unknown }).length === 'number')
  );
}

const STATUSES = ['ok', 'warning', 'alert'] as const;

function requireText(value: unknown, what: string, owner: string): void {
  if (typeof value !== 'string') {
    throw new InputError('report-bad-text', `${what} must be a string, got ${typeof value}; give plain text`, [owner]);
  }
}

/**
 * The distinct units of a plot group, in order of first use by its series.
 *
 * @example
 * ```ts
 * groupUnits(group); // ['A', 'T']
 * ```
 */
export function groupUnits(group: PlotGroup): string[] {
  const units: string[] = [];
  for (const s of group.series) if (!units.includes(s.unit)) units.push(s.unit);
  return units;
}

/**
 * Check one plot group: at least one series; each series has equal-length,
 * non-empty `t` and `values`, `t` finite and non-decreasing; at most two
 * units; reference lines finite and on one of those units; colours safe.
 *
 * @example
 * ```ts
 * validatePlotGroup(group); // throws InputError('report-time-not-sorted', ...) if t goes backwards
 * ```
 */
export function validatePlotGroup(group: PlotGroup): void {
  requireText(group.title, 'plot title', 'plot');
  const where = `plot "${group.title}"`;
  if (group.xLabel !== undefined) requireText(group.xLabel, `${where}: xLabel`, group.title);
  if (group.xUnit !== undefined) requireText(group.xUnit, `${where}: xUnit`, group.title);
  if (group.description !== undefined) requireText(group.description, `${where}: description`, group.title);
  if (!Array.isArray(group.series) || group.series.length === 0) {
    throw new InputError('report-no-series', `${where} has no series; give at least one series or leave the plot out`, [
      group.title,
    ]);
  }
  for (const s of group.series) {
    requireText(s.label, `${where}: series label`, group.title);
    requireText(s.unit, `${where}: unit of series "${s.label}"`, s.label);
    if (s.quantity !== undefined) requireText(s.quantity, `${where}: quantity of series "${s.label}"`, s.label);
    const name = `${where}, series "${s.label}"`;
    if (!isNumericArray(s.t) || !isNumericArray(s.values)) {
      throw new InputError('report-series-length', `${name}: t and values must be arrays of numbers`, [s.label]);
    }
    if (s.t.length !== s.values.length) {
      throw new InputError(
        'report-series-length',
        `${name}: t has ${s.t.length} samples but values has ${s.values.length}; give one value per instant`,
        [s.label],
      );
    }
    if (s.t.length === 0) {
      throw new InputError('report-series-empty', `${name} has no samples; give at least one sample`, [s.label]);
    }
    let previous = -Infinity;
    for (let i = 0; i < s.t.length; i++) {
      const ti = s.t[i] as number;
      if (typeof ti !== 'number' || !Number.isFinite(ti)) {
        throw new InputError('report-time-not-finite', `${name}: t[${i}] = ${ti} is not a finite number`, [s.label]);
      }
      if (ti < previous) {
        throw new InputError(
          'report-time-not-sorted',
          `${name}: t[${i}] = ${ti} is before t[${i - 1}] = ${previous}; sort the samples by t`,
          [s.label],
        );
      }
      previous = ti;
    }
    if (s.color !== undefined && !isSafeColor(s.color)) {
      throw new InputError(
        'report-bad-color',
        `${name}: colour "${s.color}" is not a CSS colour we accept; use #rrggbb, a colour name, or rgb()/hsl()`,
        [s.label],
      );
    }
  }
  const units = groupUnits(group);
  if (units.length > 2) {
    throw new InputError(
      'report-too-many-units',
      `${where} mixes ${units.length} units (${units.map((u) => `"${u}"`).join(', ')}); a plot has a left and a right axis: split it into groups of at most two units`,
      [group.title],
    );
  }
  for (const r of group.references ?? []) {
    requireText(r.label, `${where}: reference label`, group.title);
    if (r.unit !== undefined) requireText(r.unit, `${where}: unit of reference "${r.label}"`, r.label);
    if (typeof r.value !== 'number' || !Number.isFinite(r.value)) {
      throw new InputError('report-bad-reference', `${where}: reference "${r.label}" has value ${r.value}; give a finite number`, [
        r.label,
      ]);
    }
    if (r.unit !== undefined && !units.includes(r.unit)) {
      throw new InputError(
        'report-bad-reference',
        `${where}: reference "${r.label}" is in "${r.unit}" but the series are in ${units.map((u) => `"${u}"`).join(', ')}; use one of those units`,
        [r.label],
      );
    }
    if (r.color !== undefined && !isSafeColor(r.color)) {
      throw new InputError('report-bad-color', `${where}: reference "${r.label}" colour "${r.color}" is not accepted; use #rrggbb`, [
        r.label,
      ]);
    }
  }
}

/**
 * Check a whole report: texts are strings, every plot group is valid, table
 * digits are integers from 1 to 15.
 *
 * @example
 * ```ts
 * validateReportData(data); // throws InputError naming the first bad item
 * ```
 */
export function validateReportData(data: ReportData): void {
  if (typeof data !== 'object' || data === null) {
    throw new InputError('report-bad-text', 'report data must be an object with a title and sections');
  }
  requireText(data.title, 'report title', 'report');
  if (data.subtitle !== undefined) requireText(data.subtitle, 'report subtitle', 'report');
  if (data.caution !== undefined) requireText(data.caution, 'report caution', 'report');
  if (data.generatedAt !== undefined && !(data.generatedAt instanceof Date)) {
    requireText(data.generatedAt, 'generatedAt', 'report');
  }
  if (data.generatedAt instanceof Date && Number.isNaN(data.generatedAt.getTime())) {
    throw new InputError('report-bad-text', 'generatedAt is an invalid Date; give a valid Date or a string', ['report']);
  }
  for (const item of data.info ?? []) {
    requireText(item.label, 'info label', 'report');
    requireText(item.value, `info "${item.label}" value`, item.label);
  }
  if (!Array.isArray(data.sections)) {
    throw new InputError('report-bad-text', 'report sections must be an array (it may be empty)', ['report']);
  }
  const checkDigits = (digits: number | undefined, owner: string): void => {
    if (digits !== undefined && !(Number.isInteger(digits) && digits >= 1 && digits <= 15)) {
      throw new InputError('report-bad-option', `"${owner}": digits ${digits} must be an integer from 1 to 15`, [owner]);
    }
  };
  const optionalText = (value: unknown, what: string, owner: string): void => {
    if (value !== undefined) requireText(value, what, owner);
  };
  const numberOrText = (value: unknown, what: string, owner: string): void => {
    if (typeof value !== 'number') requireText(value, what, owner);
  };
  for (const section of data.sections) {
    requireText(section.title, 'section title', 'section');
    if (section.description !== undefined) requireText(section.description, `section "${section.title}" description`, section.title);
    for (const group of section.plots ?? []) validatePlotGroup(group);
    for (const table of section.metrics ?? []) {
      optionalText(table.title, 'metric table title', 'metrics');
      if (!Array.isArray(table.rows)) throw new InputError('report-bad-text', `metric table "${table.title ?? ''}": rows must be an array`, ['metrics']);
      for (const row of table.rows) {
        requireText(row.name, 'metric name', table.title ?? 'metrics');
        numberOrText(row.value, `metric "${row.name}" value`, row.name);
        optionalText(row.unit, `metric "${row.name}" unit`, row.name);
        optionalText(row.note, `metric "${row.name}" note`, row.name);
        checkDigits(row.digits, row.name);
        // The status becomes a class name and a word in the page: only the three known values pass.
        if (row.status !== undefined && !(STATUSES as readonly unknown[]).includes(row.status)) {
          throw new InputError(
            'report-bad-option',
            `metric "${row.name}": status ${JSON.stringify(row.status)} is not one of ${STATUSES.map((x) => `'${x}'`).join(', ')}; use one of them or leave it out`,
            [row.name],
          );
        }
      }
    }
    if (section.network !== undefined) {
      optionalText(section.network.title, 'network table title', 'network');
      if (!Array.isArray(section.network.rows)) throw new InputError('report-bad-text', 'network table: rows must be an array', ['network']);
    }
    for (const row of section.network?.rows ?? []) {
      requireText(row.element, 'network element name', 'network');
      requireText(row.kind, `network element "${row.element}" kind`, row.element);
      optionalText(row.connections, `network element "${row.element}" connections`, row.element);
      optionalText(row.note, `network element "${row.element}" note`, row.element);
      if (!Array.isArray(row.parameters)) throw new InputError('report-bad-text', `network element "${row.element}": parameters must be an array`, [row.element]);
      for (const p of row.parameters) {
        requireText(p.name, `parameter of "${row.element}"`, row.element);
        numberOrText(p.value, `parameter "${p.name}" of "${row.element}"`, row.element);
        optionalText(p.unit, `unit of parameter "${p.name}" of "${row.element}"`, row.element);
        checkDigits(p.digits, `${row.element}.${p.name}`);
      }
    }
  }
}
