import { InputError } from '../errors.js';
import { compileNetwork, type CompiledNetwork } from '../formulation/compile-network.js';
import type { NetworkDescription } from '../network/description.js';
import type { NetworkBuilder } from '../network/network-builder.js';
import { validateDescription } from '../network/validate-description.js';

/**
 * A network as every entry point takes it: a builder, or a plain-data
 * description (read from JSON, sent to a worker, written by another program).
 *
 * @example
 * ```ts
 * const network: NetworkInput = JSON.parse(text) as NetworkDescription;
 * ```
 */
export type NetworkInput = NetworkBuilder | NetworkDescription;

/**
 * A network accepted by an entry point: checked, compiled, with the builder's identity.
 *
 * @example
 * ```ts
 * const { description, networkId, compiled }: AcceptedNetwork = acceptNetwork(net, 'simulate');
 * ```
 *
 * @internal
 */
export interface AcceptedNetwork {
  readonly description: NetworkDescription;
  /** Identity of the builder whose handles fit (undefined for a description). */
  readonly networkId: number | undefined;
  readonly compiled: CompiledNetwork;
}

/** Descriptions this module has checked (deep-frozen, so they cannot change afterwards). */
const checked = new WeakSet<object>();

/**
 * The one front door of every entry point (`simulate`, `createStepper`,
 * `periodicSteadyState`, a sweep case): a builder gives its description; a
 * plain description is checked once by `validateDescription` (the builder's
 * own rules and error codes); then the network is compiled (topology and
 * index checks). `where` names the entry point in the message of a
 * first argument that is no network.
 *
 * @example
 * ```ts
 * const { compiled, networkId } = acceptNetwork(network, 'createStepper');
 * ```
 *
 * @internal
 */
export function acceptNetwork(network: NetworkInput, where: string): AcceptedNetwork {
  if (network === null || typeof network !== 'object') {
    throw new InputError('bad-option', `${where}: the first argument must be a network (builder or description), got ${String(network)}`, ['network']);
  }
  const fromBuilder = 'describe' in network && typeof network.describe === 'function';
  let description: NetworkDescription;
  if (fromBuilder) {
    description = network.describe();
  } else if (checked.has(network)) {
    description = network as NetworkDescription;
  } else {
    description = validateDescription(network as NetworkDescription);
    checked.add(description);
  }
  const networkId = fromBuilder ? (network as NetworkBuilder).id : undefined;
  return { description, networkId, compiled: compileNetwork(description) };
}
