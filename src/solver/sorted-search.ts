/**
 * Binary search on an ascending array: the number of entries <= x, which is
 * also the index of the first entry > x (0 when all are above x,
 * `sorted.length` when none is). The one binary search of the solver: the
 * next breakpoint after t, the step of a dense output that covers t.
 *
 * @example
 * ```ts
 * const times = Float64Array.of(0, 1, 2, 2, 3);
 * firstIndexAbove(times, 2);     // 4: the first entry > 2 is times[4]
 * firstIndexAbove(times, 2) - 1; // 3: the last entry <= 2
 * ```
 */
export function firstIndexAbove(sorted: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid]! > x) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
