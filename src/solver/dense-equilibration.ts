import { powerOfTwoInverse } from './linear-solver.js';

/**
 * Row and column equilibration of a dense row-major matrix, the same
 * factors as `equilibrationScales` (powers of two; LAPACK's xGEEQU,
 * Golub and Van Loan, Matrix Computations, sect. 3.5.2) read straight from
 * the arrays: no per-entry callback, so a factorisation allocates nothing
 * and the loops stay monomorphic. Returns the column of the first
 * non-finite entry (rows scanned in order), or -1.
 *
 * @internal
 * @example
 * ```ts
 * const bad = equilibrateReal(2, Float64Array.of(4, 1, 2, 3), rowScale, colScale); // -1
 * ```
 */
export function equilibrateReal(n: number, a: Float64Array, rowScale: Float64Array, colScale: Float64Array): number {
  for (let i = 0; i < n; i++) {
    const row = i * n;
    let m = 0;
    for (let j = 0; j < n; j++) {
      const v = Math.abs(a[row + j]!);
      if (!Number.isFinite(v)) return j;
      if (v > m) m = v;
    }
    rowScale[i] = powerOfTwoInverse(m);
  }
  for (let j = 0; j < n; j++) {
    let m = 0;
    for (let i = 0; i < n; i++) m = Math.max(m, rowScale[i]! * Math.abs(a[i * n + j]!));
    colScale[j] = powerOfTwoInverse(m);
  }
  return -1;
}

/**
 * {@link equilibrateReal} for a complex matrix re + i im, with |a_ij| taken
 * as |re_ij| + |im_ij| (as the complex LU's pivoting does).
 *
 * @internal
 * @example
 * ```ts
 * const bad = equilibrateComplex(1, Float64Array.of(0), Float64Array.of(2), rowScale, colScale); // -1
 * ```
 */
export function equilibrateComplex(n: number, re: Float64Array, im: Float64Array, rowScale: Float64Array, colScale: Float64Array): number {
  for (let i = 0; i < n; i++) {
    const row = i * n;
    let m = 0;
    for (let j = 0; j < n; j++) {
      const v = Math.abs(re[row + j]!) + Math.abs(im[row + j]!);
      if (!Number.isFinite(v)) return j;
      if (v > m) m = v;
    }
    rowScale[i] = powerOfTwoInverse(m);
  }
  for (let j = 0; j < n; j++) {
    let m = 0;
    for (let i = 0; i < n; i++) m = Math.max(m, rowScale[i]! * (Math.abs(re[i * n + j]!) + Math.abs(im[i * n + j]!)));
    colScale[j] = powerOfTwoInverse(m);
  }
  return -1;
}
