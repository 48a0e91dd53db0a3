/**
 * Minimum of f on [a, b] by Brent's method: golden-section steps with
 * parabolic interpolation through the three best points when it is safe
 * (R. P. Brent, Algorithms for Minimization without Derivatives, 1973,
 * ch. 5, procedure localmin; written from the published algorithm). For a
 * unimodal f it converges to within `tolerance` of the minimiser, with
 * superlinear convergence near a smooth minimum; for any f it returns a
 * point it evaluated.
 *
 * @internal
 */
export function brentMinimum(
  f: (x: number) => number,
  lower: number,
  upper: number,
  tolerance: number,
  maxEvaluations = 100,
): { x: number; value: number; evaluations: number } {
  const golden = (3 - Math.sqrt(5)) / 2;
  let a = lower;
  let b = upper;
  let x = a + golden * (b - a);
  let w = x;
  let v = x;
  let fx = f(x);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  let evaluations = 1;
  while (evaluations < maxEvaluations) {
    const m = 0.5 * (a + b);
    const tol1 = Math.sqrt(Number.EPSILON) * Math.abs(x) + tolerance / 3;
    const t2 = 2 * tol1;
    if (Math.abs(x - m) <= t2 - 0.5 * (b - a)) break;
    let parabolic = false;
    if (Math.abs(e) > tol1) {
      // Parabola through x, w, v.
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < t2 || b - u < t2) d = x < m ? tol1 : -tol1;
        parabolic = true;
      }
    }
    if (!parabolic) {
      e = (x < m ? b : a) - x;
      d = golden * e;
    }
    const u = x + (Math.abs(d) >= tol1 ? d : d > 0 ? tol1 : -tol1);
    const fu = f(u);
    evaluations++;
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return { x, value: fx, evaluations };
}
