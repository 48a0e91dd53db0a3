import { Matrix, SingularValueDecomposition } from 'ml-matrix';

/** Ruiz sweeps at most; each halves (in log terms) the distance of every row and column maximum from 1. */
const MAX_SWEEPS = 60;

/** Nearest power of two, so that scaling never rounds an entry. */
function powerOfTwo(x: number): number {
  return 2 ** Math.round(Math.log2(x));
}

/**
 * Row and column scales r, c (powers of two) such that every nonzero row and
 * column of diag(r) A diag(c) has its largest entry within a factor 2 of 1
 * (Ruiz equilibration: D. Ruiz, "A scaling algorithm to equilibrate both rows
 * and columns norms in matrices", RAL-TR-2001-034, 2001). A is n x n, row-major.
 *
 * Scaling rows and columns each by 1 / (their largest entry), both taken from
 * the unscaled matrix, turns an entry that dominates its row and its column
 * into its reciprocal (a 1 pF capacitance becomes 1e12), which widens the
 * spread instead of closing it; Ruiz's square-root sweeps converge instead.
 */
function equilibrate(a: Float64Array, n: number): { row: Float64Array; col: Float64Array } {
  const row = new Float64Array(n).fill(1);
  const col = new Float64Array(n).fill(1);
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    const rowMax = new Float64Array(n);
    const colMax = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const x = Math.abs(row[i]! * a[i * n + j]! * col[j]!);
        if (x > rowMax[i]!) rowMax[i] = x;
        if (x > colMax[j]!) colMax[j] = x;
      }
    }
    let settled = true;
    for (let i = 0; i < n; i++) {
      if (rowMax[i]! > 0 && (rowMax[i]! > 2 || rowMax[i]! < 0.5)) {
        settled = false;
        row[i] = row[i]! * powerOfTwo(1 / Math.sqrt(rowMax[i]!));
      }
      if (colMax[i]! > 0 && (colMax[i]! > 2 || colMax[i]! < 0.5)) {
        settled = false;
        col[i] = col[i]! * powerOfTwo(1 / Math.sqrt(colMax[i]!));
      }
    }
    if (settled) break;
  }
  return { row, col };
}

/**
 * For a DAE M y' = f(t, y), a linear functional u^T y' whose vector u lies in
 * the row space of M is known from the state alone: with M^T w = u,
 * u^T y' = w^T M y' = w^T f(t, y). This returns w (or undefined when u is not
 * in the row space, i.e. the quantity is not determined by M y' = f).
 *
 * Used for quantities that need a derivative of the state: the eddy-current
 * term R_e dphi/dt of a tube, a capacitor's current. M^T is equilibrated
 * (Ruiz) before the SVD, so that entries of very different sizes (a 1 pF
 * capacitance next to a 1e8 A s/Wb eddy resistance and 1e3 turns) do not
 * fall under the SVD's rank threshold, which is relative to the largest
 * singular value.
 *
 * @example
 * ```ts
 * const w = derivativeFunctional(mass, n, u);
 * const dphi = w ? dot(w, f) : NaN;
 * ```
 */
export function derivativeFunctional(mass: Float64Array, n: number, u: Float64Array): Float64Array | undefined {
  // M^T w = u. With S = Dc M^T Dr (Dc, Dr diagonal): S x = Dc u, w = Dr x.
  const transposed = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) transposed[j * n + i] = mass[i * n + j]!;
  const { row: dc, col: dr } = equilibrate(transposed, n);
  const S = Matrix.zeros(n, n);
  for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) S.set(j, i, dc[j]! * transposed[j * n + i]! * dr[i]!);
  const rhs = Matrix.columnVector(Array.from(u, (x, j) => x * dc[j]!));
  const svd = new SingularValueDecomposition(S);
  const x = svd.solve(rhs);
  const residual = S.mmul(x).sub(rhs);
  const scale = Math.max(...rhs.to1DArray().map(Math.abs), 1e-300);
  if (Math.max(Math.abs(residual.max()), Math.abs(residual.min())) > 1e-8 * scale) return undefined;
  return Float64Array.from({ length: n }, (_, i) => x.get(i, 0) * dr[i]!);
}
