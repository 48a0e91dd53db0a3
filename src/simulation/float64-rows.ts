import { emptyObjectArray } from './empty-object-array.js';

/**
 * A growing table of rows of `width` numbers, stored row after row in
 * blocks that double in size up to a cap (never moved once made): what a
 * run records (its samples, its steps) without an object or a typed array
 * per row, so a run of thousands of steps makes a handful of buffers
 * instead of thousands of small objects for the garbage collector to trace.
 *
 * Why few blocks that are never copied: on our bench machine memory a
 * process touches for the first time costs about 4 ms per MiB (measured:
 * writing one number per 4 KiB page of a fresh 1 MiB Float64Array), and
 * each ArrayBuffer costs a fixed amount on top of that. Blocks of 32 KiB
 * paid the fixed cost some thirty times per flux-walk run; one buffer that
 * doubles and copies touches about twice the memory it keeps. Blocks that
 * double touch only the pages they fill (a large block's untouched end is
 * not paid for) and number O(log rows).
 *
 * Snapshots share blocks: {@link Float64Rows.snapshot} gives a table of the
 * rows so far that never changes, and this table copies a shared block
 * before it writes into it again (appending into a partly filled last
 * block, after a truncation, or correcting a row).
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
  /** Rows in the first block; block b holds firstRows 2^min(b, MAX_DOUBLINGS) rows. */
  readonly firstRows: number;
  /** First row past the blocks that double (where the blocks of the largest size begin). */
  private readonly cappedStart: number;
  private readonly cappedRows: number;
  private blocks = emptyObjectArray<Float64Array>();
  /** Whether block b is shared with a snapshot (copied before the next write into it). */
  private shared = emptyObjectArray<boolean>();
  private count = 0;

  constructor(
    readonly width: number,
    firstLength = FIRST_LENGTH,
  ) {
    this.firstRows = Math.max(1, Math.floor(firstLength / Math.max(1, width)));
    this.cappedRows = this.firstRows * 2 ** MAX_DOUBLINGS;
    this.cappedStart = this.firstRows * (2 ** MAX_DOUBLINGS - 1);
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

  /** Index of the block holding row k. */
  blockIndex(k: number): number {
    if (k < this.cappedStart) return 31 - Math.clz32(Math.floor(k / this.firstRows) + 1);
    return MAX_DOUBLINGS + Math.floor((k - this.cappedStart) / this.cappedRows);
  }

  /** First row of block b. */
  private blockStart(b: number): number {
    // A shift, not 2 ** b: the power is a call of the math library, per row read or written (b is small here).
    if (b <= MAX_DOUBLINGS) return this.firstRows * ((1 << b) - 1);
    return this.cappedStart + (b - MAX_DOUBLINGS) * this.cappedRows;
  }

  /**
   * Append a zero-filled row; returns its index (fill it through
   * {@link Float64Rows.writable} and {@link Float64Rows.offsetOf}, or
   * {@link Float64Rows.set}). Rows past the count are kept zero (see
   * truncate), so this writes nothing.
   */
  pushZeros(): number {
    const k = this.count;
    const b = this.blockIndex(k);
    if (b === this.blocks.length) {
      this.blocks.push(new Float64Array(Math.min(this.firstRows * 2 ** b, this.cappedRows) * this.width));
      this.shared.push(false);
    }
    this.count = k + 1;
    return k;
  }

  /** The block holding row k, made writable (a shared block is copied first); the row starts at {@link Float64Rows.offsetOf}. */
  writable(k: number): Float64Array {
    const b = this.blockIndex(k);
    if (this.shared[b]) {
      this.blocks[b] = this.blocks[b]!.slice();
      this.shared[b] = false;
    }
    return this.blocks[b]!;
  }

  /** The block holding row k (for reading only). */
  blockOf(k: number): Float64Array {
    return this.blocks[this.blockIndex(k)]!;
  }

  /** Where row k starts in its block. */
  offsetOf(k: number): number {
    return (k - this.blockStart(this.blockIndex(k))) * this.width;
  }

  /** Entry j of row k. */
  get(k: number, j: number): number {
    const b = this.blockIndex(k);
    return this.blocks[b]![(k - this.blockStart(b)) * this.width + j]!;
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

  /**
   * Keep the first `count` rows only. Blocks past the one the next row goes
   * into are released; that one is kept (a streaming run keeps one step and
   * truncates to none at every step: no block is made again each time).
   */
  truncate(count: number): void {
    if (count >= this.count) return;
    const keep = Math.max(0, count);
    const old = this.count;
    this.count = keep;
    const next = this.blockIndex(keep);
    if (this.blocks.length > next + 1) {
      this.blocks.length = next + 1;
      this.shared.length = next + 1;
    }
    // The dropped rows of that block go back to zero (pushZeros relies on it).
    if (next < this.blocks.length) {
      const end = this.blockIndex(old - 1) === next ? this.offsetOf(old - 1) + this.width : undefined;
      this.writable(keep).fill(0, this.offsetOf(keep), end);
    }
  }

  /** The rows so far as a table that never changes (blocks shared until this one writes into them). */
  snapshot(): Float64Rows {
    const s = new Float64Rows(this.width, this.firstRows * Math.max(1, this.width));
    for (let b = 0; b < this.blocks.length; b++) {
      s.blocks.push(this.blocks[b]!);
      s.shared.push(true);
      this.shared[b] = true;
    }
    s.count = this.count;
    return s;
  }
}

/** Numbers in the first block (128 KiB: a few thousand samples of a small network). */
const FIRST_LENGTH = 16384;

/** Times the block size doubles (the largest blocks hold 64 times the first). */
const MAX_DOUBLINGS = 6;
