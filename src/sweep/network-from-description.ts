import { InputError } from '../errors.js';
import type { NetworkDescription } from '../network/description.js';
import type { NetworkBuilder } from '../network/network-builder.js';
import { replayDescription } from '../network/validate-description.js';

/**
 * Rebuild a network builder from a plain-data description by replaying the
 * builder calls, so that every value goes through the builder's own checks
 * (positive lengths, sorted schedules, valid waveforms, unique names...) and
 * a bad value throws the builder's `InputError` naming the element. A
 * description that came from JSON or from sweep edits is validated this
 * way before it is simulated. `rebuilt.describe()` equals the input.
 *
 * Function waveforms given by module reference must be resolved first
 * (`resolveFunctionWaveform`), as the builder compiles every waveform.
 *
 * @example
 * ```ts
 * const net = networkFromDescription(JSON.parse(text));
 * const result = simulate(net, { stopTime: 0.1 });
 * ```
 */
export function networkFromDescription(description: NetworkDescription): NetworkBuilder {
  const ground = description.electricNodes[0];
  if (ground === undefined || ground.name !== 'ground') {
    throw new InputError('sweep-bad-job', `network "${description.name}": electric node 0 must be the ground, named "ground"`, ['electricNodes']);
  }
  return replayDescription(description);
}
