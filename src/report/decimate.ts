// Display decimation that keeps peaks: the M4 aggregation of U. Jugel,
// Z. Jerzak, G. Hackenbroich, V. Markl, "M4: a visualization-oriented time
// series data aggregation", Proc. VLDB Endowment 7(10), 2014, pp. 797-808.
// The x range is cut into equal-width buckets (one per pixel column); in each
// bucket the first and last sample and the samples holding the minimum and
// the maximum value are kept. A line drawn through the kept samples covers the
// same pixels of each column as the full series (the paper's sect. 4), so an
// inrush peak or a one-sample spike is never lost.
import type { NumericArray } from './report-data.js';

/**
 * Indices of the samples to keep when drawing the columns `columns[c][i]`
 * against the shared, non-decreasing `t[i]` on `buckets` pixel columns.
 *
 * Per bucket (equal widths of the range `[range[0], range[1]]`, default the
 * first and last `t`), it keeps the first and last sample and, for each
 * column, the samples with its smallest and largest finite value, plus the
 * first non-finite sample so a gap stays visible. Kept indices are the union
 * over columns, so columns sharing `t` still share one decimated `t`. When
 * `t` has at most `4 * buckets` samples, every index is returned.
 *
 * Samples outside `range` fall into the first or last bucket.
 *
 * @returns ascending sample indices (at most `(2 + 3 * columns.length) * buckets`).
 *
 * @example
 * ```ts
 * const keep = decimateMinMax(t, [iPrimary, iSecondary], 1000);
 * const tShown = Array.from(keep, (i) => t[i]);
 * const iShown = Array.from(keep, (i) => iPrimary[i]); // its peak is still there
 * ```
 */
export function decimateMinMax(
  t: NumericArray,
  columns: readonly NumericArray[],
  buckets: number,
  range?: readonly [number, number],
): Uint32Array {
  const n = t.length;
  const nb = Math.max(1, Math.floor(buckets));
  if (n <= 4 * nb) return Uint32Array.from({ length: n }, (_, i) => i);

  const t0 = range?.[0] ?? (t[0] as number);
  const t1 = range?.[1] ?? (t[n - 1] as number);
  const scale = t1 > t0 ? nb / (t1 - t0) : 0;
  const bucketOf = (x: number): number => Math.min(nb - 1, Math.max(0, Math.floor((x - t0) * scale)));

  const keep = new Uint8Array(n);
  const nc = columns.length;
  const minIdx = new Int32Array(nc);
  const maxIdx = new Int32Array(nc);
  const gapIdx = new Int32Array(nc);

  const flush = (first: number, last: number): void => {
    keep[first] = 1;
    keep[last] = 1;
    for (let c = 0; c < nc; c++) {
      const lo = minIdx[c] as number;
      const hi = maxIdx[c] as number;
      const gap = gapIdx[c] as number;
      if (lo >= 0) keep[lo] = 1;
      if (hi >= 0) keep[hi] = 1;
      if (gap >= 0) keep[gap] = 1;
    }
  };

  let bucket = -1;
  let first = 0;
  for (let i = 0; i < n; i++) {
    const b = bucketOf(t[i] as number);
    if (b !== bucket) {
      if (bucket >= 0) flush(first, i - 1);
      bucket = b;
      first = i;
      minIdx.fill(-1);
      maxIdx.fill(-1);
      gapIdx.fill(-1);
    }
    for (let c = 0; c < nc; c++) {
      const v = (columns[c] as NumericArray)[i] as number;
      if (!Number.isFinite(v)) {
        if ((gapIdx[c] as number) < 0) gapIdx[c] = i;
        continue;
      }
      const lo = minIdx[c] as number;
      const hi = maxIdx[c] as number;
      const col = columns[c] as NumericArray;
      if (lo < 0 || v < (col[lo] as number)) minIdx[c] = i;
      if (hi < 0 || v > (col[hi] as number)) maxIdx[c] = i;
    }
  }
  flush(first, n - 1);

  let count = 0;
  for (let i = 0; i < n; i++) count += keep[i] as number;
  const out = new Uint32Array(count);
  for (let i = 0, k = 0; i < n; i++) if (keep[i]) out[k++] = i;
  return out;
}
