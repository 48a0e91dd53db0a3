/**
 * Copies and zero fills of the short arrays of a small network (a few to a
 * few dozen numbers), as loops: the builtins `set` and `fill` are calls
 * that V8 does not inline, and for a handful of numbers the call costs more
 * than the stores (measured on the 2-core VM: a `fill` of 3 and one of 12
 * numbers 76 to 85 ns together, the same two as loops 22 to 38 ns). The
 * same values as the builtins, bit for bit. Used on the restart path and
 * the per-step copies of the integrator, where n is the network's size.
 *
 * @internal
 */

/** to[at + i] = from[i] for every entry of `from` (as `to.set(from, at)`). */
export function copyEntries(from: Float64Array, to: Float64Array, at = 0): void {
  for (let i = 0; i < from.length; i++) to[at + i] = from[i]!;
}

/** to[i] = 0 for start <= i < end (as `to.fill(0, start, end)`). */
export function zeroEntries(to: Float64Array, start = 0, end = to.length): void {
  for (let i = start; i < end; i++) to[i] = 0;
}
