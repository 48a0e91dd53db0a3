import { cumulativeIntegral, type CumulativeOptions } from './cumulative-integral.js';

/**
 * Energy delivered by a power series: running and total.
 *
 * @example
 * ```ts
 * const { cumulative, total } = energyIntegral(t, pSource);
 * ```
 */
export interface EnergyIntegral {
  /** Energy from t[0] to t[i] at every sample, J (first entry 0). */
  readonly cumulative: Float64Array;
  /** Energy over the whole series, J. */
  readonly total: number;
}

/**
 * Energy `integral of p(t) dt` of a power series p (W), running and total,
 * the building block of the energy audit (source energy = dissipated +
 * stored). Trapezoidal rule on the samples, or Gauss-Legendre on `at`
 * (pass the product of the dense outputs of voltage and current: with
 * Radau IIA's cubic interpolant that product has degree 6, integrated
 * exactly by the default 4-point rule when `t` are the step ends).
 *
 * @example
 * ```ts
 * // a 10 ohm resistor carrying 2 A (40 W) for 1 s dissipates 40 J
 * const t = Float64Array.of(0, 0.5, 1);
 * energyIntegral(t, Float64Array.of(40, 40, 40)).total; // 40
 * ```
 */
export function energyIntegral(t: ArrayLike<number>, p: ArrayLike<number>, options: CumulativeOptions = {}): EnergyIntegral {
  const cumulative = cumulativeIntegral(t, p, { name: 'power', ...options });
  return { cumulative, total: cumulative[cumulative.length - 1] ?? 0 };
}
