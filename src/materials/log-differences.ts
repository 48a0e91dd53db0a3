/**
 * Two differences of logarithms that appear in the closed-form energy
 * densities of the saturating laws, evaluated without cancellation.
 *
 * Numerical care (derived): both are differences of two nearly equal terms
 * for small arguments, so there they are summed from their power series
 * (every term of the same sign, or alternating and decreasing), which keeps
 * full relative accuracy; for larger arguments the direct formula loses at
 * most a factor ~20 of relative accuracy, i.e. stays near 1e-15.
 */

/** Series switch-over: below it the series needs at most ~16 terms for 1e-17. */
const SERIES_LIMIT = 0.1;

/**
 * g(x) = ln(1 + x) - x / (1 + x) for x >= 0 (>= 0, ~ x^2/2 for small x).
 *
 * With u = x/(1+x): g = -ln(1-u) - u = sum over k >= 2 of u^k / k, all
 * terms positive.
 *
 * @example
 * ```ts
 * log1pMinusRatio(1e-8); // 5e-17 (the direct formula would return 0 or noise)
 * ```
 */
export function log1pMinusRatio(x: number): number {
  const u = x / (1 + x);
  if (!(u < SERIES_LIMIT)) return Math.log1p(x) - u;
  let term = u * u;
  let sum = 0;
  for (let k = 2; term > 1e-18 * sum || k === 2; k++) {
    sum += term / k;
    term *= u;
  }
  return sum;
}

/**
 * phi(u) = u - ln(1 + u) for u >= 0 (>= 0, ~ u^2/2 for small u).
 *
 * Series: sum over k >= 2 of (-1)^k u^k / k, alternating and decreasing.
 *
 * @example
 * ```ts
 * xMinusLog1p(1e-8); // 5e-17
 * ```
 */
export function xMinusLog1p(u: number): number {
  if (!(u < SERIES_LIMIT)) return u - Math.log1p(u);
  let term = u * u;
  let sum = 0;
  let sign = 1;
  for (let k = 2; term > 1e-18 * Math.abs(sum) || k === 2; k++) {
    sum += (sign * term) / k;
    term *= u;
    sign = -sign;
  }
  return sum;
}
