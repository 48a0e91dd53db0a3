import type { SparseMass } from './sparse-mass.js';

/**
 * out = shift M - J, row-major n x n (M the identity when `mass` is
 * undefined): the real part of a Radau iteration matrix, for the ml-matrix
 * path's formed matrices (the flat LUs form theirs row by row in their own
 * storage, with the same operations: `DenseLu.factorShifted`).
 *
 * @internal
 * @example `formShifted(n, jac, gamma / h, p.mass, e1)`
 */
export function formShifted(n: number, jac: Float64Array, shift: number, mass: SparseMass | undefined, out: number[] | Float64Array): void {
  for (let k = 0; k < n * n; k++) out[k] = -jac[k]!;
  if (!mass) {
    for (let i = 0; i < n; i++) out[i * n + i] = out[i * n + i]! + shift;
    return;
  }
  const { rowStart, col, value } = mass;
  for (let i = 0; i < n; i++) {
    for (let k = rowStart[i]!; k < rowStart[i + 1]!; k++) {
      const idx = i * n + col[k]!;
      out[idx] = out[idx]! + shift * value[k]!;
    }
  }
}

/**
 * out = scale M, row-major n x n (M the identity when `mass` is undefined):
 * the imaginary part of the complex Radau iteration matrix, where J has none.
 *
 * @internal
 * @example `scaledMass(n, beta / h, p.mass, im)`
 */
export function scaledMass(n: number, scale: number, mass: SparseMass | undefined, out: number[] | Float64Array): void {
  out.fill(0, 0, n * n);
  if (!mass) {
    for (let i = 0; i < n; i++) out[i * n + i] = scale;
    return;
  }
  const { rowStart, col, value } = mass;
  for (let i = 0; i < n; i++) {
    for (let k = rowStart[i]!; k < rowStart[i + 1]!; k++) out[i * n + col[k]!] = scale * value[k]!;
  }
}
