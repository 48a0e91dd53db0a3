import { LuDecomposition, Matrix } from 'ml-matrix';
import { equilibrationScales, PIVOT_RELATIVE_TOLERANCE, type ComplexLinearSolver, type RealLinearSolver } from './linear-solver.js';

/**
 * {@link RealLinearSolver} backed by ml-matrix's LuDecomposition, with our
 * row-scaled near-singular pivot test added (ml-matrix itself reports only
 * exact zero pivots). Kept as the reference the flat kernels are tested
 * against and as a selectable kernel; `npm run bench` compares them.
 *
 * @example
 * ```ts
 * const lu = createMlMatrixLu(2);
 * lu.factor(Float64Array.of(2, 1, 1, 3));
 * const b = Float64Array.of(3, 5);
 * lu.solve(b); // b = [0.8, 1.4]
 * ```
 */
export function createMlMatrixLu(n: number): RealLinearSolver {
  let dec: LuDecomposition | undefined;
  const rhs = new Matrix(n, 1);
  const tol = PIVOT_RELATIVE_TOLERANCE * n;
  const rowScale = new Float64Array(n);
  const colScale = new Float64Array(n);

  function factor(a: Float64Array): number {
    // Same equilibration and pivot test as the flat kernel.
    const nonFinite = equilibrationScales(n, (i, j) => Math.abs(a[i * n + j]!), rowScale, colScale);
    if (nonFinite >= 0) return nonFinite;
    const m = new Matrix(n, n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, rowScale[i]! * a[i * n + j]! * colScale[j]!);
    dec = new LuDecomposition(m);
    // ml-matrix keeps the packed factors in `LU` (not in its type declarations).
    const lu = (dec as unknown as { LU: Matrix }).LU;
    for (let k = 0; k < n; k++) {
      const u = Math.abs(lu.get(k, k));
      if (!(u > tol) || !Number.isFinite(u)) {
        dec = undefined;
        return k;
      }
    }
    return -1;
  }

  function solve(b: Float64Array): void {
    if (!dec) throw new Error('createMlMatrixLu: solve() before a successful factor()');
    for (let i = 0; i < n; i++) rhs.set(i, 0, rowScale[i]! * b[i]!);
    const x = dec.solve(rhs);
    for (let i = 0; i < n; i++) b[i] = colScale[i]! * x.get(i, 0);
  }

  return { size: n, factor, solve };
}

/**
 * {@link ComplexLinearSolver} that embeds A = re + i im as the real 2n x 2n
 * system [[re, -im], [im, re]] and factors it with ml-matrix. Reference for
 * the complex kernel and a selectable alternative.
 *
 * @example
 * ```ts
 * const lu = createEmbeddedComplexLu(1);
 * lu.factor(Float64Array.of(1), Float64Array.of(1)); // 1 + i
 * const re = Float64Array.of(2), im = Float64Array.of(0);
 * lu.solve(re, im); // 1 - i
 * ```
 */
export function createEmbeddedComplexLu(n: number): ComplexLinearSolver {
  const real = createMlMatrixLu(2 * n);
  const big = new Float64Array(4 * n * n);
  const b = new Float64Array(2 * n);
  const m = 2 * n;

  function factor(re: Float64Array, im: Float64Array): number {
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const r = re[i * n + j]!;
        const c = im[i * n + j]!;
        big[i * m + j] = r;
        big[i * m + n + j] = -c;
        big[(n + i) * m + j] = c;
        big[(n + i) * m + n + j] = r;
      }
    }
    const bad = real.factor(big);
    return bad < 0 ? -1 : bad % n;
  }

  function solve(bRe: Float64Array, bIm: Float64Array): void {
    b.set(bRe, 0);
    b.set(bIm, n);
    real.solve(b);
    bRe.set(b.subarray(0, n));
    bIm.set(b.subarray(n));
  }

  return { size: n, factor, solve };
}
