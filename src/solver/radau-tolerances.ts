/**
 * When atol does not follow rtol it is mapped as radau5 maps it at this rtol
 * (the default): atol' = 0.1 (1e-6)^(2/3) atol / 1e-6 = 10 atol, written in
 * the same operations, so that runs at the default rtol are bit for bit unchanged.
 */
const REFERENCE_RTOL = 1e-6;
const REFERENCE_RTOL_MAPPED = 0.1 * REFERENCE_RTOL ** (2 / 3);

/**
 * radau5's tolerance map on entry (Hairer's code): rtol' = 0.1 rtol^(2/3),
 * atol' = rtol' atol / rtol; or, with `atolFollowsRtol` false,
 * atol' = 10 atol (the same map at rtol = 1e-6) at every rtol. Writes
 * rtol'[i] and atol'[i] for each i and returns the smallest rtol'.
 *
 * @internal
 * @example
 * ```ts
 * const rmin = mapRadauTolerances([1e-6], [1e-9], true, rtolT, atolT); // rtolT[0] = 1e-5
 * ```
 */
export function mapRadauTolerances(
  rtol: ArrayLike<number>,
  atol: ArrayLike<number>,
  atolFollowsRtol: boolean,
  rtolOut: Float64Array,
  atolOut: Float64Array,
): number {
  let rmin = Infinity;
  for (let i = 0; i < rtolOut.length; i++) {
    const r = rtol[i]!;
    const rt = 0.1 * r ** (2 / 3);
    rtolOut[i] = rt;
    atolOut[i] = atolFollowsRtol ? (rt * atol[i]!) / r : (REFERENCE_RTOL_MAPPED * atol[i]!) / REFERENCE_RTOL;
    rmin = Math.min(rmin, rt);
  }
  return rmin;
}
