/**
 * One step of Radau IIA dense output: the collocation polynomial (Hairer and
 * Wanner II, sect. IV.8, "dense output"; SciPy's RadauDenseOutput form)
 * u(tOld + s h) = yOld + sum_k q[k n .. k n + n) s^(k+1), s = (t - tOld)/h,
 * with n = yOld.length and q of length 3n (Q = Z^T P, see radau-tableau.ts).
 *
 * @example
 * ```ts
 * const piece: CollocationPiece = { tOld: 0, h: 0.1, yOld: Float64Array.of(1), q: Float64Array.of(-0.1, 0.005, 0) };
 * evaluateCollocation(piece, 0.05, new Float64Array(1)); // [1 - 0.05 + 0.00125]
 * ```
 */
export interface CollocationPiece {
  readonly tOld: number;
  /** Step size the polynomial was built with (s = 1 at tOld + h). */
  readonly h: number;
  readonly yOld: Float64Array;
  /** 3n coefficients, power by power. */
  readonly q: Float64Array;
}

/**
 * Component i of the collocation polynomial at the normalised time s
 * (0 at tOld, 1 at tOld + h).
 *
 * @example
 * ```ts
 * const yMid = collocationComponent(piece, 0.5, 0);
 * ```
 */
export function collocationComponent(piece: CollocationPiece, s: number, i: number): number {
  const n = piece.yOld.length;
  const q = piece.q;
  return piece.yOld[i]! + s * (q[i]! + s * (q[n + i]! + s * q[2 * n + i]!));
}

/**
 * The state at time t from the collocation polynomial, into `out` (length n;
 * returned). The one dense-output evaluator of the project: solveDae's `at`,
 * the integrator's `interpolate` and the network run's recorded steps use it.
 *
 * @example
 * ```ts
 * const y = evaluateCollocation(integ.interpolant!, t, new Float64Array(n));
 * ```
 */
export function evaluateCollocation(piece: CollocationPiece, t: number, out: Float64Array): Float64Array {
  const yOld = piece.yOld;
  const n = yOld.length;
  const q = piece.q;
  const s = (t - piece.tOld) / piece.h;
  for (let i = 0; i < n; i++) out[i] = yOld[i]! + s * (q[i]! + s * (q[n + i]! + s * q[2 * n + i]!));
  return out;
}
