import { describe, expect, it } from 'vitest';
import { InputError, MU0, mm, uCoreLayout, type CoreLayout, type LayoutPath } from '../../src/index.js';
import { inductanceMatrix } from './linear-magnetic-network.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
const path = (l: CoreLayout, name: string): LayoutPath => {
  const p = l.paths.find((x) => x.name === name);
  if (p === undefined) throw new Error(`no path ${name}`);
  return p;
};
const codeOf = (f: () => unknown): InputError => {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError');
};

// Invented dimensions (mm): leg 12 wide, yoke 9 high, depth 15, window 14 x 30.
const dims = { legWidth: mm(12), yokeHeight: mm(9), depth: mm(15), windowWidth: mm(14), windowHeight: mm(30) };

describe('uCoreLayout', () => {
  it("takes legs between yoke centre-lines and yokes between leg centre-lines with meanPath 'centre-line'", () => {
    // Common practice (sharp-corner centre-line loop): leg h + b = 39 mm, yoke w + a = 26 mm.
    const l = uCoreLayout({ ...dims, meanPath: 'centre-line' });
    const leg = path(l, 'leg-left');
    const yoke = path(l, 'yoke-top');
    expect(leg.kind === 'core' && rel(leg.length, mm(39)) < 1e-14 && rel(leg.area, mm(12) * mm(15)) < 1e-14).toBe(true);
    expect(yoke.kind === 'core' && rel(yoke.length, mm(26)) < 1e-14 && rel(yoke.area, mm(9) * mm(15)) < 1e-14).toBe(true);
    expect(l.nodes).toEqual(['top-left', 'top-right', 'bottom-left', 'bottom-right']);
    expect(l.paths.map((p) => `${p.name}:${p.from}->${p.to}`)).toEqual([
      'leg-left:bottom-left->top-left',
      'leg-right:bottom-right->top-right',
      'yoke-top:top-left->top-right',
      'yoke-bottom:bottom-left->bottom-right',
    ]);
  });

  it('gives the IEC 60205 constants of the loop with mean-circular-path corners, worked by hand', () => {
    // IEC 60205 corner rule (READ as quoted, REFERENCES.md 3): mean circular path joining the centres of area,
    // radius (p + q)/2 with p = a/2 = 6 mm, q = b/2 = 4.5 mm: l_k = pi (p + q)/4 = 8.24668 mm;
    // area (180 + 135)/2 = 157.5 mm^2. Straights: 2 x 30 mm of 180 mm^2, 2 x 14 mm of 135 mm^2.
    const lk = (Math.PI * 10.5) / 4;
    const c1 = 60 / 180 + 28 / 135 + (4 * lk) / 157.5; // mm^-1
    const c2 = 60 / 180 ** 2 + 28 / 135 ** 2 + (4 * lk) / 157.5 ** 2; // mm^-3
    const k = uCoreLayout(dims).constants;
    expect(k).toBeDefined();
    expect(rel(k?.c1 ?? 0, c1 * 1e3)).toBeLessThan(1e-13);
    expect(rel(k?.c2 ?? 0, c2 * 1e9)).toBeLessThan(1e-13);
    expect(rel(k?.effectiveLength ?? 0, ((c1 * c1) / c2) * 1e-3)).toBeLessThan(1e-13);
    // and each path keeps its sections' C1 (its linear reluctance)
    const leg = path(uCoreLayout(dims), 'leg-left');
    if (leg.kind !== 'core') throw new Error('leg is not core');
    expect(rel(leg.length / leg.area, (30 / 180 + lk / 157.5) * 1e3)).toBeLessThan(1e-13);
  });

  it("matches McLyman's L = mu0 N^2 A_c F/(l_g + l_core/mu_r) through its gap and core paths", () => {
    // McLyman, Transformer and Inductor Design Handbook, inductor design chapter (READ as quoted,
    // REFERENCES.md 3). Uniform section (a = b = 10 mm, depth 10 mm: A_c = 100 mm^2) so the formula applies.
    const u = { legWidth: mm(10), yokeHeight: mm(10), depth: mm(10), windowWidth: mm(10), windowHeight: mm(30) };
    const mur = 2000, n = 50, lg = mm(0.5), ac = mm(10) * mm(10);
    const off = uCoreLayout({ ...u, gaps: { left: { length: lg, fringing: 'none' } } });
    const ironLength = off.paths.reduce((s, p) => s + (p.kind === 'core' ? p.length : 0), 0);
    const lOff = inductanceMatrix(off, mur, [{ path: 'leg-left', turns: n }])[0]?.[0] ?? 0;
    // F = 1: the layout's series loop is exactly the formula
    expect(rel(lOff, (MU0 * n * n * ac) / (lg + ironLength / mur))).toBeLessThan(1e-12);

    // With fringing: by hand F = 1 + (0.5/10) ln(2 x 30/0.5) = 1 + 0.05 ln 120 = 1.23937459.
    const on = uCoreLayout({ ...u, gaps: { left: { length: lg } } });
    const gap = path(on, 'gap-left');
    expect(gap.kind === 'gap' && rel(gap.fringingFactor, 1.23937459) < 1e-8).toBe(true);
    const f = gap.kind === 'gap' ? gap.fringingFactor : 1;
    const lOn = inductanceMatrix(on, mur, [{ path: 'leg-left', turns: n }])[0]?.[0] ?? 0;
    const mclyman = (MU0 * n * n * ac * f) / (lg + ironLength / mur);
    // The network applies F to the gap only: L = mu0 N^2 A_c F/(l_g + F l_core/mu_r) (DERIVED); McLyman applies
    // F to the whole; they differ by less than (F - 1) l_core/(mu_r l_g). Measured: 2.33 % (bound 2.66 %,
    // l_core = 110.9 mm); the two agree as l_core/mu_r << l_g.
    expect(rel(lOn, (MU0 * n * n * ac * f) / (lg + (f * ironLength) / mur))).toBeLessThan(1e-12);
    expect(rel(lOn, mclyman)).toBeLessThan(((f - 1) * ironLength) / (mur * lg));
    expect(rel(lOn, mclyman)).toBeGreaterThan(0);
  });

  it('rejects gaps not shorter than the leg and bad dimensions, naming them', () => {
    const e = codeOf(() => uCoreLayout({ ...dims, gaps: { right: { length: mm(30), fringing: 'none' } } }));
    expect(e.code).toBe('gap-longer-than-leg');
    expect(e.elements).toEqual(['gaps.right.length', 'windowHeight']);
    expect(codeOf(() => uCoreLayout({ ...dims, depth: -1 })).elements).toEqual(['depth']);
    expect(codeOf(() => uCoreLayout({ ...dims, windowWidth: Number.NaN })).code).toBe('invalid-dimension');
    expect(codeOf(() => uCoreLayout({ ...dims, gaps: { left: { length: mm(4) } } })).code).toBe('gap-too-long-for-fringing');
    expect(codeOf(() => uCoreLayout({ ...dims, meanPath: 'round' as 'iec-60205' })).code).toBe('invalid-option');
    expect(codeOf(() => uCoreLayout({ ...dims, gaps: { middle: { length: mm(1) } } as never })).code).toBe('unknown-leg');
  });

  it('rejects windings that do not fit the window, naming the window and the legs', () => {
    // both legs wound: 2 x (1 + 2 + 1 + 3) = 14 mm fits a 14 mm window; 2 x 7.5 = 15 mm does not
    const w = { innerBuild: mm(2), outerBuild: mm(3), spacing: mm(1), clearance: mm(1) };
    expect(() => uCoreLayout({ ...dims, windings: { left: w, right: w } })).not.toThrow();
    const e = codeOf(() => uCoreLayout({ ...dims, windings: { left: w, right: { ...w, clearance: mm(2) } } }));
    expect(e.code).toBe('windings-exceed-window');
    expect(e.elements).toEqual(['windowWidth', 'windings.left', 'windings.right']);
    expect(codeOf(() => uCoreLayout({ ...dims, windings: { left: { ...w, height: mm(31) } } })).code).toBe('winding-taller-than-window');
  });
});
