import { gaussLegendre } from './gauss-legendre.js';

/**
 * Largest i in [0, n-2] with t[i] <= a (binary search; t non-decreasing).
 *
 * @internal
 */
export function intervalIndex(t: ArrayLike<number>, a: number): number {
  let lo = 0;
  let hi = t.length - 2;
  if (hi < 0) return 0;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if ((t[mid] ?? 0) <= a) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/**
 * Value of the linear interpolant of (t, x) at s, for s in interval i.
 *
 * @internal
 */
export function interpolateAt(t: ArrayLike<number>, x: ArrayLike<number>, i: number, s: number): number {
  const t0 = t[i] ?? 0;
  const t1 = t[i + 1] ?? t0;
  const x0 = x[i] ?? 0;
  const x1 = x[i + 1] ?? x0;
  if (!(t1 > t0)) return x1;
  return x0 + ((x1 - x0) * (s - t0)) / (t1 - t0);
}

/**
 * Integral over [a, b] (inside the data) of g(x(t)).
 *
 * Without `at`: the trapezoidal rule on the samples, with the window ends
 * linearly interpolated (error O(h^2) for smooth x; exact for g = identity
 * and piecewise-linear x). With `at`: a `points`-point Gauss-Legendre rule
 * on each sample interval (clipped to the window), evaluating g(at(t)).
 * Zero-width intervals (repeated times) contribute nothing. The window start
 * is found by bisection, so a short window in a long series is cheap.
 *
 * @internal
 */
export function windowIntegral(
  t: ArrayLike<number>,
  x: ArrayLike<number>,
  a: number,
  b: number,
  g: (v: number) => number,
  at?: (t: number) => number,
  points = 4,
): number {
  const n = t.length;
  let sum = 0;
  const ga = at === undefined ? undefined : (s: number): number => g(at(s));
  for (let i = intervalIndex(t, a); i < n - 1; i++) {
    const t0 = t[i] ?? 0;
    const t1 = t[i + 1] ?? 0;
    if (t0 >= b) break;
    const lo = Math.max(a, t0);
    const hi = Math.min(b, t1);
    if (!(hi > lo)) continue;
    if (ga !== undefined) {
      sum += gaussLegendre(ga, lo, hi, points);
    } else {
      const xlo = lo === t0 ? (x[i] ?? 0) : interpolateAt(t, x, i, lo);
      const xhi = hi === t1 ? (x[i + 1] ?? 0) : interpolateAt(t, x, i, hi);
      sum += 0.5 * (hi - lo) * (g(xlo) + g(xhi));
    }
  }
  return sum;
}

/** @internal */
export const identity = (v: number): number => v;
/** @internal */
export const square = (v: number): number => v * v;
