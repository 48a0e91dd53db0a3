import type { JilesAthertonSpec } from './inverse-jiles-atherton.js';

/**
 * The hysteretic demo materials, see {@link demoHystereticMaterials}.
 *
 * @example
 * ```ts
 * const specs: DemoHystereticMaterials = demoHystereticMaterials;
 * inverseJilesAtherton(specs.steel);
 * ```
 */
export interface DemoHystereticMaterials {
  /** Non-oriented silicon steel (invented Jiles-Atherton parameters). */
  readonly steel: JilesAthertonSpec;
  /** MnZn-type power ferrite (invented Jiles-Atherton parameters). */
  readonly ferrite: JilesAthertonSpec;
}

/**
 * Two hysteretic demo materials for examples and tests. Every number is
 * INVENTED demo data (no manufacturer's data), chosen so the loops look like
 * the trade's typical ones (ranges from memory, not checked against a
 * handbook). Loop features of these parameters, measured with
 * `hysteresisLoopFeatures` (2000 steps per segment):
 *
 * | material | peak b | H at peak | coercive field | remanence | loop area |
 * | --- | --- | --- | --- | --- | --- |
 * | steel | 1.5 T | 243.6 A/m | 40.8 A/m | 0.904 T | 249.6 J/m^3 |
 * | ferrite | 0.3 T | 78.3 A/m | 11.6 A/m | 0.077 T | 13.6 J/m^3 |
 *
 * Rate-independent (static) loops: no eddy-current or excess loss, no
 * temperature dependence. Not for design: fit measured loops of the actual
 * material with `fitHysteresisLoop`.
 *
 * @example
 * ```ts
 * const steel = inverseJilesAtherton(demoHystereticMaterials.steel);
 * hysteresisLoopFeatures(steel, 1.5).coerciveField; // about 40.8 A/m
 * ```
 */
export const demoHystereticMaterials: DemoHystereticMaterials = Object.freeze({
  steel: Object.freeze({
    kind: 'jiles-atherton',
    name: 'demo hysteretic steel (invented)',
    saturationMagnetisation: 1.55e6,
    anhystereticShape: 80,
    pinning: 50,
    reversibility: 0.15,
    interdomainCoupling: 1.3e-4,
  }),
  ferrite: Object.freeze({
    kind: 'jiles-atherton',
    name: 'demo hysteretic ferrite (invented)',
    saturationMagnetisation: 3.8e5,
    anhystereticShape: 30,
    pinning: 15,
    reversibility: 0.2,
    interdomainCoupling: 6e-5,
  }),
});
