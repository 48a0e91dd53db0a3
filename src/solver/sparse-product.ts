/**
 * A sparse matrix in compressed rows whose structure is fixed: `rows` x
 * `cols`, row i's entries at rowStart[i] .. rowStart[i + 1] - 1, columns
 * ascending within a row; values kept apart (one array per evaluation).
 *
 * @internal
 */
export interface RowStructure {
  readonly rows: number;
  readonly cols: number;
  readonly rowStart: Int32Array;
  readonly col: Int32Array;
}

/**
 * The product C = A B of two sparse matrices of fixed structure, analysed
 * once: C's structure and, in the order the products are summed, the
 * triples (entry of C, entry of A, entry of B). Each evaluation is then one
 * pass over the triples (the number of multiplications, no search, no
 * allocation). Row i of C sums a_il (b_l.) over l in the order of row i of
 * A, as a dense row-by-row product does, so the rounding is that of the
 * dense product with its zero terms left out.
 *
 * @internal
 * @example
 * ```ts
 * const product = sparseProduct(a, b);
 * product.evaluate(aValues, bValues, cValues); // cValues: product.structure.col.length entries
 * ```
 */
export interface SparseProduct {
  readonly structure: RowStructure;
  /** C's values (structure order) from A's and B's, into `out`. */
  evaluate(a: Float64Array, b: Float64Array, out: Float64Array): void;
}

/** Analyse C = A B (see {@link SparseProduct}); A is rows x inner, B inner x cols. @internal */
export function sparseProduct(a: RowStructure, b: RowStructure): SparseProduct {
  if (a.cols !== b.rows) throw new RangeError(`sparseProduct: ${a.rows} x ${a.cols} times ${b.rows} x ${b.cols}`);
  const rowStart = new Int32Array(a.rows + 1);
  const cols: number[] = [];
  const slotOfCol = new Int32Array(b.cols).fill(-1);
  const outSlot: number[] = [];
  const aEntry: number[] = [];
  const bEntry: number[] = [];
  for (let i = 0; i < a.rows; i++) {
    const first = cols.length;
    // Structure of row i first (columns ascending), then the triples.
    const seen: number[] = [];
    for (let e = a.rowStart[i]!; e < a.rowStart[i + 1]!; e++) {
      const l = a.col[e]!;
      for (let f = b.rowStart[l]!; f < b.rowStart[l + 1]!; f++) {
        const j = b.col[f]!;
        if (slotOfCol[j] === -1) {
          slotOfCol[j] = 0;
          seen.push(j);
        }
      }
    }
    seen.sort((x, y) => x - y);
    for (let s = 0; s < seen.length; s++) {
      slotOfCol[seen[s]!] = first + s;
      cols.push(seen[s]!);
    }
    for (let e = a.rowStart[i]!; e < a.rowStart[i + 1]!; e++) {
      const l = a.col[e]!;
      for (let f = b.rowStart[l]!; f < b.rowStart[l + 1]!; f++) {
        outSlot.push(slotOfCol[b.col[f]!]!);
        aEntry.push(e);
        bEntry.push(f);
      }
    }
    for (const j of seen) slotOfCol[j] = -1;
    rowStart[i + 1] = cols.length;
  }
  const structure: RowStructure = { rows: a.rows, cols: b.cols, rowStart, col: Int32Array.from(cols) };
  // The triples stay in the plain arrays of small integers they were pushed into (no typed-array detach check).
  const terms = outSlot.length;
  return {
    structure,
    evaluate(av, bv, out) {
      out.fill(0, 0, structure.col.length);
      for (let t = 0; t < terms; t++) out[outSlot[t]!] = out[outSlot[t]!]! + av[aEntry[t]!]! * bv[bEntry[t]!]!;
    },
  };
}

/**
 * The transpose of a sparse matrix given by compressed columns (as the
 * null-space bases are), as row structure and the permutation of values:
 * entry e of the result holds value[valueOf[e]] of the columns. @internal
 */
export function rowsOfColumns(n: number, k: number, start: Int32Array, index: Int32Array): { structure: RowStructure; valueOf: Int32Array } {
  const rowStart = new Int32Array(n + 1);
  for (let e = 0; e < index.length; e++) rowStart[index[e]! + 1]!++;
  for (let i = 0; i < n; i++) rowStart[i + 1]! += rowStart[i]!;
  const next = rowStart.slice(0, n);
  const col = new Int32Array(index.length);
  const valueOf = new Int32Array(index.length);
  for (let j = 0; j < k; j++) {
    for (let e = start[j]!; e < start[j + 1]!; e++) {
      const s = next[index[e]!]!++;
      col[s] = j;
      valueOf[s] = e;
    }
  }
  return { structure: { rows: n, cols: k, rowStart, col }, valueOf };
}
