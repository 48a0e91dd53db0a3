import type { RhsFunction } from './types.js';

/** Unit round-off of IEEE double precision (2^-53), as radau5's UROUND. */
const UROUND = Number.EPSILON / 2;

/**
 * Forward-difference Jacobian df/dy of f(t, y), column by column. Default
 * increment, that of Hairer's radau5 code (Hairer and Wanner, Solving ODEs
 * II, sect. IV.8 and the code's routine for the approximate Jacobian):
 * delta_j = sqrt(uround * max(1e-5, |y_j|)). With `typical` (the size below
 * which component j is noise, e.g. its absolute tolerance) the increment is
 * delta_j = sqrt(uround) * max(|y_j|, typical_j) (Dennis and Schnabel,
 * Numerical Methods for Unconstrained Optimization, sect. 5.4), which keeps
 * components far below 1e-5 accurate. Costs n evaluations of f.
 *
 * This is the solver's fallback when a problem has no analytic Jacobian, and
 * the oracle that tests across the project use to check analytic Jacobians.
 *
 * @param rhs - f(t, y, out).
 * @param t - Time.
 * @param y - State (length n). Restored bit-exactly before return.
 * @param f0 - f(t, y), already evaluated (length n).
 * @param out - Receives the Jacobian, row-major n*n: out[i*n + j] = df_i/dy_j.
 * @param work - Optional scratch vector of length n (avoids an allocation).
 * @param typical - Optional per-component typical magnitude (see above).
 * @returns The number of evaluations of f made (n).
 *
 * @example
 * ```ts
 * const rhs = (t: number, y: Float64Array, out: Float64Array) => {
 *   out[0] = -2 * y[0]! + y[1]!;
 *   out[1] = y[0]! * y[1]!;
 * };
 * const y = Float64Array.of(1, 3);
 * const f0 = new Float64Array(2);
 * rhs(0, y, f0);
 * const jac = new Float64Array(4);
 * finiteDifferenceJacobian(rhs, 0, y, f0, jac); // about [-2, 1, 3, 1]
 * ```
 */
export function finiteDifferenceJacobian(
  rhs: RhsFunction,
  t: number,
  y: Float64Array,
  f0: Float64Array,
  out: Float64Array,
  work?: Float64Array,
  typical?: ArrayLike<number>,
): number {
  const n = y.length;
  const f1 = work ?? new Float64Array(n);
  const sqrtU = Math.sqrt(UROUND);
  for (let j = 0; j < n; j++) {
    const ysafe = y[j]!;
    let delta = typical ? sqrtU * Math.max(Math.abs(ysafe), typical[j]!) : 0;
    if (!(delta > 0)) delta = Math.sqrt(UROUND * Math.max(1e-5, Math.abs(ysafe)));
    y[j] = ysafe + delta;
    // The actual increment, as represented in floating point.
    let dj = y[j]! - ysafe;
    if (dj === 0) {
      delta = Math.sqrt(UROUND * Math.max(1e-5, Math.abs(ysafe)));
      y[j] = ysafe + delta;
      dj = y[j]! - ysafe;
    }
    try {
      rhs(t, y, f1);
    } finally {
      y[j] = ysafe;
    }
    for (let i = 0; i < n; i++) out[i * n + j] = (f1[i]! - f0[i]!) / dj;
  }
  return n;
}
