import { describe, expect, it } from 'vitest';
import { gapReluctance, InputError, matschFringingFactor, mclymanFringingFactor, MU0, mm, mm2 } from '../../src/index.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

function codeOf(f: () => unknown): { code: string; elements: readonly string[] } {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return { code: e.code, elements: e.elements };
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('gapReluctance', () => {
  it('gives R = l_g / (mu0 A_g) without fringing', () => {
    // Uniform-field gap (REFERENCES.md section 3). By hand: 1e-3 / (1.25663706212e-6 * 1e-4) = 7.957747150e6 A/Wb.
    const g = gapReluctance({ length: mm(1), area: mm2(100) });
    expect(g.fringingFactor).toBe(1);
    expect(rel(g.reluctance, 7.957747150e6)).toBeLessThan(1e-9);
    expect(rel(g.reluctance, mm(1) / (MU0 * mm2(100)))).toBeLessThan(1e-15);
  });

  it("divides the reluctance by McLyman's factor F = 1 + (l_g/sqrt(A_c)) ln(2G/l_g)", () => {
    // McLyman, Transformer and Inductor Design Handbook, inductor design chapter (READ as quoted, REFERENCES.md 3).
    // By hand: l_g = 1 mm, A_c = 100 mm^2 (sqrt = 10 mm), G = 20 mm: F = 1 + 0.1 ln 40 = 1.3688879454.
    const f = mclymanFringingFactor({ gapLength: mm(1), coreArea: mm2(100), windowHeight: mm(20) });
    expect(rel(f, 1.3688879454)).toBeLessThan(1e-10);
    const g = gapReluctance({ length: mm(1), area: mm2(100), fringing: { kind: 'mclyman', windowHeight: mm(20) } });
    expect(rel(g.fringingFactor, f)).toBeLessThan(1e-15);
    expect(rel(g.reluctance, 7.957747150e6 / 1.3688879454)).toBeLessThan(1e-9);
    expect(rel(g.effectiveArea, mm2(100) * f)).toBeLessThan(1e-15);
  });

  it("applies Matsch's rule F = (a + l_g)(b + l_g)/(a b)", () => {
    // Matsch, Capacitors, Magnetic Circuits, and Transformers, sect. 3-12 (READ). By hand: 11 * 21 / (10 * 20) = 1.155.
    expect(rel(matschFringingFactor({ gapLength: mm(1), width: mm(10), depth: mm(20) }), 1.155)).toBeLessThan(1e-14);
    const g = gapReluctance({ length: mm(1), area: mm2(200), fringing: { kind: 'matsch', width: mm(10), depth: mm(20) } });
    expect(rel(g.reluctance, mm(1) / (MU0 * mm2(231)))).toBeLessThan(1e-14);
  });

  it("turns fringing off with kind 'none' and takes an explicit factor >= 1", () => {
    expect(gapReluctance({ length: mm(1), area: mm2(100), fringing: { kind: 'none' } }).fringingFactor).toBe(1);
    expect(gapReluctance({ length: mm(1), area: mm2(100), fringing: { kind: 'factor', value: 1.25 } }).fringingFactor).toBe(1.25);
    expect(codeOf(() => gapReluctance({ length: mm(1), area: mm2(100), fringing: { kind: 'factor', value: 0.9 } })).code).toBe(
      'invalid-fringing-factor',
    );
  });

  it('rejects a non-positive gap, naming the gap length', () => {
    expect(codeOf(() => gapReluctance({ length: 0, area: mm2(100) }))).toEqual({ code: 'invalid-dimension', elements: ['gap length'] });
    expect(codeOf(() => gapReluctance({ length: mm(1), area: -1 }))).toEqual({ code: 'invalid-dimension', elements: ['gap area'] });
  });

  it('rejects gaps outside the short-gap range, naming the dimension they are compared with', () => {
    // limit: l_g <= 0.25 x sqrt(A_c), 0.25 x G (McLyman) and 0.25 x each side (Matsch): our limit.
    expect(codeOf(() => mclymanFringingFactor({ gapLength: mm(2.6), coreArea: mm2(100), windowHeight: mm(40) }))).toEqual({
      code: 'gap-too-long-for-fringing',
      elements: ['gap length', 'sqrt(core area)'],
    });
    expect(codeOf(() => mclymanFringingFactor({ gapLength: mm(2), coreArea: mm2(400), windowHeight: mm(6) }))).toEqual({
      code: 'gap-too-long-for-fringing',
      elements: ['gap length', 'window height'],
    });
    expect(codeOf(() => matschFringingFactor({ gapLength: mm(1.5), width: mm(5), depth: mm(20) })).elements).toEqual(['gap length', 'face width']);
    // the same gap without fringing is accepted
    expect(gapReluctance({ length: mm(2.6), area: mm2(100) }).fringingFactor).toBe(1);
    // at the limit it is accepted
    expect(mclymanFringingFactor({ gapLength: mm(2.5), coreArea: mm2(100), windowHeight: mm(40) })).toBeGreaterThan(1);
  });
});
