/**
 * Fundamental loops of the magnetic graph. Nodes are magnetic nodes, edges
 * are flux tubes (oriented from -> to). A spanning forest is grown breadth
 * first; each tube outside it (a chord) closes exactly one fundamental loop
 * with the tree path between its ends, oriented along the chord. Branch
 * fluxes are then phi = B^T psi with B the loop-branch incidence (entries
 * -1, 0, +1), so flux is conserved at every node whatever psi is
 * (Kirchhoff's cycle space; e.g. Chua, Desoer and Kuh, Linear and Nonlinear
 * Circuits, 1987, ch. 10 on fundamental loops; common practice).
 */

/** One nonzero of the loop-branch incidence: loop `loop` passes tube `tube` with `sign`. */
export interface LoopEntry {
  readonly loop: number;
  readonly tube: number;
  readonly sign: 1 | -1;
}

/** The magnetic graph's loop structure. */
export interface MagneticLoops {
  /** Number of fundamental loops (= tubes - nodes + components). */
  readonly loopCount: number;
  /** Per loop, its tubes with signs. */
  readonly loops: readonly (readonly LoopEntry[])[];
  /** Per tube, the loops through it with signs (phi_tube = sum sign * psi_loop). */
  readonly tubeLoops: readonly (readonly LoopEntry[])[];
  /** Per loop, the chord tube that defines it. */
  readonly chords: readonly number[];
  /**
   * Tree for recovering node MMFs: nodes in breadth-first order; for each
   * node its parent tube (-1 for a root) and whether it is that tube's `to`
   * end. The MMF of a root is 0.
   */
  readonly order: readonly number[];
  readonly parentTube: Int32Array;
  readonly parentIsTo: Uint8Array;
  /** Component (root node) of each node. */
  readonly root: Int32Array;
}

/**
 * Compute the fundamental loops of a graph with `nodeCount` nodes and the
 * given oriented edges.
 *
 * @example
 * ```ts
 * // a single ring of three tubes: one loop
 * fundamentalLoops(3, [{ from: 0, to: 1 }, { from: 1, to: 2 }, { from: 2, to: 0 }]).loopCount; // 1
 * ```
 */
export function fundamentalLoops(nodeCount: number, edges: readonly { readonly from: number; readonly to: number }[]): MagneticLoops {
  const adjacency: number[][] = Array.from({ length: nodeCount }, () => []);
  edges.forEach((e, k) => {
    adjacency[e.from]!.push(k);
    adjacency[e.to]!.push(k);
  });
  const parentTube = new Int32Array(nodeCount).fill(-1);
  const parentIsTo = new Uint8Array(nodeCount);
  const depth = new Int32Array(nodeCount).fill(-1);
  const root = new Int32Array(nodeCount).fill(-1);
  const inTree = new Uint8Array(edges.length);
  const order: number[] = [];
  for (let start = 0; start < nodeCount; start++) {
    if (depth[start] !== -1) continue;
    depth[start] = 0;
    root[start] = start;
    const queue = [start];
    for (let q = 0; q < queue.length; q++) {
      const u = queue[q]!;
      order.push(u);
      for (const k of adjacency[u]!) {
        const e = edges[k]!;
        const v = e.from === u ? e.to : e.from;
        if (depth[v] !== -1) continue;
        depth[v] = depth[u]! + 1;
        root[v] = start;
        parentTube[v] = k;
        parentIsTo[v] = e.to === v ? 1 : 0;
        inTree[k] = 1;
        queue.push(v);
      }
    }
  }

  const loops: LoopEntry[][] = [];
  const chords: number[] = [];
  edges.forEach((e, k) => {
    if (inTree[k]) return;
    const loop = loops.length;
    const entries: LoopEntry[] = [{ loop, tube: k, sign: 1 }];
    // Walk the loop: after the chord (from -> to), return from `to` to `from` through the tree.
    // Path to -> lca is traversed upwards (child to parent); lca -> from downwards.
    let a = e.to;
    let b = e.from;
    const down: LoopEntry[] = [];
    while (a !== b) {
      if (depth[a]! >= depth[b]!) {
        // Moving from a to its parent: along the tube if a is its `from` end.
        const t = parentTube[a]!;
        entries.push({ loop, tube: t, sign: parentIsTo[a] ? -1 : 1 });
        a = edges[t]!.from === a ? edges[t]!.to : edges[t]!.from;
      } else {
        // Moving (later, in reverse) from b's parent down to b: along the tube if b is its `to` end.
        const t = parentTube[b]!;
        down.push({ loop, tube: t, sign: parentIsTo[b] ? 1 : -1 });
        b = edges[t]!.from === b ? edges[t]!.to : edges[t]!.from;
      }
    }
    entries.push(...down.reverse());
    loops.push(entries);
    chords.push(k);
  });

  const tubeLoops: LoopEntry[][] = Array.from({ length: edges.length }, () => []);
  for (const entries of loops) for (const en of entries) tubeLoops[en.tube]!.push(en);
  return { loopCount: loops.length, loops, tubeLoops, chords, order, parentTube, parentIsTo, root };
}
