import type { FrohlichKennellySpec } from './frohlich-kennelly.js';
import type { BrauerSpec } from './brauer.js';
import type { BhTableSpec } from './bh-table.js';

/**
 * The demo materials, see {@link demoMaterials}.
 *
 * @example
 * ```ts
 * const specs: DemoMaterials = demoMaterials;
 * compileMaterial(specs.grainOrientedSteel);
 * ```
 */
export interface DemoMaterials {
  /** MnZn-type power ferrite: Frohlich-Kennelly law. */
  readonly ferrite: FrohlichKennellySpec;
  /** Grain-oriented silicon steel, rolling direction: Brauer law. */
  readonly grainOrientedSteel: BrauerSpec;
  /** Iron-based amorphous ribbon: B-H table. */
  readonly amorphous: BhTableSpec;
}

/**
 * Three generic demo materials for examples and tests. Every number is
 * INVENTED (no manufacturer's data) and chosen to fall inside handbook
 * ranges recalled from memory (not checked against a handbook):
 *
 * | material | permeability range | saturation |
 * | --- | --- | --- |
 * | MnZn ferrite | initial mu_r 1e3..1.5e4 | B_sat 0.35..0.5 T |
 * | grain-oriented Si steel | mu_r,max 3e4..8e4 | about 2.0 T |
 * | Fe-based amorphous | mu_r 1e4..1e5 | about 1.56 T |
 *
 * Values of these laws: ferrite mu_ri = 2800, J_s = 0.47 T; steel
 * mu_r,max = 1/(mu0 (k1 + k3)) = 4.19e4, joining the air line at 2.006 T with
 * polarisation 1.971 T; amorphous largest secant mu_r 3.98e4, polarisation
 * levelling off at 1.572 T. `saturationFluxDensity` is set on each for
 * margin reports. Single-valued curves: no hysteresis, no temperature
 * dependence. Not for design: use measured data of the actual material.
 *
 * @example
 * ```ts
 * const ferrite = compileMaterial(demoMaterials.ferrite);
 * ferrite.fieldStrength(0.3); // about 235 A/m
 * ```
 */
export const demoMaterials: DemoMaterials = Object.freeze({
  ferrite: Object.freeze({
    kind: 'frohlich-kennelly',
    name: 'demo MnZn ferrite (invented)',
    initialRelativePermeability: 2800,
    saturationPolarisation: 0.47,
    saturationFluxDensity: 0.47,
  }),
  grainOrientedSteel: Object.freeze({
    kind: 'brauer',
    name: 'demo grain-oriented steel (invented)',
    k1: 8e-9,
    k2: 7,
    k3: 19,
    saturationFluxDensity: 1.97,
  }),
  amorphous: Object.freeze({
    kind: 'table',
    name: 'demo Fe-based amorphous (invented)',
    fluxDensity: Object.freeze([0.2, 0.5, 0.8, 1.0, 1.2, 1.3, 1.4, 1.45, 1.5, 1.53, 1.55]) as readonly number[],
    fieldStrength: Object.freeze([4, 10, 16, 21, 28, 35, 50, 70, 120, 250, 700]) as readonly number[],
    saturationFluxDensity: 1.56,
  }),
});
