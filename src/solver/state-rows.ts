/**
 * The states a run keeps, one row of n numbers per accepted point, stored
 * row after row in chunks (none is moved once written): a step stores a
 * copy of n numbers and allocates nothing of its own, where a typed array
 * per point costs an allocation and garbage collection per step. A row is
 * handed out as a view only when it is asked for.
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
  private readonly rowsPerChunk: number;
  private count = 0;

  constructor(private readonly n: number) {
    // About 32 KB per chunk, and at least 16 rows.
    this.rowsPerChunk = Math.max(16, Math.floor(4096 / Math.max(n, 1)));
  }

  /** Rows stored. */
  get length(): number {
    return this.count;
  }

  /** Append a copy of `state` (length n). */
  push(state: Float64Array): void {
    const n = this.n;
    const c = Math.floor(this.count / this.rowsPerChunk);
    if (c === this.chunks.length) this.chunks.push(new Float64Array(this.rowsPerChunk * n));
    const chunk = this.chunks[c]!;
    const off = (this.count - c * this.rowsPerChunk) * n;
    for (let i = 0; i < n; i++) chunk[off + i] = state[i]!;
    this.count++;
  }

  /** Row k as a view of the storage (length n). */
  row(k: number): Float64Array {
    const c = Math.floor(k / this.rowsPerChunk);
    const off = (k - c * this.rowsPerChunk) * this.n;
    return new Float64Array(this.chunks[c]!.buffer, off * Float64Array.BYTES_PER_ELEMENT, this.n);
  }

  /** Entry i of row k. */
  get(k: number, i: number): number {
    const c = Math.floor(k / this.rowsPerChunk);
    return this.chunks[c]![(k - c * this.rowsPerChunk) * this.n + i]!;
  }
}
