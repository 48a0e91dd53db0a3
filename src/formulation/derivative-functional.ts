import { Matrix, SingularValueDecomposition } from 'ml-matrix';

/**
 * For a DAE M y' = f(t, y), a linear functional u^T y' whose vector u lies in
 * the row space of M is known from the state alone: with M^T w = u,
 * u^T y' = w^T M y' = w^T f(t, y). This returns w (or undefined when u is not
 * in the row space, i.e. the quantity is not determined by M y' = f).
 *
 * Used for quantities that need a derivative of the state: the eddy-current
 * term R_e dphi/dt of a tube, a capacitor's current. Rows and columns of M
 * are equilibrated before the SVD so that entries of very different sizes
 * (1e-9 F next to 1e3 turns) do not hide each other.
 *
 * @example
 * ```ts
 * const w = derivativeFunctional(mass, n, u);
 * const dphi = w ? dot(w, f) : NaN;
 * ```
 */
export function derivativeFunctional(mass: Float64Array, n: number, u: Float64Array): Float64Array | undefined {
  // M^T w = u with M^T = Dc^-1 (Dc M^T Dr) Dr^-1: scale to S = Dc M^T Dr, solve S x = Dc u, w = Dr x.
  const rowScale = new Float64Array(n);
  const colScale = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let r = 0;
    let c = 0;
    for (let j = 0; j < n; j++) {
      r = Math.max(r, Math.abs(mass[i * n + j]!));
      c = Math.max(c, Math.abs(mass[j * n + i]!));
    }
    rowScale[i] = r > 0 ? 1 / r : 1;
    colScale[i] = c > 0 ? 1 / c : 1;
  }
  // S[j][i] = colScale[j] * M[i][j] * rowScale[i]  (S = Dc M^T Dr)
  const S = Matrix.zeros(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) S.set(j, i, colScale[j]! * mass[i * n + j]! * rowScale[i]!);
  const rhs = Matrix.columnVector(Array.from(u, (x, j) => x * colScale[j]!));
  const svd = new SingularValueDecomposition(S);
  const x = svd.solve(rhs);
  const residual = S.mmul(x).sub(rhs);
  const scale = Math.max(...rhs.to1DArray().map(Math.abs), 1e-300);
  if (Math.max(Math.abs(residual.max()), Math.abs(residual.min())) > 1e-8 * scale) return undefined;
  return Float64Array.from({ length: n }, (_, i) => x.get(i, 0) * rowScale[i]!);
}
