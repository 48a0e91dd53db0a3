import { elementKind } from '../elements/registry.js';
import type { NetworkDescription } from '../network/description.js';
import type { UnknownLayout } from './unknown-layout.js';
import { UnionFind } from './union-find.js';

/**
 * Unknowns of differentiation index 2, found from the topology (the
 * structural conditions of modified nodal analysis: D. Estevez Schwarz and
 * C. Tischendorf, "Structural analysis of electric circuits and consequences
 * for MNA", Int. J. Circuit Theory Appl. 28 (2000) 131-162; from memory):
 *
 * - a cut-set made only of inductive branches (inductors, windings) and
 *   current sources (the DC-bias inductor, two windings in series): the
 *   potentials of the nodes cut off by it;
 * - a loop made only of capacitors and voltage sources, with at least one
 *   voltage source (a capacitor across a source): the currents of those
 *   voltage sources. Elements with a parallel capacitance (diodes and
 *   switches with one) count as capacitors.
 *
 * Windings count as inductive: their current is fixed by the flux through
 * the magnetic loop equations. The solver scales the error estimate of these
 * unknowns by the step size (radau5's treatment of index-2 components).
 *
 * @example
 * ```ts
 * const idx2 = findIndexTwoUnknowns(net.describe(), layout);
 * ```
 */
export function findIndexTwoUnknowns(d: NetworkDescription, layout: UnknownLayout): number[] {
  const out = new Set<number>();

  // Inductive/current-source cut-sets: contract every other branch; each
  // resulting super-node apart from ground's is bounded by such branches only.
  const uf = new UnionFind(d.electricNodes.length);
  for (const e of d.elements) {
    const role = elementKind(e).role;
    if (role !== 'inductive' && role !== 'current-source') uf.union(e.plus, e.minus);
  }
  const groundRoot = uf.find(0);
  d.electricNodes.forEach((_, k) => {
    if (k !== 0 && uf.find(k) !== groundRoot) out.add(layout.potential[k]!);
  });

  // Capacitor / voltage-source loops: a voltage source whose terminals are
  // already joined through capacitors and other sources closes such a loop.
  // A device's own capacitance (a diode's junction, a switch's output
  // capacitance) is a capacitor here: its C dv/dt ties the source current to
  // the derivative of the source voltage just the same.
  const cv = new UnionFind(d.electricNodes.length);
  for (const e of d.elements) {
    const kind = elementKind(e);
    if (kind.role === 'capacitive' || (kind.parallelCapacitance?.(e) ?? 0) > 0) cv.union(e.plus, e.minus);
  }
  d.elements.forEach((e, k) => {
    if (elementKind(e).role !== 'voltage-source') return;
    if (!cv.union(e.plus, e.minus)) out.add(layout.branchCurrent[k]!);
  });

  return [...out].sort((a, b) => a - b);
}
