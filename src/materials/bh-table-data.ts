import { InputError } from '../errors.js';

/**
 * Measured or tabulated B-H points (first magnetisation curve, B >= 0).
 *
 * @example
 * ```ts
 * const data: BhTableData = { fluxDensity: [0.5, 1.0, 1.5], fieldStrength: [40, 90, 700], name: 'sample' };
 * ```
 */
export interface BhTableData {
  /** Flux densities B in T, strictly increasing, >= 0. */
  readonly fluxDensity: readonly number[];
  /** Field strengths H in A/m at those flux densities, strictly increasing, >= 0. */
  readonly fieldStrength: readonly number[];
  /** Name for messages and reports. */
  readonly name?: string;
}

/**
 * Validated table, always starting at the origin (0, 0).
 *
 * @example
 * ```ts
 * const t: CheckedBhTable = checkBhTable({ fluxDensity: [0.5, 1, 1.5], fieldStrength: [40, 90, 700] });
 * t.originAdded; // true
 * ```
 */
export interface CheckedBhTable {
  readonly name: string;
  /** B in T, b[0] = 0, strictly increasing. */
  readonly b: Float64Array;
  /** H in A/m, h[0] = 0, strictly increasing. */
  readonly h: Float64Array;
  /** True when the origin was not among the given rows and was added. */
  readonly originAdded: boolean;
}

/**
 * Validate B-H table data and return it as typed arrays starting at the
 * origin. Rules: the two columns have the same length; at least 3 rows;
 * every value finite; every value > 0 except a first row that is exactly
 * (0, 0); B and H strictly increasing down the rows. A table that does not
 * start at (0, 0) gets the origin added in front (an unmagnetised core has
 * H = 0 at B = 0, and the law is odd). Every fault throws an
 * {@link InputError} naming the material, the 0-based row and the value.
 *
 * @example
 * ```ts
 * const t = checkBhTable({ fluxDensity: [0.5, 1, 1.5], fieldStrength: [50, 120, 900], name: 'core' });
 * t.b; // Float64Array [0, 0.5, 1, 1.5]
 * ```
 */
export function checkBhTable(data: BhTableData): CheckedBhTable {
  const name = data.name ?? 'B-H table';
  const bs = data.fluxDensity;
  const hs = data.fieldStrength;
  const fail = (code: string, message: string): InputError =>
    new InputError(code, `material "${name}": ${message}`, [name]);
  if (!Array.isArray(bs) || !Array.isArray(hs)) {
    throw fail('table-length-mismatch', 'fluxDensity and fieldStrength must both be arrays of numbers');
  }
  if (bs.length !== hs.length) {
    throw fail(
      'table-length-mismatch',
      `fluxDensity has ${bs.length} rows but fieldStrength has ${hs.length}; give one H per B`,
    );
  }
  if (bs.length < 3) {
    throw fail('table-too-short', `the table has ${bs.length} rows; give at least 3 (B, H) points`);
  }
  for (let i = 0; i < bs.length; i++) {
    for (const [col, v, unit] of [['B', bs[i], 'T'], ['H', hs[i], 'A/m']] as const) {
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        throw fail('table-not-finite', `row ${i}: ${col} = ${String(v)} is not a finite number; give ${col} in ${unit}`);
      }
    }
  }
  const b0 = bs[0] as number;
  const h0 = hs[0] as number;
  const startsAtOrigin = b0 === 0 && h0 === 0;
  for (let i = startsAtOrigin ? 1 : 0; i < bs.length; i++) {
    for (const [col, v] of [['B', bs[i] as number], ['H', hs[i] as number]] as const) {
      if (v <= 0) {
        const hint = i === 0 ? '; a first row on an axis must be exactly (0, 0)' : '';
        throw fail('table-not-positive', `row ${i}: ${col} = ${v} must be > 0${hint} (give the first magnetisation curve for B >= 0; the law is made odd)`);
      }
    }
  }
  for (let i = 1; i < bs.length; i++) {
    for (const [col, prev, v] of [['B', bs[i - 1] as number, bs[i] as number], ['H', hs[i - 1] as number, hs[i] as number]] as const) {
      if (!(v > prev)) {
        throw fail(
          'table-not-increasing',
          `row ${i}: ${col} = ${v} is not greater than ${prev} in row ${i - 1}; B and H must both increase strictly down the table`,
        );
      }
    }
  }
  const offset = startsAtOrigin ? 0 : 1;
  const b = new Float64Array(bs.length + offset);
  const h = new Float64Array(bs.length + offset);
  for (let i = 0; i < bs.length; i++) {
    b[i + offset] = bs[i] as number;
    h[i + offset] = hs[i] as number;
  }
  return { name, b, h, originAdded: !startsAtOrigin };
}
