/**
 * The Langevin function L(x) = coth(x) - 1/x, the anhysteretic shape of the
 * Jiles-Atherton model (D. C. Jiles, D. L. Atherton, J. Magn. Magn. Mater. 61
 * (1986) 48-60, eq. for M_an), with its slope, its integral and its inverse.
 * Near x = 0 the closed forms cancel catastrophically, so Taylor series are
 * used there (coefficients derived from coth's Laurent series, Abramowitz
 * and Stegun 4.5.67: coth x = 1/x + x/3 - x^3/45 + 2x^5/945 - ...).
 *
 * @example
 * ```ts
 * langevin(1); // 0.3130352855
 * ```
 */
export function langevin(x: number): number {
  const ax = Math.abs(x);
  if (ax < 0.1) {
    const x2 = x * x;
    return x * (1 / 3 - x2 * (1 / 45 - x2 * (2 / 945 - x2 * (1 / 4725 - (2 / 93555) * x2))));
  }
  if (ax > 40) return Math.sign(x) - 1 / x;
  return 1 / Math.tanh(x) - 1 / x;
}

/**
 * Slope of the Langevin function, L'(x) = 1/x^2 - 1/sinh(x)^2 (series near 0).
 *
 * @example
 * ```ts
 * langevinSlope(0); // 1/3
 * ```
 */
export function langevinSlope(x: number): number {
  const ax = Math.abs(x);
  if (ax < 0.1) {
    const x2 = x * x;
    return 1 / 3 - x2 * (1 / 15 - x2 * (2 / 189 - x2 * (1 / 675 - (2 / 10395) * x2)));
  }
  if (ax > 40) return 1 / (x * x);
  const s = Math.sinh(x);
  return 1 / (x * x) - 1 / (s * s);
}

/**
 * Integral of the Langevin function from 0 to x: ln(sinh(x) / x) (series
 * near 0, asymptotic form for large |x| so sinh does not overflow).
 *
 * @example
 * ```ts
 * langevinIntegral(2); // ln(sinh(2)/2) = 0.5942
 * ```
 */
export function langevinIntegral(x: number): number {
  const ax = Math.abs(x);
  if (ax < 0.1) {
    const x2 = x * x;
    return x2 * (1 / 6 - x2 * (1 / 180 - x2 / 2835));
  }
  if (ax < 20) return Math.log(Math.sinh(ax) / ax);
  // ln(sinh x / x) = x - ln 2 - ln x + ln(1 - exp(-2x)) for x > 0 (even function).
  return ax - Math.LN2 - Math.log(ax) + Math.log1p(-Math.exp(-2 * ax));
}

/**
 * Inverse of the Langevin function on (-1, 1): the x with L(x) = y. Newton's
 * method from the Cohen Pade start x0 = y (3 - y^2) / (1 - y^2) (A. Cohen,
 * Rheol. Acta 30 (1991) 270-273, from memory; only a starting value here).
 * Arguments at or beyond +-1 have no inverse: NaN.
 *
 * @example
 * ```ts
 * inverseLangevin(langevin(1.5)); // 1.5
 * ```
 */
export function inverseLangevin(y: number): number {
  if (!(Math.abs(y) < 1)) return Number.NaN;
  if (y === 0) return 0;
  let x = (y * (3 - y * y)) / (1 - y * y);
  for (let i = 0; i < 50; i++) {
    const r = langevin(x) - y;
    const dx = r / langevinSlope(x);
    x -= dx;
    if (Math.abs(dx) <= 1e-15 * Math.abs(x)) break;
  }
  return x;
}
