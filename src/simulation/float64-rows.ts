/**
 * A growing table of rows of `width` numbers, stored row after row in blocks
 * of about BLOCK_LENGTH numbers: what a run records (its samples, its steps)
 * without an object or a typed array per row. A run of thousands of steps
 * then allocates a few dozen blocks instead of thousands of small objects
 * for the garbage collector to trace, and growing never copies what is
 * stored already (a block is never resized).
 *
 * Snapshots share blocks: {@link Float64Rows.snapshot} gives a table of the
 * rows so far that never changes, and this table copies a shared block
 * before it writes into it again (after a truncation, or into a partly
 * filled last block), so a result taken from a live run stays what it was.
 *
 * @example
 * ```ts
 * const rows = new Float64Rows(3);
 * const k = rows.push(Float64Array.of(1, 2, 3));
 * rows.get(k, 2); // 3
 * ```
 *
 * @internal
 */
export class Float64Rows {
  /** Rows per block (at least one, so a row never spans two blocks). */
  readonly rowsPerBlock: number;
  private blocks: Float64Array[] = [];
  /** Whether block b is shared with a snapshot (copied before the next write into it). */
  private shared: boolean[] = [];
  private count = 0;

  constructor(
    readonly width: number,
    blockLength = BLOCK_LENGTH,
  ) {
    this.rowsPerBlock = Math.max(1, Math.floor(blockLength / Math.max(1, width)));
  }

  /** Number of rows. */
  get length(): number {
    return this.count;
  }

  /** Numbers held in blocks (the memory the table keeps: its rows plus the unused end of the last block). */
  get storedNumbers(): number {
    let s = 0;
    for (let b = 0; b < this.blocks.length; b++) s += this.blocks[b]!.length;
    return s;
  }

  /**
   * Append a zero-filled row; returns its index (fill it through
   * {@link Float64Rows.writable} or {@link Float64Rows.set}). Rows past the
   * count are kept zero (see truncate), so this writes nothing.
   */
  pushZeros(): number {
    const k = this.count;
    if (((k / this.rowsPerBlock) | 0) === this.blocks.length) {
      this.blocks.push(new Float64Array(this.rowsPerBlock * this.width));
      this.shared.push(false);
    }
    this.count = k + 1;
    return k;
  }

  /** The block holding row k, made writable (a shared block is copied first); the row starts at {@link Float64Rows.offsetOf}. */
  writable(k: number): Float64Array {
    const b = (k / this.rowsPerBlock) | 0;
    if (this.shared[b]) {
      this.blocks[b] = this.blocks[b]!.slice();
      this.shared[b] = false;
    }
    return this.blocks[b]!;
  }

  /** The block holding row k (for reading only). */
  blockOf(k: number): Float64Array {
    return this.blocks[(k / this.rowsPerBlock) | 0]!;
  }

  /** Where row k starts in its block. */
  offsetOf(k: number): number {
    return (k % this.rowsPerBlock) * this.width;
  }

  /** Entry j of row k. */
  get(k: number, j: number): number {
    return this.blocks[(k / this.rowsPerBlock) | 0]![(k % this.rowsPerBlock) * this.width + j]!;
  }

  /** Set entry j of row k. */
  set(k: number, j: number, value: number): void {
    this.writable(k)[this.offsetOf(k) + j] = value;
  }

  /** Copy `length` entries of row k from entry j on into out[at...]; returns out. */
  copyOut(k: number, j: number, length: number, out: Float64Array, at = 0): Float64Array {
    const block = this.blockOf(k);
    const o = this.offsetOf(k) + j;
    for (let i = 0; i < length; i++) out[at + i] = block[o + i]!;
    return out;
  }

  /** Keep the first `count` rows only (blocks past them are released). */
  truncate(count: number): void {
    if (count >= this.count) return;
    this.count = Math.max(0, count);
    const blocks = Math.ceil(this.count / this.rowsPerBlock);
    this.blocks.length = blocks;
    this.shared.length = blocks;
    // The rows dropped from the last block kept go back to zero (pushZeros relies on it).
    if (this.count % this.rowsPerBlock !== 0) this.writable(this.count).fill(0, this.offsetOf(this.count));
  }

  /** The rows so far as a table that never changes (blocks shared until this one writes into them). */
  snapshot(): Float64Rows {
    const s = new Float64Rows(this.width, this.rowsPerBlock * Math.max(1, this.width));
    s.blocks = this.blocks.slice();
    s.shared = this.blocks.map(() => true);
    s.count = this.count;
    for (let b = 0; b < this.shared.length; b++) this.shared[b] = true;
    return s;
  }
}

/** Numbers per block (32 KiB): a few hundred rows of a small network, few enough that a short run holds little. */
const BLOCK_LENGTH = 4096;
