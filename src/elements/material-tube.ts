import { compileMaterial, type MaterialSpec } from '../materials/material-spec.js';
import type { MaterialLaw } from '../materials/material-law.js';
import { requirePositive } from '../network/argument-checks.js';
import { clonePlain } from '../network/clone-plain.js';
import type { TubeLaw } from '../network/description.js';
import type { TubeKind } from './tube-kind.js';
import { checkTubeMaterial } from './tube-material-check.js';

type MaterialTubeLaw = Extract<TubeLaw, { kind: 'material' }>;

/**
 * A body of material: F = l H(phi / A) from its B-H law (evaluated
 * directly from the flux: no inversion), stored energy l A times the
 * integral of H dB.
 *
 * @example
 * ```ts
 * net.fluxTube('leg', { from: bottom, to: top, length: 0.2, area: 1.6e-3, material: demoMaterials.grainOrientedSteel });
 * ```
 */
export const materialTubeKind: TubeKind<MaterialTubeLaw> = {
  kind: 'material',
  noun: 'flux tube',
  /** Its law H(B) acts on the loop fluxes through it. */
  nonAffineUnknowns: (_law, _tube, ctx) => ctx.loops.index,
  allowsEddy: true,
  check(law, owner, name) {
    const length = requirePositive(law.length, `${owner} length`, name, 'm');
    const area = requirePositive(law.area, `${owner} area`, name, 'm^2');
    checkTubeMaterial(() => compileMaterial(law.material), owner, name);
    return { kind: 'material', length, area, material: clonePlain(law.material) };
  },
  hasArea: () => true,
  compile(law, tube) {
    const material: MaterialLaw = compileMaterial(law.material as MaterialSpec | MaterialLaw);
    const { length, area } = law;
    return {
      name: tube.name,
      law: material,
      length,
      area,
      reluctance: NaN,
      eddyResistance: tube.eddyResistance ?? 0,
      volume: length * area,
      zeroFluxReluctance: (length / area) * material.fieldSlope(0),
      mmf: (flux) => length * material.fieldStrength(flux / area),
      mmfSlope: (flux) => (length / area) * material.fieldSlope(flux / area),
      energy: (flux) => length * area * material.energyDensity(flux / area),
    };
  },
  listing: (law) => [
    { name: 'length', value: law.length, unit: 'm' },
    { name: 'area', value: law.area, unit: 'm^2' },
    { name: 'material', value: compileMaterial(law.material).name },
  ],
};
