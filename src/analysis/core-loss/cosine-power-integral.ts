import { gammaFunction } from './gamma-function.js';

/**
 * `integral from 0 to 2 pi of |cos theta|^alpha d theta`
 * `= 2 sqrt(pi) Gamma((alpha + 1)/2) / Gamma(alpha/2 + 1)` (alpha > -1),
 * the normalising integral of the iGSE coefficient (Venkatachalam et al.,
 * COMPEL 2002; the closed form follows from the Beta function,
 * `integral_0^{pi/2} cos^a = B(1/2, (a+1)/2) / 2`).
 *
 * @example
 * ```ts
 * cosinePowerIntegral(2); // pi
 * cosinePowerIntegral(1); // 4
 * ```
 */
export function cosinePowerIntegral(alpha: number): number {
  return (2 * Math.sqrt(Math.PI) * gammaFunction((alpha + 1) / 2)) / gammaFunction(alpha / 2 + 1);
}
