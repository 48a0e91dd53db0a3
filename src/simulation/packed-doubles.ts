/**
 * A plain array of n zeros whose elements kind is packed doubles from birth
 * (V8's PACKED_DOUBLE_ELEMENTS), for work arrays read and written in the
 * network's f, Jacobian and step paths.
 *
 * Why not a Float64Array: once any code in the process detaches an
 * ArrayBuffer (a TypeScript loader does, so do many applications), V8
 * drops the guarantee that no typed array is ever detached, and from then
 * on every typed-array element access in optimised code checks for it. A
 * plain array of doubles carries no such check. Why not `new Array(n)`:
 * that array is holey, and `Array.from` of integer values is an array of
 * small integers that turns into doubles on the first fractional store;
 * either way the code reading it would see two element kinds. Pushing -0
 * (a double, never a small integer) makes the array packed doubles from
 * the first element, and it stays so as long as only numbers are stored
 * into it. An empty array is made the same way, so even n = 0 gives the
 * same kind.
 *
 * @example
 * ```ts
 * const values = packedDoubles(3); // [0, 0, 0], packed doubles
 * values[1] = 2.5;
 * ```
 */
export function packedDoubles(n: number): number[] {
  const a: number[] = [-0];
  for (let i = 1; i < n; i++) a.push(-0);
  // -0 only made the kind; the entries start at +0 as a Float64Array's do.
  for (let i = 0; i < n; i++) a[i] = 0;
  if (n < 1) a.length = 0;
  return a;
}

/**
 * A packed-double array (see {@link packedDoubles}) holding `values[i]`, or
 * `of(values[i], i)` when given, for every i, converted to a number as
 * `Float64Array.from` converts it: the doubles of a compiled element
 * (resistances, turns) in an array of one elements kind whatever the
 * values (integers included).
 *
 * @example
 * ```ts
 * const r = packedDoublesFrom(windings, (w) => w.resistance); // [0.5, 1]
 * ```
 */
export function packedDoublesFrom<T>(values: ArrayLike<T>, of: (value: T, i: number) => number): number[];
export function packedDoublesFrom(values: ArrayLike<number>): number[];
export function packedDoublesFrom<T>(values: ArrayLike<T>, of?: (value: T, i: number) => number): number[] {
  const a = packedDoubles(values.length);
  // ToNumber, as Float64Array.from does: a number stays itself bit for bit, and nothing but a number
  // (an undefined field would be NaN there) ever lands in the array to change its kind.
  for (let i = 0; i < values.length; i++) a[i] = +(of ? of(values[i]!, i) : (values[i] as number));
  return a;
}
