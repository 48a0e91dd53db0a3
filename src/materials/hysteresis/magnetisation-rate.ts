import type { HystereticMaterial } from './inverse-jiles-atherton.js';

/**
 * The right-hand side of a hysteretic tube's magnetisation row in the
 * constant-mass form (docs/materials.md, "Hysteresis"):
 *
 *   m' = g(b, m, sign u) u,   with the rate unknown u = db/dt set by its own
 *   mass row (1/A) phi' = u.
 *
 * With u an unknown, both rows have constant mass entries; the direction of
 * travel is the sign of u, and the product g u is continuous where u changes
 * sign (it is 0 there), with a kink that the step-size control resolves.
 *
 * @example
 * ```ts
 * const f = magnetisationRate(model, 1.2, 8e5, 50); // A/(m s)
 * ```
 */
export function magnetisationRate(model: HystereticMaterial, b: number, m: number, u: number): number {
  if (u === 0) return 0;
  return model.magnetisationSlope(b, m, u) * u;
}

/**
 * Partial derivatives of {@link magnetisationRate} with respect to b, m and
 * u, for the Jacobian. The partials in b and m are central differences of the
 * slope at fixed direction (relative step 1e-7 of the quantity's scale:
 * b against the saturation flux density, m against mu0 M_s's magnetisation);
 * the partial in u is the slope itself (at u = 0: the reversible-only slope,
 * the mean of the one-sided values is not used because the right-hand side
 * itself takes sign(0) = 0).
 *
 * @example
 * ```ts
 * const { db, dm, du } = magnetisationRatePartials(model, 1.2, 8e5, 50);
 * ```
 */
export function magnetisationRatePartials(
  model: HystereticMaterial,
  b: number,
  m: number,
  u: number,
): { readonly db: number; readonly dm: number; readonly du: number } {
  const direction = Math.sign(u);
  const du = model.magnetisationSlope(b, m, direction);
  if (u === 0) return { db: 0, dm: 0, du };
  const hb = 1e-7 * Math.max(Math.abs(b), model.saturationFluxDensity);
  const hm = 1e-7 * Math.max(Math.abs(m), model.spec.saturationMagnetisation);
  const slopeB = (model.magnetisationSlope(b + hb, m, direction) - model.magnetisationSlope(b - hb, m, direction)) / (2 * hb);
  const slopeM = (model.magnetisationSlope(b, m + hm, direction) - model.magnetisationSlope(b, m - hm, direction)) / (2 * hm);
  return { db: slopeB * u, dm: slopeM * u, du };
}
