import { collectColumnMaxima, equilibrateReal, equilibrateRealRow, finishColumnScales, firstNonFiniteColumn } from './dense-equilibration.js';
import { PIVOT_RELATIVE_TOLERANCE, powerOfTwoInverse, type RealLinearSolver } from './linear-solver.js';
import { identityPermutation, packedDoubles } from './packed-doubles.js';
import type { SparseMass } from './sparse-mass.js';

/**
 * Real LU factorisation with partial pivoting of a row-major Float64Array
 * (Doolittle, row-oriented k-i-j loop; Golub and Van Loan, Matrix
 * Computations, Algorithm 3.4.1). Buffers are allocated once; factor and
 * solve allocate nothing. The factors are kept in plain arrays of doubles,
 * not typed arrays (docs/solver.md, "Sixth pass", says why). Checked
 * against ml-matrix's LuDecomposition in test/solver/dense-lu.test.ts;
 * `npm run bench` measures both.
 *
 * @example
 * ```ts
 * const lu = createDenseLu(2);
 * if (lu.factor(Float64Array.of(2, 1, 1, 3)) === -1) {
 *   const b = Float64Array.of(3, 5);
 *   lu.solve(b); // b = [0.8, 1.4]
 * }
 * ```
 */
export function createDenseLu(n: number): RealLinearSolver {
  return new DenseLu(n);
}

/**
 * A class, not closures: its methods are one function for every instance, so a call site
 * that saw one solver sees the same target with the next (closures made per solver are new
 * targets, and the code specialised on the first deoptimised with the second).
 *
 * @internal
 */
export class DenseLu implements RealLinearSolver {
  private readonly lu: number[];
  private readonly perm: number[];
  private readonly rowScale: number[];
  private readonly colScale: number[];
  private readonly tmp: number[];
  private readonly tol: number;
  /** The shift of the matrix being factored by factorShifted. */
  private shift = NaN;

  constructor(readonly size: number) {
    const n = size;
    this.lu = packedDoubles(n * n);
    this.perm = identityPermutation(n);
    this.rowScale = packedDoubles(n);
    this.colScale = packedDoubles(n);
    this.tmp = packedDoubles(n);
    this.tol = PIVOT_RELATIVE_TOLERANCE * n;
  }

  factor(a: Float64Array): number {
    const { size: n, lu, rowScale, colScale } = this;
    // Copied in first, so that equilibration and elimination only ever read the factor's own
    // storage (one kind of array at their loads); the same values as reading `a`, bit for bit.
    for (let k = 0; k < n * n; k++) lu[k] = a[k]!;
    const nonFinite = equilibrateReal(n, lu, rowScale, colScale);
    if (nonFinite >= 0) return nonFinite;
    return this.scaleAndEliminate();
  }

  /**
   * Factor shift M - J (M the identity when `mass` is undefined) without a matrix of its own:
   * each row is formed in the factor's storage and at once scanned for its equilibration scale,
   * with the same operations as {@link factor} of the formed matrix (the same factors and result,
   * bit for bit), and no separate passes to form it, copy it in and read it back.
   */
  factorShifted(jac: Float64Array, shift: number, mass: SparseMass | undefined): number {
    this.shift = shift;
    return this.factorHeldShift(jac, mass);
  }

  /**
   * {@link factorShifted} with the shift in a field (a number passed to a call that is not inlined
   * is boxed on the heap). With M the identity each row is formed and its largest entry found in
   * one pass, the diagonal taken out of the loop (the same entries, -J + shift computed as before),
   * then its column maxima. One finiteness probe per row, not a test per entry: the sum of the
   * row's |entries| is finite when every entry is (they are non-negative, so no Infinity - Infinity
   * can hide one, and a NaN stays NaN); when it is not, the row is read again for the first
   * non-finite column (none when the sum only overflowed), the same column as a test per entry.
   */
  private factorHeldShift(jac: Float64Array, mass: SparseMass | undefined): number {
    if (mass) {
      const bad = this.formShiftedWithMass(jac, mass);
      if (bad >= 0) return bad;
      finishColumnScales(this.size, this.colScale);
      return this.scaleAndEliminate();
    }
    const { size: n, lu, rowScale, colScale, shift } = this;
    for (let j = 0; j < n; j++) colScale[j] = 0;
    for (let i = 0; i < n; i++) {
      const row = i * n;
      const diagonal = row + i;
      const end = row + n;
      let m = 0;
      let probe = 0;
      for (let k = row; k < diagonal; k++) {
        const v = -jac[k]!;
        lu[k] = v;
        const a = Math.abs(v);
        probe += a;
        if (a > m) m = a;
      }
      const d = -jac[diagonal]! + shift;
      lu[diagonal] = d;
      const ad = Math.abs(d);
      probe += ad;
      if (ad > m) m = ad;
      for (let k = diagonal + 1; k < end; k++) {
        const v = -jac[k]!;
        lu[k] = v;
        const a = Math.abs(v);
        probe += a;
        if (a > m) m = a;
      }
      if (!(probe < Infinity)) {
        const bad = firstNonFiniteColumn(n, i, lu);
        if (bad >= 0) return bad;
      }
      const r = powerOfTwoInverse(m);
      rowScale[i] = r;
      collectColumnMaxima(n, i, lu, r, colScale);
    }
    finishColumnScales(n, colScale);
    return this.scaleAndEliminate();
  }

  /** {@link factorHeldShift}'s forming for shift M - J with M in compressed rows: each row formed, then equilibrateRealRow while it is at hand. */
  private formShiftedWithMass(jac: Float64Array, mass: SparseMass): number {
    const { size: n, lu, rowScale, colScale, shift } = this;
    const { rowStart, col, value } = mass;
    for (let j = 0; j < n; j++) colScale[j] = 0;
    for (let i = 0; i < n; i++) {
      const row = i * n;
      for (let j = 0; j < n; j++) lu[row + j] = -jac[row + j]!;
      for (let k = rowStart[i]!; k < rowStart[i + 1]!; k++) {
        const idx = row + col[k]!;
        lu[idx] = lu[idx]! + shift * value[k]!;
      }
      // The row's part of equilibrateReal (the rows below are not read by it).
      const bad = equilibrateRealRow(n, i, lu, rowScale, colScale);
      if (bad >= 0) return bad;
    }
    return -1;
  }

  /**
   * The matrix in `lu` equilibrated in place and eliminated, the scaling folded into the first
   * elimination step: each entry is scaled (r_i a_ij c_j, as a pass of its own would) just before
   * that step first reads it, so the matrix is swept once less (the same numbers, bit for bit).
   */
  private scaleAndEliminate(): number {
    const { size: n, lu, perm, rowScale, colScale, tol } = this;
    if (n === 0) return -1;
    // Column 0 scaled, and its pivot searched as eliminate does.
    const c0 = colScale[0]!;
    for (let i = 0; i < n; i++) {
      perm[i] = i;
      lu[i * n] = rowScale[i]! * lu[i * n]! * c0;
    }
    let p = 0;
    let pmax = Math.abs(lu[0]!);
    for (let i = 1; i < n; i++) {
      const v = Math.abs(lu[i * n]!);
      if (v > pmax) {
        pmax = v;
        p = i;
      }
    }
    if (p !== 0) {
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        const t = lu[rp + j]!;
        lu[rp + j] = lu[j]!;
        lu[j] = t;
      }
      perm[p] = 0;
      perm[0] = p;
    }
    // The pivot row scaled (with its own row's scale: rows are swapped whole, scales stay with perm).
    const r0 = rowScale[p]!;
    for (let j = 1; j < n; j++) lu[j] = r0 * lu[j]! * colScale[j]!;
    if (!(pmax > tol) || !Number.isFinite(pmax)) return 0;
    const pivot = lu[0]!;
    for (let i = 1; i < n; i++) {
      const ri = i * n;
      const r = rowScale[perm[i]!]!;
      const l = lu[ri]! / pivot;
      lu[ri] = l;
      if (l !== 0) {
        for (let j = 1; j < n; j++) lu[ri + j] = r * lu[ri + j]! * colScale[j]! - l * lu[j]!;
      } else {
        for (let j = 1; j < n; j++) lu[ri + j] = r * lu[ri + j]! * colScale[j]!;
      }
    }
    return this.eliminate(1);
  }

  /** Gaussian elimination with partial pivoting of the equilibrated matrix in `lu`, from column `from` on (the columns before done). */
  private eliminate(from: number): number {
    const { size: n, lu, perm, tol } = this;
    for (let k = from; k < n; k++) {
      let p = k;
      let pmax = Math.abs(lu[k * n + k]!);
      for (let i = k + 1; i < n; i++) {
        const v = Math.abs(lu[i * n + k]!);
        if (v > pmax) {
          pmax = v;
          p = i;
        }
      }
      if (p !== k) {
        const rp = p * n;
        const rk = k * n;
        for (let j = 0; j < n; j++) {
          const t = lu[rp + j]!;
          lu[rp + j] = lu[rk + j]!;
          lu[rk + j] = t;
        }
        const tp = perm[p]!;
        perm[p] = perm[k]!;
        perm[k] = tp;
      }
      // Not finite (NaN entries) or negligible in the equilibrated matrix: singular.
      if (!(pmax > tol) || !Number.isFinite(pmax)) return k;
      const rk = k * n;
      const pivot = lu[rk + k]!;
      for (let i = k + 1; i < n; i++) {
        const ri = i * n;
        const l = lu[ri + k]! / pivot;
        lu[ri + k] = l;
        if (l !== 0) {
          for (let j = k + 1; j < n; j++) lu[ri + j] = lu[ri + j]! - l * lu[rk + j]!;
        }
      }
    }
    return -1;
  }

  solve(b: Float64Array): void {
    const { size: n, lu, perm, rowScale, colScale, tmp } = this;
    // Forward (L has a unit diagonal), reading the permuted, row-scaled b as it goes; then backward,
    // writing each x_i scaled by its column as soon as it is final (the same operations as three passes).
    for (let i = 0; i < n; i++) {
      const p = perm[i]!;
      const ri = i * n;
      let s = rowScale[p]! * b[p]!;
      for (let j = 0; j < i; j++) s -= lu[ri + j]! * tmp[j]!;
      tmp[i] = s;
    }
    for (let i = n - 1; i >= 0; i--) {
      const ri = i * n;
      let s = tmp[i]!;
      for (let j = i + 1; j < n; j++) s -= lu[ri + j]! * tmp[j]!;
      const x = s / lu[ri + i]!;
      tmp[i] = x;
      b[i] = colScale[i]! * x;
    }
  }
}
