import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { affinePartition, SingularAlgebraicBlock, type AffinePartition } from '../solver/affine-elimination.js';
import { createReducedIntegrator, type ReducedDaeIntegrator } from '../solver/reduced-integrator.js';
import type { SolveDaeOptions } from '../solver/types.js';
import type { NetworkDae } from './network-dae.js';

/** Most unknowns the reduction takes: it forms dense n x n matrices (M, df/dy) at each restart (our choice). */
const MAX_REDUCED_SIZE = 1000;

/** The advice every refusal ends with. */
const FIX = "use formulation 'full' (the default) for this network";

function refuse(message: string, elements: readonly string[]): InputError {
  return new InputError('not-reducible', `formulation 'reduced': ${message}; ${FIX}`, elements);
}

/**
 * The split of a compiled network for the reduced formulation, after the
 * checks that make eliminating its algebraic unknowns inside f sound (and
 * affordable: at most 1000 unknowns, as the elimination is dense):
 * every element and tube declares how it enters the unknowns, none enters
 * an algebraic unknown other than affinely, no unknown is of index 2, M's
 * differential block is square and nonsingular (after dependent rows are
 * recombined) and not empty. A device that changes its own state (an ideal
 * diode) is affine within each interval and declares so: each commutation
 * is an event and a restart, where the maps are formed again.
 * Throws InputError `not-reducible` naming what stands in the way.
 *
 * @internal
 * @example
 * ```ts
 * const split = reducedPartition(compiled);
 * ```
 */
export function reducedPartition(c: CompiledNetwork): AffinePartition {
  if (c.layout.size > MAX_REDUCED_SIZE) {
    throw refuse(`the network has ${c.layout.size} unknowns, more than the ${MAX_REDUCED_SIZE} the reduction takes (it works on dense n x n matrices)`, []);
  }
  const declared = c.nonAffineUnknowns();
  if (declared.undeclared.length > 0) {
    throw refuse(`${declared.undeclared.map((o) => o.label).join(', ')} does not declare which unknowns it enters other than affinely`, declared.undeclared.map((o) => o.name));
  }
  if (c.index2.length > 0) {
    throw refuse(`${c.layout.labels[c.index2[0]!]} is of index 2 (a current that a current source forces through a winding)`, c.layout.owners[c.index2[0]!] ?? []);
  }
  const split = affinePartition(c.mass, c.layout.size);
  if ('reason' in split) {
    const unknowns = [...split.unknowns];
    const owners = [...new Set(unknowns.flatMap((i) => c.layout.owners[i] ?? []))];
    throw refuse(`${split.reason}: ${unknowns.map((i) => c.layout.labels[i]).join('; ')}`, owners);
  }
  if (split.differential.length === 0) {
    // Nothing left to integrate: the inner integrator would have no unknown at all.
    throw refuse('no unknown has a derivative (no winding, inductor, capacitor or eddy term), so nothing is left to integrate', []);
  }
  for (const i of split.algebraic) {
    const owner = declared.byUnknown.get(i);
    if (owner !== undefined) {
      throw refuse(
        `${owner.label} enters the ${c.layout.labels[i]} other than affinely, and that unknown is algebraic (no winding, inductor, capacitor or eddy term gives it a derivative), so it cannot be eliminated inside f`,
        [owner.name],
      );
    }
  }
  return split;
}

/**
 * The integrator of a network run in reduced form (see reducedPartition
 * and createReducedIntegrator); a singular algebraic block at the start is
 * reported as `not-reducible`, naming the unknown.
 *
 * @internal
 * @example
 * ```ts
 * const integ = createReducedNetworkIntegrator(compiled, dae, { rtol: 1e-6 });
 * ```
 */
export function createReducedNetworkIntegrator(c: CompiledNetwork, dae: NetworkDae, options: SolveDaeOptions): ReducedDaeIntegrator {
  const split = reducedPartition(c);
  try {
    return createReducedIntegrator(dae, split, options);
  } catch (err) {
    if (err instanceof SingularAlgebraicBlock) {
      throw refuse(`the algebraic equations do not determine the ${c.layout.labels[err.unknown]}`, c.layout.owners[err.unknown] ?? []);
    }
    throw err;
  }
}
