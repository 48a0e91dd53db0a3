import { InputError } from '../errors.js';
import { MU0 } from '../constants.js';
import { requirePositive } from '../network/argument-checks.js';
import type { TubeLaw } from '../network/description.js';
import type { TubeKind } from './tube-kind.js';
import { linearTube } from './linear-tube.js';

type AirGapLaw = Extract<TubeLaw, { kind: 'air-gap' }>;

/**
 * An air gap: reluctance l / (mu0 k A) with k >= 1 the fringing factor
 * (fringing widens the effective area).
 *
 * @example
 * ```ts
 * net.airGap('centre gap', { from: a, to: b, length: 0.5e-3, area: 9e-4, fringingFactor: 1.15 });
 * ```
 */
export const airGapKind: TubeKind<AirGapLaw> = {
  kind: 'air-gap',
  noun: 'air gap',
  /** Linear: MMF = reluctance x flux. */
  nonAffineUnknowns: () => [],
  allowsEddy: false,
  check(law, owner, name) {
    const length = requirePositive(law.length, `${owner} length`, name, 'm');
    const area = requirePositive(law.area, `${owner} area`, name, 'm^2');
    const fringingFactor = law.fringingFactor ?? 1;
    requirePositive(fringingFactor, `${owner} fringing factor`, name, '');
    if (fringingFactor < 1) {
      throw new InputError(
        'bad-fringing-factor',
        `${owner} fringing factor ${fringingFactor} is below 1; fringing only widens the effective area (use 1 for none)`,
        [name],
      );
    }
    return { kind: 'air-gap', length, area, fringingFactor };
  },
  hasArea: () => true,
  compile: (law, tube) =>
    linearTube(tube, law.length / (MU0 * law.fringingFactor * law.area), { length: law.length, area: law.area, volume: law.length * law.area }),
  listing: (law) => [
    { name: 'length', value: law.length, unit: 'm' },
    { name: 'area', value: law.area, unit: 'm^2' },
    { name: 'fringing factor', value: law.fringingFactor },
  ],
};
