import type { SparsePattern } from './sparse-pattern.js';

/**
 * Reverse Cuthill-McKee ordering of the symmetric pattern A + A^T: a
 * breadth-first numbering from a pseudo-peripheral node, neighbours by
 * increasing degree, reversed (E. Cuthill and J. McKee, Reducing the
 * bandwidth of sparse symmetric matrices, Proc. 24th ACM National Conference,
 * 1969; the reversal and the pseudo-peripheral start node after A. George and
 * J. W. H. Liu, Computer Solution of Large Sparse Positive Definite Systems,
 * Prentice-Hall 1981, sect. 4.3 and 4.4). Chains and ladders of elements get
 * a bandwidth of a few entries, whatever order the unknowns were created in.
 * Returns order[k] = original index of the k-th unknown; each connected
 * component is numbered in turn.
 *
 * @example
 * ```ts
 * const order = reverseCuthillMcKee(pattern);
 * const permuted = order.map((i) => y[i]);
 * ```
 */
export function reverseCuthillMcKee(pattern: SparsePattern): Int32Array {
  const { n } = pattern;
  const adjacency = symmetricAdjacency(pattern);
  const degree = Int32Array.from(adjacency, (a) => a.length);
  const visited = new Uint8Array(n);
  const order = new Int32Array(n);
  let count = 0;
  const levelOf = new Int32Array(n);
  for (let seed = 0; seed < n; seed++) {
    if (visited[seed]) continue;
    const start = pseudoPeripheral(seed, adjacency, degree, levelOf);
    // Breadth-first search, neighbours in increasing degree.
    let head = count;
    order[count++] = start;
    visited[start] = 1;
    while (head < count) {
      const v = order[head++]!;
      const next = adjacency[v]!.filter((w) => !visited[w]).sort((a, b) => degree[a]! - degree[b]! || a - b);
      for (const w of next) {
        visited[w] = 1;
        order[count++] = w;
      }
    }
  }
  return order.reverse();
}

/** Neighbour lists of A + A^T without the diagonal. */
function symmetricAdjacency(pattern: SparsePattern): number[][] {
  const { n, rowStart, col } = pattern;
  const sets: Set<number>[] = Array.from({ length: n }, () => new Set<number>());
  for (let i = 0; i < n; i++) {
    for (let k = rowStart[i]!; k < rowStart[i + 1]!; k++) {
      const j = col[k]!;
      if (j === i) continue;
      sets[i]!.add(j);
      sets[j]!.add(i);
    }
  }
  return sets.map((s) => [...s].sort((a, b) => a - b));
}

/**
 * A node of (nearly) maximal eccentricity in the component of `seed` (George
 * and Liu 1981, sect. 4.4.2): repeat a level-structure search from a node of
 * least degree in the last level while the number of levels grows.
 */
function pseudoPeripheral(seed: number, adjacency: number[][], degree: Int32Array, levelOf: Int32Array): number {
  let root = seed;
  let depth = -1;
  for (;;) {
    const { levels, last } = levelStructure(root, adjacency, levelOf);
    if (levels <= depth) return root;
    depth = levels;
    let best = last[0]!;
    for (const v of last) if (degree[v]! < degree[best]!) best = v;
    if (best === root) return root;
    root = best;
  }
}

/** Breadth-first level structure from root: its number of levels and the nodes of the last one. */
function levelStructure(root: number, adjacency: number[][], levelOf: Int32Array): { levels: number; last: number[] } {
  const queue: number[] = [root];
  const seen = new Set<number>([root]);
  levelOf[root] = 0;
  let maxLevel = 0;
  for (let h = 0; h < queue.length; h++) {
    const v = queue[h]!;
    for (const w of adjacency[v]!) {
      if (seen.has(w)) continue;
      seen.add(w);
      levelOf[w] = levelOf[v]! + 1;
      maxLevel = Math.max(maxLevel, levelOf[w]!);
      queue.push(w);
    }
  }
  return { levels: maxLevel + 1, last: queue.filter((v) => levelOf[v] === maxLevel) };
}
