import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { InputError, MU0, mm, toroidConstants } from '../../src/index.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

/**
 * C1 and C2 of a ring by brute force (DERIVED method, independent of the
 * closed forms): n thin concentric rings of radius r_i (midpoint rule), each of
 * length l_i = 2 pi r_i and section dA = h dr, all in parallel between the same
 * two magnetic potentials. Parallel permeances add: C1 = 1 / sum(dA/l).
 * With the same MMF F on each ring, B_i = mu F / l_i, and the IEC C2 is the
 * constant with integral(B^3 dV) = phi^3 C2: C2 = sum(dA/l^2) / (sum(dA/l))^3.
 */
function thinRings(r1: number, r2: number, h: number, n: number): { c1: number; c2: number } {
  let s1 = 0;
  let s2 = 0;
  const dr = (r2 - r1) / n;
  for (let i = 0; i < n; i++) {
    const l = 2 * Math.PI * (r1 + (i + 0.5) * dr);
    s1 += (h * dr) / l;
    s2 += (h * dr) / (l * l);
  }
  return { c1: 1 / s1, c2: s2 / s1 ** 3 };
}

describe('toroidConstants', () => {
  it('gives le = 87.1034436 mm, Ae = 96.0906028 mm^2, Ve = 8369.8224 mm^3 for r1 = 10, r2 = 20, h = 10 mm', () => {
    // REFERENCES.md section 3, DERIVED check values of the ring-core closed forms.
    const k = toroidConstants({ innerRadius: mm(10), outerRadius: mm(20), height: mm(10) });
    expect(rel(k.effectiveLength, 87.1034436e-3)).toBeLessThan(1e-9);
    expect(rel(k.effectiveArea, 96.0906028e-6)).toBeLessThan(1e-9);
    expect(rel(k.effectiveVolume, 8369.8224e-9)).toBeLessThan(1e-9);
  });

  it('agrees with thin concentric rings integrated numerically (DERIVED), for random rings', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 0.2, noNaN: true }),
        fc.double({ min: 1.01, max: 5, noNaN: true }),
        fc.double({ min: 1e-3, max: 0.1, noNaN: true }),
        (r1, ratio, h) => {
          const r2 = r1 * ratio;
          const k = toroidConstants({ innerRadius: r1, outerRadius: r2, height: h });
          const num = thinRings(r1, r2, h, 4000);
          // midpoint rule, error O(n^-2): measured at most 2.9e-8 over 300 random rings with r2/r1 <= 5
          expect(rel(k.c1, num.c1)).toBeLessThan(1e-7);
          expect(rel(k.c2, num.c2)).toBeLessThan(1e-7);
        },
      ),
      { numRuns: 30 },
    );
  });

  it('has C1 consistent with the air-toroid inductance mu0 N^2 h ln(r2/r1) / (2 pi)', () => {
    // READ (REFERENCES.md section 3): L = mu0 N^2 h ln(r2/r1)/(2 pi); a linear core gives L = mu0 N^2 / C1.
    const r1 = mm(12.5), r2 = mm(19), h = mm(7), n = 40;
    const k = toroidConstants({ innerRadius: r1, outerRadius: r2, height: h });
    expect(rel((MU0 * n * n) / k.c1, (MU0 * n * n * h * Math.log(r2 / r1)) / (2 * Math.PI))).toBeLessThan(1e-14);
  });

  it('scales every area by the stacking factor', () => {
    const full = toroidConstants({ innerRadius: mm(30), outerRadius: mm(50), height: mm(25) });
    const k = toroidConstants({ innerRadius: mm(30), outerRadius: mm(50), height: mm(25), stackingFactor: 0.8 });
    expect(rel(k.effectiveArea, 0.8 * full.effectiveArea)).toBeLessThan(1e-14);
    expect(rel(k.effectiveLength, full.effectiveLength)).toBeLessThan(1e-14);
  });

  it('rejects r2 <= r1 and non-positive dimensions, naming them', () => {
    try {
      toroidConstants({ innerRadius: mm(20), outerRadius: mm(10), height: mm(5) });
      expect.unreachable();
    } catch (e) {
      expect((e as InputError).code).toBe('radii-out-of-order');
      expect((e as InputError).elements).toEqual(['innerRadius', 'outerRadius']);
    }
    expect(() => toroidConstants({ innerRadius: mm(10), outerRadius: mm(20), height: 0 })).toThrow(/height/);
    expect(() => toroidConstants({ innerRadius: mm(10), outerRadius: mm(20), height: mm(5), stackingFactor: 1.2 })).toThrow(InputError);
  });
});
