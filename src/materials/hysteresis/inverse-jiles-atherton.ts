import { InputError } from '../../errors.js';
import { MU0 } from '../../constants.js';
import { inverseLangevin, langevin, langevinIntegral, langevinSlope } from './langevin.js';

/**
 * Plain-data parameters of the Jiles-Atherton hysteresis model (symbols of
 * D. C. Jiles, D. L. Atherton, "Theory of ferromagnetic hysteresis",
 * J. Magn. Magn. Mater. 61 (1986) 48-60, in parentheses).
 *
 * @example
 * ```ts
 * const steel: JilesAthertonSpec = {
 *   kind: 'jiles-atherton', name: 'demo steel',
 *   saturationMagnetisation: 1.6e6, anhystereticShape: 1100, pinning: 400,
 *   reversibility: 0.2, interdomainCoupling: 1.6e-3,
 * };
 * ```
 */
export interface JilesAthertonSpec {
  readonly kind: 'jiles-atherton';
  /** Name for messages and reports. */
  readonly name?: string;
  /** Saturation magnetisation (M_s), A/m; > 0. */
  readonly saturationMagnetisation: number;
  /** Shape of the anhysteretic Langevin curve (a), A/m; > 0. */
  readonly anhystereticShape: number;
  /** Pinning constant (k), A/m; > 0. Sets the coercivity. */
  readonly pinning: number;
  /** Reversible fraction (c), 0 <= c < 1. */
  readonly reversibility: number;
  /** Interdomain (mean-field) coupling (alpha), dimensionless, 0 <= alpha < 1. */
  readonly interdomainCoupling: number;
  /** Flux density reported as saturation for margin reports, T; default mu0 M_s. */
  readonly saturationFluxDensity?: number;
}

/**
 * Everything the inverse Jiles-Atherton model computes at one state
 * (flux density b, magnetisation m) for one direction of travel.
 *
 * @example
 * ```ts
 * const p: JilesAthertonPoint = inverseJilesAtherton(spec).evaluate(0.5, 3e5, 1);
 * p.fieldStrength; // H = b/mu0 - m
 * ```
 */
export interface JilesAthertonPoint {
  /** H = b/mu0 - m, A/m. */
  readonly fieldStrength: number;
  /** Effective field H_e = H + alpha m, A/m. */
  readonly effectiveField: number;
  /** Anhysteretic magnetisation M_an(H_e), A/m. */
  readonly anhystereticMagnetisation: number;
  /** Irreversible magnetisation M_irr = (m - c M_an) / (1 - c), A/m. */
  readonly irreversibleMagnetisation: number;
  /** dM_irr/dB_e with B_e = mu0 H_e (0 where the safeguard acts), A/(m T). */
  readonly irreversibleSlope: number;
  /** dM/dB along the direction of travel, A/(m T); 0 <= dM/dB < 1/(mu0 (1 - alpha)). */
  readonly magnetisationSlope: number;
  /** d(B_e)/dB = 1 / (1 + mu0 (1 - alpha) P), dimensionless. */
  readonly effectiveFluxSlope: number;
}

/**
 * A hysteretic material driven by flux density: its state is the
 * magnetisation m (A/m) of each flux tube, H = b/mu0 - m, and
 * dm/dt = magnetisationSlope(b, m, sign(db/dt)) * db/dt.
 *
 * @example
 * ```ts
 * const model: HystereticMaterial = inverseJilesAtherton(spec);
 * const dmdb = model.magnetisationSlope(0.2, 1e5, 1);
 * ```
 */
export interface HystereticMaterial {
  /** Name for messages and reports. */
  readonly name: string;
  /** The parameters it was compiled from (frozen copy). */
  readonly spec: JilesAthertonSpec;
  /** Flux density regarded as saturation, T (margin reports). */
  readonly saturationFluxDensity: number;
  /** H in A/m at flux density b (T) and magnetisation m (A/m). */
  fieldStrength(b: number, m: number): number;
  /** dM/dB in A/(m T) at (b, m) travelling in `direction` (sign of db/dt; 0 = at rest). */
  magnetisationSlope(b: number, m: number, direction: number): number;
  /** All intermediate quantities at (b, m, direction). */
  evaluate(b: number, m: number, direction: number): JilesAthertonPoint;
  /**
   * Stored energy density W(b, m), J/m^3: a state function with
   * H db = dW + p dt, where p >= 0 is {@link HystereticMaterial.dissipationRate}.
   */
  storedEnergyDensity(b: number, m: number): number;
  /** Hysteresis loss density rate p (W/m^3) at (b, m) when b changes at rate dbdt (T/s). */
  dissipationRate(b: number, m: number, dbdt: number): number;
}

/**
 * The inverse (flux-density driven) Jiles-Atherton model.
 *
 * Equations (N. Sadowski, N. J. Batistela, J. P. A. Bastos, M. Lajoie-Mazenc,
 * "An inverse Jiles-Atherton model to take into account hysteresis in
 * time-stepping finite-element calculations", IEEE Trans. Magn. 38(2) (2002)
 * 797-800; written here from the forward model of Jiles and Atherton 1986 by
 * the derivation in docs/materials.md, section "Hysteresis", since the paper
 * itself was not at hand):
 *
 *   H_e = b/mu0 - (1 - alpha) m,  M_an = M_s L(H_e / a),
 *   M_irr = (m - c M_an) / (1 - c),
 *   dM_irr/dB_e = (M_an - M_irr) / (mu0 delta k),
 *   P = (1 - c) dM_irr/dB_e + (c / mu0) dM_an/dH_e,
 *   dM/dB = P / (1 + mu0 (1 - alpha) P).
 *
 * Safeguard (D. C. Jiles, J. B. Thoelke, M. K. Devine, IEEE Trans. Magn. 28(1)
 * (1992) 27-35, common practice since): where delta (M_an - M_irr) <= 0, just
 * after a reversal, the irreversible slope is set to 0, so dM/dB >= 0 always
 * and the loss density rate is never negative.
 *
 * @example
 * ```ts
 * const model = inverseJilesAtherton({
 *   kind: 'jiles-atherton', saturationMagnetisation: 1.6e6, anhystereticShape: 1100,
 *   pinning: 400, reversibility: 0.2, interdomainCoupling: 1.6e-3,
 * });
 * model.fieldStrength(1.0, 7.5e5); // A/m
 * ```
 */
export function inverseJilesAtherton(spec: JilesAthertonSpec): HystereticMaterial {
  checkJilesAthertonSpec(spec);
  const frozen = Object.freeze({ ...spec });
  const ms = spec.saturationMagnetisation;
  const a = spec.anhystereticShape;
  const k = spec.pinning;
  const c = spec.reversibility;
  const alpha = spec.interdomainCoupling;
  const name = spec.name ?? 'Jiles-Atherton material';

  const evaluate = (b: number, m: number, direction: number): JilesAthertonPoint => {
    const h = b / MU0 - m;
    const he = h + alpha * m;
    const x = he / a;
    const man = ms * langevin(x);
    const dman = (ms / a) * langevinSlope(x);
    const mirr = (m - c * man) / (1 - c);
    const delta = Math.sign(direction);
    const gap = man - mirr;
    // Safeguard: no irreversible change against the pull of the anhysteretic.
    const irreversibleSlope = delta * gap > 0 ? gap / (MU0 * delta * k) : 0;
    const p = (1 - c) * irreversibleSlope + (c / MU0) * dman;
    const denominator = 1 + MU0 * (1 - alpha) * p;
    return {
      fieldStrength: h,
      effectiveField: he,
      anhystereticMagnetisation: man,
      irreversibleMagnetisation: mirr,
      irreversibleSlope,
      magnetisationSlope: p / denominator,
      effectiveFluxSlope: 1 / denominator,
    };
  };

  return Object.freeze({
    name,
    spec: frozen,
    saturationFluxDensity: spec.saturationFluxDensity ?? MU0 * ms,
    fieldStrength: (b: number, m: number) => b / MU0 - m,
    magnetisationSlope: (b: number, m: number, direction: number) => evaluate(b, m, direction).magnetisationSlope,
    evaluate,
    storedEnergyDensity: (b: number, m: number): number => {
      const h = b / MU0 - m;
      const he = h + alpha * m;
      const x = he / a;
      const man = ms * langevin(x);
      const mirr = (m - c * man) / (1 - c);
      // W = mu0 H^2/2 - mu0 alpha m^2/2 + c mu0 (H_e M_an - M_s a ln(sinh x / x)) + (1 - c) mu0 Psi(M_irr),
      // Psi(M_irr) = integral of H_an dM (Legendre transform of the anhysteretic), see docs/materials.md.
      const hi = a * inverseLangevin(clampUnit(mirr / ms));
      const psi = hi * mirr - ms * a * langevinIntegral(hi / a);
      return (
        0.5 * MU0 * h * h -
        0.5 * MU0 * alpha * m * m +
        c * MU0 * (he * man - ms * a * langevinIntegral(x)) +
        (1 - c) * MU0 * psi
      );
    },
    dissipationRate: (b: number, m: number, dbdt: number): number => {
      const pt = evaluate(b, m, dbdt);
      if (pt.irreversibleSlope === 0 || dbdt === 0) return 0;
      const mirr = pt.irreversibleMagnetisation;
      const hi = a * inverseLangevin(clampUnit(mirr / ms));
      // p = mu0 (1 - c) (H_e - H_an(M_irr)) dM_irr/dt, dM_irr/dt = dM_irr/dB_e * dB_e/dB * db/dt.
      const dmirrdt = pt.irreversibleSlope * pt.effectiveFluxSlope * dbdt;
      return MU0 * (1 - c) * (pt.effectiveField - hi) * dmirrdt;
    },
  });
}

/** |M_irr| < M_s holds on every trajectory the safeguard allows; keep round-off from leaving the domain. */
function clampUnit(y: number): number {
  const limit = 1 - 1e-15;
  return Math.max(-limit, Math.min(limit, y));
}

/**
 * Throws `bad-hysteresis-parameters` (naming the material and the fix) when a
 * Jiles-Atherton parameter is outside its domain.
 *
 * @example
 * ```ts
 * checkJilesAthertonSpec({ kind: 'jiles-atherton', saturationMagnetisation: 1.6e6, anhystereticShape: 1100,
 *   pinning: 400, reversibility: 0.2, interdomainCoupling: 1.6e-3 }); // passes
 * ```
 */
export function checkJilesAthertonSpec(spec: JilesAthertonSpec): void {
  const label = spec.name ?? 'Jiles-Atherton material';
  const fail = (field: string, rule: string, value: unknown): never => {
    throw new InputError(
      'bad-hysteresis-parameters',
      `hysteretic material '${label}': ${field} must be ${rule} (got ${String(value)}); fix the material's parameters`,
      [label],
    );
  };
  const positive = (field: keyof JilesAthertonSpec): void => {
    const v = spec[field];
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) fail(field, 'a finite number > 0', v);
  };
  positive('saturationMagnetisation');
  positive('anhystereticShape');
  positive('pinning');
  const c = spec.reversibility;
  if (typeof c !== 'number' || !(c >= 0 && c < 1)) fail('reversibility', 'in [0, 1)', c);
  const alpha = spec.interdomainCoupling;
  if (typeof alpha !== 'number' || !(alpha >= 0 && alpha < 1)) fail('interdomainCoupling', 'in [0, 1)', alpha);
  if (spec.saturationFluxDensity !== undefined) positive('saturationFluxDensity');
}
