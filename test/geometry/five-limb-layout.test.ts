import { describe, expect, it } from 'vitest';
import { fiveLimbLayout, InputError, MU0, mm } from '../../src/index.js';
import { inductanceMatrix } from './linear-magnetic-network.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
const parallel = (x: number, y: number): number => (x * y) / (x + y);
// Textbook flux-tube reluctance R = l/(mu0 mu_r A) (e.g. Fitzgerald, Kingsley and Umans, ch. 1); mm, mm^2 in.
const tube = (lengthMm: number, areaMm2: number, mur: number): number => (lengthMm * 1e-3) / (MU0 * mur * areaMm2 * 1e-6);

// Invented five-limb core (mm): phase limbs 80, return limbs 45, yokes 45, depth 80, windows 90 (outer 60) x 250.
const dims = {
  limbWidth: mm(80),
  returnLimbWidth: mm(45),
  yokeHeight: mm(45),
  depth: mm(80),
  windowWidth: mm(90),
  returnWindowWidth: mm(60),
  windowHeight: mm(250),
  meanPath: 'centre-line' as const,
};

describe('fiveLimbLayout', () => {
  it('has the hand-made network inductance of the centre phase limb', () => {
    const mur = 5000, n = 150;
    // centre-line, by hand: phase limb 295 mm of 6400 mm^2; return limb 295 mm of 3600 mm^2;
    // yoke ab/bc 170 mm, outer yoke 60 + 22.5 + 40 = 122.5 mm, both 3600 mm^2.
    // Winding on b: R = R_b + side/2, side = 2 R_yab + R_a || (2 R_yl + R_ret).
    const rPhase = tube(295, 6400, mur), rRet = tube(295, 3600, mur);
    const side = 2 * tube(170, 3600, mur) + parallel(rPhase, 2 * tube(122.5, 3600, mur) + rRet);
    const layout = fiveLimbLayout(dims);
    const l = inductanceMatrix(layout, mur, [{ path: 'leg-b', turns: n }])[0]?.[0] ?? 0;
    expect(rel(l, (n * n) / (rPhase + side / 2))).toBeLessThan(1e-12);
    expect(layout.windingLegs).toEqual(['a', 'b', 'c']);
    expect(layout.windows.map((w) => w.width)).toEqual([mm(60), mm(90), mm(90), mm(60)]);
  });

  it('carries zero-sequence flux in the return limbs that a three-limb core lacks', () => {
    // Equal MMF on a, b, c (zero sequence): the phase-limb fluxes cannot close among themselves, so the
    // return limbs carry their sum (flux conservation at the yoke nodes, DERIVED).
    const layout = fiveLimbLayout(dims);
    const m = inductanceMatrix(layout, 5000, [
      { path: 'leg-a', turns: 1 },
      { path: 'leg-b', turns: 1 },
      { path: 'leg-c', turns: 1 },
      { path: 'leg-return-left', turns: 1 },
      { path: 'leg-return-right', turns: 1 },
    ]);
    const total = (i: number): number => (m[i]?.[0] ?? 0) + (m[i]?.[1] ?? 0) + (m[i]?.[2] ?? 0);
    expect(rel(-(total(3) + total(4)), total(0) + total(1) + total(2))).toBeLessThan(1e-12);
    expect(Math.abs(total(3))).toBeGreaterThan(0);
  });

  it('refuses windings on a return limb', () => {
    try {
      fiveLimbLayout({ ...dims, windings: { 'return-left': { innerBuild: mm(1), outerBuild: mm(1), spacing: 0 } } as never });
      expect.unreachable();
    } catch (e) {
      expect((e as InputError).code).toBe('unknown-leg');
      expect((e as InputError).elements).toEqual(['windings.return-left']);
    }
    expect(() => fiveLimbLayout({ ...dims, gaps: { 'return-left': { length: mm(1) } } })).not.toThrow();
  });
});
