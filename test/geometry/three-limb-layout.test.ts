import { describe, expect, it } from 'vitest';
import { InputError, MU0, mm, threeLimbLayout } from '../../src/index.js';
import { inductanceMatrix } from './linear-magnetic-network.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
const parallel = (x: number, y: number): number => (x * y) / (x + y);
// Textbook flux-tube reluctance R = l/(mu0 mu_r A) (e.g. Fitzgerald, Kingsley and Umans, ch. 1); mm, mm^2 in.
const tube = (lengthMm: number, areaMm2: number, mur: number): number => (lengthMm * 1e-3) / (MU0 * mur * areaMm2 * 1e-6);

// Invented three-phase core (mm): limbs 80 wide, yokes 60 high, depth 80, stacking 0.96, windows 90 x 250.
const dims = {
  limbWidth: mm(80),
  yokeHeight: mm(60),
  depth: mm(80),
  stackingFactor: 0.96,
  windowWidth: mm(90),
  windowHeight: mm(250),
  meanPath: 'centre-line' as const,
};

describe('threeLimbLayout', () => {
  const mur = 5000;
  const n = 200;
  // centre-line, by hand: limb h + b = 310 mm of 0.96 x 80 x 80 = 6144 mm^2;
  // yoke segment w + a = 170 mm of 0.96 x 60 x 80 = 4608 mm^2.
  const rl = tube(310, 6144, mur);
  const ry = tube(170, 4608, mur);

  it('has the hand-made network inductances of an outer and of the centre limb', () => {
    const layout = threeLimbLayout(dims);
    // winding on limb a: R = R_l + 2 R_y + R_l || (2 R_y + R_l)
    const la = inductanceMatrix(layout, mur, [{ path: 'leg-a', turns: n }])[0]?.[0] ?? 0;
    expect(rel(la, (n * n) / (rl + 2 * ry + parallel(rl, 2 * ry + rl)))).toBeLessThan(1e-12);
    // winding on limb b: R = R_l + (R_l + 2 R_y)/2
    const lb = inductanceMatrix(layout, mur, [{ path: 'leg-b', turns: n }])[0]?.[0] ?? 0;
    expect(rel(lb, (n * n) / (rl + (rl + 2 * ry) / 2))).toBeLessThan(1e-12);
    // symmetry: limbs a and c alike
    const lc = inductanceMatrix(layout, mur, [{ path: 'leg-c', turns: n }])[0]?.[0] ?? 0;
    expect(rel(lc, la)).toBeLessThan(1e-12);
    expect(layout.constants).toBeUndefined();
    expect(layout.windows.map((w) => `${w.name}:${w.legs.join('-')}`)).toEqual(['ab:a-b', 'bc:b-c']);
  });

  it('gives the sum of the three limb fluxes zero for balanced excitation (flux conservation at the yokes)', () => {
    // Kirchhoff's flux law at the yoke nodes (DERIVED): phi_a + phi_b + phi_c = 0 for any excitation.
    const layout = threeLimbLayout(dims);
    const m = inductanceMatrix(layout, mur, [
      { path: 'leg-a', turns: 1 },
      { path: 'leg-b', turns: 1 },
      { path: 'leg-c', turns: 1 },
    ]);
    for (const j of [0, 1, 2]) {
      const sum = (m[0]?.[j] ?? 0) + (m[1]?.[j] ?? 0) + (m[2]?.[j] ?? 0);
      expect(Math.abs(sum)).toBeLessThan(1e-12 * Math.abs(m[j]?.[j] ?? 1));
    }
  });

  it('models LV/HV windings on every limb, each with its leakage path', () => {
    const w = { innerBuild: mm(15), outerBuild: mm(20), spacing: mm(8), clearance: mm(2) }; // 45 mm per limb
    const layout = threeLimbLayout({ ...dims, windings: { a: w, b: w, c: w } });
    expect(layout.paths.filter((p) => p.kind === 'leakage').map((p) => p.name)).toEqual(['leakage-a', 'leakage-b', 'leakage-c']);
    expect(layout.legs.map((l) => l.outerWindingPath)).toEqual(['leg-a-head', 'leg-b-head', 'leg-c-head']);
    try {
      threeLimbLayout({ ...dims, windings: { a: w, b: { ...w, spacing: mm(9) } } });
      expect.unreachable();
    } catch (e) {
      expect((e as InputError).code).toBe('windings-exceed-window');
      expect((e as InputError).elements).toEqual(['windowWidth', 'windings.a', 'windings.b']);
    }
  });
});
