import { elementKind, tubeKind } from '../elements/registry.js';
import type { NetworkDescription } from '../network/description.js';
import type { MagneticLoops } from './magnetic-graph.js';

/** What an unknown of the DAE stands for. */
export type UnknownKind = 'potential' | 'current' | 'loop-flux' | 'internal-state';

/**
 * Position of every unknown in the state vector y:
 * [node potentials (ground excluded) | branch currents | loop fluxes |
 * internal states of elements and tubes].
 */
export interface UnknownLayout {
  readonly size: number;
  /** Index in y of electric node k's potential; -1 for ground (k = 0). */
  readonly potential: Int32Array;
  /** Index in y of element e's branch current (voltage sources, inductors, windings); -1 otherwise. */
  readonly branchCurrent: Int32Array;
  /** Index in y of the first loop flux. */
  readonly loopOffset: number;
  readonly loopCount: number;
  /** Index in y of element e's first internal state; -1 when it has none. */
  readonly elementStates: Int32Array;
  /** Index in y of tube b's first internal state; -1 when it has none. */
  readonly tubeStates: Int32Array;
  /** Per unknown, its kind. */
  readonly kinds: readonly UnknownKind[];
  /** Per unknown, a phrase naming it for messages, e.g. `current of winding "primary"`. */
  readonly labels: readonly string[];
  /** Per unknown, the element names it belongs to (for diagnoses by element). */
  readonly owners: readonly (readonly string[])[];
}

/**
 * Assign state-vector positions to the unknowns of a network.
 *
 * @example
 * ```ts
 * const layout = layoutUnknowns(net.describe(), fundamentalLoops(...));
 * ```
 */
export function layoutUnknowns(d: NetworkDescription, loops: MagneticLoops): UnknownLayout {
  const kinds: UnknownKind[] = [];
  const labels: string[] = [];
  const owners: string[][] = [];
  const potential = new Int32Array(d.electricNodes.length).fill(-1);
  d.electricNodes.forEach((node, k) => {
    if (k === 0) return;
    potential[k] = kinds.length;
    kinds.push('potential');
    labels.push(`potential of node "${node.name}"`);
    owners.push([node.name]);
  });
  const branchCurrent = new Int32Array(d.elements.length).fill(-1);
  d.elements.forEach((e, k) => {
    const kind = elementKind(e);
    if (!kind.branchCurrent) return;
    branchCurrent[k] = kinds.length;
    kinds.push('current');
    labels.push(`current of ${kind.noun} "${e.name}"`);
    owners.push([e.name]);
  });
  const loopOffset = kinds.length;
  loops.loops.forEach((entries, l) => {
    const tubeNames = entries.map((en) => d.tubes[en.tube]!.name);
    kinds.push('loop-flux');
    labels.push(`flux of magnetic loop ${l + 1} (tubes ${tubeNames.map((n) => `"${n}"`).join(', ')})`);
    owners.push(tubeNames);
  });
  const addStates = (names: readonly string[], owner: string, what: string): number => {
    if (names.length === 0) return -1;
    const first = kinds.length;
    for (const label of names) {
      kinds.push('internal-state');
      labels.push(`${label} of ${what} "${owner}"`);
      owners.push([owner]);
    }
    return first;
  };
  const elementStates = Int32Array.from(d.elements, (e) => {
    const kind = elementKind(e);
    return addStates(kind.internalStates?.(e) ?? [], e.name, kind.noun);
  });
  const tubeStates = Int32Array.from(d.tubes, (t) => {
    const kind = tubeKind(t.law);
    return addStates(kind.internalStates?.(t.law, t) ?? [], t.name, kind.noun);
  });
  return {
    size: kinds.length,
    potential,
    branchCurrent,
    loopOffset,
    loopCount: loops.loopCount,
    elementStates,
    tubeStates,
    kinds,
    labels,
    owners,
  };
}
