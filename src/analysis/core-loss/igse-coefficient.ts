import { cosinePowerIntegral } from './cosine-power-integral.js';
import { checkSteinmetz, type SteinmetzCoefficients } from './steinmetz-coefficients.js';

/**
 * The iGSE coefficient
 * `k_i = k / ((2 pi)^(alpha - 1) * 2^(beta - alpha) * integral_0^{2 pi} |cos theta|^alpha d theta)`
 * (K. Venkatachalam, C. R. Sullivan, T. Abdallah, H. Tacca, "Accurate
 * prediction of ferrite core loss with nonsinusoidal waveforms using only
 * Steinmetz parameters", IEEE Workshop on Computers in Power Electronics
 * (COMPEL) 2002, pp. 36-41). It is chosen so that the iGSE gives the
 * Steinmetz loss for a sinusoid.
 *
 * @example
 * ```ts
 * igseCoefficient({ k: 1, alpha: 1.5, beta: 2.5 }); // 0.0570557099
 * ```
 */
export function igseCoefficient(c: SteinmetzCoefficients, owner = 'core'): number {
  checkSteinmetz(c, owner);
  const { k, alpha, beta } = c;
  return k / (Math.pow(2 * Math.PI, alpha - 1) * Math.pow(2, beta - alpha) * cosinePowerIntegral(alpha));
}
