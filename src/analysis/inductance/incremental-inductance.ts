import type { NetworkDescription } from '../../network/description.js';
import type { Winding } from '../../network/handles.js';
import type { NetworkBuilder } from '../../network/network-builder.js';
import { InputError } from '../../errors.js';
import { inductanceAt, resolveWindings } from './inductance-matrix.js';
import { magnetostaticModel, operatingPoint, tubeFluxes, windingLoopCoupling } from './magnetostatic-model.js';

/**
 * A winding's inductance against its DC current.
 *
 * @example
 * ```ts
 * const curve = incrementalInductance(net, choke, [0, 1, 2, 4]);
 * curve.incremental[3]; // dlambda/di at 4 A, H
 * ```
 */
export interface InductanceCurve {
  /** Name of the winding. */
  readonly winding: string;
  /** The DC currents, A. */
  readonly current: Float64Array;
  /** Flux linkage at each current, Wb-turns. */
  readonly fluxLinkage: Float64Array;
  /** Incremental (differential) inductance d lambda / d i, H: what a small ripple sees. */
  readonly incremental: Float64Array;
  /** Secant (apparent) inductance lambda / i, H (the incremental one at i = 0). */
  readonly secant: Float64Array;
}

/**
 * Incremental inductance of one winding against its DC current, the other
 * windings open: for a choke with DC bias, the ripple inductance falls as
 * the core saturates. Each point is the operating point of the magnetic
 * network at that current and the Jacobian there (see
 * {@link inductanceMatrix}).
 *
 * @example
 * ```ts
 * const currents = Float64Array.from({ length: 11 }, (_, k) => k * 0.5); // 0 ... 5 A
 * const curve = incrementalInductance(net, 'choke', currents);
 * curve.incremental.forEach((l, k) => console.log(`${currents[k]} A: ${(l * 1e3).toFixed(2)} mH`));
 * ```
 */
export function incrementalInductance(
  network: NetworkBuilder | NetworkDescription,
  winding: Winding | string,
  currents: ArrayLike<number>,
): InductanceCurve {
  const { description, selected } = resolveWindings(network, [winding], 'incrementalInductance');
  const w = selected[0]!;
  const list = Float64Array.from(currents);
  if (list.length === 0 || list.some((i) => !Number.isFinite(i))) {
    throw new InputError('bad-option', `incrementalInductance: give one or more finite DC currents (A) for winding "${w.name}"`, [w.name]);
  }
  const model = magnetostaticModel(description);
  const c = windingLoopCoupling(model, w);
  const fluxLinkage = new Float64Array(list.length);
  const incremental = new Float64Array(list.length);
  const secant = new Float64Array(list.length);
  list.forEach((i, k) => {
    const psi = operatingPoint(model, Float64Array.from(c, (v) => v * i));
    const lambda = w.turns * w.orientation * tubeFluxes(model, psi)[w.tube]!;
    fluxLinkage[k] = lambda;
    incremental[k] = inductanceAt(model, psi, [c])[0]![0]!;
    secant[k] = i === 0 ? incremental[k]! : lambda / i;
  });
  return { winding: w.name, current: list, fluxLinkage, incremental, secant };
}
