import { describe, expect, it } from 'vitest';
import { formatNumber } from '../../src/report/index.js';
import { formatTicks, roundSignificant } from '../../src/report/format-number.js';
import { REPORT_SCRIPT } from '../../src/report/html-report-script.js';

// Expected strings are significant-digit rounding as defined by ECMAScript's
// Number.prototype.toPrecision (ECMA-262, sect. 21.1.3.5, section number from
// memory), written out by hand.
const CASES: [number, number, string][] = [
  [41.234, 3, '41.2'],
  [41.25, 4, '41.25'],
  [1.5, 4, '1.5'],
  [-0.8353, 4, '-0.8353'],
  [123456, 4, '123500'],
  [999.96, 4, '1000'],
  [0.001234, 3, '0.00123'],
  [1.5e-6, 4, '1.5\u00D710\u207B\u2076'],
  [-2.5e7, 3, '-2.5\u00D710\u2077'],
  [1e6, 4, '1\u00D710\u2076'],
  [0, 4, '0'],
  [NaN, 4, 'NaN'],
  [Infinity, 4, '\u221E'],
  [-Infinity, 4, '-\u221E'],
];

/** The copy of formatNumber inside the browser script, evaluated in Node. */
function browserFormatNumber(): (v: number, d: number) => string {
  const start = REPORT_SCRIPT.indexOf('  var SUP =');
  const end = REPORT_SCRIPT.indexOf('  window.fluxstateFormatNumber');
  expect(start).toBeGreaterThan(0);
  expect(end).toBeGreaterThan(start);
  // eslint-disable-next-line @typescript-eslint/no-implied-eval
  return new Function(`${REPORT_SCRIPT.slice(start, end)}\nreturn formatNumber;`)() as (v: number, d: number) => string;
}

describe('formatNumber', () => {
  it.each(CASES)('formatNumber(%d, %d) gives %s', (value, digits, text) => {
    expect(formatNumber(value, digits)).toBe(text);
  });

  it('rejects digits outside 1..17 with a typed error', () => {
    expect(() => formatNumber(1, 0)).toThrow(expect.objectContaining({ code: 'report-bad-option' }));
    expect(() => formatNumber(1, 2.5)).toThrow(expect.objectContaining({ code: 'report-bad-option' }));
  });

  it('is the same function as the copy in the browser script of the HTML report', () => {
    const inBrowser = browserFormatNumber();
    for (const [value, digits, text] of CASES) expect(inBrowser(value, digits)).toBe(text);
  });
});

describe('roundSignificant', () => {
  it('rounds to the given significant digits and maps non-finite values to null (a gap)', () => {
    expect(roundSignificant(0.123456789, 7)).toBe(0.1234568);
    expect(roundSignificant(-98765.4321, 3)).toBe(-98800);
    expect(roundSignificant(NaN, 7)).toBeNull();
    expect(roundSignificant(Infinity, 7)).toBeNull();
  });
});

describe('formatTicks', () => {
  it('writes ticks with the decimals of the step and never "-0"', () => {
    expect(formatTicks([0, 0.25, 0.5], 0.25)).toEqual(['0.00', '0.25', '0.50']);
    expect(formatTicks([-1, -0, 1], 1)).toEqual(['-1', '0', '1']);
    expect(formatTicks([100, 200], 100)).toEqual(['100', '200']);
  });

  it('switches to powers of ten for tiny values, keeping neighbours distinct', () => {
    const labels = formatTicks([0, 2e-6, 4e-6, 6e-6], 2e-6);
    expect(labels[0]).toBe('0');
    expect(new Set(labels).size).toBe(4);
    expect(labels[1]).toBe('2\u00D710\u207B\u2076');
  });
});
