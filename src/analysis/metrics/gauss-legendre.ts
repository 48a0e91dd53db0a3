/**
 * Gauss-Legendre nodes and weights on [-1, 1] for 1 to 5 points, in closed
 * form (standard; cf. Abramowitz and Stegun, Handbook of Mathematical
 * Functions, sect. 25.4.29 and Table 25.4; checked against numpy's
 * `leggauss` to the last digit). An n-point rule integrates polynomials of
 * degree up to 2n - 1 exactly.
 *
 * @internal
 */
export const GAUSS_LEGENDRE: readonly { readonly nodes: readonly number[]; readonly weights: readonly number[] }[] = (() => {
  const s2 = 1 / Math.sqrt(3);
  const s3 = Math.sqrt(3 / 5);
  const a4 = Math.sqrt(3 / 7 - (2 / 7) * Math.sqrt(6 / 5));
  const b4 = Math.sqrt(3 / 7 + (2 / 7) * Math.sqrt(6 / 5));
  const wa4 = (18 + Math.sqrt(30)) / 36;
  const wb4 = (18 - Math.sqrt(30)) / 36;
  const a5 = Math.sqrt(5 - 2 * Math.sqrt(10 / 7)) / 3;
  const b5 = Math.sqrt(5 + 2 * Math.sqrt(10 / 7)) / 3;
  const wa5 = (322 + 13 * Math.sqrt(70)) / 900;
  const wb5 = (322 - 13 * Math.sqrt(70)) / 900;
  return [
    { nodes: [0], weights: [2] },
    { nodes: [-s2, s2], weights: [1, 1] },
    { nodes: [-s3, 0, s3], weights: [5 / 9, 8 / 9, 5 / 9] },
    { nodes: [-b4, -a4, a4, b4], weights: [wb4, wa4, wa4, wb4] },
    { nodes: [-b5, -a5, 0, a5, b5], weights: [wb5, wa5, 128 / 225, wa5, wb5] },
  ];
})();

/**
 * Integral of g over [a, b] by the n-point Gauss-Legendre rule.
 *
 * @internal
 */
export function gaussLegendre(g: (t: number) => number, a: number, b: number, n: number): number {
  const rule = GAUSS_LEGENDRE[n - 1];
  if (rule === undefined || !(b > a)) return 0;
  const half = 0.5 * (b - a);
  const mid = 0.5 * (a + b);
  let sum = 0;
  for (let k = 0; k < rule.nodes.length; k++) sum += (rule.weights[k] ?? 0) * g(mid + half * (rule.nodes[k] ?? 0));
  return half * sum;
}
