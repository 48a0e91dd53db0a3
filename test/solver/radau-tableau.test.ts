import { describe, expect, it } from 'vitest';
import { C1, C2, MU_COMPLEX_IM, MU_COMPLEX_RE, MU_REAL, P, T, TI } from '../../src/solver/radau-tableau.js';

// Radau IIA, 3 stages: Butcher tableau from Hairer and Wanner, Solving ODEs II,
// Table IV.5.6 (a_ij in closed form with sqrt 6).
const S6 = Math.sqrt(6);
const A = [
  [(88 - 7 * S6) / 360, (296 - 169 * S6) / 1800, (-2 + 3 * S6) / 225],
  [(296 + 169 * S6) / 1800, (88 + 7 * S6) / 360, (-2 - 3 * S6) / 225],
  [(16 - S6) / 36, (16 + S6) / 36, 1 / 9],
];
const mat = (a: readonly number[]): number[][] => [0, 1, 2].map((i) => [0, 1, 2].map((j) => a[i * 3 + j]!));
const mul = (a: number[][], b: number[][]): number[][] => a.map((r) => b[0]!.map((_, j) => r.reduce((s, _v, k) => s + r[k]! * b[k]![j]!, 0)));
function inv3(m: number[][]): number[][] {
  const [[a, b, c], [d, e, f], [g, h, i]] = m as [[number, number, number], [number, number, number], [number, number, number]];
  const det = a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
  return [
    [(e * i - f * h) / det, (c * h - b * i) / det, (b * f - c * e) / det],
    [(f * g - d * i) / det, (a * i - c * g) / det, (c * d - a * f) / det],
    [(d * h - e * g) / det, (b * g - a * h) / det, (a * e - b * d) / det],
  ];
}

describe('radau-tableau constants', () => {
  it('T and T^-1 are inverse to each other', () => {
    const I = mul(mat(TI), mat(T));
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(I[i]![j]!).toBeCloseTo(i === j ? 1 : 0, 14);
  });

  it('T^-1 A^-1 T is diag(gamma) plus the [[alpha, beta], [-beta, alpha]] block (book eq. IV.8.16), so the complex system is (alpha - i beta)', () => {
    const L = mul(mul(mat(TI), inv3(A)), mat(T));
    expect(L[0]![0]!).toBeCloseTo(MU_REAL, 12);
    expect(L[1]![1]!).toBeCloseTo(MU_COMPLEX_RE, 12);
    expect(L[2]![2]!).toBeCloseTo(MU_COMPLEX_RE, 12);
    expect(L[1]![2]!).toBeCloseTo(-MU_COMPLEX_IM, 12);
    expect(L[2]![1]!).toBeCloseTo(MU_COMPLEX_IM, 12);
    for (const [i, j] of [[0, 1], [0, 2], [1, 0], [2, 0]] as const) expect(Math.abs(L[i]![j]!)).toBeLessThan(1e-13);
  });

  it('the nodes are the row sums of A (collocation condition, book sect. IV.5)', () => {
    expect(A[0]!.reduce((s, v) => s + v, 0)).toBeCloseTo(C1, 15);
    expect(A[1]!.reduce((s, v) => s + v, 0)).toBeCloseTo(C2, 15);
    expect(A[2]!.reduce((s, v) => s + v, 0)).toBeCloseTo(1, 15);
  });

  it('P makes the dense output pass through every stage value: sum_k P[i][k] c_j^(k+1) = delta_ij (derived)', () => {
    const c = [C1, C2, 1];
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) {
        let s = 0;
        for (let k = 0; k < 3; k++) s += P[i * 3 + k]! * c[j]! ** (k + 1);
        expect(s).toBeCloseTo(i === j ? 1 : 0, 12);
      }
    }
  });
});
