/**
 * A fixed sparsity pattern (compressed sparse rows, columns ascending within
 * a row) and a matrix of values on it. The pattern is built once (at
 * compile time, from the elements' stamps); a stamping target then adds
 * (row, col, value) into it for every evaluation, either by position
 * ({@link SparseMatrix.add}) or, faster, through a slot looked up once
 * ({@link SparseMatrix.slot}, {@link SparseMatrix.addAt}).
 *
 * @example
 * ```ts
 * const pattern = sparsePattern(3, [0, 1, 1, 2, 2], [0, 1, 2, 1, 2]);
 * const a = createSparseMatrix(pattern);
 * a.add(1, 2, 0.5);
 * const s = a.slot(2, 2);
 * a.addAt(s, 4);
 * ```
 */
export interface SparsePattern {
  readonly n: number;
  /** Row i's entries are rowStart[i] .. rowStart[i + 1] - 1. */
  readonly rowStart: Int32Array;
  /** Column of each entry, ascending within a row. */
  readonly col: Int32Array;
}

/**
 * The pattern holding the given (row, col) positions (duplicates merged),
 * plus the diagonal, which the iteration matrices (gamma/h) M - J always need.
 *
 * @example
 * ```ts
 * const tridiagonal = sparsePattern(3, [0, 1, 1, 2], [1, 0, 2, 1]); // off-diagonals; the diagonal is added
 * ```
 */
export function sparsePattern(n: number, rows: ArrayLike<number>, cols: ArrayLike<number>): SparsePattern {
  if (rows.length !== cols.length) throw new RangeError(`sparsePattern: ${rows.length} rows but ${cols.length} columns`);
  const perRow: Set<number>[] = Array.from({ length: n }, (_, i) => new Set([i]));
  for (let k = 0; k < rows.length; k++) {
    const i = rows[k]!;
    const j = cols[k]!;
    if (!(Number.isInteger(i) && Number.isInteger(j) && i >= 0 && j >= 0 && i < n && j < n)) {
      throw new RangeError(`sparsePattern: entry (${i}, ${j}) is outside a ${n} x ${n} matrix`);
    }
    perRow[i]!.add(j);
  }
  const rowStart = new Int32Array(n + 1);
  const colList: number[] = [];
  for (let i = 0; i < n; i++) {
    for (const j of [...perRow[i]!].sort((a, b) => a - b)) colList.push(j);
    rowStart[i + 1] = colList.length;
  }
  return { n, rowStart, col: Int32Array.from(colList) };
}

/**
 * Gather a dense row-major n x n matrix onto a pattern: values[e] =
 * a[i n + col[e]]. Returns the first row holding a non-zero that the pattern
 * does not, or -1 (the caller names it in its own error).
 *
 * @example
 * ```ts
 * if (gatherOnPattern(pattern, a, values) >= 0) throw new RangeError('an entry outside the pattern');
 * ```
 */
export function gatherOnPattern(pattern: SparsePattern, a: Float64Array, values: Float64Array): number {
  const { n, rowStart, col } = pattern;
  for (let i = 0; i < n; i++) {
    let inPattern = 0;
    for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
      const v = a[i * n + col[e]!]!;
      values[e] = v;
      if (v !== 0) inPattern++;
    }
    let nonZero = 0;
    for (let j = 0; j < n; j++) if (a[i * n + j] !== 0) nonZero++;
    if (nonZero !== inPattern) return i;
  }
  return -1;
}

/**
 * The pattern of the non-zero entries of a dense row-major n x n matrix (and the diagonal).
 *
 * @example
 * ```ts
 * const p = patternOfDense(Float64Array.of(1, 0, 2, 3), 2); // entries (0,0), (1,0), (1,1)
 * ```
 */
export function patternOfDense(a: Float64Array, n: number): SparsePattern {
  const rows: number[] = [];
  const cols: number[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (a[i * n + j] !== 0) {
        rows.push(i);
        cols.push(j);
      }
    }
  }
  return sparsePattern(n, rows, cols);
}

/**
 * Values on a fixed {@link SparsePattern}.
 *
 * @example
 * ```ts
 * const a = createSparseMatrix(pattern);
 * a.clear();
 * a.add(0, 0, 2);
 * ```
 */
export interface SparseMatrix {
  readonly pattern: SparsePattern;
  /** One value per pattern entry. */
  readonly values: Float64Array;
  /** Index into `values` of entry (row, col); throws if it is not in the pattern. */
  slot(row: number, col: number): number;
  /** values[slot] += value. */
  addAt(slot: number, value: number): void;
  /** Entry (row, col) += value; throws if it is not in the pattern. */
  add(row: number, col: number, value: number): void;
  /** All values to zero. */
  clear(): void;
  /** Scatter into a dense row-major n x n array (zeros elsewhere). */
  toDense(out?: Float64Array): Float64Array;
}

/**
 * A zero matrix on `pattern`.
 *
 * @example
 * ```ts
 * const a = createSparseMatrix(sparsePattern(2, [0], [1]));
 * a.add(0, 1, 3);
 * a.toDense(); // [0, 3, 0, 0]
 * ```
 */
export function createSparseMatrix(pattern: SparsePattern): SparseMatrix {
  const { n, rowStart, col } = pattern;
  const values = new Float64Array(col.length);
  const slot = (row: number, c: number): number => {
    let lo = rowStart[row]!;
    let hi = rowStart[row + 1]!;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (col[mid]! < c) lo = mid + 1;
      else hi = mid;
    }
    if (lo >= rowStart[row + 1]! || col[lo] !== c) throw new RangeError(`entry (${row}, ${c}) is not in the sparsity pattern`);
    return lo;
  };
  return {
    pattern,
    values,
    slot,
    addAt: (s, v) => {
      values[s] = values[s]! + v;
    },
    add: (row, c, v) => {
      const s = slot(row, c);
      values[s] = values[s]! + v;
    },
    clear: () => values.fill(0),
    toDense: (out = new Float64Array(n * n)) => {
      out.fill(0);
      for (let i = 0; i < n; i++) for (let k = rowStart[i]!; k < rowStart[i + 1]!; k++) out[i * n + col[k]!] = values[k]!;
      return out;
    },
  };
}
