import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { TopologyError } from '../errors.js';
import { elementKind } from '../elements/registry.js';
import type { ElementDescription, NetworkDescription } from '../network/description.js';
import type { MagneticLoops } from './magnetic-graph.js';
import { UnionFind } from './union-find.js';

/**
 * Check that a network can be simulated as built. Each failure raises a
 * TopologyError whose message names the elements and says how to fix the
 * model; `elements` lists the names. Checks run in an order where the
 * earlier ones make the later messages meaningful.
 *
 * @example
 * ```ts
 * checkTopology(net.describe(), loops); // throws TopologyError('floating-node', ...) for a floating part
 * ```
 */
export function checkTopology(d: NetworkDescription, loops: MagneticLoops): void {
  checkNotEmpty(d);
  checkMagneticNodes(d);
  checkWindingPaths(d, loops);
  checkFloatingNodes(d);
  checkOpenTerminals(d);
  checkVoltageSourceLoops(d);
  checkCurrentSourceCutsets(d);
  checkIdealWindingLoops(d, loops);
}

const quote = (names: readonly string[]): string => names.map((n) => `"${n}"`).join(', ');

function checkNotEmpty(d: NetworkDescription): void {
  // Without electric nodes besides ground and without magnetic nodes there is nothing to solve for.
  if (d.electricNodes.length <= 1 && d.magneticNodes.length === 0) {
    throw new TopologyError(
      'empty-network',
      `network "${d.name}" has no electric node besides ground and no magnetic node, so there is nothing to simulate; ` +
        `add nodes and elements before calling simulate`,
      [d.name],
    );
  }
}

function checkMagneticNodes(d: NetworkDescription): void {
  const degree = new Int32Array(d.magneticNodes.length);
  for (const t of d.tubes) {
    degree[t.from]!++;
    degree[t.to]!++;
  }
  d.magneticNodes.forEach((node, k) => {
    if (degree[k] === 0) {
      throw new TopologyError(
        'unused-magnetic-node',
        `magnetic node "${node.name}" has no flux tube; connect tubes to it or remove it`,
        [node.name],
      );
    }
    if (degree[k] === 1) {
      const tube = d.tubes.find((t) => t.from === k || t.to === k)!;
      throw new TopologyError(
        'dangling-magnetic-node',
        `magnetic node "${node.name}" has only one flux tube ("${tube.name}"), so no flux can pass; ` +
          `close the magnetic path (add the return tube, gap or leakage path) or remove the tube`,
        [node.name, tube.name],
      );
    }
  });
}

function checkWindingPaths(d: NetworkDescription, loops: MagneticLoops): void {
  for (const e of d.elements) {
    const linked = elementKind(e).linkedFlux?.(e);
    if (linked === undefined) continue;
    if (loops.tubeLoops[linked.tube]!.length === 0) {
      const tube = d.tubes[linked.tube]!;
      throw new TopologyError(
        'winding-on-open-path',
        `${elementKind(e).noun} "${e.name}" sits on tube "${tube.name}", which is not part of any closed magnetic path, so its flux is always zero; ` +
          `close the magnetic circuit through tube "${tube.name}"`,
        [e.name, tube.name],
      );
    }
  }
}

function checkFloatingNodes(d: NetworkDescription): void {
  const uf = new UnionFind(d.electricNodes.length);
  for (const e of d.elements) uf.union(e.plus, e.minus);
  const groundRoot = uf.find(0);
  const floating = new Map<number, string[]>();
  d.electricNodes.forEach((node, k) => {
    const r = uf.find(k);
    if (r === groundRoot) return;
    floating.set(r, [...(floating.get(r) ?? []), node.name]);
  });
  for (const names of floating.values()) {
    const touching = d.elements.filter((e) => names.includes(d.electricNodes[e.plus]!.name)).map((e) => e.name);
    const what = touching.length === 0 ? `node${names.length > 1 ? 's' : ''} ${quote(names)} ${names.length > 1 ? 'are' : 'is'} connected to nothing` :
      `node${names.length > 1 ? 's' : ''} ${quote(names)} (elements ${quote(touching)}) ${names.length > 1 ? 'have' : 'has'} no connection to ground`;
    throw new TopologyError(
      'floating-node',
      `${what}; every part of the circuit needs a reference: connect one of its nodes to ground ` +
        `(for a magnetically coupled secondary, tie one winding terminal to ground) or remove unused nodes`,
      [...names, ...touching],
    );
  }
}

function checkOpenTerminals(d: NetworkDescription): void {
  const users: ElementDescription[][] = d.electricNodes.map(() => []);
  for (const e of d.elements) {
    users[e.plus]!.push(e);
    users[e.minus]!.push(e);
  }
  users.forEach((list, k) => {
    if (k === 0 || list.length !== 1) return;
    const e = list[0]!;
    const node = d.electricNodes[k]!.name;
    const kind = elementKind(e);
    if (kind.openTerminalCode !== undefined) {
      throw new TopologyError(
        kind.openTerminalCode === 'open-winding' ? 'open-winding' : 'open-terminal',
        `${kind.noun} "${e.name}" has its terminal node "${node}" connected to nothing else, which forces its current to zero; ` +
          `connect the terminal, or model an open circuit with a large resistor (for example 1e6 ohm) across it`,
        [e.name, node],
      );
    }
  });
}

function checkVoltageSourceLoops(d: NetworkDescription): void {
  const adjacency: { to: number; element: number }[][] = d.electricNodes.map(() => []);
  const uf = new UnionFind(d.electricNodes.length);
  d.elements.forEach((e, k) => {
    if (elementKind(e).role !== 'voltage-source') return;
    if (!uf.union(e.plus, e.minus)) {
      const path = treePath(adjacency, e.plus, e.minus).map((i) => d.elements[i]!.name);
      const names = [e.name, ...path];
      throw new TopologyError(
        'voltage-source-loop',
        `voltage sources ${quote(names)} form a loop, so their voltages over-determine the loop and its current is undefined; ` +
          `add series resistance (a source impedance) to one of them or remove one`,
        names,
      );
    }
    adjacency[e.plus]!.push({ to: e.minus, element: k });
    adjacency[e.minus]!.push({ to: e.plus, element: k });
  });
}

function checkCurrentSourceCutsets(d: NetworkDescription): void {
  const uf = new UnionFind(d.electricNodes.length);
  const isCurrentSource = (e: ElementDescription): boolean => elementKind(e).role === 'current-source';
  for (const e of d.elements) if (!isCurrentSource(e)) uf.union(e.plus, e.minus);
  const groups = new Map<number, string[]>();
  for (const e of d.elements) {
    if (!isCurrentSource(e)) continue;
    const a = uf.find(e.plus);
    const b = uf.find(e.minus);
    if (a === b) continue;
    for (const r of [a, b]) groups.set(r, [...(groups.get(r) ?? []), e.name]);
  }
  for (const [root, sources] of groups) {
    if (root === uf.find(0)) continue;
    const nodes = d.electricNodes.filter((_, k) => uf.find(k) === root).map((n) => n.name);
    throw new TopologyError(
      'current-source-cutset',
      `nodes ${quote(nodes)} are joined to the rest of the circuit only through current sources ${quote(sources)}, ` +
        `whose currents cannot all flow; add a path (a resistor, winding or inductor) in parallel with one of them`,
      [...sources, ...nodes],
    );
  }
}

/**
 * Zero-resistance windings and voltage sources forming loops prescribe
 * combinations of flux derivatives (Faraday's law around each loop). If those
 * combinations are linearly dependent, two loops prescribe the same flux:
 * the network is over-constrained (or the loop current is undefined).
 */
function checkIdealWindingLoops(d: NetworkDescription, loops: MagneticLoops): void {
  const edges: { element: number; a: number; b: number }[] = [];
  const linkedFlux = (k: number): { readonly tube: number; readonly turns: number } | undefined => {
    const e = d.elements[k]!;
    return elementKind(e).linkedFlux?.(e);
  };
  d.elements.forEach((e, k) => {
    if (elementKind(e).rigidVoltage?.(e)) edges.push({ element: k, a: e.plus, b: e.minus });
  });
  if (!edges.some((e) => linkedFlux(e.element) !== undefined)) return;
  const adjacency: { to: number; element: number }[][] = d.electricNodes.map(() => []);
  const uf = new UnionFind(d.electricNodes.length);
  const constraints: { vector: Float64Array; windings: string[] }[] = [];
  for (const edge of edges) {
    if (uf.union(edge.a, edge.b)) {
      adjacency[edge.a]!.push({ to: edge.b, element: edge.element });
      adjacency[edge.b]!.push({ to: edge.a, element: edge.element });
      continue;
    }
    // The cycle: this edge (a -> b) and the forest path b -> a. Orientation signs follow the walk.
    const vector = new Float64Array(loops.loopCount);
    const windings: string[] = [];
    const addWinding = (k: number, sign: number): void => {
      const linked = linkedFlux(k);
      if (linked === undefined) return;
      windings.push(d.elements[k]!.name);
      for (const en of loops.tubeLoops[linked.tube]!) vector[en.loop]! += sign * linked.turns * en.sign;
    };
    addWinding(edge.element, 1);
    let at = edge.b;
    for (const k of treePath(adjacency, edge.b, edge.a)) {
      const e = d.elements[k]!;
      const forward = e.plus === at;
      addWinding(k, forward ? 1 : -1);
      at = forward ? e.minus : e.plus;
    }
    if (windings.length > 0) constraints.push({ vector, windings });
  }
  if (constraints.length === 0) return;
  const scale = Math.max(...constraints.map((c) => Math.max(...c.vector.map(Math.abs))));
  for (const c of constraints) {
    if (Math.max(...c.vector.map(Math.abs)) <= 1e-12 * Math.max(scale, 1)) {
      throw new TopologyError(
        'cancelling-winding-loop',
        `zero-resistance windings ${quote(c.windings)} form a loop whose induced voltages cancel, so the current around it is undefined; ` +
          `give the windings their resistance`,
        c.windings,
      );
    }
  }
  const A = new Matrix(constraints.map((c) => Array.from(c.vector)));
  const svd = new SingularValueDecomposition(A.transpose(), { autoTranspose: true });
  const sv = svd.diagonal;
  const rank = sv.filter((s) => s > 1e-10 * (sv[0] ?? 0)).length;
  if (rank < constraints.length) {
    const names = [...new Set(constraints.flatMap((c) => c.windings))];
    throw new TopologyError(
      'over-constrained-flux',
      `zero-resistance windings ${quote(names)}, driven through voltage sources, prescribe the same flux more than once; ` +
        `give the windings their resistance or drive the flux from one winding only`,
      names,
    );
  }
}

/** Element indices along the forest path from node `from` to node `to` (they are known to be connected). */
function treePath(adjacency: readonly { to: number; element: number }[][], from: number, to: number): number[] {
  const prev = new Map<number, { node: number; element: number }>();
  const queue = [from];
  const seen = new Set([from]);
  for (let q = 0; q < queue.length; q++) {
    const u = queue[q]!;
    if (u === to) break;
    for (const { to: w, element } of adjacency[u]!) {
      if (seen.has(w)) continue;
      seen.add(w);
      prev.set(w, { node: u, element });
      queue.push(w);
    }
  }
  const path: number[] = [];
  for (let at = to; at !== from; ) {
    const p = prev.get(at)!;
    path.push(p.element);
    at = p.node;
  }
  return path.reverse();
}
