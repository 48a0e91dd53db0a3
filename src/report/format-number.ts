// Number formatting shared by the SVG plots and the HTML tables. The browser
// script of the HTML report carries a copy of `formatNumber` (it cannot import);
// test/report/format-number.test.ts pins the behaviour both must follow.
import { InputError } from '../errors.js';

const SUPERSCRIPT: Readonly<Record<string, string>> = {
  '-': '\u207B',
  '0': '\u2070',
  '1': '\u00B9',
  '2': '\u00B2',
  '3': '\u00B3',
  '4': '\u2074',
  '5': '\u2075',
  '6': '\u2076',
  '7': '\u2077',
  '8': '\u2078',
  '9': '\u2079',
};

/** Drop trailing zeros after a decimal point ("1.500" -> "1.5", "2.000" -> "2"). */
function trimZeros(s: string): string {
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

/**
 * `value` rounded to `digits` significant digits, for display. Numbers with
 * magnitude in [1e-3, 1e6) are written plainly ("0.01234", "41.2", "123500");
 * others as a mantissa and a power of ten with superscript exponent
 * ("1.5×10⁻⁶"). Trailing zeros are dropped. Non-finite values give "NaN", "∞", "-∞".
 *
 * @throws InputError (`report-bad-option`) when `digits` is not an integer from 1 to 17.
 *
 * @example
 * ```ts
 * formatNumber(41.234, 3);   // "41.2"
 * formatNumber(1.5e-6);      // "1.5×10⁻⁶"
 * ```
 */
export function formatNumber(value: number, digits = 4): string {
  if (!(Number.isInteger(digits) && digits >= 1 && digits <= 17)) {
    throw new InputError('report-bad-option', `formatNumber: digits ${digits} must be an integer from 1 to 17`, ['digits']);
  }
  if (Number.isNaN(value)) return 'NaN';
  if (!Number.isFinite(value)) return value > 0 ? '\u221E' : '-\u221E';
  if (value === 0) return '0';
  const rounded = Number(value.toPrecision(digits));
  const abs = Math.abs(rounded);
  if (abs >= 1e-3 && abs < 1e6) {
    const exponent = Math.floor(Math.log10(abs));
    return trimZeros(rounded.toFixed(Math.max(0, digits - 1 - exponent)));
  }
  const [mantissa = '', exponent = '0'] = rounded.toExponential(digits - 1).split('e');
  const sup = [...String(Number(exponent))].map((c) => SUPERSCRIPT[c] ?? c).join('');
  return `${trimZeros(mantissa)}\u00D710${sup}`;
}

/**
 * `value` rounded to `digits` significant digits as a number (for compact
 * JSON). Non-finite values become `null` (a gap in a plot).
 *
 * @example
 * ```ts
 * roundSignificant(0.123456789, 7); // 0.1234568
 * roundSignificant(NaN, 7);         // null
 * ```
 */
export function roundSignificant(value: number, digits: number): number | null {
  if (!Number.isFinite(value)) return null;
  return value === 0 ? 0 : Number(value.toPrecision(digits));
}

/**
 * Labels for axis ticks spaced `step` apart: plain decimals with the number
 * of fraction digits the step needs, or mantissa and power of ten when the
 * largest tick is below 1e-3 or at least 1e6 in magnitude.
 *
 * @example
 * ```ts
 * formatTicks([0, 0.25, 0.5], 0.25); // ["0.00", "0.25", "0.50"]
 * ```
 */
export function formatTicks(ticks: readonly number[], step: number): string[] {
  const maxAbs = ticks.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
  if (maxAbs !== 0 && (maxAbs < 1e-3 || maxAbs >= 1e6)) {
    // enough digits to tell neighbouring ticks apart
    const digits = Math.min(15, Math.max(1, Math.ceil(Math.log10(maxAbs / step) + 1e-9) + 1));
    return ticks.map((v) => (v === 0 ? '0' : formatNumber(v, digits)));
  }
  const stepText = trimZeros(Number(step.toPrecision(6)).toFixed(12));
  const decimals = stepText.includes('.') ? stepText.length - stepText.indexOf('.') - 1 : 0;
  return ticks.map((v) => {
    const s = v.toFixed(decimals);
    return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
  });
}
