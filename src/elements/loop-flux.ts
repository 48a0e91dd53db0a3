import type { TubeLoops } from './tube-kind.js';

/**
 * A tube's flux from the loop fluxes through it: sum_k sign[k] y[index[k]],
 * in the loops' order from 0, so every caller gets the same bits. A tube in
 * one loop (every tube of a core with one window) is read without a loop's
 * back edge, as 0 + sign y, the loop's own first addition (+0 for -0).
 *
 * @internal
 * @example
 * ```ts
 * loopFlux({ index: [0, 1], sign: [1, -1] }, Float64Array.of(3e-4, 1e-4)); // 2e-4
 * ```
 */
export function loopFlux(loops: TubeLoops, y: Float64Array): number {
  const { index, sign } = loops;
  let s = 0;
  if (index.length === 1) return s + sign[0]! * y[index[0]!]!;
  for (let k = 0; k < index.length; k++) s += sign[k]! * y[index[k]!]!;
  return s;
}
