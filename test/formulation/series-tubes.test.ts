import { describe, expect, it } from 'vitest';
import { compileNetwork } from '../../src/formulation/compile-network.js';
import { constant, createNetwork, demoMaterials, MU0, type MaterialLaw } from '../../src/index.js';

// Tubes in series carry one flux; with one area and one law they have one flux density, so their MMF
// drops are l1 H(B) and l2 H(B) with one H(B): the series rule of magnetic circuits (e.g. Hayt and
// Buck, Engineering Electromagnetics, sect. 9.8; common practice). The compiler evaluates H once for
// such tubes; f and df/dy must be those of the law read tube by tube, bit for bit.

const law: MaterialLaw = {
  name: 'B/(mu0 2000) + 2 sinh(B/0.04) (invented)',
  fieldStrength: (b) => b / (MU0 * 2000) + 2 * Math.sinh(b / 0.04),
  fieldSlope: (b) => 1 / (MU0 * 2000) + (2 / 0.04) * Math.cosh(b / 0.04),
  energyDensity: (b) => (b * b) / (2 * MU0 * 2000) + 2 * 0.04 * (Math.cosh(b / 0.04) - 1),
};

function core(lengths: number[], material: MaterialLaw | typeof demoMaterials.grainOrientedSteel, areas?: number[]) {
  const net = createNetwork('series tubes');
  const nodes = lengths.map((_, k) => net.magneticNode(`m${k}`));
  const tubes = lengths.map((length, k) =>
    net.fluxTube(`t${k}`, { from: nodes[k]!, to: nodes[(k + 1) % nodes.length]!, length, area: areas?.[k] ?? 1e-4, material }),
  );
  const d = net.node('drive');
  net.voltageSource('drive', d, net.ground, constant(12));
  net.winding('coil', { tube: tubes[0]!, turns: 20, resistance: 0.5, plus: d, minus: net.ground });
  return compileNetwork(net.describe());
}

function fAndJ(c: ReturnType<typeof compileNetwork>, flux: number) {
  const n = c.layout.size;
  const y = new Float64Array(n);
  y[c.layout.loopOffset] = flux;
  y[c.layout.branchCurrent[1]!] = 0.3; // the winding's current
  const f = new Float64Array(n);
  c.rhs(0, y, f);
  const J = new Float64Array(n * n);
  c.jacobian(0, y, J);
  return { f, J };
}

describe('tubes in series with one law', () => {
  for (const [name, material] of [['a law object', law], ['a material spec', demoMaterials.grainOrientedSteel]] as const) {
    it(`give the loop the drops l1 H(B) + l2 H(B) and slopes (l1 + l2) H'(B) / A of one H(B) (${name})`, () => {
      const c = core([0.025, 0.035], material);
      const h = c.tubes[0]!.law!;
      const loop = c.layout.loopOffset;
      const n = c.layout.size;
      const zero = fAndJ(c, 0).f[loop]!; // the winding's MMF alone
      // Deep in saturation too (B = 0.9 T for the invented law is far up its sinh).
      for (const flux of [3e-6, -4e-5, 9e-5]) {
        const { f, J } = fAndJ(c, flux);
        // Tube by tube, in tube order, as the loop row sums them (0 - F1 - F2 + N i).
        const f1 = 0.025 * h.fieldStrength(flux / 1e-4);
        const f2 = 0.035 * h.fieldStrength(flux / 1e-4);
        expect(f[loop]).toBe(0 - f1 - f2 + zero);
        const s1 = (0.025 / 1e-4) * h.fieldSlope(flux / 1e-4);
        const s2 = (0.035 / 1e-4) * h.fieldSlope(flux / 1e-4);
        expect(J[loop * n + loop]).toBe(0 - s1 - s2);
      }
    });
  }

  it('keep tubes of different areas apart (their flux densities differ)', () => {
    const c = core([0.025, 0.025], law, [1e-4, 2e-4]);
    const loop = c.layout.loopOffset;
    const zero = fAndJ(c, 0).f[loop]!;
    const { f } = fAndJ(c, 5e-5);
    expect(f[loop]).toBe(0 - 0.025 * law.fieldStrength(5e-5 / 1e-4) - 0.025 * law.fieldStrength(5e-5 / 2e-4) + zero);
  });
});
