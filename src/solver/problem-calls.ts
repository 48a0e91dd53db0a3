import { recombineJacobianRows, recombineRhsRows, type MassRowCompression } from './mass-row-compression.js';
import type { DaeProblem, JacobianEntryTarget } from './types.js';

/** Adds entries into a row-major n x n array (the dense Jacobian of a problem that gives entries only). */
class DenseEntryTarget implements JacobianEntryTarget {
  out: Float64Array = new Float64Array(0);

  constructor(private readonly n: number) {}

  add(row: number, col: number, value: number): void {
    const n = this.n;
    if (row >= 0 && col >= 0) this.out[row * n + col] = this.out[row * n + col]! + value;
  }
}

/**
 * The problem's f and J as the integrator calls them: dependent rows of M
 * recombined (see mass-row-compression.ts), the dense J made from entries
 * when only those are given. The problem's callbacks are called as methods
 * of the problem object (`problem.rhs(t, y, out)`). Both call sites then
 * see the same function in every run when the problem is a class instance:
 * a closure per run is a new call target each time, and the next run in a
 * process deoptimised the code specialised on the last.
 *
 * @internal
 * @example
 * ```ts
 * const calls = new ProblemCalls(problem, n, compression);
 * calls.rhs(t, y, out);
 * ```
 */
export class ProblemCalls {
  private readonly denseTarget: DenseEntryTarget;

  constructor(
    private readonly problem: DaeProblem,
    private readonly n: number,
    private readonly compression: MassRowCompression | undefined,
  ) {
    this.denseTarget = new DenseEntryTarget(n);
  }

  /** Whether J is analytic: the problem gives `jacobian` or `jacobianEntries`. */
  get hasJacobian(): boolean {
    return this.problem.jacobian !== undefined || this.problem.jacobianEntries !== undefined;
  }

  /** Whether the problem gives J entry by entry. */
  get hasJacobianEntries(): boolean {
    return this.problem.jacobianEntries !== undefined;
  }

  /** f, recombined. */
  rhs(t: number, y: Float64Array, out: Float64Array): void {
    this.problem.rhs(t, y, out);
    if (this.compression) recombineRhsRows(out, this.compression);
  }

  /**
   * f recombined into `out`, as {@link rhs}; where rows are recombined, the
   * problem's own f (before recombination) into `own` as well: one copy, for
   * a caller that hands f at a step's end on (`DaeIntegrator.readRhsAtState`).
   */
  rhsKeepingOwn(t: number, y: Float64Array, out: Float64Array, own: Float64Array): void {
    this.problem.rhs(t, y, out);
    if (this.compression) {
      own.set(out);
      recombineRhsRows(out, this.compression);
    }
  }

  /** The dense J (row-major n x n, `out` zero-filled by the caller), recombined. Only when {@link hasJacobian}. */
  jacobian(t: number, y: Float64Array, out: Float64Array): void {
    const problem = this.problem;
    if (problem.jacobian !== undefined) problem.jacobian(t, y, out);
    else {
      this.denseTarget.out = out;
      problem.jacobianEntries!(t, y, this.denseTarget);
    }
    if (this.compression) recombineJacobianRows(out, this.n, this.compression);
  }

  /** J entry by entry as the problem gives it (not recombined). Only when {@link hasJacobianEntries}. */
  jacobianEntries(t: number, y: Float64Array, target: JacobianEntryTarget): void {
    this.problem.jacobianEntries!(t, y, target);
  }
}
