import { ComponentList } from './component-list.js';

/**
 * The one weighted RMS norm used everywhere in the solver (Hairer and
 * Wanner, Solving ODEs I, sect. II.4, eq. 4.11; radau5):
 * ||v|| = sqrt((1/n) sum_i (v_i / scale_i)^2), scale_i = atol_i + rtol_i |y_i|.
 *
 * @internal
 */
export function weightedRmsNorm(v: Float64Array, scale: Float64Array): number {
  return Math.sqrt(weightedSquares(v, scale) / v.length);
}

/**
 * sum_i (v_i / scale_i)^2, the sum under {@link weightedRmsNorm} (also the
 * state's part of a norm that takes dependent unknowns, see dependent-error.ts).
 *
 * @internal
 */
export function weightedSquares(v: Float64Array, scale: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) {
    const r = v[i]! / scale[i]!;
    s += r * r;
  }
  return s;
}

/**
 * Writes scale_i = atol_i + rtol_i |y_i| into `out`.
 *
 * @internal
 */
export function errorScale(y: Float64Array, rtol: Float64Array, atol: Float64Array, out: Float64Array): Float64Array {
  for (let i = 0; i < y.length; i++) out[i] = atol[i]! + rtol[i]! * Math.abs(y[i]!);
  return out;
}

/**
 * Indices of the `count` entries of |v_i / scale_i| that are largest, largest first
 * (ties in index order, NaN and zero left out: {@link ComponentList.keepLargest}).
 *
 * @internal
 */
export function largestScaled(v: Float64Array, scale: Float64Array | undefined, count = 3): number[] {
  return largestScaledInto(v, scale, count, new ComponentList(count)).toArray();
}

/**
 * {@link largestScaled} into a list of the caller's (cleared first), which is returned.
 *
 * @internal
 */
export function largestScaledInto(v: Float64Array, scale: Float64Array | undefined, count: number, out: ComponentList): ComponentList {
  out.clear();
  for (let i = 0; i < v.length; i++) out.keepLargest(count, i, Math.abs(v[i]! / (scale ? scale[i]! : 1)));
  return out;
}

/**
 * Whether every entry of `v` is finite (no allocation, for hot paths).
 *
 * @internal
 */
export function allFinite(v: Float64Array): boolean {
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i]!)) return false;
  return true;
}

/**
 * Indices of the non-finite entries of `v`.
 *
 * @internal
 */
export function nonFiniteIndices(v: Float64Array): number[] {
  const idx: number[] = [];
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i]!)) idx.push(i);
  return idx;
}

/**
 * Rounding units of a quantity below which a Newton update counts as zero in
 * the convergence tests (a few units: the update of a converged iteration is
 * of the size of the rounding error of f, common practice).
 *
 * @internal
 */
export const ROUNDING_FLOOR_UNITS = 4;

/**
 * The weighted RMS norm of an update dy of y, with the part of each entry
 * within {@link ROUNDING_FLOOR_UNITS} rounding units of y_i removed:
 * sqrt((1/n) sum_i (max(|dy_i| - 4 eps |y_i|, 0) / scale_i)^2). A convergence
 * test on this norm can be met at any tolerance: at rtol below about 1e-10
 * the plain norm asks for updates smaller than one rounding unit, which
 * round-off in f never delivers.
 *
 * @internal
 */
export function roundingFlooredNorm(dy: Float64Array, y: Float64Array, scale: Float64Array): number {
  const n = dy.length;
  const u = ROUNDING_FLOOR_UNITS * Number.EPSILON;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const d = Math.abs(dy[i]!) - u * Math.abs(y[i]!);
    if (d > 0 || d !== d) {
      const r = d / scale[i]!;
      s += r * r;
    }
  }
  return Math.sqrt(s / n);
}
