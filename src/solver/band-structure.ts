import { reverseCuthillMcKee } from './reverse-cuthill-mckee.js';
import type { SparsePattern } from './sparse-pattern.js';

/**
 * Symbolic analysis of a sparse pattern for the band LU, done once and
 * reused by every factorisation on that pattern: a reverse Cuthill-McKee
 * ordering, the lower and upper bandwidths of the permuted matrix, and where
 * each pattern entry goes in the band storage. With partial pivoting
 * (row interchanges within the lower band, as LAPACK's xGBTRF) the upper
 * band of U grows to upper + lower: the storage has room for that fill.
 *
 * Band storage: row r of the permuted matrix holds columns
 * r - lower .. r + lower + upper at r * width + (c - r + lower).
 *
 * @example
 * ```ts
 * const s = analyseBand(pattern);
 * console.log(s.lower, s.upper); // bandwidths after reordering
 * ```
 */
export interface BandStructure {
  readonly pattern: SparsePattern;
  /** order[k] = original index of permuted unknown k. */
  readonly order: Int32Array;
  /** position[i] = permuted index of original unknown i. */
  readonly position: Int32Array;
  readonly lower: number;
  readonly upper: number;
  readonly width: number;
  /** Band-storage index of each pattern entry. */
  readonly slotOfEntry: Int32Array;
}

/**
 * Reorder and size the band for `pattern` (see {@link BandStructure}).
 *
 * @example
 * ```ts
 * const s = analyseBand(sparsePattern(n, rows, cols));
 * ```
 */
export function analyseBand(pattern: SparsePattern): BandStructure {
  const { n, rowStart, col } = pattern;
  const order = reverseCuthillMcKee(pattern);
  const position = new Int32Array(n);
  for (let k = 0; k < n; k++) position[order[k]!] = k;
  let lower = 0;
  let upper = 0;
  for (let i = 0; i < n; i++) {
    const r = position[i]!;
    for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
      const c = position[col[e]!]!;
      lower = Math.max(lower, r - c);
      upper = Math.max(upper, c - r);
    }
  }
  const width = 2 * lower + upper + 1;
  const slotOfEntry = new Int32Array(col.length);
  for (let i = 0; i < n; i++) {
    const r = position[i]!;
    for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) slotOfEntry[e] = r * width + (position[col[e]!]! - r + lower);
  }
  return { pattern, order, position, lower, upper, width, slotOfEntry };
}
