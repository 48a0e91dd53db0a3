import { describe, expect, it } from 'vitest';
import { MU0, InputError, frohlichKennellyMaterial, type FrohlichKennellySpec } from '../../src/index.js';

const spec: FrohlichKennellySpec = {
  kind: 'frohlich-kennelly',
  initialRelativePermeability: 5000,
  saturationPolarisation: 1.6,
  name: 'test iron',
};

describe('frohlichKennellyMaterial', () => {
  it('satisfies the published defining equation J = H / (a + b |H|) plus the air line, for its explicit H(B)', () => {
    // Frohlich (1881) / Kennelly (1891) rational law (FROM MEMORY), applied to the
    // polarisation J = B - mu0 H; a = 1/(mu0 (mu_ri - 1)), b = 1/J_s (derived conversion).
    // Evaluated forward here, independently of the law's quadratic-root inversion.
    const law = frohlichKennellyMaterial(spec);
    const a = 1 / (MU0 * (spec.initialRelativePermeability - 1));
    const b = 1 / spec.saturationPolarisation;
    for (const bb of [-50, -2.1, -1e-6, 1e-9, 0.01, 0.5, 1.2, 1.59, 1.6, 1.61, 2, 5, 100, 1e4]) {
      const h = law.fieldStrength(bb);
      const back = MU0 * h + h / (a + b * Math.abs(h));
      expect(Math.abs(back - bb) / Math.abs(bb)).toBeLessThan(1e-14);
    }
  });

  it('has the initial permeability mu0 mu_ri at B = 0 and slope 1/(dB/dH) from the defining equation elsewhere', () => {
    const law = frohlichKennellyMaterial(spec);
    expect(1 / (MU0 * law.fieldSlope(0))).toBeCloseTo(5000, 8);
    // dB/dH = mu0 + a / (a + b H)^2 (derivative of the defining equation, derived)
    const a = 1 / (MU0 * 4999);
    const b = 1 / 1.6;
    for (const bb of [0.3, 1.4, 1.7, 3]) {
      const h = law.fieldStrength(bb);
      const dbdh = MU0 + a / (a + b * h) ** 2;
      expect(law.fieldSlope(bb) * dbdh).toBeCloseTo(1, 13);
    }
  });

  it('reaches half the saturation polarisation at the knee field H_a = J_s / (mu0 (mu_ri - 1))', () => {
    const law = frohlichKennellyMaterial(spec);
    const ha = 1.6 / (MU0 * 4999);
    const bKnee = MU0 * ha + 0.8;
    expect(law.fieldStrength(bKnee) / ha).toBeCloseTo(1, 13);
  });

  it('keeps full relative accuracy of H and the energy density at tiny B (no cancellation)', () => {
    // Linear limit (derived): H -> B / (mu0 mu_ri), w -> B^2 / (2 mu0 mu_ri).
    const law = frohlichKennellyMaterial(spec);
    const b = 1e-12;
    const nu = 1 / (MU0 * 5000);
    expect(law.fieldStrength(b) / (nu * b)).toBeCloseTo(1, 10);
    expect(law.energyDensity(b) / (0.5 * nu * b * b)).toBeCloseTo(1, 10);
  });

  it('rejects mu_ri <= 1, a non-positive J_s and a bad saturation flux density, naming the material', () => {
    const cases: [Partial<FrohlichKennellySpec>, string][] = [
      [{ initialRelativePermeability: 1 }, 'bad-permeability'],
      [{ initialRelativePermeability: Number.NaN }, 'bad-permeability'],
      [{ saturationPolarisation: 0 }, 'bad-polarisation'],
      [{ saturationPolarisation: Number.POSITIVE_INFINITY }, 'bad-polarisation'],
      [{ saturationFluxDensity: -1 }, 'bad-saturation'],
    ];
    for (const [patch, code] of cases) {
      const call = (): unknown => frohlichKennellyMaterial({ ...spec, ...patch });
      expect(call).toThrow(InputError);
      expect(call).toThrow(/test iron/);
      try {
        call();
      } catch (e) {
        expect((e as InputError).code).toBe(code);
        expect((e as InputError).elements).toEqual(['test iron']);
      }
    }
  });
});
