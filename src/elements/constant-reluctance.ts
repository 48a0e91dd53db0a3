import { requirePositive } from '../network/argument-checks.js';
import type { TubeLaw } from '../network/description.js';
import type { TubeKind } from './tube-kind.js';
import { linearTube } from './linear-tube.js';

type ReluctanceLaw = Extract<TubeLaw, { kind: 'reluctance' }>;

/**
 * A constant reluctance (A/Wb), e.g. a leakage path computed from the
 * window geometry; an area is optional (needed only for flux density).
 *
 * @example
 * ```ts
 * net.reluctance('leakage', { from: top, to: bottom, reluctance: 2e7 });
 * ```
 */
export const constantReluctanceKind: TubeKind<ReluctanceLaw> = {
  kind: 'reluctance',
  noun: 'reluctance',
  /** Linear: MMF = reluctance x flux. */
  nonAffineUnknowns: () => [],
  allowsEddy: false,
  check(law, owner, name) {
    const reluctance = requirePositive(law.reluctance, `${owner} value`, name, 'A/Wb');
    return law.area === undefined
      ? { kind: 'reluctance', reluctance }
      : { kind: 'reluctance', reluctance, area: requirePositive(law.area, `${owner} area`, name, 'm^2') };
  },
  hasArea: (law) => law.area !== undefined,
  compile: (law, tube) => linearTube(tube, law.reluctance, { length: NaN, area: law.area ?? NaN, volume: NaN }),
  listing: (law) => [{ name: 'reluctance', value: law.reluctance, unit: 'A/Wb' }],
};
