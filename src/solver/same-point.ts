/**
 * Whether (t, y) is the point (atT, atY) bit for bit, over the first
 * `length` entries: the test the reduced formulation's caches (kept
 * evaluations, the formed Jacobian, the last expansion, a step's start
 * scales, a step's end) are keyed by.
 *
 * @internal
 * @example
 * ```ts
 * if (samePoint(t, yD, keptT, keptD, nd)) return keptF;
 * ```
 */
export function samePoint(t: number, y: ArrayLike<number>, atT: number, atY: ArrayLike<number>, length: number): boolean {
  if (t !== atT) return false;
  for (let j = 0; j < length; j++) if (y[j] !== atY[j]) return false;
  return true;
}
