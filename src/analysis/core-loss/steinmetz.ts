import { InputError } from '../../errors.js';
import { checkSteinmetz, type SteinmetzCoefficients } from './steinmetz-coefficients.js';

/**
 * Core loss per unit volume under sinusoidal flux by the Steinmetz
 * equation, `P_v = k f^alpha B_peak^beta` (W/m^3 with f in Hz, B_peak in T).
 * Valid for sinusoidal flux without DC bias, within the range the
 * coefficients were fitted over; for other waveforms use
 * {@link igseLossDensity}.
 *
 * @example
 * ```ts
 * // invented ferrite-like coefficients, 100 kHz, 0.1 T peak
 * steinmetzLossDensity({ k: 1.5, alpha: 1.4, beta: 2.6 }, 100e3, 0.1); // W/m^3
 * ```
 */
export function steinmetzLossDensity(c: SteinmetzCoefficients, frequency: number, peakFluxDensity: number, owner = 'core'): number {
  checkSteinmetz(c, owner);
  if (!Number.isFinite(frequency) || frequency <= 0) {
    throw new InputError('bad-option', `${owner}: frequency ${frequency} Hz must be positive and finite`, [owner]);
  }
  if (!Number.isFinite(peakFluxDensity) || peakFluxDensity < 0) {
    throw new InputError('bad-option', `${owner}: peak flux density ${peakFluxDensity} T must be finite and >= 0`, [owner]);
  }
  return c.k * Math.pow(frequency, c.alpha) * Math.pow(peakFluxDensity, c.beta);
}
