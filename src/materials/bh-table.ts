import { MU0 } from '../constants.js';
import type { MaterialLaw } from './material-law.js';
import { checkBhTable, type BhTableData } from './bh-table-data.js';
import { fritschCarlsonSlopes } from './fritsch-carlson-slopes.js';
import { checkSaturationFluxDensity, oddMaterialLaw } from './odd-law.js';
import { xMinusLog1p } from './log-differences.js';

/**
 * Plain-data description of a tabulated material: points of the first
 * magnetisation curve (B >= 0), see {@link BhTableData} for the rules.
 *
 * @example
 * ```ts
 * const spec: BhTableSpec = {
 *   kind: 'table', name: 'sample', saturationFluxDensity: 1.6,
 *   fluxDensity: [0.5, 1.0, 1.5], fieldStrength: [40, 90, 700],
 * };
 * ```
 */
export interface BhTableSpec extends BhTableData {
  readonly kind: 'table';
  /** Flux density to report the saturation margin against, T (optional). */
  readonly saturationFluxDensity?: number;
}

/**
 * The tail beyond the last point (B_n, H_n) with end slope s_n:
 *
 *     H = H_n + D / mu0 - (1/mu0 - s_n) D / (1 + D / tau),   D = B - B_n,
 *     dH/dB = 1/mu0 - (1/mu0 - s_n) / (1 + D / tau)^2,
 *
 * with tau = H_n / s_n (T). Derived: the slope runs monotonically from s_n
 * (C1 join) to 1/mu0 (the air line), staying positive; the polarisation
 * B - mu0 H tends to J_n + (1 - mu0 s_n) H_n / s_n, the same limit as the law
 * of approach to saturation J = J_inf - a / H matched in value and slope at
 * the last point (that law: common practice in magnetism texts).
 */
interface Tail {
  readonly bn: number;
  readonly hn: number;
  readonly wn: number;
  readonly k: number;
  readonly tau: number;
}

function tailField(t: Tail, d: number): number {
  return t.hn + d / MU0 - (t.k * d) / (1 + d / t.tau);
}

function tailSlope(t: Tail, d: number): number {
  const q = 1 + d / t.tau;
  return 1 / MU0 - t.k / (q * q);
}

function tailEnergy(t: Tail, d: number): number {
  // integral of k x / (1 + x / tau) from 0 to d = k tau^2 (u - ln(1 + u)), u = d / tau
  return t.wn + t.hn * d + (0.5 * d * d) / MU0 - t.k * t.tau * t.tau * xMinusLog1p(d / t.tau);
}

/** Index k of the interval [b_k, b_(k+1)) holding x, for b_0 <= x < b_last. */
function findInterval(b: Float64Array, x: number): number {
  let lo = 0;
  let hi = b.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if ((b[mid] as number) <= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Tabulated B-H law: monotone piecewise cubic interpolation of H(B)
 * (Fritsch and Carlson 1980; slopes as documented in docs/materials.md), odd
 * extension to negative B, and a tail beyond the last point that joins the
 * cubic with a continuous slope and tends to the air line.
 *
 * - Between points: cubic Hermite pieces with the Fritsch-Carlson slopes,
 *   so H is C1 and strictly increasing (every knot slope is > 0 and each
 *   piece has alpha^2 + beta^2 <= 9). Error O(h^3) for smooth data.
 * - At B = 0: the origin is a knot (added if missing); H(-B) = -H(B), so the
 *   slope at 0 is the same from both sides.
 * - Beyond the last point (B_n, H_n), with s_n the interpolant's end slope:
 *   H = H_n + D/mu0 - (1/mu0 - s_n) D/(1 + D/tau), D = B - B_n,
 *   tau = H_n / s_n. Value and slope match at B_n; the slope then moves
 *   monotonically to 1/mu0 and the polarisation B - mu0 H levels off at
 *   J_n + (1 - mu0 s_n) H_n / s_n, the limit of the law of approach to
 *   saturation J = J_inf - a/H fitted to the last point's value and slope.
 *   Extend the table into deep saturation if that extrapolation matters.
 * - Energy density: the cubic pieces are integrated exactly (their
 *   antiderivative is a quartic) and summed per knot in advance; the tail
 *   has a closed form.
 *
 * @example
 * ```ts
 * const law = bhTableMaterial({
 *   kind: 'table', name: 'my steel',
 *   fluxDensity: [0.5, 1.0, 1.4, 1.6, 1.7],
 *   fieldStrength: [40, 80, 200, 800, 3000],
 * });
 * law.fieldStrength(1.2); // between 80 and 200 A/m
 * ```
 */
export function bhTableMaterial(spec: BhTableSpec): MaterialLaw {
  const { name, b, h } = checkBhTable(spec);
  const sat = checkSaturationFluxDensity(name, spec.saturationFluxDensity);
  const m = fritschCarlsonSlopes(b, h);
  const pieces = b.length - 1;
  // Power form per piece in x = B - b_k: H = h_k + x (m_k + x (c2_k + x c3_k)).
  const c2 = new Float64Array(pieces);
  const c3 = new Float64Array(pieces);
  const w = new Float64Array(pieces + 1);
  for (let k = 0; k < pieces; k++) {
    const dx = (b[k + 1] as number) - (b[k] as number);
    const slope = ((h[k + 1] as number) - (h[k] as number)) / dx;
    const mk = m[k] as number;
    const mk1 = m[k + 1] as number;
    c2[k] = (3 * slope - 2 * mk - mk1) / dx;
    c3[k] = (mk + mk1 - 2 * slope) / (dx * dx);
    w[k + 1] = (w[k] as number) + pieceIntegral(h[k] as number, mk, c2[k] as number, c3[k] as number, dx);
  }
  const bn = b[pieces] as number;
  const hn = h[pieces] as number;
  const sn = m[pieces] as number;
  const tail: Tail = { bn, hn, wn: w[pieces] as number, k: 1 / MU0 - sn, tau: hn / sn };
  return oddMaterialLaw(
    name,
    {
      field: (x) => {
        if (x >= bn) return tailField(tail, x - bn);
        const k = findInterval(b, x);
        const t = x - (b[k] as number);
        return (h[k] as number) + t * ((m[k] as number) + t * ((c2[k] as number) + t * (c3[k] as number)));
      },
      slope: (x) => {
        if (x >= bn) return tailSlope(tail, x - bn);
        const k = findInterval(b, x);
        const t = x - (b[k] as number);
        return (m[k] as number) + t * (2 * (c2[k] as number) + 3 * t * (c3[k] as number));
      },
      energy: (x) => {
        if (x >= bn) return tailEnergy(tail, x - bn);
        const k = findInterval(b, x);
        return (w[k] as number) + pieceIntegral(h[k] as number, m[k] as number, c2[k] as number, c3[k] as number, x - (b[k] as number));
      },
    },
    sat,
  );
}

/** Exact integral from 0 to t of h0 + m x + c2 x^2 + c3 x^3. */
function pieceIntegral(h0: number, m: number, c2: number, c3: number, t: number): number {
  return t * (h0 + t * (m / 2 + t * (c2 / 3 + (t * c3) / 4)));
}
