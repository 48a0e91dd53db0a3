import { describe, expect, it } from 'vitest';
import { cosinePowerIntegral, gammaFunction } from '../../../src/index.js';

describe('gammaFunction', () => {
  it('gives Gamma(n) = (n - 1)! for integers (definition)', () => {
    let fact = 1;
    for (let n = 1; n <= 20; n++) {
      expect(gammaFunction(n) / fact).toBeCloseTo(1, 14);
      fact *= n;
    }
  });

  it('gives Gamma(1/2) = sqrt(pi) and Gamma(n + 1/2) = (2n)! sqrt(pi) / (4^n n!) (standard identities)', () => {
    expect(gammaFunction(0.5) / Math.sqrt(Math.PI)).toBeCloseTo(1, 15);
    expect(gammaFunction(1.5) / (Math.sqrt(Math.PI) / 2)).toBeCloseTo(1, 14);
    expect(gammaFunction(4.5) / ((105 / 16) * Math.sqrt(Math.PI))).toBeCloseTo(1, 14);
  });

  it('matches the classical constants Gamma(1/3) and Gamma(1/4) (from memory; confirmed with mpmath at 40 digits)', () => {
    expect(gammaFunction(1 / 3) / 2.678938534707747633).toBeCloseTo(1, 14);
    expect(gammaFunction(1 / 4) / 3.625609908221908311).toBeCloseTo(1, 14);
  });

  it('satisfies Gamma(x + 1) = x Gamma(x) and the reflection formula for negative non-integers', () => {
    for (const x of [0.07, 0.5, 1.3, 2.71, 9.9, 33.3]) expect(gammaFunction(x + 1) / (x * gammaFunction(x))).toBeCloseTo(1, 13);
    expect(gammaFunction(-0.5) / (-2 * Math.sqrt(Math.PI))).toBeCloseTo(1, 14);
    expect(Number.isNaN(gammaFunction(0))).toBe(true);
    expect(Number.isNaN(gammaFunction(-3))).toBe(true);
  });
});

describe('cosinePowerIntegral', () => {
  /** Composite Gauss-Legendre (5 points) on [0, pi/2], times 4 by symmetry: an independent quadrature. */
  function quadrature(alpha: number): number {
    const x = [-0.906179845938664, -0.5384693101056831, 0, 0.5384693101056831, 0.906179845938664];
    const wgt = [0.23692688505618928, 0.4786286704993663, 0.5688888888888887, 0.4786286704993663, 0.23692688505618928];
    const m = 20000;
    const h = Math.PI / 2 / m;
    let s = 0;
    for (let j = 0; j < m; j++) {
      const mid = (j + 0.5) * h;
      for (let q = 0; q < 5; q++) s += (wgt[q] ?? 0) * Math.cos(mid + (h / 2) * (x[q] ?? 0)) ** alpha;
    }
    return 4 * (h / 2) * s;
  }

  it('gives 2 pi, 4, pi, 8/3, 3 pi/4 for alpha = 0..4 (elementary integrals)', () => {
    expect(cosinePowerIntegral(0)).toBeCloseTo(2 * Math.PI, 14);
    expect(cosinePowerIntegral(1)).toBeCloseTo(4, 14);
    expect(cosinePowerIntegral(2)).toBeCloseTo(Math.PI, 14);
    expect(cosinePowerIntegral(3)).toBeCloseTo(8 / 3, 14);
    expect(cosinePowerIntegral(4)).toBeCloseTo((3 * Math.PI) / 4, 14);
  });

  it('agrees with direct quadrature of |cos|^alpha for non-integer alpha', () => {
    for (const alpha of [1.2, 1.5, 2.3, 2.9]) expect(cosinePowerIntegral(alpha) / quadrature(alpha)).toBeCloseTo(1, 9);
  });
});
