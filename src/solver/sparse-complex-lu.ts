import { analyseBand, type BandStructure } from './band-structure.js';
import { REFINEMENT_THRESHOLD } from './sparse-lu.js';
import { PIVOT_RELATIVE_TOLERANCE, powerOfTwoInverse, type ComplexLinearSolver } from './linear-solver.js';
import { identityPermutation, packedDoubles, packedIndices } from './packed-doubles.js';
import type { SparsePattern } from './sparse-pattern.js';

/**
 * A {@link ComplexLinearSolver} that also factors values given on the pattern.
 *
 * @example
 * ```ts
 * const lu = createSparseComplexLu(pattern);
 * lu.factorValues(re.values, im.values);
 * ```
 */
export interface SparseComplexLinearSolver extends ComplexLinearSolver {
  readonly structure: BandStructure;
  /** Factor re + i im given on the pattern (pattern order). Returns as factor(). */
  factorValues(re: Float64Array, im: Float64Array): number;
}

/**
 * The complex counterpart of {@link createSparseLu}: the same symbolic
 * analysis (reverse Cuthill-McKee, band), band LU with partial pivoting by
 * |re| + |im| in complex arithmetic (as the dense complex kernel), the same
 * equilibration and singular-pivot test. Checked against the dense complex
 * LU in test/solver/sparse-lu.test.ts.
 *
 * @example
 * ```ts
 * const lu = createSparseComplexLu(sparsePattern(2, [0], [1]));
 * lu.factor(Float64Array.of(1, 1, 0, 1), Float64Array.of(1, 0, 0, 0)); // [[1+i, 1], [0, 1]]
 * ```
 */
export function createSparseComplexLu(pattern: SparsePattern, structure: BandStructure = analyseBand(pattern)): SparseComplexLinearSolver {
  const { n } = pattern;
  const { lower: kl, upper: ku, width: w } = structure;
  // Plain arrays of small integers and of doubles, inputs copied in: as the real kernel ({@link createSparseLu}).
  const rowStart = packedIndices(pattern.rowStart);
  const col = packedIndices(pattern.col);
  const order = packedIndices(structure.order);
  const slotOfEntry = packedIndices(structure.slotOfEntry);
  const nnz = col.length;
  const br = packedDoubles(n * w);
  const bi = packedDoubles(n * w);
  const mr = packedDoubles(n * kl);
  const mi = packedDoubles(n * kl);
  const pivotRow = identityPermutation(n);
  const rowScale = packedDoubles(n);
  const colScale = packedDoubles(n);
  const xr = packedDoubles(n);
  const xi = packedDoubles(n);
  /** The dense matrix gathered onto the pattern by factor(). */
  const valuesRe = new Float64Array(nnz);
  const valuesIm = new Float64Array(nnz);
  /** The matrix last factored (unscaled, on the pattern), for the refinement step. */
  const factoredRe = packedDoubles(nnz);
  const factoredIm = packedDoubles(nnz);
  /** The right-hand side, the solution before refinement and its residual. */
  const b0Re = packedDoubles(n);
  const b0Im = packedDoubles(n);
  const solRe = packedDoubles(n);
  const solIm = packedDoubles(n);
  const rRe = packedDoubles(n);
  const rIm = packedDoubles(n);
  const tol = PIVOT_RELATIVE_TOLERANCE * n;

  function gather(re: Float64Array, im: Float64Array): void {
    for (let i = 0; i < n; i++) {
      let inPattern = 0;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        const j = col[e]!;
        valuesRe[e] = re[i * n + j]!;
        valuesIm[e] = im[i * n + j]!;
        if (valuesRe[e] !== 0 || valuesIm[e] !== 0) inPattern++;
      }
      let nonZero = 0;
      for (let j = 0; j < n; j++) if (re[i * n + j] !== 0 || im[i * n + j] !== 0) nonZero++;
      if (nonZero !== inPattern) throw new RangeError(`sparse complex LU: row ${i} has a non-zero entry outside the sparsity pattern`);
    }
  }

  function factorValues(inputRe: Float64Array, inputIm: Float64Array): number {
    const re = factoredRe;
    const im = factoredIm;
    for (let e = 0; e < nnz; e++) {
      re[e] = inputRe[e]!;
      im[e] = inputIm[e]!;
    }
    for (let i = 0; i < n; i++) {
      let m = 0;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        const a = Math.abs(re[e]!) + Math.abs(im[e]!);
        if (!Number.isFinite(a)) return col[e]!;
        if (a > m) m = a;
      }
      rowScale[i] = powerOfTwoInverse(m);
    }
    for (let j = 0; j < n; j++) colScale[j] = 0;
    for (let i = 0; i < n; i++) {
      const r = rowScale[i]!;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        colScale[col[e]!] = Math.max(colScale[col[e]!]!, r * (Math.abs(re[e]!) + Math.abs(im[e]!)));
      }
    }
    for (let j = 0; j < n; j++) colScale[j] = powerOfTwoInverse(colScale[j]!);
    for (let s = 0; s < n * w; s++) {
      br[s] = 0;
      bi[s] = 0;
    }
    for (let i = 0; i < n; i++) {
      const r = rowScale[i]!;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        const c = r * colScale[col[e]!]!;
        br[slotOfEntry[e]!] = c * re[e]!;
        bi[slotOfEntry[e]!] = c * im[e]!;
      }
    }
    for (let k = 0; k < n; k++) {
      const last = Math.min(n - 1, k + kl);
      let p = k;
      let pmax = Math.abs(br[k * w + kl]!) + Math.abs(bi[k * w + kl]!);
      for (let i = k + 1; i <= last; i++) {
        const s = i * w + (k - i + kl);
        const a = Math.abs(br[s]!) + Math.abs(bi[s]!);
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
          let t = br[ik]!;
          br[ik] = br[ip]!;
          br[ip] = t;
          t = bi[ik]!;
          bi[ik] = bi[ip]!;
          bi[ip] = t;
        }
      }
      const pr = br[k * w + kl]!;
      const pi = bi[k * w + kl]!;
      const d = pr * pr + pi * pi;
      const ir = pr / d;
      const ii = -pi / d;
      const rowK = k * w - k + kl;
      for (let i = k + 1; i <= last; i++) {
        const ik = i * w + (k - i + kl);
        const ar = br[ik]!;
        const ai = bi[ik]!;
        const lr = ar * ir - ai * ii;
        const li = ar * ii + ai * ir;
        mr[k * kl + (i - k - 1)] = lr;
        mi[k * kl + (i - k - 1)] = li;
        br[ik] = 0;
        bi[ik] = 0;
        if (lr === 0 && li === 0) continue;
        const rowI = i * w - i + kl;
        for (let j = k + 1; j <= right; j++) {
          const ur = br[rowK + j]!;
          const ui = bi[rowK + j]!;
          br[rowI + j] = br[rowI + j]! - (lr * ur - li * ui);
          bi[rowI + j] = bi[rowI + j]! - (lr * ui + li * ur);
        }
      }
    }
    return -1;
  }

  /**
   * Solve, then one step of iterative refinement where the backward error asks for it, as the real
   * kernel ({@link createSparseLu}): b read once and written with the solution (again when refined),
   * the rest on the kernel's arrays.
   */
  function solve(bRe: Float64Array, bIm: Float64Array): void {
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      const r = rowScale[i]!;
      const vr = bRe[i]!;
      const vi = bIm[i]!;
      b0Re[i] = vr;
      b0Im[i] = vi;
      xr[k] = r * vr;
      xi[k] = r * vi;
    }
    substitute();
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      const c = colScale[i]!;
      const sr = c * xr[k]!;
      const si = c * xi[k]!;
      solRe[i] = sr;
      solIm[i] = si;
      bRe[i] = sr;
      bIm[i] = si;
    }
    let backward = 0;
    for (let i = 0; i < n; i++) {
      let sr = b0Re[i]!;
      let si = b0Im[i]!;
      let size = Math.abs(sr) + Math.abs(si);
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        const ar = factoredRe[e]!;
        const ai = factoredIm[e]!;
        const xr = solRe[col[e]!]!;
        const xi = solIm[col[e]!]!;
        const tr = ar * xr - ai * xi;
        const ti = ar * xi + ai * xr;
        sr -= tr;
        si -= ti;
        size += Math.abs(tr) + Math.abs(ti);
      }
      rRe[i] = sr;
      rIm[i] = si;
      if (size > 0) backward = Math.max(backward, (Math.abs(sr) + Math.abs(si)) / size);
    }
    if (!(backward > REFINEMENT_THRESHOLD) || !Number.isFinite(backward)) return;
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      xr[k] = rowScale[i]! * rRe[i]!;
      xi[k] = rowScale[i]! * rIm[i]!;
    }
    substitute();
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      bRe[i] = solRe[i]! + colScale[i]! * xr[k]!;
      bIm[i] = solIm[i]! + colScale[i]! * xi[k]!;
    }
  }

  /** Forward and back substitution with the factors on (xr, xi) (the permuted, row-scaled right-hand side), in place. */
  function substitute(): void {
    for (let k = 0; k < n; k++) {
      const p = pivotRow[k]!;
      if (p !== k) {
        let t = xr[k]!;
        xr[k] = xr[p]!;
        xr[p] = t;
        t = xi[k]!;
        xi[k] = xi[p]!;
        xi[p] = t;
      }
      const ar = xr[k]!;
      const ai = xi[k]!;
      if (ar === 0 && ai === 0) continue;
      const last = Math.min(n - 1, k + kl);
      for (let i = k + 1; i <= last; i++) {
        const lr = mr[k * kl + (i - k - 1)]!;
        const li = mi[k * kl + (i - k - 1)]!;
        xr[i] = xr[i]! - (lr * ar - li * ai);
        xi[i] = xi[i]! - (lr * ai + li * ar);
      }
    }
    for (let k = n - 1; k >= 0; k--) {
      const rowK = k * w - k + kl;
      const right = Math.min(n - 1, k + kl + ku);
      let sr = xr[k]!;
      let si = xi[k]!;
      for (let j = k + 1; j <= right; j++) {
        const ur = br[rowK + j]!;
        const ui = bi[rowK + j]!;
        sr -= ur * xr[j]! - ui * xi[j]!;
        si -= ur * xi[j]! + ui * xr[j]!;
      }
      const pr = br[rowK + k]!;
      const pi = bi[rowK + k]!;
      const d = pr * pr + pi * pi;
      xr[k] = (sr * pr + si * pi) / d;
      xi[k] = (si * pr - sr * pi) / d;
    }
  }

  return {
    size: n,
    structure,
    factor: (re, im) => {
      gather(re, im);
      return factorValues(valuesRe, valuesIm);
    },
    factorValues,
    solve,
  };
}
