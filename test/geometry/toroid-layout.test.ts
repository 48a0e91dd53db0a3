import { describe, expect, it } from 'vitest';
import { InputError, MU0, mm, toroidConstants, toroidLayout } from '../../src/index.js';
import { inductanceMatrix } from './linear-magnetic-network.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
const ring = { innerRadius: mm(12), outerRadius: mm(20), height: mm(12) };

describe('toroidLayout', () => {
  it('gives L = mu0 mu_r N^2 h ln(r2/r1)/(2 pi) through its two halves', () => {
    // Air-toroid inductance (READ, REFERENCES.md 3) times mu_r for a linear core.
    const layout = toroidLayout(ring);
    expect(layout.paths.map((p) => `${p.name}:${p.from}->${p.to}`)).toEqual(['ring-1:n1->n2', 'ring-2:n2->n1']);
    const l = inductanceMatrix(layout, 3000, [{ path: 'ring-1', turns: 25 }])[0]?.[0] ?? 0;
    expect(rel(l, (MU0 * 3000 * 625 * mm(12) * Math.log(20 / 12)) / (2 * Math.PI))).toBeLessThan(1e-12);
    expect(layout.constants).toEqual(toroidConstants(ring));
  });

  it('gives a gapped ring the iron of thin rings 2 pi r - l_g long, integrated numerically, plus the gap', () => {
    // DERIVED: a slot of width l_g leaves iron 2 pi r - l_g long at radius r; thin rings in parallel.
    const lg = mm(1);
    const layout = toroidLayout({ ...ring, gap: { length: lg } });
    let s1 = 0, s2 = 0;
    const nr = 4000, dr = (ring.outerRadius - ring.innerRadius) / nr;
    for (let i = 0; i < nr; i++) {
      const l = 2 * Math.PI * (ring.innerRadius + (i + 0.5) * dr) - lg;
      s1 += (ring.height * dr) / l;
      s2 += (ring.height * dr) / (l * l);
    }
    const c1 = 1 / s1, c2 = s2 / s1 ** 3;
    const iron = layout.paths.filter((p) => p.kind === 'core');
    const c1Layout = iron.reduce((s, p) => s + (p.kind === 'core' ? p.length / p.area : 0), 0);
    const c2Layout = iron.reduce((s, p) => s + (p.kind === 'core' ? p.length / p.area ** 2 : 0), 0);
    expect(rel(c1Layout, c1)).toBeLessThan(1e-7); // measured 1.5e-9 (midpoint rule)
    expect(rel(c2Layout, c2)).toBeLessThan(1e-7); // measured 2e-10
    // inductance: N^2 / (R_iron + l_g/(mu0 (r2 - r1) h)), no fringing by default
    const mur = 3000;
    const l = inductanceMatrix(layout, mur, [{ path: 'ring-1', turns: 25 }])[0]?.[0] ?? 0;
    const rGap = lg / (MU0 * mm(8) * mm(12));
    expect(rel(l, 625 / (c1 / (MU0 * mur) + rGap))).toBeLessThan(1e-7);
  });

  it("applies Matsch's fringing on the (r2 - r1) x h face and refuses McLyman's, which needs a window height", () => {
    const layout = toroidLayout({ ...ring, gap: { length: mm(1), fringing: 'matsch' } });
    const gap = layout.paths.find((p) => p.name === 'gap');
    // By hand: (8 + 1)(12 + 1)/(8 x 12) = 117/96
    expect(gap?.kind === 'gap' && rel(gap.fringingFactor, 117 / 96) < 1e-14).toBe(true);
    expect(() => toroidLayout({ ...ring, gap: { length: mm(1), fringing: 'mclyman' as 'none' } })).toThrow(/window height/);
  });

  it('rejects a gap wider than the inner radius, naming both', () => {
    try {
      toroidLayout({ ...ring, gap: { length: mm(13) } });
      expect.unreachable();
    } catch (e) {
      expect((e as InputError).code).toBe('gap-longer-than-inner-radius');
      expect((e as InputError).elements).toEqual(['gap.length', 'innerRadius']);
    }
    expect(() => toroidLayout({ ...ring, gap: { length: 0 } })).toThrow(/gap\.length/);
  });
});
