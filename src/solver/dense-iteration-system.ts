import { ComplexLu } from './complex-lu.js';
import { DenseLu } from './dense-lu.js';
import { finiteDifferenceJacobian } from './finite-difference-jacobian.js';
import { ownFloat64, type TakeFloat64 } from './float64-chunks.js';
import { NO_ROWS, type IterationSystem } from './iteration-system.js';
import type { ComplexLinearSolver, RealLinearSolver } from './linear-solver.js';
import { createEmbeddedComplexLu, createMlMatrixLu } from './ml-matrix-lu.js';
import type { NormalizedDae } from './normalize-problem.js';
import { formShifted, scaledMass } from './shifted-matrix.js';

/**
 * The {@link IterationSystem} on dense row-major n x n arrays: J from the
 * problem's Jacobian (or finite differences), the iteration matrices formed
 * inside the flat LU kernels' own storage as they are factored (or built
 * entry by entry and factored by ml-matrix's, with `linearAlgebra: 'ml-matrix'`). The choice for small n, where it is fastest.
 * Work arrays from `take` ({@link TakeFloat64}).
 *
 * @internal
 * @example
 * ```ts
 * const system = createDenseIterationSystem(normalizeDae(problem));
 * ```
 */
export function createDenseIterationSystem(p: NormalizedDae, take: TakeFloat64 = ownFloat64): IterationSystem {
  return new DenseIterationSystem(p, take);
}

/**
 * A class, not closures, for the reason given at the dense LU: the integrator's call sites
 * (`system.evaluate`, `system.factor`) see one target whatever the integrator.
 */
class DenseIterationSystem implements IterationSystem {
  readonly luReal: RealLinearSolver;
  readonly luComplex: ComplexLinearSolver;
  readonly jacobianSize: number;
  readonly analytic: boolean;
  private readonly n: number;
  private readonly p: NormalizedDae;
  /** The flat kernels, which form the iteration matrices themselves (undefined with ml-matrix). */
  private readonly flatReal: DenseLu | undefined;
  private readonly flatComplex: ComplexLu | undefined;
  /** The iteration matrices, formed here for ml-matrix's kernels only. */
  private readonly formed: { readonly e1: Float64Array; readonly e2r: Float64Array; readonly e2i: Float64Array } | undefined;
  private readonly fdWork: Float64Array;
  private readonly mass: NormalizedDae['mass'];

  constructor(p: NormalizedDae, take: TakeFloat64) {
    const n = p.n;
    this.n = n;
    this.p = p;
    if (p.linearAlgebra === 'ml-matrix') {
      this.luReal = createMlMatrixLu(n);
      this.luComplex = createEmbeddedComplexLu(n);
      this.formed = { e1: take(n * n), e2r: take(n * n), e2i: take(n * n) };
    } else {
      this.luReal = this.flatReal = new DenseLu(n);
      this.luComplex = this.flatComplex = new ComplexLu(n);
    }
    this.fdWork = take(n);
    this.mass = p.mass;
    this.jacobianSize = n * n;
    this.analytic = p.calls.hasJacobian;
  }

  evaluate(t: number, y: Float64Array, f: Float64Array, out: Float64Array): number {
    if (this.analytic) {
      out.fill(0);
      this.p.calls.jacobian(t, y, out);
      return 0;
    }
    return finiteDifferenceJacobian(this.p.rhs, t, y, f, out, this.fdWork);
  }

  nonFiniteRows(jac: Float64Array): readonly number[] {
    const n = this.n;
    for (let k = 0; k < n * n; k++) {
      if (!Number.isFinite(jac[k]!)) {
        const rows = new Set<number>();
        for (let m = k; m < n * n; m++) if (!Number.isFinite(jac[m]!)) rows.add(Math.floor(m / n));
        return [...rows];
      }
    }
    return NO_ROWS;
  }

  factor(J: Float64Array, fac1: number, alphn: number, betan: number): number {
    const real = this.flatReal;
    if (real) {
      const bad = real.factorShifted(J, fac1, this.mass);
      return bad >= 0 ? bad : this.flatComplex!.factorShifted(J, alphn, betan, this.mass);
    }
    const { n, mass } = this;
    const { e1, e2r, e2i } = this.formed!;
    formShifted(n, J, fac1, mass, e1);
    formShifted(n, J, alphn, mass, e2r);
    scaledMass(n, betan, mass, e2i);
    const r = this.luReal.factor(e1);
    return r >= 0 ? r : this.luComplex.factor(e2r, e2i);
  }

  toDense(jac: Float64Array, out: Float64Array): Float64Array {
    out.set(jac);
    return out;
  }

  storage(): { jacobian: number; iterationMatrices: number; factors: number } {
    const n = this.n;
    return { jacobian: 0, iterationMatrices: this.formed ? 3 * n * n : 0, factors: 3 * n * n };
  }
}
