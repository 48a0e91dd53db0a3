/**
 * A growing table of rows of `width` numbers, stored row after row in one
 * Float64Array that doubles when full: what a run records (its samples, its
 * steps) without an object or a typed array per row. A run of thousands of
 * steps then makes a handful of buffers instead of thousands of small
 * objects for the garbage collector to trace.
 *
 * Why one buffer that doubles rather than many small blocks: each
 * ArrayBuffer costs a fixed amount on top of its size, and measured on our
 * bench machine that fixed cost dominates (30 Float64Arrays of 4096 numbers:
 * about 3 ms; one of 30 x 4096 numbers, written in full: about 0.25 ms).
 * Doubling copies each number about once on average; the buffer holds at
 * most twice the numbers recorded (plus the first buffer).
 *
 * Snapshots share the buffer: {@link Float64Rows.snapshot} gives a table of
 * the rows so far that never changes. This table goes on appending past
 * them in the same buffer (the snapshot reads only its own rows), and
 * copies the buffer before it writes into a row the snapshot holds (after a
 * truncation, or a correction of the last row).
 *
 * @example
 * ```ts
 * const rows = new Float64Rows(3);
 * const k = rows.pushZeros();
 * rows.set(k, 2, 3);
 * rows.get(k, 2); // 3
 * ```
 *
 * @internal
 */
export class Float64Rows {
  /** Numbers in the first buffer. */
  private readonly firstLength: number;
  private data: Float64Array;
  private count = 0;
  /** Rows below this index are shared with a snapshot: the buffer is copied before any of them is written. */
  private sharedRows = 0;

  constructor(
    readonly width: number,
    firstLength = FIRST_LENGTH,
    data?: Float64Array,
    count = 0,
  ) {
    this.data = data ?? new Float64Array(0);
    this.count = count;
    this.sharedRows = data ? count : 0;
    this.firstLength = firstLength;
  }

  /** Number of rows. */
  get length(): number {
    return this.count;
  }

  /** Numbers held (the memory the table keeps: its rows plus the unused end of its buffer). */
  get storedNumbers(): number {
    return this.data.length;
  }

  /**
   * Append a zero-filled row; returns its index (fill it through
   * {@link Float64Rows.buffer} and {@link Float64Rows.offsetOf}, or
   * {@link Float64Rows.set}). Numbers past the last row are kept zero (see
   * truncate), so this writes nothing unless the buffer grows.
   */
  pushZeros(): number {
    const k = this.count;
    const end = (k + 1) * this.width;
    if (end > this.data.length) this.grow(end);
    this.count = k + 1;
    return k;
  }

  /** A buffer of at least `length` numbers holding the rows so far (double the old one, at least the first length). */
  private grow(length: number): void {
    const bigger = new Float64Array(Math.max(length, 2 * this.data.length, this.firstLength));
    bigger.set(this.count * this.width === this.data.length ? this.data : this.data.subarray(0, this.count * this.width));
    this.data = bigger;
    this.sharedRows = 0;
  }

  /**
   * The buffer that holds row k, ready to write into it (copied first when a
   * snapshot holds row k); the row starts at {@link Float64Rows.offsetOf}.
   * Valid until the next push.
   */
  writable(k: number): Float64Array {
    if (k < this.sharedRows) {
      this.data = this.data.slice();
      this.sharedRows = 0;
    }
    return this.data;
  }

  /** The buffer, for reading only (valid until the next push). */
  get buffer(): Float64Array {
    return this.data;
  }

  /** Where row k starts in the buffer. */
  offsetOf(k: number): number {
    return k * this.width;
  }

  /** Entry j of row k. */
  get(k: number, j: number): number {
    return this.data[k * this.width + j]!;
  }

  /** Set entry j of row k. */
  set(k: number, j: number, value: number): void {
    this.writable(k)[k * this.width + j] = value;
  }

  /** Copy `length` entries of row k from entry j on into out[at...]; returns out. */
  copyOut(k: number, j: number, length: number, out: Float64Array, at = 0): Float64Array {
    const data = this.data;
    const o = k * this.width + j;
    for (let i = 0; i < length; i++) out[at + i] = data[o + i]!;
    return out;
  }

  /** Keep the first `count` rows only (the buffer keeps its size). */
  truncate(count: number): void {
    if (count >= this.count) return;
    const keep = Math.max(0, count);
    // The dropped rows go back to zero (pushZeros relies on it), in a copy if a snapshot holds them.
    this.writable(keep).fill(0, keep * this.width, this.count * this.width);
    this.count = keep;
  }

  /** The rows so far as a table that never changes (it shares this table's buffer; see the class comment). */
  snapshot(): Float64Rows {
    this.sharedRows = this.count;
    return new Float64Rows(this.width, this.firstLength, this.data, this.count);
  }
}

/** Numbers in the first buffer (128 KiB): the few thousand samples of a short run without growing. */
const FIRST_LENGTH = 16384;
