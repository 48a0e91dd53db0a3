import type { TubeDescription } from '../network/description.js';
import type { CompiledTube } from './tube-kind.js';

/**
 * A tube with a constant reluctance R: F = R phi, energy R phi^2 / 2.
 *
 * @example
 * ```ts
 * const gap = linearTube(tube, 3.3e5, { length: 1e-3, area: 2.4e-3, volume: 2.4e-6 });
 * ```
 */
export function linearTube(
  tube: TubeDescription,
  reluctance: number,
  geometry: { readonly length: number; readonly area: number; readonly volume: number },
): CompiledTube {
  return {
    name: tube.name,
    law: undefined,
    ...geometry,
    reluctance,
    eddyResistance: tube.eddyResistance ?? 0,
    zeroFluxReluctance: reluctance,
    mmf: (flux) => reluctance * flux,
    mmfSlope: () => reluctance,
    energy: (flux) => 0.5 * reluctance * flux * flux,
  };
}
