/**
 * The states a run keeps, one row of n numbers per accepted point, stored
 * row after row in chunks (none is moved once written): a step stores a
 * copy of n numbers and allocates nothing of its own, where a typed array
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
 * rows.push(Float64Array.of(1, 2));
 * rows.row(0); // Float64Array [1, 2] (a view)
 * rows.get(0, 1); // 2
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

  constructor(private readonly n: number) {
    this.maxRows = Math.max(16, Math.floor(4096 / Math.max(n, 1)));
  }

  /** Rows stored. */
  get length(): number {
    return this.count;
  }

  /** Append a copy of `state` (length n). */
  push(state: Float64Array): void {
    const n = this.n;
    let r = this.count - this.currentStart;
    if (r >= this.currentRows) {
      const rows = Math.min(this.maxRows, Math.max(FIRST_ROWS, 2 * this.count));
      this.current = new Float64Array(rows * n);
      this.chunks.push(this.current);
      this.starts.push(this.count);
      this.currentStart = this.count;
      this.currentRows = rows;
      r = 0;
    }
    const chunk = this.current;
    const off = r * n;
    for (let i = 0; i < n; i++) chunk[off + i] = state[i]!;
    this.count++;
  }

  /** Row k as a view of the storage (length n). */
  row(k: number): Float64Array {
    const c = this.chunkOf(k);
    const off = (k - this.starts[c]!) * this.n;
    return new Float64Array(this.chunks[c]!.buffer, off * Float64Array.BYTES_PER_ELEMENT, this.n);
  }

  /** Entry i of row k. */
  get(k: number, i: number): number {
    const c = this.chunkOf(k);
    return this.chunks[c]![(k - this.starts[c]!) * this.n + i]!;
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

/** Rows of the first chunk (fewer when a row is long: a chunk holds at most about 32 KB). */
const FIRST_ROWS = 64;
