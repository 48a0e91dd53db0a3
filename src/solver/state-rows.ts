/**
 * The points a run keeps, one row per accepted point (its time, then its n
 * state numbers), stored row after row in chunks (none is moved once
 * written): a step stores a copy of n + 1 numbers and allocates nothing of
 * its own (the times in an array of their own grew it, and copying it into
 * the solution's typed array took as long again), where a typed array
 * per point costs an allocation and garbage collection per step. Chunks
 * grow with the run (64 rows first, then twice as many rows as are stored,
 * up to about 32 KB), so a short solve pays for no large buffer, and a
 * solve of a few hundred steps for three or four of them (each chunk costs
 * an ArrayBuffer: with 16 rows first and then as many as stored, a third of
 * a 270-step solve's bookkeeping was spent allocating its six chunks). A row is handed
 * out as a view only when it is asked for.
 *
 * @internal
 * @example
 * ```ts
 * const rows = new StateRows(2);
 * rows.push(Float64Array.of(0.5, 1, 2)); // t = 0.5, state [1, 2]
 * rows.row(0); // Float64Array [1, 2] (a view)
 * rows.get(0, 1); // 2
 * rows.times(); // Float64Array [0.5]
 * ```
 */
export class StateRows {
  private readonly chunks: Float64Array[] = [];
  /** First row of each chunk. */
  private readonly starts: number[] = [];
  private readonly maxRows: number;
  private current = new Float64Array(0);
  private currentStart = 0;
  private currentRows = 0;
  private count = 0;

  /** Numbers per row: the time, then the state. */
  private readonly width: number;

  constructor(private readonly n: number) {
    this.width = n + 1;
    this.maxRows = Math.max(16, Math.floor(4096 / this.width));
  }

  /** Rows stored. */
  get length(): number {
    return this.count;
  }

  /**
   * Append a copy of `point` (length n + 1): the time, then the state. One
   * array rather than the time as an argument of its own: a number passed to
   * a call that is not inlined is boxed on the heap, once per step.
   */
  push(point: Float64Array): void {
    const off = this.appendRow();
    const chunk = this.current;
    for (let i = 0; i < this.width; i++) chunk[off + i] = point[i]!;
  }

  /**
   * Append a row that `source` writes in place (its time, then its state):
   * one copy of the state per row, where {@link push} copies it twice (into
   * the point, then into the store).
   */
  pushFrom(source: PointSource): void {
    const off = this.appendRow();
    source.readPoint(this.current, off);
  }

  /** The state of row k as a view of the storage (length n). */
  row(k: number): Float64Array {
    const c = this.chunkOf(k);
    const off = (k - this.starts[c]!) * this.width + 1;
    return new Float64Array(this.chunks[c]!.buffer, off * Float64Array.BYTES_PER_ELEMENT, this.n);
  }

  /** Entry i of row k's state. */
  get(k: number, i: number): number {
    const c = this.chunkOf(k);
    return this.chunks[c]![(k - this.starts[c]!) * this.width + 1 + i]!;
  }

  /** The times of all rows, in a typed array of their own. */
  times(): Float64Array {
    const out = new Float64Array(this.count);
    const width = this.width;
    for (let c = 0; c < this.chunks.length; c++) {
      const chunk = this.chunks[c]!;
      const start = this.starts[c]!;
      const end = c + 1 < this.starts.length ? this.starts[c + 1]! : this.count;
      for (let k = start; k < end; k++) out[k] = chunk[(k - start) * width]!;
    }
    return out;
  }

  /** Where a new row starts in the current chunk (a new chunk when it is full); the row is counted. */
  private appendRow(): number {
    let r = this.count - this.currentStart;
    if (r >= this.currentRows) {
      const rows = Math.min(this.maxRows, Math.max(FIRST_ROWS, 2 * this.count));
      this.current = new Float64Array(rows * this.width);
      this.chunks.push(this.current);
      this.starts.push(this.count);
      this.currentStart = this.count;
      this.currentRows = rows;
      r = 0;
    }
    this.count++;
    return r * this.width;
  }

  /** Index of the chunk holding row k (the last chunk starting at or before k). */
  private chunkOf(k: number): number {
    const starts = this.starts;
    let lo = 0;
    let hi = starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (starts[mid]! <= k) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }
}

/**
 * What writes a row of {@link StateRows} in place: `out[offset]` the time,
 * `out[offset + 1 .. offset + n]` the state.
 *
 * @internal
 */
export interface PointSource {
  readPoint(out: Float64Array, offset: number): void;
}

/** Rows of the first chunk (fewer when a row is long: a chunk holds at most about 32 KB). */
const FIRST_ROWS = 64;
