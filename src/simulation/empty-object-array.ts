/**
 * An empty array made for object elements from the start. A literal `[]`
 * starts as an array of small integers and changes its element kind at its
 * first push of an object; a push site that saw only changed arrays in one
 * run is optimised for them and deoptimises at the first push of the next
 * run (measured with --trace-deopt on the flux walk: "not a Smi" in the
 * third run of a process). Element kinds only ever generalise, so an array
 * that once held an object and was emptied keeps the object kind.
 *
 * @example
 * ```ts
 * const blocks = emptyObjectArray<Float64Array>();
 * ```
 *
 * @internal
 */
export function emptyObjectArray<T>(): T[] {
  const a: unknown[] = [PLACEHOLDER];
  a.length = 0;
  return a as T[];
}

const PLACEHOLDER = {};
