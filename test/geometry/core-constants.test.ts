import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { coreConstants, InputError, mm, mm2, type CoreSection } from '../../src/index.js';

// Method of core constants: IEC 60205, definitions IEC 60050-221, IEV 221-04-31
// (READ, see REFERENCES.md section 3): C1 = sum(l/A), C2 = sum(l/A^2),
// Ae = C1/C2, le = C1^2/C2, Ve = C1^3/C2^2.

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe('coreConstants', () => {
  it('gives the IEC 60205 values of a two-section path worked by hand', () => {
    // By hand, in mm: sections (10 mm, 10 mm^2) and (20 mm, 20 mm^2).
    // C1 = 10/10 + 20/20 = 2 mm^-1; C2 = 10/100 + 20/400 = 0.15 mm^-3;
    // Ae = 2/0.15 = 13.333... mm^2; le = 4/0.15 = 26.666... mm; Ve = 8/0.0225 = 355.555... mm^3.
    const k = coreConstants([
      { length: mm(10), area: mm2(10) },
      { length: mm(20), area: mm2(20) },
    ]);
    expect(rel(k.c1, 2e3)).toBeLessThan(1e-14); // 2 mm^-1 = 2000 m^-1
    expect(rel(k.c2, 0.15e9)).toBeLessThan(1e-14); // mm^-3 -> m^-3: x 1e9
    expect(rel(k.effectiveArea, 40 / 3 * 1e-6)).toBeLessThan(1e-14);
    expect(rel(k.effectiveLength, 80 / 3 * 1e-3)).toBeLessThan(1e-14);
    expect(rel(k.effectiveVolume, 3200 / 9 * 1e-9)).toBeLessThan(1e-14);
  });

  it('returns the geometric length and area for a uniform core', () => {
    // Definition (IEV 221-04-31): the effective core of a uniform core is the core itself.
    const k = coreConstants([{ length: 0.123, area: 4.5e-5 }]);
    expect(rel(k.effectiveLength, 0.123)).toBeLessThan(1e-15);
    expect(rel(k.effectiveArea, 4.5e-5)).toBeLessThan(1e-15);
  });

  it("rounds like IEC 60205's tables with rounding: 'iec-60205' (C1, C2 to 5 figures in mm; results to 3)", () => {
    // By hand, in mm: (7 mm, 3 mm^2) and (11 mm, 13 mm^2):
    // C1 = 7/3 + 11/13 = 3.179487... -> 3.1795 mm^-1; C2 = 7/9 + 11/169 = 0.8428665... -> 0.84287 mm^-3;
    // from the rounded constants Ae = 3.77223 -> 3.77 mm^2, le = 11.9938 -> 12.0 mm, Ve = 45.2434 -> 45.2 mm^3.
    const k = coreConstants(
      [
        { length: mm(7), area: mm2(3) },
        { length: mm(11), area: mm2(13) },
      ],
      { rounding: 'iec-60205' },
    );
    expect(rel(k.c1, 3.1795e3)).toBeLessThan(1e-12);
    expect(rel(k.c2, 0.84287e9)).toBeLessThan(1e-12);
    expect(rel(k.effectiveArea, 3.77e-6)).toBeLessThan(1e-12);
    expect(rel(k.effectiveLength, 12.0e-3)).toBeLessThan(1e-12);
    expect(rel(k.effectiveVolume, 45.2e-9)).toBeLessThan(1e-12);
  });

  const section = fc.record({
    length: fc.double({ min: 1e-4, max: 1, noNaN: true }),
    area: fc.double({ min: 1e-7, max: 1e-2, noNaN: true }),
  });
  const sections = fc.array(section, { minLength: 1, maxLength: 12 });

  it('keeps Ve = le Ae (property, from the definitions)', () => {
    fc.assert(
      fc.property(sections, (s) => {
        const k = coreConstants(s);
        expect(rel(k.effectiveVolume, k.effectiveLength * k.effectiveArea)).toBeLessThan(1e-13);
        expect(rel(k.effectiveVolume, k.c1 ** 3 / k.c2 ** 2)).toBeLessThan(1e-13);
      }),
    );
  });

  it('keeps C1 and C2 when a section is split into pieces (property: both are sums over length)', () => {
    fc.assert(
      fc.property(sections, fc.integer({ min: 0, max: 11 }), fc.array(fc.double({ min: 0.01, max: 1, noNaN: true }), { minLength: 2, maxLength: 6 }), (s, pick, weights) => {
        const i = pick % s.length;
        const target = s[i] as CoreSection;
        const total = weights.reduce((a, b) => a + b, 0);
        const pieces = weights.map((w) => ({ length: (target.length * w) / total, area: target.area }));
        const split = [...s.slice(0, i), ...pieces, ...s.slice(i + 1)];
        const a = coreConstants(s);
        const b = coreConstants(split);
        expect(rel(b.c1, a.c1)).toBeLessThan(1e-12);
        expect(rel(b.c2, a.c2)).toBeLessThan(1e-12);
      }),
    );
  });

  it('scales Ae with the areas and leaves le unchanged (property)', () => {
    fc.assert(
      fc.property(sections, fc.double({ min: 0.1, max: 10, noNaN: true }), (s, factor) => {
        const a = coreConstants(s);
        const b = coreConstants(s.map((x) => ({ length: x.length, area: x.area * factor })));
        expect(rel(b.effectiveArea, a.effectiveArea * factor)).toBeLessThan(1e-12);
        expect(rel(b.effectiveLength, a.effectiveLength)).toBeLessThan(1e-12);
      }),
    );
  });

  it('rejects an empty list and a bad section, naming the section', () => {
    expect(() => coreConstants([])).toThrow(InputError);
    try {
      coreConstants([{ length: 0.01, area: 1e-4 }, { length: 0.01, area: -1e-4, label: 'corner' }]);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).code).toBe('invalid-section');
      expect((e as InputError).elements).toEqual(['corner']);
      expect((e as InputError).message).toMatch(/area/);
    }
    expect(() => coreConstants([{ length: Number.NaN, area: 1 }])).toThrow(/section 0/);
  });
});
