import { createDenseLu } from './dense-lu.js';
import type { RealLinearSolver } from './linear-solver.js';
import { createSparseLu, type SparseRealLinearSolver } from './sparse-lu.js';
import { patternOfDense } from './sparse-pattern.js';
import { maximumTransversalOfDense } from './sparse-transversal.js';
import { SPARSE_MIN_SIZE } from './types.js';

/**
 * A {@link RealLinearSolver} for dense-stored matrices that are sparse in
 * fact but whose pattern nobody declared (the systems of consistent
 * initialisation: rows of M and of J recombined). Below
 * {@link SPARSE_MIN_SIZE} it is the dense LU. From there on it factors with
 * the sparse LU on the pattern of the matrix's present non-zeros, keeping
 * that pattern's symbolic analysis (ordering, band) for the next matrices
 * and redoing it only when a non-zero falls outside it. The rows are first
 * permuted to a maximum transversal ({@link maximumTransversal}): these
 * systems number their rows unrelated to their columns. Pivots and the
 * singular test are those of the dense LU (see {@link createSparseLu}).
 *
 * @internal
 * @example
 * ```ts
 * const lu = createPatternAdaptiveLu(n);
 * if (lu.factor(a) < 0) lu.solve(b);
 * ```
 */
export function createPatternAdaptiveLu(n: number): RealLinearSolver {
  if (n < SPARSE_MIN_SIZE) return createDenseLu(n);
  let sparse: SparseRealLinearSolver | undefined;
  /** Row rowOf[j] of A is row j of the matrix factored (a maximum transversal: non-zeros on the diagonal). */
  let rowOf: Int32Array = new Int32Array(0);
  const permuted = new Float64Array(n * n);
  const x = new Float64Array(n);
  const permute = (a: Float64Array): void => {
    for (let j = 0; j < n; j++) permuted.set(a.subarray(rowOf[j]! * n, rowOf[j]! * n + n), j * n);
  };
  return {
    size: n,
    factor(a) {
      if (sparse) {
        permute(a);
        try {
          return sparse.factor(permuted);
        } catch (e) {
          if (!(e instanceof RangeError)) throw e;
        }
      }
      rowOf = maximumTransversalOfDense(a, n);
      permute(a);
      sparse = createSparseLu(patternOfDense(permuted, n));
      return sparse.factor(permuted);
    },
    solve(b) {
      if (!sparse) throw new Error('createPatternAdaptiveLu: solve before factor');
      for (let j = 0; j < n; j++) x[j] = b[rowOf[j]!]!;
      sparse.solve(x);
      b.set(x);
    },
  };
}
