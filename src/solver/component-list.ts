import { identityPermutation, packedDoubles } from './packed-doubles.js';

/**
 * Component indices in arrays allocated once and rewritten in place: what a
 * failure would name (the largest increments of a failed Newton iteration,
 * the largest errors of a rejected step, the components with non-finite f)
 * is recorded at every such event, but read only when the run finally
 * fails, so that recording it allocates nothing in a run that succeeds.
 * {@link ComponentList.toArray} makes the caller's copy.
 *
 * @internal
 * @example
 * ```ts
 * const worst = new ComponentList(3);
 * for (let i = 0; i < v.length; i++) worst.keepLargest(3, i, Math.abs(v[i]!));
 * const named = worst.toArray(); // indices of the three largest, largest first
 * worst.clear();
 * ```
 */
export class ComponentList {
  /** The indices (the first `length` entries are meaningful). */
  private readonly indices: number[];
  /** Their magnitudes, for {@link ComponentList.keepLargest}. */
  private readonly sizes: number[];
  length = 0;

  /** Room for `capacity` indices. */
  constructor(readonly capacity: number) {
    this.indices = identityPermutation(capacity);
    this.sizes = packedDoubles(capacity);
  }

  clear(): void {
    this.length = 0;
  }

  /** Append index i (the caller stays within the capacity). */
  push(i: number): void {
    this.indices[this.length++] = i;
  }

  /**
   * Selection of the `count` largest (count <= capacity): insert index i
   * with magnitude a when it ranks, after every entry at least as large, so
   * ties keep index order as a stable descending sort would. NaN and zero
   * never rank.
   */
  keepLargest(count: number, i: number, a: number): void {
    if (!(a > 0)) return;
    const top = this.indices;
    const size = this.sizes;
    let p = this.length;
    while (p > 0 && size[p - 1]! < a) p--;
    if (p >= count) return;
    // Shift the smaller entries down one place, dropping the last when the list is full.
    let q = this.length;
    if (q < count) this.length++;
    else q = count - 1;
    for (; q > p; q--) {
      top[q] = top[q - 1]!;
      size[q] = size[q - 1]!;
    }
    top[p] = i;
    size[p] = a;
  }

  /** The indices as an array of the caller's. */
  toArray(): number[] {
    return this.indices.slice(0, this.length);
  }
}
