import { InputError } from '../errors.js';
import { MU0 } from '../constants.js';
import type { MaterialLaw } from './material-law.js';
import { checkSaturationFluxDensity, oddMaterialLaw } from './odd-law.js';

/**
 * Plain-data description of a Brauer exponential-reluctivity material,
 * continued on the air line:
 *
 *     H = (k1 exp(k2 B^2) + k3) B            for |B| <= B_t,
 *     H = H_t + (|B| - B_t) / mu0 (signed)   beyond,
 *
 * where B_t is the flux density at which the Brauer slope dH/dB reaches
 * 1/mu0 (computed once, when the law is compiled).
 *
 * @example
 * ```ts
 * const spec: BrauerSpec = { kind: 'brauer', k1: 8e-9, k2: 7, k3: 19, name: 'steel' };
 * ```
 */
export interface BrauerSpec {
  readonly kind: 'brauer';
  /** k1 in A/(m*T): weight of the exponential part of the reluctivity; > 0. */
  readonly k1: number;
  /** k2 in 1/T^2: growth rate of the reluctivity with B^2; > 0. */
  readonly k2: number;
  /** k3 in A/(m*T): constant part of the reluctivity; >= 0. */
  readonly k3: number;
  /** Name for messages and reports. */
  readonly name?: string;
  /** Flux density to report the saturation margin against, T (optional). */
  readonly saturationFluxDensity?: number;
}

/**
 * Where a Brauer law joins the air line, see {@link brauerAirLineJoin}.
 *
 * @example
 * ```ts
 * const join: BrauerJoin = brauerAirLineJoin({ kind: 'brauer', k1: 8e-9, k2: 7, k3: 19 });
 * ```
 */
export interface BrauerJoin {
  /** Join flux density B_t in T: the Brauer slope equals 1/mu0 there. */
  readonly fluxDensity: number;
  /** Field strength H_t = H(B_t) in A/m. */
  readonly fieldStrength: number;
  /** Polarisation on the air line, J = B_t - mu0 H_t in T (constant beyond B_t). */
  readonly polarisation: number;
  /** Initial relative permeability 1 / (mu0 (k1 + k3)). */
  readonly initialRelativePermeability: number;
}

function checkBrauer(spec: BrauerSpec, name: string): void {
  const { k1, k2, k3 } = spec;
  const bad = (label: string, v: number, rule: string): InputError =>
    new InputError('bad-parameter', `material "${name}": Brauer ${label} = ${v} ${rule}`, [name]);
  if (!Number.isFinite(k1) || k1 <= 0) throw bad('k1', k1, 'must be a positive finite number (A/(m*T))');
  if (!Number.isFinite(k2) || k2 <= 0) throw bad('k2', k2, 'must be a positive finite number (1/T^2)');
  if (!Number.isFinite(k3) || k3 < 0) throw bad('k3', k3, 'must be a finite number >= 0 (A/(m*T))');
  if (k1 + k3 >= 1 / MU0) {
    throw bad('k1 + k3', k1 + k3, `must be below 1/mu0 = ${1 / MU0} A/(m*T) (initial permeability above that of vacuum)`);
  }
}

/**
 * Solve k1 e^(k2 x)(1 + 2 k2 x) + k3 = 1/mu0 for x = B_t^2 >= 0. In logs,
 * g(x) = k2 x + ln(1 + 2 k2 x) - L = 0 with L = ln((1/mu0 - k3) / k1) > 0;
 * g is increasing and concave, so Newton from x = 0 (g < 0) climbs to the
 * root monotonically without overshoot (derived). Compile time only.
 */
function joinSquare(k1: number, k2: number, k3: number): number {
  const target = Math.log((1 / MU0 - k3) / k1);
  let x = 0;
  for (let i = 0; i < 200; i++) {
    const g = k2 * x + Math.log1p(2 * k2 * x) - target;
    const dg = k2 + (2 * k2) / (1 + 2 * k2 * x);
    const dx = -g / dg;
    x += dx;
    if (Math.abs(dx) <= 1e-16 * x) break;
  }
  return x;
}

/**
 * Where the Brauer law joins the air line, and the engineering quantities of
 * a {@link BrauerSpec}: initial relative permeability 1/(mu0 (k1 + k3)) and
 * the polarisation B_t - mu0 H_t that the continued law keeps for ever.
 *
 * @example
 * ```ts
 * const j = brauerAirLineJoin({ kind: 'brauer', k1: 8e-9, k2: 7, k3: 19 });
 * j.fluxDensity;  // about 2.0 T
 * j.polarisation; // about 1.97 T
 * ```
 */
export function brauerAirLineJoin(spec: BrauerSpec): BrauerJoin {
  const name = spec.name ?? 'Brauer';
  checkBrauer(spec, name);
  const { k1, k2, k3 } = spec;
  const x = joinSquare(k1, k2, k3);
  const bt = Math.sqrt(x);
  const ht = (k1 * Math.exp(k2 * x) + k3) * bt;
  return {
    fluxDensity: bt,
    fieldStrength: ht,
    polarisation: bt - MU0 * ht,
    initialRelativePermeability: 1 / (MU0 * (k1 + k3)),
  };
}

/**
 * Brauer's exponential-reluctivity law H = (k1 exp(k2 B^2) + k3) B, an
 * explicit H(B), continued on the air line with a continuous slope.
 *
 * Source (READ): J. R. Brauer, "Simple equations for the magnetization and
 * reluctivity curves of steel", IEEE Transactions on Magnetics, vol. MAG-11,
 * no. 1, p. 81, 1975, equation (1). (Volume, issue and page from memory.)
 *
 * Our modification: Brauer's slope dH/dB = k1 e^(k2 B^2)(1 + 2 k2 B^2) + k3
 * grows without bound, while past saturation a real core's slope tends to
 * the air line 1/mu0. We therefore stop the published curve at the flux
 * density B_t where its slope equals 1/mu0 (unique: the slope increases with
 * |B|) and continue on the straight line of slope 1/mu0 from (B_t, H_t).
 * Value and slope match at B_t, so the law is C1 and strictly increasing;
 * beyond B_t the polarisation B - mu0 H stays at B_t - mu0 H_t.
 *
 * Parameters (SI): k1 and k3 in A/(m*T) (reluctivity, H/B), k2 in 1/T^2.
 * Initial relative permeability mu_ri = 1/(mu0 (k1 + k3)); this is also the
 * largest secant permeability B/(mu0 H), since H/B grows with |B|.
 * Energy density (derived): for |B| <= B_t,
 * w = k1 (exp(k2 B^2) - 1) / (2 k2) + k3 B^2 / 2; beyond, w(B_t) plus the
 * exact integral of the straight line.
 *
 * @example
 * ```ts
 * const steel = brauerMaterial({ kind: 'brauer', k1: 8e-9, k2: 7, k3: 19 });
 * steel.fieldStrength(1.7); // about 40 A/m
 * ```
 */
export function brauerMaterial(spec: BrauerSpec): MaterialLaw {
  const { k1, k2, k3 } = spec;
  const name = spec.name ?? `Brauer k1=${k1} k2=${k2} k3=${k3}`;
  checkBrauer(spec, name);
  const sat = checkSaturationFluxDensity(name, spec.saturationFluxDensity);
  const join = brauerAirLineJoin({ ...spec, name });
  const bt = join.fluxDensity;
  const ht = join.fieldStrength;
  const wt = (k1 * Math.expm1(k2 * bt * bt)) / (2 * k2) + (k3 * bt * bt) / 2;
  const nu0 = 1 / MU0;
  return oddMaterialLaw(
    name,
    {
      field: (b) => (b <= bt ? (k1 * Math.exp(k2 * b * b) + k3) * b : ht + (b - bt) * nu0),
      slope: (b) => {
        if (b > bt) return nu0;
        const x = k2 * b * b;
        return k1 * Math.exp(x) * (1 + 2 * x) + k3;
      },
      energy: (b) => {
        if (b <= bt) return (k1 * Math.expm1(k2 * b * b)) / (2 * k2) + (k3 * b * b) / 2;
        const d = b - bt;
        return wt + ht * d + 0.5 * nu0 * d * d;
      },
    },
    sat,
  );
}
