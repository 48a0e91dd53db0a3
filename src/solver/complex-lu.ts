import {
  collectComplexColumnMaxima,
  equilibrateComplex,
  equilibrateComplexRow,
  finishColumnScales,
  firstNonFiniteComplexColumn,
} from './dense-equilibration.js';
import { PIVOT_RELATIVE_TOLERANCE, powerOfTwoInverse, type ComplexLinearSolver } from './linear-solver.js';
import { identityPermutation, packedDoubles } from './packed-doubles.js';
import type { SparseMass } from './sparse-mass.js';

/**
 * Complex LU factorisation with partial pivoting on split real/imaginary
 * row-major Float64Arrays, for the complex Radau iteration matrix
 * ((alpha - i beta)/h) M - J. Same algorithm as {@link createDenseLu} in
 * complex arithmetic (Golub and Van Loan, Algorithm 3.4.1); it does about half
 * the floating-point work of the real 2n x 2n embedding. The factors are
 * kept in plain arrays of doubles (docs/solver.md, "Sixth pass", says
 * why). Checked against ml-matrix on the real embedding in
 * test/solver/complex-lu.test.ts; `npm run bench` measures both.
 *
 * @example
 * ```ts
 * const lu = createComplexLu(1);
 * lu.factor(Float64Array.of(0), Float64Array.of(2)); // A = 2i
 * const re = Float64Array.of(4), im = Float64Array.of(0);
 * lu.solve(re, im); // x = -2i
 * ```
 */
export function createComplexLu(n: number): ComplexLinearSolver {
  return new ComplexLu(n);
}

/**
 * A class, not closures: its methods are one function for every instance, so a call site
 * that saw one solver sees the same target with the next (closures made per solver are new
 * targets, and the code specialised on the first deoptimised with the second).
 *
 * @internal
 */
export class ComplexLu implements ComplexLinearSolver {
  private readonly ar: number[];
  private readonly ai: number[];
  private readonly perm: number[];
  private readonly rowScale: number[];
  private readonly colScale: number[];
  private readonly tr: number[];
  private readonly ti: number[];
  /** |pivot|^2 of each row of U (re^2 + im^2), computed by the elimination and read by every solve. */
  private readonly pivotNorm: number[];
  private readonly tol: number;
  /** The shift of the matrix being factored by factorShifted. */
  private shiftRe = NaN;
  private shiftIm = NaN;

  constructor(readonly size: number) {
    const n = size;
    this.ar = packedDoubles(n * n);
    this.ai = packedDoubles(n * n);
    this.perm = identityPermutation(n);
    this.rowScale = packedDoubles(n);
    this.colScale = packedDoubles(n);
    this.tr = packedDoubles(n);
    this.ti = packedDoubles(n);
    this.pivotNorm = packedDoubles(n);
    this.tol = PIVOT_RELATIVE_TOLERANCE * n;
  }

  factor(re: Float64Array, im: Float64Array): number {
    const { size: n, ar, ai, rowScale, colScale } = this;
    // Copied in first, as in the real LU: the loops below read only the factor's own storage.
    for (let k = 0; k < n * n; k++) {
      ar[k] = re[k]!;
      ai[k] = im[k]!;
    }
    const nonFinite = equilibrateComplex(n, ar, ai, rowScale, colScale);
    if (nonFinite >= 0) return nonFinite;
    return this.scaleAndEliminate();
  }

  /**
   * Factor (shiftRe + i shiftIm) M - J (M the identity when `mass` is undefined) without
   * matrices of their own: each row is formed in the factor's storage and at once scanned for its
   * equilibration scale, with the same operations as {@link factor} of the formed matrix (the
   * same factors and result, bit for bit), and no separate passes to form them and read them
   * back.
   */
  factorShifted(jac: Float64Array, shiftRe: number, shiftIm: number, mass: SparseMass | undefined): number {
    this.shiftRe = shiftRe;
    this.shiftIm = shiftIm;
    return this.factorHeldShift(jac, mass);
  }

  /**
   * {@link factorShifted} with the shifts in fields (see the real LU's). With M the identity each
   * row is formed and scanned in one pass with the diagonal out of the loop and one finiteness
   * probe per row, as in the real LU. Off the diagonal the imaginary part is 0, so |re| + |im| is
   * |re| there exactly (x + 0 is x for every x >= +0, NaN and Infinity included) and is not summed.
   */
  private factorHeldShift(jac: Float64Array, mass: SparseMass | undefined): number {
    if (mass) {
      const bad = this.formShiftedWithMass(jac, mass);
      if (bad >= 0) return bad;
      finishColumnScales(this.size, this.colScale);
      return this.scaleAndEliminate();
    }
    const { size: n, ar, ai, rowScale, colScale, shiftRe, shiftIm } = this;
    const absShiftIm = Math.abs(shiftIm);
    for (let j = 0; j < n; j++) colScale[j] = 0;
    for (let i = 0; i < n; i++) {
      const row = i * n;
      const diagonal = row + i;
      const end = row + n;
      let m = 0;
      let probe = 0;
      for (let k = row; k < diagonal; k++) {
        const v = -jac[k]!;
        ar[k] = v;
        ai[k] = 0;
        const a = Math.abs(v);
        probe += a;
        if (a > m) m = a;
      }
      const d = -jac[diagonal]! + shiftRe;
      ar[diagonal] = d;
      ai[diagonal] = shiftIm;
      const ad = Math.abs(d) + absShiftIm;
      probe += ad;
      if (ad > m) m = ad;
      for (let k = diagonal + 1; k < end; k++) {
        const v = -jac[k]!;
        ar[k] = v;
        ai[k] = 0;
        const a = Math.abs(v);
        probe += a;
        if (a > m) m = a;
      }
      if (!(probe < Infinity)) {
        const bad = firstNonFiniteComplexColumn(n, i, ar, ai);
        if (bad >= 0) return bad;
      }
      const r = powerOfTwoInverse(m);
      rowScale[i] = r;
      if (r !== Infinity) {
        // The column maxima as collectComplexColumnMaxima takes them (compare and store), with |im| = 0 off the diagonal.
        for (let k = row; k < diagonal; k++) {
          const x = r * Math.abs(ar[k]!);
          if (x > colScale[k - row]!) colScale[k - row] = x;
        }
        const x = r * ad;
        if (x > colScale[i]!) colScale[i] = x;
        for (let k = diagonal + 1; k < end; k++) {
          const x = r * Math.abs(ar[k]!);
          if (x > colScale[k - row]!) colScale[k - row] = x;
        }
      } else {
        collectComplexColumnMaxima(n, i, ar, ai, r, colScale);
      }
    }
    finishColumnScales(n, colScale);
    return this.scaleAndEliminate();
  }

  /** {@link factorHeldShift}'s forming for a shift times M in compressed rows: each row formed, then equilibrateComplexRow while it is at hand. */
  private formShiftedWithMass(jac: Float64Array, mass: SparseMass): number {
    const { size: n, ar, ai, rowScale, colScale, shiftRe, shiftIm } = this;
    const { rowStart, col, value } = mass;
    for (let j = 0; j < n; j++) colScale[j] = 0;
    for (let i = 0; i < n; i++) {
      const row = i * n;
      for (let j = 0; j < n; j++) {
        ar[row + j] = -jac[row + j]!;
        ai[row + j] = 0;
      }
      for (let k = rowStart[i]!; k < rowStart[i + 1]!; k++) {
        const idx = row + col[k]!;
        ar[idx] = ar[idx]! + shiftRe * value[k]!;
        ai[idx] = shiftIm * value[k]!;
      }
      const bad = equilibrateComplexRow(n, i, ar, ai, rowScale, colScale);
      if (bad >= 0) return bad;
    }
    return -1;
  }

  /**
   * The matrix in (ar, ai) equilibrated in place and eliminated, the scaling folded into the first
   * elimination step as in the real LU (the same numbers, bit for bit, one sweep less).
   */
  private scaleAndEliminate(): number {
    const { size: n, ar, ai, perm, pivotNorm, rowScale, colScale, tol } = this;
    if (n === 0) return -1;
    // Column 0 scaled, and its pivot searched as eliminate does.
    const c0 = colScale[0]!;
    for (let i = 0; i < n; i++) {
      perm[i] = i;
      const c = rowScale[i]! * c0;
      ar[i * n] = c * ar[i * n]!;
      ai[i * n] = c * ai[i * n]!;
    }
    let p = 0;
    let pmax = Math.abs(ar[0]!) + Math.abs(ai[0]!);
    for (let i = 1; i < n; i++) {
      const v = Math.abs(ar[i * n]!) + Math.abs(ai[i * n]!);
      if (v > pmax) {
        pmax = v;
        p = i;
      }
    }
    if (p !== 0) {
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        let t = ar[rp + j]!;
        ar[rp + j] = ar[j]!;
        ar[j] = t;
        t = ai[rp + j]!;
        ai[rp + j] = ai[j]!;
        ai[j] = t;
      }
      perm[p] = 0;
      perm[0] = p;
    }
    // The pivot row scaled with its own row's scale.
    const r0 = rowScale[p]!;
    for (let j = 1; j < n; j++) {
      const c = r0 * colScale[j]!;
      ar[j] = c * ar[j]!;
      ai[j] = c * ai[j]!;
    }
    const pr = ar[0]!;
    const pi = ai[0]!;
    const mod = Math.abs(pr) + Math.abs(pi);
    if (!(mod > tol) || !Number.isFinite(mod)) return 0;
    const d = pr * pr + pi * pi;
    pivotNorm[0] = d;
    const ir = pr / d;
    const ii = -pi / d;
    for (let i = 1; i < n; i++) {
      const ri = i * n;
      const r = rowScale[perm[i]!]!;
      const xr = ar[ri]!;
      const xi = ai[ri]!;
      if (xr === 0 && xi === 0) {
        for (let j = 1; j < n; j++) {
          const c = r * colScale[j]!;
          ar[ri + j] = c * ar[ri + j]!;
          ai[ri + j] = c * ai[ri + j]!;
        }
        continue;
      }
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      ar[ri] = lr;
      ai[ri] = li;
      for (let j = 1; j < n; j++) {
        const c = r * colScale[j]!;
        const vr = c * ar[ri + j]!;
        const vi = c * ai[ri + j]!;
        const ur = ar[j]!;
        const ui = ai[j]!;
        ar[ri + j] = vr - (lr * ur - li * ui);
        ai[ri + j] = vi - (lr * ui + li * ur);
      }
    }
    return this.eliminate(1);
  }

  /** Gaussian elimination with partial pivoting of the equilibrated matrix in (ar, ai), from column `from` on (the columns before done). */
  private eliminate(from: number): number {
    const { size: n, ar, ai, perm, pivotNorm, tol } = this;
    for (let k = from; k < n; k++) {
      let p = k;
      let pmax = Math.abs(ar[k * n + k]!) + Math.abs(ai[k * n + k]!);
      for (let i = k + 1; i < n; i++) {
        const v = Math.abs(ar[i * n + k]!) + Math.abs(ai[i * n + k]!);
        if (v > pmax) {
          pmax = v;
          p = i;
        }
      }
      const rk = k * n;
      if (p !== k) {
        const rp = p * n;
        for (let j = 0; j < n; j++) {
          let t = ar[rp + j]!;
          ar[rp + j] = ar[rk + j]!;
          ar[rk + j] = t;
          t = ai[rp + j]!;
          ai[rp + j] = ai[rk + j]!;
          ai[rk + j] = t;
        }
        const tp = perm[p]!;
        perm[p] = perm[k]!;
        perm[k] = tp;
      }
      const pr = ar[rk + k]!;
      const pi = ai[rk + k]!;
      const mod = Math.abs(pr) + Math.abs(pi);
      if (!(mod > tol) || !Number.isFinite(mod)) return k;
      // 1/pivot
      const d = pr * pr + pi * pi;
      pivotNorm[k] = d;
      const ir = pr / d;
      const ii = -pi / d;
      for (let i = k + 1; i < n; i++) {
        const ri = i * n;
        const xr = ar[ri + k]!;
        const xi = ai[ri + k]!;
        if (xr === 0 && xi === 0) continue;
        const lr = xr * ir - xi * ii;
        const li = xr * ii + xi * ir;
        ar[ri + k] = lr;
        ai[ri + k] = li;
        for (let j = k + 1; j < n; j++) {
          const ur = ar[rk + j]!;
          const ui = ai[rk + j]!;
          ar[ri + j] = ar[ri + j]! - (lr * ur - li * ui);
          ai[ri + j] = ai[ri + j]! - (lr * ui + li * ur);
        }
      }
    }
    return -1;
  }

  solve(bRe: Float64Array, bIm: Float64Array): void {
    const { size: n, ar, ai, perm, rowScale, colScale, tr, ti, pivotNorm } = this;
    // Forward with the permuted, row-scaled b read as it goes; backward writing each scaled x_i once final.
    for (let i = 0; i < n; i++) {
      const p = perm[i]!;
      const r = rowScale[p]!;
      const ri = i * n;
      let sr = r * bRe[p]!;
      let si = r * bIm[p]!;
      for (let j = 0; j < i; j++) {
        const lr = ar[ri + j]!;
        const li = ai[ri + j]!;
        sr -= lr * tr[j]! - li * ti[j]!;
        si -= lr * ti[j]! + li * tr[j]!;
      }
      tr[i] = sr;
      ti[i] = si;
    }
    for (let i = n - 1; i >= 0; i--) {
      const ri = i * n;
      let sr = tr[i]!;
      let si = ti[i]!;
      for (let j = i + 1; j < n; j++) {
        const ur = ar[ri + j]!;
        const ui = ai[ri + j]!;
        sr -= ur * tr[j]! - ui * ti[j]!;
        si -= ur * ti[j]! + ui * tr[j]!;
      }
      const pr = ar[ri + i]!;
      const pi = ai[ri + i]!;
      const d = pivotNorm[i]!;
      const xr = (sr * pr + si * pi) / d;
      const xi = (si * pr - sr * pi) / d;
      tr[i] = xr;
      ti[i] = xi;
      const c = colScale[i]!;
      bRe[i] = c * xr;
      bIm[i] = c * xi;
    }
  }
}
