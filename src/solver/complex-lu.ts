import { equilibrateComplex, equilibrateComplexRow, finishColumnScales } from './dense-equilibration.js';
import { PIVOT_RELATIVE_TOLERANCE, type ComplexLinearSolver } from './linear-solver.js';
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

  /** {@link factorShifted} with the shifts in fields (see the real LU's). */
  private factorHeldShift(jac: Float64Array, mass: SparseMass | undefined): number {
    const { size: n, ar, ai, rowScale, colScale, shiftRe, shiftIm } = this;
    for (let j = 0; j < n; j++) colScale[j] = 0;
    for (let i = 0; i < n; i++) {
      const row = i * n;
      for (let j = 0; j < n; j++) {
        ar[row + j] = -jac[row + j]!;
        ai[row + j] = 0;
      }
      if (mass) {
        const { rowStart, col, value } = mass;
        for (let k = rowStart[i]!; k < rowStart[i + 1]!; k++) {
          const idx = row + col[k]!;
          ar[idx] = ar[idx]! + shiftRe * value[k]!;
          ai[idx] = shiftIm * value[k]!;
        }
      } else {
        ar[row + i] = ar[row + i]! + shiftRe;
        ai[row + i] = shiftIm;
      }
      // The row's part of equilibrateComplex (see the real LU's factorShifted).
      const bad = equilibrateComplexRow(n, i, ar, ai, rowScale, colScale);
      if (bad >= 0) return bad;
    }
    finishColumnScales(n, colScale);
    return this.scaleAndEliminate();
  }

  /** The matrix in (ar, ai) equilibrated in place, then the elimination. */
  private scaleAndEliminate(): number {
    const { size: n, ar, ai, perm, rowScale, colScale } = this;
    for (let i = 0; i < n; i++) {
      perm[i] = i;
      const row = i * n;
      const r = rowScale[i]!;
      for (let j = 0; j < n; j++) {
        const c = r * colScale[j]!;
        ar[row + j] = c * ar[row + j]!;
        ai[row + j] = c * ai[row + j]!;
      }
    }
    return this.eliminate();
  }

  /** Gaussian elimination with partial pivoting of the equilibrated matrix in (ar, ai) (perm the identity on entry). */
  private eliminate(): number {
    const { size: n, ar, ai, perm, pivotNorm, tol } = this;
    for (let k = 0; k < n; k++) {
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
