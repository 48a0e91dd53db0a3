import type { NetworkDescription } from '../network/description.js';
import type { MagneticLoops } from './magnetic-graph.js';

/** What an unknown of the DAE stands for. */
export type UnknownKind = 'potential' | 'current' | 'loop-flux';

/**
 * Position of every unknown in the state vector y:
 * [node potentials (ground excluded) | branch currents | loop fluxes].
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
    if (e.kind !== 'voltage-source' && e.kind !== 'inductor' && e.kind !== 'winding') return;
    branchCurrent[k] = kinds.length;
    kinds.push('current');
    labels.push(`current of ${e.kind.replace('-', ' ')} "${e.name}"`);
    owners.push([e.name]);
  });
  const loopOffset = kinds.length;
  loops.loops.forEach((entries, l) => {
    const tubeNames = entries.map((en) => d.tubes[en.tube]!.name);
    kinds.push('loop-flux');
    labels.push(`flux of magnetic loop ${l + 1} (tubes ${tubeNames.map((n) => `"${n}"`).join(', ')})`);
    owners.push(tubeNames);
  });
  return {
    size: kinds.length,
    potential,
    branchCurrent,
    loopOffset,
    loopCount: loops.loopCount,
    kinds,
    labels,
    owners,
  };
}
