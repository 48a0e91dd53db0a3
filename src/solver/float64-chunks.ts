/**
 * Storage for many small Float64Arrays (the states and step polynomials a
 * run keeps): views into chunks of CHUNK_LENGTH numbers instead of one typed
 * array each. A typed array of its own costs an ArrayBuffer, about ten times
 * the time of a view, and a few hundred bytes of bookkeeping; a chunk is
 * freed when no view into it is left, so views of dropped steps do not pin
 * memory for long (a streaming run drops its steps one by one).
 *
 * @internal
 * @example
 * ```ts
 * const chunks = new Float64Chunks();
 * const y = chunks.copy(Float64Array.of(1, 2, 3)); // a view of length 3
 * ```
 */
export class Float64Chunks {
  private chunk = new Float64Array(0);
  private used = 0;

  constructor(private readonly chunkLength = CHUNK_LENGTH) {}

  /** A zero-filled view of `length` numbers. */
  take(length: number): Float64Array {
    if (this.used + length > this.chunk.length) {
      this.chunk = new Float64Array(Math.max(this.chunkLength, length));
      this.used = 0;
    }
    // A view made by the constructor (subarray looks up the species constructor on every call).
    const view = new Float64Array(this.chunk.buffer, this.used * Float64Array.BYTES_PER_ELEMENT, length);
    this.used += length;
    return view;
  }

  /** A view holding a copy of `values`. */
  copy(values: Float64Array): Float64Array {
    const view = this.take(values.length);
    view.set(values);
    return view;
  }
}

/** Numbers per chunk (32 KiB): a few hundred steps of a small network, few enough that a streaming run frees them soon. */
const CHUNK_LENGTH = 4096;

/**
 * Where a kernel takes its zero-filled work arrays from: a typed array of
 * its own by default, or views into one integrator's chunk
 * (an integrator's internal chunks), so that setting up a solve allocates a few
 * ArrayBuffers instead of one per array. The LU kernels
 * ({@link createDenseLu}, {@link createComplexLu}) take one as an optional
 * second argument.
 *
 * @example
 * ```ts
 * const lu = createComplexLu(4, (length) => new Float64Array(length));
 * ```
 */
export type TakeFloat64 = (length: number) => Float64Array;

/** @internal A typed array of its own (the default {@link TakeFloat64}). */
export const ownFloat64: TakeFloat64 = (length) => new Float64Array(length);

/**
 * A view of `length` numbers from `offset` inside `a` (made by the
 * constructor; `subarray` looks up the species constructor on every call).
 *
 * @internal
 */
export function float64View(a: Float64Array, offset: number, length: number): Float64Array {
  return new Float64Array(a.buffer, a.byteOffset + offset * Float64Array.BYTES_PER_ELEMENT, length);
}
