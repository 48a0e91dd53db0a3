import { InputError } from '../errors.js';
import type { MaterialLaw } from './material-law.js';

/**
 * The branch of a material law for B >= 0: field strength, its slope and
 * the energy density. {@link oddMaterialLaw} extends it to negative B.
 *
 * @example
 * ```ts
 * const linearBranch: PositiveBranch = { field: (b) => 800 * b, slope: () => 800, energy: (b) => 400 * b * b };
 * ```
 */
export interface PositiveBranch {
  /** H(b) in A/m for b >= 0, with H(0) = 0. */
  readonly field: (b: number) => number;
  /** dH/dB in A/(m*T) for b >= 0. */
  readonly slope: (b: number) => number;
  /** integral from 0 to b of H dB' in J/m^3 for b >= 0. */
  readonly energy: (b: number) => number;
}

/**
 * Make a {@link MaterialLaw} from its branch for B >= 0 by odd extension:
 * H(-B) = -H(B), so the slope and the energy density are even. If the
 * branch has H(0) = 0 and a slope that is continuous on [0, inf), the law is
 * C1 everywhere (the slopes from both sides of 0 are the same number).
 *
 * @example
 * ```ts
 * const law = oddMaterialLaw('cubic toy', {
 *   field: (b) => b + b ** 3,
 *   slope: (b) => 1 + 3 * b * b,
 *   energy: (b) => b * b / 2 + b ** 4 / 4,
 * });
 * law.fieldStrength(-2); // -10
 * ```
 */
export function oddMaterialLaw(name: string, branch: PositiveBranch, saturationFluxDensity?: number): MaterialLaw {
  const { field, slope, energy } = branch;
  const law: MaterialLaw = {
    name,
    fieldStrength: (b) => (b < 0 ? -field(-b) : field(b)),
    fieldSlope: (b) => slope(Math.abs(b)),
    energyDensity: (b) => energy(Math.abs(b)),
    ...(saturationFluxDensity !== undefined ? { saturationFluxDensity } : {}),
  };
  return Object.freeze(law);
}

/**
 * Check an optional saturation flux density given on a spec (positive and
 * finite when present) and return it.
 *
 * @example
 * ```ts
 * checkSaturationFluxDensity('core', 1.9); // 1.9
 * ```
 */
export function checkSaturationFluxDensity(name: string, value: number | undefined): number | undefined {
  if (value === undefined) return undefined;
  if (!Number.isFinite(value) || value <= 0) {
    throw new InputError(
      'bad-saturation',
      `material "${name}": saturation flux density ${value} T is not a positive finite number; give B_sat > 0 in T or leave it out`,
      [name],
    );
  }
  return value;
}
