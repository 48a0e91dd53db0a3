/**
 * Knot slopes of a monotone piecewise cubic Hermite interpolant through
 * strictly increasing data, after F. N. Fritsch and R. E. Carlson,
 * "Monotone piecewise cubic interpolation", SIAM Journal on Numerical
 * Analysis 17(2), 1980, 238-246.
 *
 * Step 1 (initial slopes): at interior knots the three-point formula, i.e.
 * the slope of the parabola through the knot and its two neighbours,
 * m_i = (h_i d_(i-1) + h_(i-1) d_i) / (h_(i-1) + h_i), with h the interval
 * widths and d the secant slopes; at both ends the one-sided three-point
 * formula. These are second-order accurate, so the interpolant's error is
 * O(h^3) (derived: Hermite error O(h^4) plus h times the slope error).
 *
 * Step 2 (monotonicity): on each interval with alpha = m_k / d_k and
 * beta = m_(k+1) / d_k, if alpha^2 + beta^2 > 9 both are scaled by
 * tau = 3 / sqrt(alpha^2 + beta^2). The disc of radius 3 lies inside the
 * Fritsch-Carlson monotonicity region, so each cubic piece is monotone.
 * Scaling only ever lowers a slope, which keeps the earlier intervals inside
 * the disc, so one left-to-right pass suffices.
 *
 * Our deviation: where the published rule sets an end slope to 0 (when the
 * one-sided estimate has the wrong sign) we need a strictly positive slope
 * (finite permeability), so an end estimate below half its secant slope is
 * raised to half the secant slope (alpha >= 1/2). For smooth, well-resolved
 * data the estimate is close to the secant and this floor is inactive.
 *
 * @param x - strictly increasing abscissae, at least 3
 * @param y - strictly increasing ordinates, same length
 * @returns slopes m with m_i > 0 at every knot
 *
 * @example
 * ```ts
 * const m = fritschCarlsonSlopes([0, 1, 2, 3], [0, 1, 4, 9]);
 * // m = [0.5, 2, 4, 6]  (quadratic data: exact slopes, except the floored start)
 * ```
 */
export function fritschCarlsonSlopes(x: ArrayLike<number>, y: ArrayLike<number>): Float64Array {
  const n = x.length;
  const h = new Float64Array(n - 1);
  const d = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) {
    h[i] = (x[i + 1] as number) - (x[i] as number);
    d[i] = ((y[i + 1] as number) - (y[i] as number)) / (h[i] as number);
  }
  const m = new Float64Array(n);
  for (let i = 1; i < n - 1; i++) {
    const hl = h[i - 1] as number;
    const hr = h[i] as number;
    m[i] = (hr * (d[i - 1] as number) + hl * (d[i] as number)) / (hl + hr);
  }
  m[0] = endSlope(h[0] as number, h[1] as number, d[0] as number, d[1] as number);
  m[n - 1] = endSlope(h[n - 2] as number, h[n - 3] as number, d[n - 2] as number, d[n - 3] as number);
  for (let k = 0; k < n - 1; k++) {
    const dk = d[k] as number;
    const alpha = (m[k] as number) / dk;
    const beta = (m[k + 1] as number) / dk;
    const r2 = alpha * alpha + beta * beta;
    if (r2 > 9) {
      const tau = 3 / Math.sqrt(r2);
      m[k] = tau * alpha * dk;
      m[k + 1] = tau * beta * dk;
    }
  }
  return m;
}

/**
 * One-sided three-point slope at an end knot: h0, d0 belong to the end
 * interval, h1, d1 to its neighbour. Floored at d0 / 2 (see above).
 */
function endSlope(h0: number, h1: number, d0: number, d1: number): number {
  const m = ((2 * h0 + h1) * d0 - h0 * d1) / (h0 + h1);
  return m < 0.5 * d0 ? 0.5 * d0 : m;
}
