import { InputError } from '../../errors.js';

/**
 * Steinmetz coefficients of a core material, in SI units:
 * `P_v = k f^alpha B_peak^beta` with P_v in W/m^3, f in Hz, B_peak in T.
 * (Data sheets often give k for mW/cm^3 = kW/m^3 or for B in mT: convert k
 * first. Coefficients fitted over a frequency and flux range are only valid
 * in that range.)
 *
 * @example
 * ```ts
 * // invented values; a data-sheet k for kW/m^3 (= mW/cm^3) multiplies by 1000 for W/m^3
 * const ferrite: SteinmetzCoefficients = { k: 1.5, alpha: 1.4, beta: 2.6 };
 * ```
 */
export interface SteinmetzCoefficients {
  /** k, W/m^3 / (Hz^alpha T^beta) (> 0). */
  readonly k: number;
  /** Frequency exponent alpha (> 0; typically 1 to 2). */
  readonly alpha: number;
  /** Flux-density exponent beta (> 0; typically 2 to 3). */
  readonly beta: number;
}

/**
 * Validate Steinmetz coefficients, naming `owner` in the error.
 *
 * @internal
 */
export function checkSteinmetz(c: SteinmetzCoefficients, owner: string): void {
  for (const [label, v] of [['k', c.k], ['alpha', c.alpha], ['beta', c.beta]] as const) {
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
      throw new InputError('bad-loss-coefficients', `${owner}: Steinmetz ${label} = ${v} must be a positive finite number`, [owner]);
    }
  }
}
