/**
 * n zeros in a plain array whose elements V8 stores unboxed as doubles from
 * birth (PACKED_DOUBLE_ELEMENTS): storage that the solver's kernels and the
 * network's f and J read in their inner loops.
 *
 * Why not a Float64Array: once any code in the process has detached an
 * ArrayBuffer (transferring one to a worker does; so does the TypeScript
 * loader tsx), V8 checks for detachment on every typed-array access in
 * optimised code, which cost 18 % of a Test Set solve (HIRES) in
 * docs/solver.md's measurement. Plain arrays carry no such check, and
 * without it they are as fast. Why not `new Array(n)`: that array is
 * holey, and `Array.from` of whole numbers gives small integers that turn
 * into doubles at the first fractional store; either way the code reading
 * it would see two elements kinds. Pushing -0 (a double, never a small
 * integer) makes the kind double before any value is stored, and it stays
 * so while only numbers are stored; even n = 0 gives the same kind. The
 * entries then start at +0, as a Float64Array's do.
 *
 * @internal
 * @example
 * ```ts
 * const lu = packedDoubles(9); // [0, 0, 0, 0, 0, 0, 0, 0, 0], doubles
 * ```
 */
export function packedDoubles(n: number): number[] {
  // A slice of a longer such array has its elements kind and is allocated at its length at once, where
  // pushing reallocates the array as it grows (three times the time, and garbage, for a 64-entry LU).
  return n <= SMALL_ZEROS.length ? SMALL_ZEROS.slice(0, n) : pushedZeros(n);
}

/** n zeros as doubles, built by pushing -0 (see {@link packedDoubles}). */
function pushedZeros(n: number): number[] {
  const a: number[] = [-0];
  for (let i = 1; i < n; i++) a.push(-0);
  for (let i = 0; i < n; i++) a[i] = 0;
  if (n < 1) a.length = 0;
  return a;
}

/** The zeros that small arrays are sliced from (32 KB; never written). */
const SMALL_ZEROS: readonly number[] = pushedZeros(4096);

/**
 * A {@link packedDoubles} array holding `values[i]`, or `of(values[i], i)`
 * when given, for every i, converted to a number as `Float64Array.from`
 * converts it: doubles in an array of one elements kind whatever the
 * values (whole numbers included).
 *
 * @internal
 * @example
 * ```ts
 * const mass = packedDoublesFrom(Float64Array.of(1, 0, 20)); // [1, 0, 20], doubles
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

/**
 * 0, 1, ..., n - 1 in a plain array of small integers (PACKED_SMI_ELEMENTS):
 * a permutation without a typed array's detach check (see
 * {@link packedDoubles}).
 *
 * @internal
 * @example
 * ```ts
 * const perm = identityPermutation(3); // [0, 1, 2]
 * ```
 */
export function identityPermutation(n: number): number[] {
  const p: number[] = [];
  for (let i = 0; i < n; i++) p.push(i);
  return p;
}

/**
 * A copy of integer indices (a pattern's row starts or columns, an
 * ordering) in a plain array of small integers (PACKED_SMI_ELEMENTS), built
 * by push: read in the sparse kernels' loops without a typed array's detach
 * check (see {@link packedDoubles}).
 *
 * @internal
 * @example
 * ```ts
 * const rowStart = packedIndices(pattern.rowStart); // [0, 2, 5, ...]
 * ```
 */
export function packedIndices(values: ArrayLike<number>): number[] {
  const a: number[] = [];
  for (let i = 0; i < values.length; i++) a.push(values[i]! | 0);
  return a;
}
