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
  // One finiteness probe for the row (see firstNonFiniteColumn), not a test per entry.
  let probe = 0;
  for (let j = 0; j < n; j++) {
    const v = Math.abs(a[row + j]!);
    probe += v;
    if (v > m) m = v;
  }
  if (!(probe < Infinity)) {
    const bad = firstNonFiniteColumn(n, i, a);
    if (bad >= 0) return bad;
  }
  const r = powerOfTwoInverse(m);
  rowScale[i] = r;
  collectColumnMaxima(n, i, a, r, colScale);
  return -1;
}

/**
 * The column of row i's first entry whose |a_ij| is not finite, or -1. The
 * row kernels sum the row's |entries| instead of testing each one: the sum of
 * non-negative numbers is NaN or Infinity when one of them is (Infinity -
 * Infinity cannot occur), and otherwise finite unless it overflowed, so a
 * finite sum means a finite row, and only a row whose sum is not finite is
 * read again here, for the same column a test per entry returns.
 *
 * @internal
 * @example
 * ```ts
 * firstNonFiniteColumn(3, 0, [1, NaN, Infinity]); // 1
 * ```
 */
export function firstNonFiniteColumn(n: number, i: number, a: number[]): number {
  const row = i * n;
  for (let j = 0; j < n; j++) if (!Number.isFinite(Math.abs(a[row + j]!))) return j;
  return -1;
}

/**
 * Row i's part of the column maxima of rowScale_i |a_ij| (colScale collects
 * them). With r finite (a power of two from powerOfTwoInverse of the row's
 * largest |entry| m, and every |a_ij| <= m finite) each r |a_ij| is finite,
 * non-negative and +0 rather than -0, so `x > c ? x : c` is Math.max(c, x)
 * exactly: Math.max differs from the comparison only for a NaN operand (an x
 * that cannot be NaN here; a c that is NaN from an earlier row stays NaN in
 * both) and for -0 against +0 (no -0 here). r is Infinity for a row whose
 * largest entry is below 2^-1023.5 (subnormal): then r * 0 is NaN, which
 * Math.max keeps as the definition does, so that row takes Math.max.
 *
 * @internal
 * @example
 * ```ts
 * collectColumnMaxima(n, i, a, rowScale[i], colScale);
 * ```
 */
export function collectColumnMaxima(n: number, i: number, a: number[], r: number, colScale: number[]): void {
  const row = i * n;
  if (r !== Infinity) {
    for (let j = 0; j < n; j++) {
      const x = r * Math.abs(a[row + j]!);
      if (x > colScale[j]!) colScale[j] = x;
    }
  } else {
    for (let j = 0; j < n; j++) colScale[j] = Math.max(colScale[j]!, r * Math.abs(a[row + j]!));
  }
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
  // One finiteness probe for the row, as in equilibrateRealRow.
  let probe = 0;
  for (let j = 0; j < n; j++) {
    const v = Math.abs(re[row + j]!) + Math.abs(im[row + j]!);
    probe += v;
    if (v > m) m = v;
  }
  if (!(probe < Infinity)) {
    const bad = firstNonFiniteComplexColumn(n, i, re, im);
    if (bad >= 0) return bad;
  }
  const r = powerOfTwoInverse(m);
  rowScale[i] = r;
  collectComplexColumnMaxima(n, i, re, im, r, colScale);
  return -1;
}

/**
 * {@link firstNonFiniteColumn} with |a_ij| taken as |re_ij| + |im_ij| (so an
 * entry whose two finite parts sum to Infinity counts as not finite, as the
 * test per entry had it).
 *
 * @internal
 * @example
 * ```ts
 * firstNonFiniteComplexColumn(2, 0, [1, 1e308], [0, 1e308]); // 1
 * ```
 */
export function firstNonFiniteComplexColumn(n: number, i: number, re: number[], im: number[]): number {
  const row = i * n;
  for (let j = 0; j < n; j++) if (!Number.isFinite(Math.abs(re[row + j]!) + Math.abs(im[row + j]!))) return j;
  return -1;
}

/**
 * {@link collectColumnMaxima} with |a_ij| taken as |re_ij| + |im_ij| (the
 * same argument: with r finite every r |a_ij| is finite, non-negative and not
 * -0, so compare and store is Math.max).
 *
 * @internal
 * @example
 * ```ts
 * collectComplexColumnMaxima(n, i, re, im, rowScale[i], colScale);
 * ```
 */
export function collectComplexColumnMaxima(n: number, i: number, re: number[], im: number[], r: number, colScale: number[]): void {
  const row = i * n;
  if (r !== Infinity) {
    for (let j = 0; j < n; j++) {
      const x = r * (Math.abs(re[row + j]!) + Math.abs(im[row + j]!));
      if (x > colScale[j]!) colScale[j] = x;
    }
  } else {
    for (let j = 0; j < n; j++) colScale[j] = Math.max(colScale[j]!, r * (Math.abs(re[row + j]!) + Math.abs(im[row + j]!)));
  }
}
