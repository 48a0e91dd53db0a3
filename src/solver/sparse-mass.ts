/**
 * A constant mass matrix held by its non-zeros (compressed rows): row i
 * holds `value[e]` at column `col[e]` for e in rowStart[i] .. rowStart[i + 1] - 1,
 * columns increasing within a row, no exact zeros, one entry per position.
 * The solver's set-up (row compression, null spaces, the iteration pattern)
 * reads M in this form, so no `n x n` array is needed on the sparse path.
 *
 * @internal
 */
export interface SparseMass {
  readonly n: number;
  readonly rowStart: Int32Array;
  readonly col: Int32Array;
  readonly value: Float64Array;
}

/**
 * M from row-major dense storage (exact zeros dropped). O(n^2): for a dense input only.
 *
 * @internal
 * @example
 * ```ts
 * sparseMassOfDense(Float64Array.of(1, 0, 0, 0), 2).col; // [0]
 * ```
 */
export function sparseMassOfDense(mass: Float64Array, n: number): SparseMass {
  const rowStart = new Int32Array(n + 1);
  let nnz = 0;
  for (let k = 0; k < n * n; k++) if (mass[k] !== 0) nnz++;
  const col = new Int32Array(nnz);
  const value = new Float64Array(nnz);
  let e = 0;
  for (let i = 0; i < n; i++) {
    const base = i * n;
    for (let j = 0; j < n; j++) {
      const v = mass[base + j]!;
      if (v !== 0) {
        col[e] = j;
        value[e++] = v;
      }
    }
    rowStart[i + 1] = e;
  }
  return { n, rowStart, col, value };
}

/**
 * M from (row, col, value) triplets: entries at one position add up, and
 * positions that add up to an exact zero are dropped. The caller has
 * checked that indices are in range and values finite. O(nnz log nnz).
 *
 * @internal
 * @example
 * ```ts
 * sparseMassOfEntries(2, [0, 0, 1], [0, 0, 1], [0.5, 0.5, 2]).value; // [1, 2]
 * ```
 */
export function sparseMassOfEntries(n: number, rows: ArrayLike<number>, cols: ArrayLike<number>, values: ArrayLike<number>): SparseMass {
  const m = rows.length;
  // Counting sort by row, then each row sorted by column and merged.
  const count = new Int32Array(n + 1);
  for (let k = 0; k < m; k++) count[rows[k]! + 1]!++;
  for (let i = 0; i < n; i++) count[i + 1]! += count[i]!;
  const byRow = new Int32Array(m);
  const next = count.slice(0, n);
  for (let k = 0; k < m; k++) byRow[next[rows[k]!]!++] = k;
  const rowStart = new Int32Array(n + 1);
  const col: number[] = [];
  const value: number[] = [];
  for (let i = 0; i < n; i++) {
    const slice = Array.from(byRow.subarray(count[i]!, count[i + 1]!)).sort((a, b) => cols[a]! - cols[b]! || a - b);
    for (let s = 0; s < slice.length; ) {
      const j = cols[slice[s]!]!;
      let v = 0;
      // In the order given: the sum is the one a dense stamp target would form.
      for (; s < slice.length && cols[slice[s]!] === j; s++) v += values[slice[s]!]!;
      if (v !== 0) {
        col.push(j);
        value.push(v);
      }
    }
    rowStart[i + 1] = col.length;
  }
  return { n, rowStart, col: Int32Array.from(col), value: Float64Array.from(value) };
}

/**
 * The row-major dense n x n array of M (for the dense path and small problems).
 *
 * @internal
 * @example
 * ```ts
 * const dense = denseOfSparseMass(sparseMassOfEntries(2, [1], [0], [3])); // [0, 0, 3, 0]
 * ```
 */
export function denseOfSparseMass(m: SparseMass): Float64Array {
  const { n, rowStart, col, value } = m;
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) out[i * n + col[e]!] = value[e]!;
  return out;
}

/**
 * Whether M is exactly the identity.
 *
 * @internal
 * @example
 * ```ts
 * isIdentityMass(sparseMassOfEntries(2, [0, 1], [0, 1], [1, 1])); // true
 * ```
 */
export function isIdentityMass(m: SparseMass): boolean {
  const { n, rowStart, col, value } = m;
  if (col.length !== n) return false;
  for (let i = 0; i < n; i++) if (rowStart[i + 1]! - rowStart[i]! !== 1 || col[rowStart[i]!] !== i || value[rowStart[i]!] !== 1) return false;
  return true;
}

/**
 * The connected blocks of M: the components of the bipartite graph of its
 * non-zeros (row i joined to column j when M_ij != 0). Permuting rows and
 * columns by blocks makes M block diagonal. Rows and columns are listed
 * increasing; zero rows and columns belong to no block. Blocks come in the
 * order of their first row. O(nnz).
 *
 * @internal
 * @example
 * ```ts
 * massBlocks(sparseMassOfEntries(3, [0, 2], [0, 1], [1, 1])); // [{ rows: [0], cols: [0] }, { rows: [2], cols: [1] }]
 * ```
 */
export function massBlocks(m: SparseMass): { rows: number[]; cols: number[] }[] {
  const { n, rowStart, col } = m;
  const parent = new Int32Array(2 * n);
  for (let i = 0; i < 2 * n; i++) parent[i] = i;
  const find = (a: number): number => {
    while (parent[a] !== a) {
      parent[a] = parent[parent[a]!]!;
      a = parent[a]!;
    }
    return a;
  };
  const colUsed = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
      const j = col[e]!;
      colUsed[j] = 1;
      const a = find(i);
      const b = find(n + j);
      if (a !== b) parent[a] = b;
    }
  }
  const blocks = new Map<number, { rows: number[]; cols: number[] }>();
  const blockOf = (root: number): { rows: number[]; cols: number[] } => {
    let b = blocks.get(root);
    if (!b) blocks.set(root, (b = { rows: [], cols: [] }));
    return b;
  };
  for (let i = 0; i < n; i++) if (rowStart[i + 1]! > rowStart[i]!) blockOf(find(i)).rows.push(i);
  for (let j = 0; j < n; j++) if (colUsed[j]) blockOf(find(n + j)).cols.push(j);
  return [...blocks.values()];
}

/**
 * The block's entries of M as a dense rows x cols array (row-major), read
 * from the compressed rows: O(entries of the block's rows + its size).
 *
 * @internal
 * @example
 * ```ts
 * const sub = blockOf(mass, massBlocks(mass)[0]!);
 * ```
 */
export function blockOf(mass: SparseMass, b: { readonly rows: readonly number[]; readonly cols: readonly number[] }): Float64Array {
  const q = b.cols.length;
  const sub = new Float64Array(b.rows.length * q);
  const { rowStart, col, value } = mass;
  b.rows.forEach((i, r) => {
    // Columns of a row and of the block are both increasing: a merge.
    let c = 0;
    for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
      while (b.cols[c]! < col[e]!) c++;
      sub[r * q + c] = value[e]!;
    }
  });
  return sub;
}
