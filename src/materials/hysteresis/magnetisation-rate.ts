import { MU0 } from '../../constants.js';
import { inverseLangevin, langevinSlope } from './langevin.js';
import type { HystereticMaterial } from './inverse-jiles-atherton.js';

/**
 * Width of the band |db/dt| < REVERSAL_BAND (T/s) over which the irreversible
 * part of dM/dB fades in after a reversal (our choice). Without it the rate
 * g(b, m, sign u) u has a kink at u = 0 whose two slopes differ by up to a
 * factor 100 on the steep part of a loop, and a tube relaxing to rest (u -> 0
 * through a discharge resistor) made the collocation Newton iteration stall
 * on that kink (status 'newton-failure'). With the band the rate is
 * continuously differentiable in u. Its effect on two 50 Hz cycles at 1.5 T
 * is 1.9e-11 of M_s in m (measured in
 * test/materials/hysteresis/reversal-band.test.ts). Drives slower than
 * about 100 x REVERSAL_BAND (0.1 T/s) would see the band: not this model's use.
 *
 * @example
 * ```ts
 * const inBand = Math.abs(dbdt) < REVERSAL_BAND; // irreversible slope partly faded
 * ```
 */
export const REVERSAL_BAND = 1e-3;

/** Smooth step on [0, 1]: 0 at 0, 1 from 1 on, continuous first derivative. */
function fadeIn(x: number): number {
  return x >= 1 ? 1 : x * x * (3 - 2 * x);
}

/** Derivative of {@link fadeIn}. */
function fadeInSlope(x: number): number {
  return x >= 1 ? 0 : 6 * x * (1 - x);
}

/**
 * The right-hand side of a hysteretic tube's magnetisation row in the
 * constant-mass form (docs/materials.md, "Hysteresis"):
 *
 *   m' = G(b, m, u) u,   with the rate unknown u = db/dt set by its own
 *   mass row (1/A) phi' = u,
 *
 * G = g_rev + w(|u| / REVERSAL_BAND) (g(sign u) - g_rev): g(sign u) is the
 * model's dM/dB in the direction of travel, g_rev its reversible-only slope
 * (the safeguard's value at a reversal), w a smooth step. G lies between the
 * two, so the loss rate stays non-negative, and G u is continuously
 * differentiable in u (slope g_rev on both sides of u = 0).
 *
 * @example
 * ```ts
 * const f = magnetisationRate(model, 1.2, 8e5, 50); // A/(m s)
 * ```
 */
export function magnetisationRate(model: HystereticMaterial, b: number, m: number, u: number): number {
  if (u === 0) return 0;
  const x = Math.abs(u) / REVERSAL_BAND;
  if (x >= 1) return model.magnetisationSlope(b, m, u) * u;
  const reversible = model.magnetisationSlope(b, m, 0);
  return (reversible + fadeIn(x) * (model.magnetisationSlope(b, m, u) - reversible)) * u;
}

/**
 * Partial derivatives of {@link magnetisationRate} with respect to b, m and
 * u, for the Jacobian. The partials in b and m are central differences of the
 * slopes at fixed direction (relative step 1e-7 of the quantity's scale:
 * b against the saturation flux density, m against M_s); the partial in u is
 * analytic (at u = 0: the reversible slope, the same from both sides).
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
  const x = Math.abs(u) / REVERSAL_BAND;
  const w = fadeIn(x);
  const slope = (bb: number, mm: number): number => {
    const g = model.magnetisationSlope(bb, mm, direction);
    if (w === 1) return g;
    const reversible = model.magnetisationSlope(bb, mm, 0);
    return reversible + w * (g - reversible);
  };
  const here = slope(b, m);
  if (u === 0) return { db: 0, dm: 0, du: here };
  const hb = 1e-7 * Math.max(Math.abs(b), model.saturationFluxDensity);
  const hm = 1e-7 * Math.max(Math.abs(m), model.spec.saturationMagnetisation);
  const slopeB = (slope(b + hb, m) - slope(b - hb, m)) / (2 * hb);
  const slopeM = (slope(b, m + hm) - slope(b, m - hm)) / (2 * hm);
  let du = here;
  if (w < 1) du += x * fadeInSlope(x) * (model.magnetisationSlope(b, m, direction) - model.magnetisationSlope(b, m, 0));
  return { db: slopeB * u, dm: slopeM * u, du };
}

/**
 * Hysteresis loss density rate (W/m^3) of a tube whose magnetisation moves at
 * the rate {@link magnetisationRate} gives: p = mu0 (1 - c) (H_e - H_an(M_irr))
 * dM_irr/dt, with dM_irr/dt taken from that m' (dM_irr = (dm - c dM_an)/(1 - c),
 * dM_an = M_an'(H_e) dH_e, dH_e = db/mu0 - (1 - alpha) dm). Equal to
 * `model.dissipationRate` outside the reversal band, and consistent with the
 * rate the network integrates inside it, so the energy audit balances.
 *
 * @example
 * ```ts
 * const p = hysteresisLossRate(model, 1.2, 8e5, 50); // W/m^3, >= 0
 * ```
 */
export function hysteresisLossRate(model: HystereticMaterial, b: number, m: number, u: number): number {
  if (u === 0) return 0;
  if (Math.abs(u) >= REVERSAL_BAND) return model.dissipationRate(b, m, u);
  const { saturationMagnetisation: ms, anhystereticShape: a, reversibility: c, interdomainCoupling: alpha } = model.spec;
  const point = model.evaluate(b, m, u);
  const mdot = magnetisationRate(model, b, m, u);
  const dManDHe = (ms / a) * langevinSlope(point.effectiveField / a);
  const dHedt = u / MU0 - (1 - alpha) * mdot;
  const dMirrDt = (mdot - c * dManDHe * dHedt) / (1 - c);
  const limit = 1 - 1e-15;
  const hAn = a * inverseLangevin(Math.max(-limit, Math.min(limit, point.irreversibleMagnetisation / ms)));
  return MU0 * (1 - c) * (point.effectiveField - hAn) * dMirrDt;
}
