import { powerOfTwoInverse } from './linear-solver.js';

/**
 * Row and column equilibration of a dense row-major matrix, the same
 * factors as `equilibrationScales` (powers of two; LAPACK's xGEEQU,
 * Golub and Van Loan, Matrix Computations, sect. 3.5.2) read straight from
 * the arrays: no per-entry callback, so a factorisation allocates nothing
 * and the loops stay monomorphic. Returns the column of the first
 * non-finite entry (rows scanned in order), or -1 (rowScale and colScale
 * are then overwritten, as the factorisation is). The same scales, exactly,
 * as `equilibrationScales` (test/solver/dense-equilibration.test.ts).
 *
 * @internal
 * @example
 * ```ts
 * const bad = equilibrateReal(2, [4, 1, 2, 3], rowScale, colScale); // -1
 * ```
 */
export function equilibrateReal(n: number, a: number[], rowScale: number[], colScale: number[]): number {
  // colScale first collects the column maxima of rowScale_i |a_ij|, row by row while the row is at
  // hand (one pass in storage order; max is exact, so the order of the rows does not matter; Math.max
  // keeps a NaN from an infinite scale times 0, as the column pass by definition does).
  for (let j = 0; j < n; j++) colScale[j] = 0;
  for (let i = 0; i < n; i++) {
    const bad = equilibrateRealRow(n, i, a, rowScale, colScale);
    if (bad >= 0) return bad;
  }
  finishColumnScales(n, colScale);
  return -1;
}

/**
 * Row i's part of {@link equilibrateReal}: its scale, and the column maxima
 * so far (colScale zeroed before row 0). The factorisations that form the
 * matrix row by row call it while the row is at hand. Returns the column of
 * the row's first non-finite entry, or -1.
 *
 * @internal
 * @example
 * ```ts
 * for (let i = 0; i < n; i++) if (equilibrateRealRow(n, i, a, rowScale, colScale) >= 0) break;
 * ```
 */
export function equilibrateRealRow(n: number, i: number, a: number[], rowScale: number[], colScale: number[]): number {
  const row = i * n;
  let m = 0;
  for (let j = 0; j < n; j++) {
    const v = Math.abs(a[row + j]!);
    if (!Number.isFinite(v)) return j;
    if (v > m) m = v;
  }
  const r = powerOfTwoInverse(m);
  rowScale[i] = r;
  for (let j = 0; j < n; j++) {
    colScale[j] = Math.max(colScale[j]!, r * Math.abs(a[row + j]!));
  }
  return -1;
}

/**
 * The column scales from the column maxima the row passes collected.
 *
 * @internal
 * @example
 * ```ts
 * finishColumnScales(n, colScale);
 * ```
 */
export function finishColumnScales(n: number, colScale: number[]): void {
  for (let j = 0; j < n; j++) colScale[j] = powerOfTwoInverse(colScale[j]!);
}

/**
 * {@link equilibrateReal} for a complex matrix re + i im, with |a_ij| taken
 * as |re_ij| + |im_ij| (as the complex LU's pivoting does).
 *
 * @internal
 * @example
 * ```ts
 * const bad = equilibrateComplex(1, [0], [2], rowScale, colScale); // -1
 * ```
 */
export function equilibrateComplex(n: number, re: number[], im: number[], rowScale: number[], colScale: number[]): number {
  for (let j = 0; j < n; j++) colScale[j] = 0;
  for (let i = 0; i < n; i++) {
    const bad = equilibrateComplexRow(n, i, re, im, rowScale, colScale);
    if (bad >= 0) return bad;
  }
  finishColumnScales(n, colScale);
  return -1;
}

/**
 * Row i's part of {@link equilibrateComplex} (see {@link equilibrateRealRow}).
 *
 * @internal
 * @example
 * ```ts
 * for (let i = 0; i < n; i++) if (equilibrateComplexRow(n, i, re, im, rowScale, colScale) >= 0) break;
 * ```
 */
export function equilibrateComplexRow(n: number, i: number, re: number[], im: number[], rowScale: number[], colScale: number[]): number {
  const row = i * n;
  let m = 0;
  for (let j = 0; j < n; j++) {
    const v = Math.abs(re[row + j]!) + Math.abs(im[row + j]!);
    if (!Number.isFinite(v)) return j;
    if (v > m) m = v;
  }
  const r = powerOfTwoInverse(m);
  rowScale[i] = r;
  for (let j = 0; j < n; j++) {
    colScale[j] = Math.max(colScale[j]!, r * (Math.abs(re[row + j]!) + Math.abs(im[row + j]!)));
  }
  return -1;
}
