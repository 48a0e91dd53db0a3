/**
 * The value of unknown i in y, or 0 for i = -1 (ground's potential, an
 * absent unknown).
 *
 * @example
 * ```ts
 * const u = stateValue(y, p) - stateValue(y, q); // voltage between two nodes
 * ```
 */
export function stateValue(y: Float64Array, i: number): number {
  return i < 0 ? 0 : y[i]!;
}
