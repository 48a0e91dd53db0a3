import { describe, expect, it } from 'vitest';
import { MU0, brauerAirLineJoin, compileMaterial, demoMaterials, type MaterialLaw, type MaterialSpec } from '../../src/index.js';

/**
 * Handbook ranges, FROM MEMORY (shared/REFERENCES.md section 6): MnZn ferrite initial mu_r
 * 1e3..1.5e4 and B_sat 0.35..0.5 T; grain-oriented silicon steel mu_r,max 3e4..8e4 and B_sat
 * about 2.0 T; iron-based amorphous mu_r 1e4..1e5 and B_sat about 1.56 T. "About" is read
 * here as within 5 %.
 */
const ranges = {
  ferrite: { mu: [1e3, 1.5e4], bsat: [0.35, 0.5] },
  grainOrientedSteel: { mu: [3e4, 8e4], bsat: [1.9, 2.1] },
  amorphous: { mu: [1e4, 1e5], bsat: [0.95 * 1.56, 1.05 * 1.56] },
} as const;

/** Largest secant relative permeability B / (mu0 H) on a fine grid up to 2.5 T. */
function maxSecantPermeability(law: MaterialLaw): number {
  let best = 0;
  for (let i = 1; i <= 5000; i++) {
    const b = (2.5 * i) / 5000;
    best = Math.max(best, b / (MU0 * law.fieldStrength(b)));
  }
  return best;
}

/** Polarisation B - mu0 H deep in saturation (B = 5 T), where every demo law has levelled off. */
const deepPolarisation = (law: MaterialLaw): number => 5 - MU0 * law.fieldStrength(5);

describe('demoMaterials', () => {
  it('ferrite: initial mu_r and saturation inside the MnZn ferrite ranges', () => {
    const law = compileMaterial(demoMaterials.ferrite);
    const muInitial = 1 / (MU0 * law.fieldSlope(0));
    expect(muInitial).toBeGreaterThanOrEqual(ranges.ferrite.mu[0]);
    expect(muInitial).toBeLessThanOrEqual(ranges.ferrite.mu[1]);
    for (const bsat of [law.saturationFluxDensity as number, deepPolarisation(law)]) {
      expect(bsat).toBeGreaterThanOrEqual(ranges.ferrite.bsat[0]);
      expect(bsat).toBeLessThanOrEqual(ranges.ferrite.bsat[1]);
    }
  });

  it('grain-oriented steel: mu_r,max and saturation inside the handbook ranges', () => {
    const law = compileMaterial(demoMaterials.grainOrientedSteel);
    const muMax = maxSecantPermeability(law);
    expect(muMax).toBeGreaterThanOrEqual(ranges.grainOrientedSteel.mu[0]);
    expect(muMax).toBeLessThanOrEqual(ranges.grainOrientedSteel.mu[1]);
    const join = brauerAirLineJoin(demoMaterials.grainOrientedSteel);
    for (const bsat of [law.saturationFluxDensity as number, deepPolarisation(law), join.polarisation]) {
      expect(bsat).toBeGreaterThanOrEqual(ranges.grainOrientedSteel.bsat[0]);
      expect(bsat).toBeLessThanOrEqual(ranges.grainOrientedSteel.bsat[1]);
    }
  });

  it('amorphous: mu_r and saturation inside the Fe-based amorphous ranges', () => {
    const law = compileMaterial(demoMaterials.amorphous);
    const muMax = maxSecantPermeability(law);
    expect(muMax).toBeGreaterThanOrEqual(ranges.amorphous.mu[0]);
    expect(muMax).toBeLessThanOrEqual(ranges.amorphous.mu[1]);
    for (const bsat of [law.saturationFluxDensity as number, deepPolarisation(law)]) {
      expect(bsat).toBeGreaterThanOrEqual(ranges.amorphous.bsat[0]);
      expect(bsat).toBeLessThanOrEqual(ranges.amorphous.bsat[1]);
    }
  });

  it('are frozen plain data that survive a JSON round trip unchanged', () => {
    for (const spec of Object.values(demoMaterials) as MaterialSpec[]) {
      expect(Object.isFrozen(spec)).toBe(true);
      const copy = JSON.parse(JSON.stringify(spec)) as MaterialSpec;
      expect(copy).toEqual(spec);
      const a = compileMaterial(spec);
      const b = compileMaterial(copy);
      for (const x of [0.05, 0.3, 1.2, 1.9, 3]) expect(b.fieldStrength(x)).toBe(a.fieldStrength(x));
    }
  });
});
