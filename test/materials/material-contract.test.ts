import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  MU0,
  bhTableMaterial,
  brauerAirLineJoin,
  brauerMaterial,
  compileMaterial,
  demoMaterials,
  frohlichKennellyMaterial,
  type MaterialLaw,
} from '../../src/index.js';
import { integrate } from '../helpers/quadrature.js';

/**
 * The contract of every nonlinear material law (src/materials/material-law.ts):
 * defined for every real B, odd, strictly increasing, slope continuous and
 * strictly positive, slope tending to 1/mu0 far beyond saturation, and an
 * energy density equal to the integral of H (checked against independent
 * adaptive quadrature) whose derivative is H.
 *
 * Oracles: adaptive 5-point Gauss-Legendre quadrature (nodes and weights from
 * Abramowitz and Stegun, Table 25.4; test/helpers/quadrature.ts) and
 * Richardson-extrapolated central differences (common practice); fast-check
 * for the monotonicity property.
 */
interface Case {
  readonly law: MaterialLaw;
  /** Flux densities where the law's pieces meet (0 always). */
  readonly joints: readonly number[];
  /** A flux density around saturation, T. */
  readonly bsat: number;
}

const fkSpec = { kind: 'frohlich-kennelly', initialRelativePermeability: 5000, saturationPolarisation: 1.6 } as const;
const fk = frohlichKennellyMaterial(fkSpec);
const sampledB = [0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.6, 1.7];
const softBrauer = { kind: 'brauer', k1: 0.5, k2: 2, k3: 100 } as const;
const goJoin = brauerAirLineJoin(demoMaterials.grainOrientedSteel).fluxDensity;
const amorphousB = demoMaterials.amorphous.fluxDensity;

const cases: Record<string, Case> = {
  'Frohlich-Kennelly mu_ri 5000, J_s 1.6 T': { law: fk, joints: [0], bsat: 1.6 },
  'Brauer k1 0.5, k2 2, k3 100': {
    law: brauerMaterial(softBrauer),
    joints: [0, brauerAirLineJoin(softBrauer).fluxDensity],
    bsat: brauerAirLineJoin(softBrauer).fluxDensity,
  },
  'table sampled from Frohlich-Kennelly, origin added': {
    law: bhTableMaterial({ kind: 'table', fluxDensity: sampledB, fieldStrength: sampledB.map((b) => fk.fieldStrength(b)) }),
    joints: [0, ...sampledB],
    bsat: 1.7,
  },
  'table with an explicit origin row': {
    law: bhTableMaterial({ kind: 'table', fluxDensity: [0, 0.8, 1.2, 1.5], fieldStrength: [0, 60, 200, 2500] }),
    joints: [0, 0.8, 1.2, 1.5],
    bsat: 1.5,
  },
  'demo ferrite': { law: compileMaterial(demoMaterials.ferrite), joints: [0], bsat: 0.47 },
  'demo grain-oriented steel': { law: compileMaterial(demoMaterials.grainOrientedSteel), joints: [0, goJoin], bsat: 2 },
  'demo amorphous': { law: compileMaterial(demoMaterials.amorphous), joints: [0, ...amorphousB], bsat: 1.56 },
};

/** Flux densities from 1e-12 T to 1e6 T, and a dense linear grid to 3 B_sat. */
function grid(bsat: number): number[] {
  const out: number[] = [];
  for (let e = -12; e <= 6; e += 0.25) out.push(10 ** e);
  for (let i = 1; i <= 600; i++) out.push((3 * bsat * i) / 600);
  return out;
}

/** dH/dB by Richardson-extrapolated central differences (test oracle). */
function numericSlope(f: (b: number) => number, b: number, h: number): number {
  const d1 = (f(b + h) - f(b - h)) / (2 * h);
  const d2 = (f(b + h / 2) - f(b - h / 2)) / h;
  return (4 * d2 - d1) / 3;
}

describe.each(Object.entries(cases))('material law contract: %s', (_title, c) => {
  const { law, joints, bsat } = c;

  it('fieldStrength, fieldSlope and energyDensity are finite for |B| up to 1e100 T, with H(0) = 0', () => {
    expect(law.fieldStrength(0)).toBe(0);
    expect(law.energyDensity(0)).toBe(0);
    for (const b of [...grid(bsat), 1e20, 1e100]) {
      for (const s of [b, -b]) {
        expect(Number.isFinite(law.fieldStrength(s))).toBe(true);
        expect(Number.isFinite(law.fieldSlope(s))).toBe(true);
        expect(Number.isFinite(law.energyDensity(s))).toBe(true);
      }
    }
  });

  it('is odd: H(-B) = -H(B), with an even slope and energy density', () => {
    for (const b of grid(bsat)) {
      expect(law.fieldStrength(-b)).toBe(-law.fieldStrength(b));
      expect(law.fieldSlope(-b)).toBe(law.fieldSlope(b));
      expect(law.energyDensity(-b)).toBe(law.energyDensity(b));
    }
  });

  it('is strictly increasing with a strictly positive slope (property test)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -5 * bsat, max: 5 * bsat, noNaN: true }),
        fc.double({ min: 1e-6, max: 2 * bsat, noNaN: true }),
        (b, gap) => {
          expect(law.fieldStrength(b + gap)).toBeGreaterThan(law.fieldStrength(b));
          expect(law.fieldSlope(b)).toBeGreaterThan(0);
        },
      ),
      { numRuns: 2000 },
    );
    const g = [...new Set(grid(bsat))].sort((p, q) => p - q);
    for (let i = 1; i < g.length; i++) {
      expect(law.fieldStrength(g[i] as number)).toBeGreaterThan(law.fieldStrength(g[i - 1] as number));
      expect(law.fieldSlope(g[i] as number)).toBeGreaterThan(0);
    }
  });

  it('fieldSlope is dH/dB (Richardson central differences, away from joints)', () => {
    for (let i = 1; i <= 300; i++) {
      const b = (2.5 * bsat * i) / 300 + 1e-3 * bsat * Math.SQRT1_2;
      const h = 1e-5 * bsat;
      if (joints.some((j) => Math.abs(b - j) < 2 * h)) continue;
      const fd = numericSlope(law.fieldStrength, b, h);
      expect(Math.abs(fd - law.fieldSlope(b)) / law.fieldSlope(b)).toBeLessThan(1e-6);
    }
  });

  it('has a continuous slope (C1) across every joint, 0 included', () => {
    for (const j of joints) {
      const eps = 1e-10 * Math.max(1, Math.abs(j));
      const left = law.fieldSlope(j - eps);
      const right = law.fieldSlope(j + eps);
      expect(Math.abs(left - right) / Math.max(left, right)).toBeLessThan(1e-6);
      const hl = law.fieldStrength(j - eps);
      const hr = law.fieldStrength(j + eps);
      expect(hr).toBeGreaterThan(hl);
    }
  });

  it('tends to the air line: mu0 dH/dB -> 1 and B - mu0 H levels off far beyond saturation', () => {
    const dev = [10, 100, 1000, 1e4].map((b) => Math.abs(MU0 * law.fieldSlope(b) - 1));
    for (let i = 1; i < dev.length; i++) expect(dev[i]).toBeLessThanOrEqual(dev[i - 1] as number);
    expect(dev[1]).toBeLessThan(1e-4);
    expect(dev[3]).toBeLessThan(1e-8);
    const j = (b: number): number => b - MU0 * law.fieldStrength(b);
    expect(Math.abs(j(1e4) - j(1e3))).toBeLessThan(1e-3 * bsat);
  });

  it('energyDensity equals the integral of H from 0 (adaptive Gauss-Legendre quadrature) to 1e-12', () => {
    const points = [0.01, 0.3, 0.7, 1, 1.2, 1.5, 2, 3, 10].map((x) => x * bsat);
    for (const b of points) {
      const q = integrate(law.fieldStrength, 0, b, joints);
      const w = law.energyDensity(b);
      expect(Math.abs(w - q) / q).toBeLessThan(1e-12);
    }
  });

  it('d energyDensity / dB = H (Richardson central differences)', () => {
    for (const x of [0.05, 0.4, 0.83, 1.13, 1.77, 2.9]) {
      const b = x * bsat;
      const h = 1e-5 * bsat;
      if (joints.some((jt) => Math.abs(b - jt) < 2 * h)) continue;
      const fd = numericSlope(law.energyDensity, b, h);
      expect(Math.abs(fd - law.fieldStrength(b)) / law.fieldStrength(b)).toBeLessThan(1e-6);
    }
  });
});
