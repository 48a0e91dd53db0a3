import { InputError } from '../errors.js';
import { MU0 } from '../constants.js';
import type { MaterialLaw } from './material-law.js';
import { checkSaturationFluxDensity, oddMaterialLaw } from './odd-law.js';
import { log1pMinusRatio } from './log-differences.js';

/**
 * Plain-data description of a Frohlich-Kennelly material with the air line:
 *
 *     B = mu0 H + J_s H / (H_a + |H|),   H_a = J_s / (mu0 (mu_ri - 1)).
 *
 * The polarisation J = B - mu0 H follows the rational law of Frohlich and
 * Kennelly and tends to J_s; the slope dB/dH at H = 0 is mu0 mu_ri.
 *
 * @example
 * ```ts
 * const spec: FrohlichKennellySpec = {
 *   kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: 0.48, name: 'ferrite',
 * };
 * ```
 */
export interface FrohlichKennellySpec {
  readonly kind: 'frohlich-kennelly';
  /** Initial relative permeability mu_ri = (dB/dH at H = 0) / mu0; > 1. */
  readonly initialRelativePermeability: number;
  /** Saturation polarisation J_s in T (the limit of B - mu0 H); > 0. */
  readonly saturationPolarisation: number;
  /** Name for messages and reports. */
  readonly name?: string;
  /** Flux density to report the saturation margin against, T (optional). */
  readonly saturationFluxDensity?: number;
}

/**
 * Frohlich-Kennelly saturation law with an added air line, evaluated as an
 * explicit H(B).
 *
 * Sources (FROM MEMORY, not checked against a copy): O. Frohlich,
 * Elektrotechnische Zeitschrift 2 (1881), the magnetisation of dynamo iron as
 * B = H / (a + b H); A. E. Kennelly, "Magnetic reluctance", Transactions of
 * the AIEE 8 (1891) 485-517, the reluctivity H/B = a + b H (the same law);
 * named the "Frohlich-Kennelly relation" in D. C. Jiles, Introduction to
 * Magnetism and Magnetic Materials (Chapman & Hall, 2nd ed. 1998).
 *
 * Our modification: the published law is applied to the polarisation
 * J = B - mu0 H instead of B, i.e. J = H / (a + b |H|), and the vacuum term
 * mu0 H is added. Without it B stays below 1/b, so H(B) would not exist
 * beyond saturation and the slope would not tend to the air line 1/mu0.
 * Conversion to engineering parameters (derived): a = 1 / (mu0 (mu_ri - 1)),
 * b = 1 / J_s, so dB/dH(0) = mu0 + 1/a = mu0 mu_ri and J -> J_s; the knee
 * field H_a = a / b = J_s / (mu0 (mu_ri - 1)) (A/m) is where J = J_s / 2.
 *
 * H(B) for B >= 0 is the positive root of the quadratic
 * mu0 H^2 + p H - H_a B = 0 with p = mu0 H_a + J_s - B, taken in the form
 * that avoids cancellation for either sign of p (derived). Slope:
 * dH/dB = 1 / (mu0 + J_s H_a / (H_a + H)^2). Energy density (derived, via
 * w = B H - integral of B dH):
 * w = mu0 H^2 / 2 + J_s H_a [ln(1 + H/H_a) - (H/H_a) / (1 + H/H_a)].
 *
 * @example
 * ```ts
 * const law = frohlichKennellyMaterial({
 *   kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: 0.48,
 * });
 * law.fieldStrength(0.3); // A/m
 * ```
 */
export function frohlichKennellyMaterial(spec: FrohlichKennellySpec): MaterialLaw {
  const murI = spec.initialRelativePermeability;
  const js = spec.saturationPolarisation;
  const name = spec.name ?? `Frohlich-Kennelly mu_ri=${murI} J_s=${js} T`;
  if (!Number.isFinite(murI) || murI <= 1) {
    throw new InputError(
      'bad-permeability',
      `material "${name}": initial relative permeability ${murI} must be a finite number > 1 (the polarisation needs mu_ri > 1)`,
      [name],
    );
  }
  if (!Number.isFinite(js) || js <= 0) {
    throw new InputError(
      'bad-polarisation',
      `material "${name}": saturation polarisation ${js} T must be a positive finite number`,
      [name],
    );
  }
  const sat = checkSaturationFluxDensity(name, spec.saturationFluxDensity);
  const ha = js / (MU0 * (murI - 1));
  const mu0Ha = MU0 * ha;
  const field = (b: number): number => {
    const p = mu0Ha + js - b;
    // hypot keeps the discriminant finite for huge |B|.
    const d = Math.hypot(p, 2 * Math.sqrt(mu0Ha * b));
    return p >= 0 ? (2 * ha * b) / (p + d) : (d - p) / (2 * MU0);
  };
  const slopeAtField = (h: number): number => {
    const u = ha + h;
    return 1 / (MU0 + (js * ha) / (u * u));
  };
  return oddMaterialLaw(
    name,
    {
      field,
      slope: (b) => slopeAtField(field(b)),
      energy: (b) => {
        const h = field(b);
        return 0.5 * MU0 * h * h + js * ha * log1pMinusRatio(h / ha);
      },
    },
    sat,
  );
}
