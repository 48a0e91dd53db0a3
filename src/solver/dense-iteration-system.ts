import { createComplexLu } from './complex-lu.js';
import { createDenseLu } from './dense-lu.js';
import { finiteDifferenceJacobian } from './finite-difference-jacobian.js';
import { ownFloat64, type TakeFloat64 } from './float64-chunks.js';
import type { IterationSystem } from './iteration-system.js';
import { createEmbeddedComplexLu, createMlMatrixLu } from './ml-matrix-lu.js';
import type { NormalizedDae } from './normalize-problem.js';

/**
 * The {@link IterationSystem} on dense row-major n x n arrays: J from the
 * problem's Jacobian (or finite differences), the iteration matrices built
 * entry by entry and factored by the flat LU kernels (or ml-matrix's, with
 * `linearAlgebra: 'ml-matrix'`). The choice for small n, where it is fastest.
 * Work arrays from `take` ({@link TakeFloat64}).
 *
 * @internal
 * @example
 * ```ts
 * const system = createDenseIterationSystem(normalizeDae(problem));
 * ```
 */
export function createDenseIterationSystem(p: NormalizedDae, take: TakeFloat64 = ownFloat64): IterationSystem {
  const n = p.n;
  const luReal = p.linearAlgebra === 'ml-matrix' ? createMlMatrixLu(n) : createDenseLu(n, take);
  const luComplex = p.linearAlgebra === 'ml-matrix' ? createEmbeddedComplexLu(n) : createComplexLu(n, take);
  const e1 = take(n * n);
  const e2r = take(n * n);
  const e2i = take(n * n);
  const fdWork = take(n);
  // Sparse copy of M (CSR) for adding its multiples; none for the identity.
  let mRowPtr: Int32Array | undefined;
  let mCol: Int32Array | undefined;
  let mVal: Float64Array | undefined;
  if (p.mass) {
    mRowPtr = p.mass.rowStart;
    mCol = p.mass.col;
    mVal = p.mass.value;
  }
  const jf = p.jacobian;
  return {
    luReal,
    luComplex,
    jacobianSize: n * n,
    analytic: jf !== undefined,
    evaluate(t, y, f, out) {
      if (jf) {
        out.fill(0);
        jf(t, y, out);
        return 0;
      }
      return finiteDifferenceJacobian(p.rhs, t, y, f, out, fdWork);
    },
    nonFiniteRows(jac) {
      for (let k = 0; k < n * n; k++) {
        if (!Number.isFinite(jac[k]!)) {
          const rows = new Set<number>();
          for (let m = k; m < n * n; m++) if (!Number.isFinite(jac[m]!)) rows.add(Math.floor(m / n));
          return [...rows];
        }
      }
      return [];
    },
    factor(J, fac1, alphn, betan) {
      for (let k = 0; k < n * n; k++) {
        const v = -J[k]!;
        e1[k] = v;
        e2r[k] = v;
      }
      e2i.fill(0);
      if (!mRowPtr) {
        for (let i = 0; i < n; i++) {
          e1[i * n + i] = e1[i * n + i]! + fac1;
          e2r[i * n + i] = e2r[i * n + i]! + alphn;
          e2i[i * n + i] = betan;
        }
      } else {
        const col = mCol!;
        const val = mVal!;
        for (let i = 0; i < n; i++) {
          for (let k = mRowPtr[i]!; k < mRowPtr[i + 1]!; k++) {
            const idx = i * n + col[k]!;
            const m = val[k]!;
            e1[idx] = e1[idx]! + fac1 * m;
            e2r[idx] = e2r[idx]! + alphn * m;
            e2i[idx] = betan * m;
          }
        }
      }
      const real = luReal.factor(e1);
      return real >= 0 ? real : luComplex.factor(e2r, e2i);
    },
    toDense(jac, out) {
      out.set(jac);
      return out;
    },
    storage: () => ({ jacobian: 0, iterationMatrices: 3 * n * n, factors: 3 * n * n }),
  };
}
