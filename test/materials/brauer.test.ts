import { describe, expect, it } from 'vitest';
import { MU0, InputError, brauerAirLineJoin, brauerMaterial, type BrauerSpec } from '../../src/index.js';

// Invented test parameters (a soft steel-like curve), not values from the paper.
const spec: BrauerSpec = { kind: 'brauer', k1: 3.8, k2: 2.17, k3: 396.2, name: 'test steel' };

/**
 * Brauer, "Simple equations for the magnetization and reluctivity curves of
 * steel", IEEE Trans. Magn. MAG-11(1), 1975, eq. (1): H = (k1 exp(k2 B^2) + k3) B,
 * evaluated here directly (READ).
 */
const brauerEq1 = (s: BrauerSpec, b: number): number => (s.k1 * Math.exp(s.k2 * b * b) + s.k3) * b;
/** Its derivative (derived): dH/dB = k1 exp(k2 B^2) (1 + 2 k2 B^2) + k3. */
const brauerSlope = (s: BrauerSpec, b: number): number =>
  s.k1 * Math.exp(s.k2 * b * b) * (1 + 2 * s.k2 * b * b) + s.k3;

describe('brauerMaterial', () => {
  it("equals Brauer's equation (1) up to the join with the air line", () => {
    const law = brauerMaterial(spec);
    const bt = brauerAirLineJoin(spec).fluxDensity;
    for (const b of [1e-6, 0.3, 1, 1.5, 2, 0.999 * bt, bt]) {
      expect(law.fieldStrength(b) / brauerEq1(spec, b)).toBeCloseTo(1, 14);
      expect(law.fieldStrength(-b) / brauerEq1(spec, -b)).toBeCloseTo(1, 14);
      expect(law.fieldSlope(b) / brauerSlope(spec, b)).toBeCloseTo(1, 14);
    }
  });

  it('joins the air line where the slope of equation (1) equals 1/mu0, and is that straight line beyond', () => {
    const join = brauerAirLineJoin(spec);
    expect(MU0 * brauerSlope(spec, join.fluxDensity)).toBeCloseTo(1, 12);
    expect(join.fieldStrength / brauerEq1(spec, join.fluxDensity)).toBeCloseTo(1, 14);
    expect(join.polarisation).toBeCloseTo(join.fluxDensity - MU0 * join.fieldStrength, 14);
    const law = brauerMaterial(spec);
    for (const d of [1e-3, 0.1, 1, 10]) {
      const b = join.fluxDensity + d;
      expect(law.fieldStrength(b) / (join.fieldStrength + d / MU0)).toBeCloseTo(1, 13);
      expect(MU0 * law.fieldSlope(b)).toBe(1);
    }
  });

  it('has the initial relative permeability 1/(mu0 (k1 + k3)) as its largest secant permeability', () => {
    const law = brauerMaterial(spec);
    const muri = brauerAirLineJoin(spec).initialRelativePermeability;
    expect(muri).toBeCloseTo(1 / (MU0 * (3.8 + 396.2)), 6);
    expect(1 / (MU0 * law.fieldSlope(0))).toBeCloseTo(muri, 6);
    for (const b of [0.01, 0.5, 1, 1.8, 2.5]) {
      expect(b / (MU0 * law.fieldStrength(b))).toBeLessThanOrEqual(muri);
    }
  });

  it('rejects non-positive k1 or k2, negative k3 and k1 + k3 >= 1/mu0, naming the material', () => {
    const bad: Partial<BrauerSpec>[] = [{ k1: 0 }, { k2: -1 }, { k3: -0.1 }, { k1: Number.NaN }, { k3: 1 / MU0 }];
    for (const patch of bad) {
      const call = (): unknown => brauerMaterial({ ...spec, ...patch });
      expect(call).toThrow(InputError);
      expect(call).toThrow(/test steel/);
      try {
        call();
      } catch (e) {
        expect((e as InputError).code).toBe('bad-parameter');
      }
    }
  });
});
