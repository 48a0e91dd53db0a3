import type { InputView } from '../elements/element-kind.js';
import { elementKind } from '../elements/registry.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';

/** An inductive current that a jump left without a closed path, and the devices that opened it. */
export interface CutInductiveCurrent {
  /** The inductors or windings whose current has nowhere to go. */
  readonly inductive: readonly string[];
  /** The switches and diodes that stopped conducting at the jump (or every blocking device when none did). */
  readonly devices: readonly string[];
  /** In engineering words, with the fix. */
  readonly message: string;
}

/** A current below this many absolute tolerances counts as zero (a diode that turned off at its zero crossing). */
const CURRENT_FLOOR_ATOL = 100;

/**
 * Finds, after a jump (a gate edge, a diode turning off), an inductive
 * current that the new device states leave with no closed path: an
 * inductor whose terminals are no longer joined by conducting elements
 * (resistors, capacitors, sources, closed switches, conducting diodes,
 * other inductive elements; a switch or diode with a capacitance always
 * conducts), or a winding whose current cannot pass to another winding
 * of the same magnetic loops (the flux linked only with it, such as its
 * leakage flux, would have to collapse). Without this check the current
 * would be forced through the off-conductance: a voltage of I/G_off
 * (megavolts), then a solver failure far from the cause.
 *
 * Structural (union-find over the conducting elements) plus, for
 * windings, a small least-squares test on the loop-winding incidence:
 * the MMF carried by the path-less windings must lie in the span of the
 * MMFs the others can carry. Buffers are allocated once.
 *
 * @example
 * ```ts
 * const check = freewheelCheck(compiled, 1e-6);
 * const cut = check(t, yBefore, before, after);
 * if (cut) console.error(cut.message);
 * ```
 */
export function freewheelCheck(
  compiled: CompiledNetwork,
  atol: number | Float64Array,
): (t: number, yBefore: Float64Array, before: InputView, after: InputView) => CutInductiveCurrent | undefined {
  const d = compiled.description;
  const els = d.elements;
  const inductive = els.flatMap((e, k) => (elementKind(e).role === 'inductive' ? [k] : []));
  const switching = els.flatMap((_e, k) => (compiled.elements[k]!.conducting ? [k] : []));
  const parent = new Int32Array(d.electricNodes.length);
  const conducting = new Uint8Array(els.length);
  const loopCount = compiled.loops.loopCount;
  /** Column of winding w in the loop-winding incidence: s N on every loop through its tube. */
  const column = (w: number): Float64Array => {
    const col = new Float64Array(loopCount);
    const link = elementKind(els[w]!).linkedFlux?.(els[w]!);
    if (!link) return col;
    for (const en of compiled.loops.tubeLoops[link.tube]!) col[en.loop] = col[en.loop]! + en.sign * link.turns;
    return col;
  };
  const columns = new Map(inductive.filter((k) => elementKind(els[k]!).linkedFlux).map((k) => [k, column(k)] as const));
  const atolOf = (i: number): number => (typeof atol === 'number' ? atol : atol[i]!);

  const find = (a: number): number => {
    while (parent[a] !== a) {
      parent[a] = parent[parent[a]!]!;
      a = parent[a]!;
    }
    return a;
  };
  /** Whether the terminals of element `skip` are joined by the other conducting elements. */
  const hasPath = (skip: number): boolean => {
    for (let i = 0; i < parent.length; i++) parent[i] = i;
    for (let k = 0; k < els.length; k++) {
      if (k === skip || !conducting[k]) continue;
      const a = find(els[k]!.plus);
      const b = find(els[k]!.minus);
      if (a !== b) parent[a] = b;
    }
    return find(els[skip]!.plus) === find(els[skip]!.minus);
  };

  return (t, yBefore, before, after) => {
    if (inductive.length === 0 || switching.length === 0) return undefined;
    for (let k = 0; k < els.length; k++) {
      const role = elementKind(els[k]!).role;
      conducting[k] = role !== 'current-source' && (compiled.elements[k]!.conducting?.(t, after) ?? true) ? 1 : 0;
    }
    const cut: number[] = [];
    const pathlessWindings: number[] = [];
    const pathWindings: number[] = [];
    for (const k of inductive) {
      const j = compiled.layout.branchCurrent[k]!;
      const current = j >= 0 ? yBefore[j]! : 0;
      const path = hasPath(k);
      if (columns.has(k)) {
        if (path) pathWindings.push(k);
        else if (Math.abs(current) > CURRENT_FLOOR_ATOL * atolOf(j)) pathlessWindings.push(k);
      } else if (!path && Math.abs(current) > CURRENT_FLOOR_ATOL * atolOf(j)) {
        cut.push(k);
      }
    }
    if (pathlessWindings.length > 0) {
      // MMF the path-less windings carry, minus its part that the windings with a path can take over.
      const r = new Float64Array(loopCount);
      let floor = 0;
      for (const w of pathlessWindings) {
        const j = compiled.layout.branchCurrent[w]!;
        const col = columns.get(w)!;
        for (let l = 0; l < loopCount; l++) r[l] = r[l]! + col[l]! * yBefore[j]!;
        floor += CURRENT_FLOOR_ATOL * atolOf(j) * Math.max(...col.map(Math.abs));
      }
      for (const q of orthonormalBasis(pathWindings.map((w) => columns.get(w)!))) {
        let dot = 0;
        for (let l = 0; l < loopCount; l++) dot += q[l]! * r[l]!;
        for (let l = 0; l < loopCount; l++) r[l] = r[l]! - dot * q[l]!;
      }
      if (Math.max(0, ...r.map(Math.abs)) > floor) cut.push(...pathlessWindings);
    }
    if (cut.length === 0) return undefined;
    const opened = switching.filter((k) => (compiled.elements[k]!.conducting!(t, before) && !conducting[k]));
    const devices = opened.length > 0 ? opened : switching.filter((k) => !conducting[k]);
    const label = (k: number): string => `${elementKind(els[k]!).noun} "${els[k]!.name}"`;
    const who = devices.map(label).join(' and ');
    const message =
      `${who || 'a device'} opened the current of ${cut.map(label).join(' and ')} with no freewheeling path at t = ${t} s: ` +
      "add a diode, a snubber or the switch's capacitance";
    return { inductive: cut.map((k) => els[k]!.name), devices: devices.map((k) => els[k]!.name), message };
  };
}

/** Orthonormal basis of the span of some vectors (modified Gram-Schmidt, dependent ones dropped). */
function orthonormalBasis(vectors: readonly Float64Array[]): Float64Array[] {
  const basis: Float64Array[] = [];
  for (const v of vectors) {
    const u = Float64Array.from(v);
    const size = Math.sqrt(u.reduce((s, x) => s + x * x, 0));
    for (const q of basis) {
      let dot = 0;
      for (let l = 0; l < u.length; l++) dot += q[l]! * u[l]!;
      for (let l = 0; l < u.length; l++) u[l] = u[l]! - dot * q[l]!;
    }
    const norm = Math.sqrt(u.reduce((s, x) => s + x * x, 0));
    if (norm > 1e-12 * size && norm > 0) basis.push(u.map((x) => x / norm));
  }
  return basis;
}
