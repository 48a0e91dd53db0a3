/**
 * Adaptive Gauss-Legendre quadrature, a test oracle for energy densities.
 *
 * 5-point Gauss-Legendre rule (nodes and weights: Abramowitz and Stegun,
 * Handbook of Mathematical Functions, Table 25.4), exact for polynomials of
 * degree <= 9. Adaptive bisection (common practice, e.g. Davis and
 * Rabinowitz, Methods of Numerical Integration): a panel is accepted when
 * the rule on it and on its two halves agree to the tolerance.
 */
const NODES = [0, -0.5384693101056831, 0.5384693101056831, -0.906179845938664, 0.906179845938664];
const WEIGHTS = [0.5688888888888889, 0.4786286704993665, 0.4786286704993665, 0.2369268850561891, 0.2369268850561891];

/** 5-point Gauss-Legendre on [a, b]. */
export function gaussLegendre5(f: (x: number) => number, a: number, b: number): number {
  const c = 0.5 * (a + b);
  const r = 0.5 * (b - a);
  let s = 0;
  for (let i = 0; i < 5; i++) s += (WEIGHTS[i] as number) * f(c + r * (NODES[i] as number));
  return r * s;
}

/**
 * Integral of f from a to b, split first at the given breakpoints (where f
 * has a kink in a derivative), then adaptively to relative tolerance tol.
 */
export function integrate(
  f: (x: number) => number,
  a: number,
  b: number,
  breakpoints: readonly number[] = [],
  tol = 1e-14,
): number {
  const cuts = [a, ...breakpoints.filter((x) => x > a && x < b).sort((p, q) => p - q), b];
  let total = 0;
  for (let i = 0; i + 1 < cuts.length; i++) {
    const lo = cuts[i] as number;
    const hi = cuts[i + 1] as number;
    total += adapt(f, lo, hi, gaussLegendre5(f, lo, hi), tol, 0);
  }
  return total;
}

function adapt(f: (x: number) => number, a: number, b: number, whole: number, tol: number, depth: number): number {
  const m = 0.5 * (a + b);
  const left = gaussLegendre5(f, a, m);
  const right = gaussLegendre5(f, m, b);
  const both = left + right;
  if (depth >= 40 || Math.abs(both - whole) <= tol * Math.abs(both)) return both;
  return adapt(f, a, m, left, tol, depth + 1) + adapt(f, m, b, right, tol, depth + 1);
}
