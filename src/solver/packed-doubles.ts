/**
 * n zeros in a plain array whose elements V8 stores unboxed as doubles from
 * birth (PACKED_DOUBLE_ELEMENTS), for the factorisations' storage. Why not a
 * Float64Array: once any code in the process has detached an ArrayBuffer
 * (transferring one to a worker does; so does the TypeScript loader tsx),
 * V8 checks for detachment on every typed-array access in optimised code,
 * which cost 18 % of a Test Set solve (HIRES) in docs/solver.md's
 * measurement. Plain arrays carry no such check, and without it they are as
 * fast. Pushing -0 (not a small integer) makes the kind double before any
 * value is stored, so every array made here has the same elements kind
 * and the loops that read them stay monomorphic; `new Array(n)` would be
 * holey.
 *
 * @internal
 * @example
 * ```ts
 * const lu = packedDoubles(9); // [0, 0, 0, 0, 0, 0, 0, 0, 0], doubles
 * ```
 */
export function packedDoubles(n: number): number[] {
  const a: number[] = [];
  for (let i = 0; i < n; i++) a.push(-0);
  for (let i = 0; i < n; i++) a[i] = 0;
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
 * A copy of `values` in an array made by {@link packedDoubles} (doubles
 * from birth, whatever the values: whole numbers included).
 *
 * @internal
 * @example
 * ```ts
 * const mass = packedDoublesFrom(Float64Array.of(1, 0, 20)); // [1, 0, 20], doubles
 * ```
 */
export function packedDoublesFrom(values: ArrayLike<number>): number[] {
  const a = packedDoubles(values.length);
  for (let i = 0; i < values.length; i++) a[i] = values[i]!;
  return a;
}
