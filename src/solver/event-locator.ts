/**
 * Locate a sign change of g on [ta, tb] (g(ta) = ga and g(tb) = gb of
 * opposite signs, or gb = 0) by the Illinois variant of regula falsi
 * (Dowell and Jarratt, BIT 11 (1971) 168-174), safeguarded by a bisection
 * step whenever the bracket fails to halve. Returns the right end of the
 * final bracket: a time where g already has its new sign, no further than
 * `tol` after the crossing.
 *
 * @internal
 */
export function locateSignChange(g: (t: number) => number, ta: number, tb: number, ga: number, gb: number, tol: number): number {
  if (gb === 0) return tb;
  let a = ta;
  let b = tb;
  let fa = ga;
  let fb = gb;
  let side = 0;
  for (let iter = 0; iter < 200 && b - a > tol; iter++) {
    const width = b - a;
    let t = (a * fb - b * fa) / (fb - fa);
    if (!(t > a && t < b)) t = 0.5 * (a + b);
    const ft = g(t);
    if (ft === 0) return t;
    if (Math.sign(ft) === Math.sign(fb)) {
      b = t;
      fb = ft;
      if (side === 1) fa /= 2;
      side = 1;
    } else {
      a = t;
      fa = ft;
      if (side === -1) fb /= 2;
      side = -1;
    }
    // Safeguard: force a bisection when the bracket did not halve.
    if (b - a > 0.5 * width) {
      const m = 0.5 * (a + b);
      if (m <= a || m >= b) break;
      const fm = g(m);
      if (fm === 0) return m;
      if (Math.sign(fm) === Math.sign(fb)) {
        b = m;
        fb = fm;
      } else {
        a = m;
        fa = fm;
      }
      side = 0;
    }
  }
  return b;
}
