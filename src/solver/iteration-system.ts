import type { SparsePattern } from './sparse-pattern.js';
import type { ComplexLinearSolver, RealLinearSolver } from './linear-solver.js';

/**
 * The empty answer of {@link IterationSystem.nonFiniteRows}, shared: a new empty array per
 * Jacobian evaluation was garbage whenever the check was not inlined into its caller.
 *
 * @internal
 * @example `if (system.nonFiniteRows(jac) !== NO_ROWS) fail();`
 */
export const NO_ROWS: readonly number[] = Object.freeze([]);

/**
 * The linear algebra of one integrator behind one seam: where the Jacobian
 * J is held, how it is evaluated, and how the iteration matrices of Radau
 * IIA, (gamma/h) M - J (real) and ((alpha + i beta)/h) M - J (complex), are
 * formed from it and factored. Two implementations: dense row-major n x n
 * storage ({@link createDenseIterationSystem}, small n) and values on the
 * fixed pattern of J, M and the diagonal ({@link createSparseIterationSystem},
 * large networks), where nothing is of size n^2.
 *
 * A Jacobian storage is a Float64Array of {@link IterationSystem.jacobianSize}
 * entries; the integrator holds one and compares or copies them as arrays.
 *
 * @internal
 * @example
 * ```ts
 * const system = createDenseIterationSystem(problem);
 * const jac = new Float64Array(system.jacobianSize);
 * system.evaluate(t, y, f, jac);
 * if (system.factor(jac, gamma / h, alpha / h, beta / h) < 0) system.luReal.solve(b);
 * ```
 */
export interface IterationSystem {
  readonly luReal: RealLinearSolver;
  readonly luComplex: ComplexLinearSolver;
  /** Entries of one Jacobian storage (n*n dense; the pattern's entries sparse). */
  readonly jacobianSize: number;
  /** Whether J comes from user code (analytic) rather than finite differences of f. */
  readonly analytic: boolean;
  /**
   * Evaluate J at (t, y), with f = f(t, y), into `out` (a storage of this
   * system). Returns the evaluations of f it made (finite differences).
   * Throws {@link OutsidePatternError} for an entry the pattern does not hold.
   */
  evaluate(t: number, y: Float64Array, f: Float64Array, out: Float64Array): number;
  /** Rows of J (in `jac`) holding NaN or Infinity, ascending; {@link NO_ROWS} when all are finite. */
  nonFiniteRows(jac: Float64Array): readonly number[];
  /**
   * Form (fac1 M - J) and ((alphn + i betan) M - J) from `jac` and factor
   * them. Returns -1, or the column of the first bad pivot (real system first).
   */
  factor(jac: Float64Array, fac1: number, alphn: number, betan: number): number;
  /** J (in `jac`) as a dense row-major n x n array, into `out`. */
  toDense(jac: Float64Array, out: Float64Array): Float64Array;
  /**
   * Numbers (Float64 or Int32 entries) the system holds, by part: Jacobian
   * scratch (the integrator holds J itself), the iteration matrices, the LU
   * factors and work. For
   * tests that a large network is held without n^2 arrays.
   */
  storage(): { readonly jacobian: number; readonly iterationMatrices: number; readonly factors: number };
  /** The sparse system's pattern and M on it (undefined for the dense system). */
  readonly sparse?: { readonly pattern: SparsePattern; readonly massValues: Float64Array };
}

/**
 * A Jacobian entry outside the declared pattern: a silently dropped entry
 * would be a wrong answer, so the sparse system refuses it.
 *
 * @internal
 * @example
 * ```ts
 * throw new OutsidePatternError(3, 7);
 * ```
 */
export class OutsidePatternError extends RangeError {
  constructor(
    readonly row: number,
    readonly col: number,
  ) {
    super(`entry (${row}, ${col}) of the Jacobian is not in jacobianPattern`);
  }
}
