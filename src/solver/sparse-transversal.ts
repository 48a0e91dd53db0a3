import type { SparsePattern } from './sparse-pattern.js';

/**
 * A row for every column such that the entry (row, column) is in the
 * pattern, each row used once where possible (a maximum transversal, found
 * by depth-first augmenting paths: I. S. Duff, On algorithms for obtaining a
 * maximum transversal, ACM TOMS 7, 1981, the method of his MC21; iterative
 * here, so long paths do not overflow the stack). Permuting the rows so that
 * row rowOf[j] comes j-th puts non-zeros on the diagonal; a symmetric
 * fill-reducing ordering (reverse Cuthill-McKee on A + A^T) then sees the
 * matrix's real structure. Systems whose row numbering has nothing to do
 * with the column numbering (rows of M and of J recombined by the null-space
 * bases of consistent initialisation) need this, or the band spans the
 * whole matrix. Columns left without a row (a structurally singular
 * pattern) get the unused rows in order.
 *
 * @internal
 * @example
 * ```ts
 * const rowOf = maximumTransversal(pattern); // row rowOf[j] for column j
 * ```
 */
export function maximumTransversal(pattern: SparsePattern): Int32Array {
  const { n, rowStart, col } = pattern;
  // Rows of each column (compressed columns).
  const colStart = new Int32Array(n + 1);
  for (let e = 0; e < col.length; e++) colStart[col[e]! + 1]!++;
  for (let j = 0; j < n; j++) colStart[j + 1]! += colStart[j]!;
  const rowsOfCol = new Int32Array(col.length);
  const fill = colStart.slice(0, n);
  for (let i = 0; i < n; i++) for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) rowsOfCol[fill[col[e]!]!++] = i;

  const rowOf = new Int32Array(n).fill(-1);
  const colOfRow = new Int32Array(n).fill(-1);
  // Cheap assignment first: an unused row of the column.
  for (let j = 0; j < n; j++) {
    for (let e = colStart[j]!; e < colStart[j + 1]!; e++) {
      const i = rowsOfCol[e]!;
      if (colOfRow[i] === -1) {
        colOfRow[i] = j;
        rowOf[j] = i;
        break;
      }
    }
  }
  // Augmenting paths for the rest: column -> a row -> the column that row serves -> ...
  const visited = new Int32Array(n).fill(-1);
  const stackCol = new Int32Array(n);
  const stackPos = new Int32Array(n);
  for (let j0 = 0; j0 < n; j0++) {
    if (rowOf[j0] !== -1) continue;
    let depth = 0;
    stackCol[0] = j0;
    stackPos[0] = colStart[j0]!;
    let found = -1;
    while (depth >= 0 && found < 0) {
      const j = stackCol[depth]!;
      const end = colStart[j + 1]!;
      let advanced = false;
      while (stackPos[depth]! < end) {
        const i = rowsOfCol[stackPos[depth]!++]!;
        if (visited[i] === j0) continue;
        visited[i] = j0;
        if (colOfRow[i] === -1) {
          found = i;
          break;
        }
        const next = colOfRow[i]!;
        depth++;
        stackCol[depth] = next;
        stackPos[depth] = colStart[next]!;
        advanced = true;
        break;
      }
      if (found >= 0) break;
      if (!advanced) depth--;
    }
    if (found < 0) continue;
    // Flip the path: each column on the stack takes the row it reached.
    let i = found;
    for (let d = depth; d >= 0; d--) {
      const j = stackCol[d]!;
      const previous = rowOf[j]!;
      rowOf[j] = i;
      colOfRow[i] = j;
      i = previous;
    }
  }
  let spare = 0;
  for (let j = 0; j < n; j++) {
    if (rowOf[j] !== -1) continue;
    while (colOfRow[spare] !== -1) spare++;
    rowOf[j] = spare;
    colOfRow[spare] = j;
  }
  return rowOf;
}

/**
 * {@link maximumTransversal} of the non-zeros of a dense row-major n x n
 * matrix (only those: a pattern from `sparsePattern` also holds the
 * diagonal, which would match every column to its own row).
 *
 * @internal
 */
export function maximumTransversalOfDense(a: Float64Array, n: number): Int32Array {
  const rowStart = new Int32Array(n + 1);
  const cols: number[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) if (a[i * n + j] !== 0) cols.push(j);
    rowStart[i + 1] = cols.length;
  }
  return maximumTransversal({ n, rowStart, col: Int32Array.from(cols) });
}
