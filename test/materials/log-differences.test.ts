import { describe, expect, it } from 'vitest';
import { log1pMinusRatio, xMinusLog1p } from '../../src/materials/log-differences.js';

// Derived identities: ln(1+x) - x/(1+x) = sum_{k>=2} (-1)^k (k-1) x^k / k and
// u - ln(1+u) = sum_{k>=2} (-1)^k u^k / k (Taylor series of ln(1+x) and x/(1+x) = 1 - 1/(1+x)).
function seriesG(x: number): number {
  let s = 0;
  for (let k = 60; k >= 2; k--) s += ((-1) ** k * (k - 1) * x ** k) / k;
  return s;
}
function seriesPhi(u: number): number {
  let s = 0;
  for (let k = 60; k >= 2; k--) s += ((-1) ** k * u ** k) / k;
  return s;
}

describe('log differences', () => {
  it('log1pMinusRatio matches its Taylor series at small x and the direct formula at large x', () => {
    for (const x of [1e-150, 1e-12, 1e-6, 1e-3, 0.05, 0.11, 0.2]) {
      expect(log1pMinusRatio(x) / seriesG(x)).toBeCloseTo(1, 14);
    }
    for (const x of [0.5, 3, 1e3, 1e20]) expect(log1pMinusRatio(x)).toBeCloseTo(Math.log1p(x) - x / (1 + x), 12);
    expect(log1pMinusRatio(0)).toBe(0);
  });

  it('xMinusLog1p matches its Taylor series at small u and the direct formula at large u', () => {
    for (const u of [1e-150, 1e-12, 1e-6, 1e-3, 0.05, 0.099, 0.2]) {
      expect(xMinusLog1p(u) / seriesPhi(u)).toBeCloseTo(1, 14);
    }
    for (const u of [0.5, 3, 1e3]) expect(xMinusLog1p(u)).toBeCloseTo(u - Math.log1p(u), 10);
    expect(xMinusLog1p(0)).toBe(0);
  });
});
