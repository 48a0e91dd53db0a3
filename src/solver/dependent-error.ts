import { weightedSquares } from './weighted-norm.js';

/**
 * Unknowns outside an integrator's state whose values follow from it: the
 * algebraic unknowns the reduced formulation solves inside f. Their share
 * of the error estimate, so that the error control watches them as it does
 * in the full problem. There, for an index-1 unknown, the embedded estimate
 * solves the algebraic rows of ((gamma/h) M - J) e = r, whose leading term
 * at a consistent start is e_A = -J_AA^-1 J_AD e_D, the change of the
 * solved unknowns along e_D (Hairer and Wanner II, sect. VI.1 and IV.8);
 * the implementer measures that change for the state's estimate e_D.
 *
 * @internal
 * @example
 * ```ts
 * dependent.measure(at, y, err);
 * const norm = Math.sqrt((stateSquares + dependent.squares) / (n + dependent.count));
 * ```
 */
export interface DependentError {
  /** How many unknowns; the error norm's mean runs over the state's and these. */
  readonly count: number;
  /**
   * Sum over those unknowns of (e_k / scale_k)^2 for the error estimate
   * `err` of the step from (`at.t`, `y`), with scale_k = atol'_k +
   * rtol'_k |y_k| (the mapped tolerances), written to {@link DependentError.squares}: a field, not a
   * return value, because a double returned from a call that is not inlined
   * is boxed on the heap.
   */
  measure(at: { readonly t: number }, y: Float64Array, err: Float64Array): void;
  /**
   * The same sum for a Newton increment of the step from (`at.t`, `y`):
   * `dw` holds the increments of the three transformed stages (3 x n, stage
   * k at [k n, k n + n)), each taken through the linearised map of the
   * state to the dependent unknowns (the Jacobian's, frozen as the Newton
   * iteration freezes it), so that the iteration converges on them as the
   * full problem's does. Written to {@link DependentError.squares}.
   */
  measureIncrement(at: { readonly t: number }, y: Float64Array, dw: Float64Array): void;
  /** The last {@link DependentError.measure}'s sum. */
  readonly squares: number;
}

/**
 * The weighted RMS norm of a step's error estimate (radau5's ERR), over the
 * state's components and, when given, the dependent unknowns': the mean of
 * the squared scaled errors over all of them.
 *
 * @internal
 * @example
 * ```ts
 * const err = stepErrorNorm(at, y, errv, scale, dependent);
 * ```
 */
export function stepErrorNorm(at: { readonly t: number }, y: Float64Array, err: Float64Array, scale: Float64Array, dependent: DependentError): number {
  const s = weightedSquares(err, scale);
  dependent.measure(at, y, err);
  return Math.sqrt((s + dependent.squares) / (err.length + dependent.count));
}
