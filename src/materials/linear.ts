import { InputError } from '../errors.js';
import { MU0 } from '../constants.js';
import type { MaterialLaw } from './material-law.js';
import { checkSaturationFluxDensity } from './odd-law.js';

/**
 * Plain-data description of a linear material.
 *
 * @example
 * ```ts
 * const spec: LinearMaterialSpec = { kind: 'linear', relativePermeability: 2000, name: 'first estimate' };
 * ```
 */
export interface LinearMaterialSpec {
  readonly kind: 'linear';
  /** Relative permeability mu_r (> 0; 1 for air). */
  readonly relativePermeability: number;
  /** Name for messages and reports. */
  readonly name?: string;
  /** Flux density to report the saturation margin against, T (optional). */
  readonly saturationFluxDensity?: number;
}

/**
 * Linear law H = B / (mu0 mu_r).
 *
 * @example
 * ```ts
 * const air = linearMaterial({ kind: 'linear', relativePermeability: 1 });
 * air.fieldStrength(1); // 795774.7 A/m
 * ```
 */
export function linearMaterial(spec: LinearMaterialSpec): MaterialLaw {
  const mur = spec.relativePermeability;
  const name = spec.name ?? `linear mu_r=${mur}`;
  if (!Number.isFinite(mur) || mur <= 0) {
    throw new InputError(
      'bad-permeability',
      `material "${name}": relative permeability ${mur} is not a positive finite number; give mu_r > 0 (1 for air)`,
      [name],
    );
  }
  const sat = checkSaturationFluxDensity(name, spec.saturationFluxDensity);
  const reluctivity = 1 / (MU0 * mur);
  const law: MaterialLaw = {
    name,
    fieldStrength: (b) => reluctivity * b,
    fieldSlope: () => reluctivity,
    energyDensity: (b) => 0.5 * reluctivity * b * b,
    ...(sat !== undefined ? { saturationFluxDensity: sat } : {}),
  };
  return Object.freeze(law);
}
