/**
 * The float next above x (x finite): one unit in the last place up.
 *
 * @example
 * ```ts
 * nextUp(1) - 1 === Number.EPSILON; // true
 * ```
 */
export function nextUp(x: number): number {
  if (x === 0) return Number.MIN_VALUE;
  const buf = new Float64Array([x]);
  const bits = new BigInt64Array(buf.buffer);
  bits[0] = bits[0]! + (x > 0 ? 1n : -1n);
  return buf[0]!;
}

/**
 * The float next below x (x finite).
 *
 * @example
 * ```ts
 * nextDown(1) < 1; // true
 * ```
 */
export function nextDown(x: number): number {
  return -nextUp(-x);
}
