import { analyseBand, type BandStructure } from './band-structure.js';
import { PIVOT_RELATIVE_TOLERANCE, powerOfTwoInverse, type RealLinearSolver } from './linear-solver.js';
import { identityPermutation, packedDoubles, packedIndices } from './packed-doubles.js';
import { gatherOnPattern, type SparsePattern } from './sparse-pattern.js';

/**
 * Componentwise backward error (max_i |b - A x|_i / (|A| |x| + |b|)_i) above
 * which the sparse kernels take a step of iterative refinement: 64 eps,
 * where the dense LU's stands on well-posed systems (measured about 2e-17).
 *
 * @internal
 */
export const REFINEMENT_THRESHOLD = 64 * Number.EPSILON;

/**
 * A {@link RealLinearSolver} that also factors values given on the pattern
 * directly (what a stamping target fills), without a dense matrix.
 *
 * @example
 * ```ts
 * const lu = createSparseLu(pattern);
 * lu.factorValues(matrix.values); // -1 when every pivot is acceptable
 * lu.solve(b);
 * ```
 */
export interface SparseRealLinearSolver extends RealLinearSolver {
  readonly structure: BandStructure;
  /** Factor the matrix whose entries are `values` on the pattern (pattern order). Returns as factor(). */
  factorValues(values: Float64Array): number;
}

/**
 * Sparse LU for a fixed pattern: the symbolic analysis ({@link analyseBand}:
 * reverse Cuthill-McKee ordering, bandwidths) is done once here; each
 * factorisation is a band LU with partial pivoting on the reordered,
 * equilibrated matrix (the algorithm of LAPACK's DGBTRF/DGBTRS, unblocked;
 * Golub and Van Loan, Matrix Computations, sect. 4.3), O(n b^2) for
 * bandwidth b instead of O(n^3). Equilibration and the singular-pivot test
 * are those of the dense kernels (pivot below 64 n eps of the equilibrated matrix), so
 * both report the same matrices as singular. Checked against the dense LU on
 * random sparse systems in test/solver/sparse-lu.test.ts.
 *
 * `factor(a)` takes a dense row-major matrix (the interface the integrator
 * uses) and throws if a has a non-zero outside the pattern: a silently
 * dropped entry would be a wrong answer.
 *
 * @example
 * ```ts
 * const lu = createSparseLu(sparsePattern(3, [0, 1, 1, 2], [1, 0, 2, 1]));
 * lu.factor(Float64Array.of(2, -1, 0, -1, 2, -1, 0, -1, 2));
 * const b = Float64Array.of(1, 0, 1);
 * lu.solve(b); // [1, 1, 1]
 * ```
 */
export function createSparseLu(pattern: SparsePattern): SparseRealLinearSolver {
  const structure = analyseBand(pattern);
  const { n } = pattern;
  const { lower: kl, upper: ku, width: w } = structure;
  // The pattern and the ordering as plain arrays of small integers, and the factors, scales and
  // work vectors as plain arrays of doubles: no typed-array detach check in the loops below
  // ({@link packedDoubles} says why). Inputs (Float64Array) are copied in first, so that the
  // loops read one kind of array only.
  const rowStart = packedIndices(pattern.rowStart);
  const col = packedIndices(pattern.col);
  const order = packedIndices(structure.order);
  const slotOfEntry = packedIndices(structure.slotOfEntry);
  const nnz = col.length;
  const band = packedDoubles(n * w);
  const multipliers = packedDoubles(n * kl);
  const pivotRow = identityPermutation(n);
  const rowScale = packedDoubles(n);
  const colScale = packedDoubles(n);
  const x = packedDoubles(n);
  /** The dense matrix gathered onto the pattern by factor(). */
  const values = new Float64Array(nnz);
  /** The matrix last factored (unscaled, on the pattern), for the refinement step. */
  const factored = packedDoubles(nnz);
  /** The right-hand side, the solution before refinement and its residual. */
  const b0 = packedDoubles(n);
  const solution = packedDoubles(n);
  const residual = packedDoubles(n);
  const tol = PIVOT_RELATIVE_TOLERANCE * n;

  function gather(a: Float64Array): void {
    const row = gatherOnPattern(pattern, a, values);
    if (row >= 0) throw new RangeError(`sparse LU: row ${row} has a non-zero entry outside the sparsity pattern`);
  }

  function factorValues(input: Float64Array): number {
    const v = factored;
    for (let e = 0; e < nnz; e++) v[e] = input[e]!;
    // Equilibration (as the dense kernels: rows, then columns, powers of two).
    for (let i = 0; i < n; i++) {
      let m = 0;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        const a = Math.abs(v[e]!);
        if (!Number.isFinite(a)) return col[e]!;
        if (a > m) m = a;
      }
      rowScale[i] = powerOfTwoInverse(m);
    }
    for (let j = 0; j < n; j++) colScale[j] = 0;
    for (let i = 0; i < n; i++) {
      const r = rowScale[i]!;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) colScale[col[e]!] = Math.max(colScale[col[e]!]!, r * Math.abs(v[e]!));
    }
    for (let j = 0; j < n; j++) colScale[j] = powerOfTwoInverse(colScale[j]!);
    for (let s = 0; s < n * w; s++) band[s] = 0;
    for (let i = 0; i < n; i++) {
      const r = rowScale[i]!;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) band[slotOfEntry[e]!] = r * v[e]! * colScale[col[e]!]!;
    }
    // Band LU with partial pivoting within the lower band (DGBTF2).
    for (let k = 0; k < n; k++) {
      const last = Math.min(n - 1, k + kl);
      let p = k;
      let pmax = Math.abs(band[k * w + kl]!);
      for (let i = k + 1; i <= last; i++) {
        const a = Math.abs(band[i * w + (k - i + kl)]!);
        if (a > pmax) {
          pmax = a;
          p = i;
        }
      }
      pivotRow[k] = p;
      if (!(pmax > tol)) return order[k]!;
      const right = Math.min(n - 1, k + kl + ku);
      if (p !== k) {
        for (let j = k; j <= right; j++) {
          const ik = k * w + (j - k + kl);
          const ip = p * w + (j - p + kl);
          const t = band[ik]!;
          band[ik] = band[ip]!;
          band[ip] = t;
        }
      }
      const pivot = band[k * w + kl]!;
      for (let i = k + 1; i <= last; i++) {
        const ik = i * w + (k - i + kl);
        const l = band[ik]! / pivot;
        multipliers[k * kl + (i - k - 1)] = l;
        band[ik] = 0;
        if (l === 0) continue;
        const rowI = i * w - i + kl;
        const rowK = k * w - k + kl;
        for (let j = k + 1; j <= right; j++) band[rowI + j] = band[rowI + j]! - l * band[rowK + j]!;
      }
    }
    return -1;
  }

  /**
   * Solve, then, when the componentwise backward error of x is above
   * {@link REFINEMENT_THRESHOLD}, one step of iterative refinement in working
   * precision with the residual b - A x on the pattern (O(nnz)): the
   * fill-reducing order can pivot differently from the dense LU's natural
   * order (seen: 8e-9 where the dense LU has 2e-17, on a network with an open
   * switch and a 1e6 A/Wb leakage path), and one refinement step makes the
   * solution componentwise backward stable all the same
   * (R. D. Skeel, Iterative refinement implies numerical stability for
   * Gaussian elimination, Math. Comp. 35, 1980; Higham, Accuracy and
   * Stability of Numerical Algorithms, sect. 12.2).
   *
   * b is read once (into b0) and written with the solution (again when
   * refined); everything in between runs on the kernel's own arrays.
   */
  function solve(b: Float64Array): void {
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      const bi = b[i]!;
      b0[i] = bi;
      x[k] = rowScale[i]! * bi;
    }
    substitute();
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      const s = colScale[i]! * x[k]!;
      solution[i] = s;
      b[i] = s;
    }
    let backward = 0;
    for (let i = 0; i < n; i++) {
      let s = b0[i]!;
      let size = Math.abs(s);
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        const t = factored[e]! * solution[col[e]!]!;
        s -= t;
        size += Math.abs(t);
      }
      residual[i] = s;
      if (size > 0) backward = Math.max(backward, Math.abs(s) / size);
    }
    // Not finite: leave it to the caller's checks. Already at round-off: nothing to refine.
    if (!(backward > REFINEMENT_THRESHOLD) || !Number.isFinite(backward)) return;
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      x[k] = rowScale[i]! * residual[i]!;
    }
    substitute();
    // The correction A^-1 r (colScale[i] x[k]) added to the solution.
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      b[i] = solution[i]! + colScale[i]! * x[k]!;
    }
  }

  /** Forward and back substitution with the factors on x (the permuted, row-scaled right-hand side), in place. */
  function substitute(): void {
    for (let k = 0; k < n; k++) {
      const p = pivotRow[k]!;
      if (p !== k) {
        const t = x[k]!;
        x[k] = x[p]!;
        x[p] = t;
      }
      const xk = x[k]!;
      if (xk === 0) continue;
      const last = Math.min(n - 1, k + kl);
      for (let i = k + 1; i <= last; i++) x[i] = x[i]! - multipliers[k * kl + (i - k - 1)]! * xk;
    }
    for (let k = n - 1; k >= 0; k--) {
      const rowK = k * w - k + kl;
      const right = Math.min(n - 1, k + kl + ku);
      let s = x[k]!;
      for (let j = k + 1; j <= right; j++) s -= band[rowK + j]! * x[j]!;
      x[k] = s / band[rowK + k]!;
    }
  }

  return {
    size: n,
    structure,
    factor: (a) => {
      gather(a);
      return factorValues(values);
    },
    factorValues,
    solve,
  };
}
