import { createDenseLu } from './dense-lu.js';
import type { RealLinearSolver } from './linear-solver.js';
import { createSparseLu, type SparseRealLinearSolver } from './sparse-lu.js';
import { patternOfDense } from './sparse-pattern.js';
import { SPARSE_MIN_SIZE } from './types.js';

/**
 * A {@link RealLinearSolver} for dense-stored matrices that are sparse in
 * fact but whose pattern nobody declared (the systems of consistent
 * initialisation: rows of M and of J recombined). Below
 * {@link SPARSE_MIN_SIZE} it is the dense LU. From there on it factors with
 * the sparse LU on the pattern of the matrix's present non-zeros, keeping
 * that pattern's symbolic analysis (ordering, band) for the next matrices
 * and redoing it only when a non-zero falls outside it. Pivots and the
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
  return {
    size: n,
    factor(a) {
      if (sparse) {
        try {
          return sparse.factor(a);
        } catch (e) {
          if (!(e instanceof RangeError)) throw e;
        }
      }
      sparse = createSparseLu(patternOfDense(a, n));
      return sparse.factor(a);
    },
    solve(b) {
      if (!sparse) throw new Error('createPatternAdaptiveLu: solve before factor');
      sparse.solve(b);
    },
  };
}
