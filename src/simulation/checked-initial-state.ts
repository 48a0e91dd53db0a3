import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';

/**
 * A raw initial state checked against the network: one finite value per
 * unknown. Shared by every entry point that takes `initialState`.
 *
 * @example
 * ```ts
 * const y0 = checkedInitialState(compiled, saved, 'stepper options');
 * ```
 *
 * @internal
 */
export function checkedInitialState(c: CompiledNetwork, y: ArrayLike<number>, where: string): Float64Array {
  if (y === null || typeof y !== 'object' || typeof y.length !== 'number') {
    throw new InputError('bad-initial-state', `${where}: initialState must be an array of numbers, got ${String(y)}`, ['options']);
  }
  if (y.length !== c.layout.size) {
    throw new InputError('bad-initial-state', `${where}: initialState has ${y.length} entries; this network has ${c.layout.size} unknowns`, ['options']);
  }
  const out = Float64Array.from(y);
  out.forEach((v, i) => {
    if (!Number.isFinite(v)) {
      throw new InputError('bad-initial-state', `${where}: initialState[${i}] (${c.layout.labels[i]}) is ${v}; give finite values`, ['options']);
    }
  });
  return out;
}
