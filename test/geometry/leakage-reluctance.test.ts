import { describe, expect, it } from 'vitest';
import { concentricLeakageReluctance, InputError, MU0, mm } from '../../src/index.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

/**
 * Leakage inductance by the energy of the ampere-turn diagram, integrated
 * numerically (DERIVED, independent of the closed form): balanced windings
 * N i, axial field H(x) rising linearly across the inner winding (a1),
 * flat across the spacing (d), falling across the outer winding (a2);
 * W = (mu0/2) integral(H^2 MLT h_w dx), L = 2 W / i^2.
 */
function energyLeakage(a1: number, d: number, a2: number, hw: number, mlt: number, turns: number, n = 30000): number {
  const i = 1;
  const hMax = (turns * i) / hw;
  const total = a1 + d + a2;
  const dx = total / n;
  let w = 0;
  for (let k = 0; k < n; k++) {
    const x = (k + 0.5) * dx;
    const h = x < a1 ? (hMax * x) / a1 : x < a1 + d ? hMax : (hMax * (total - x)) / a2;
    w += 0.5 * MU0 * h * h * mlt * hw * dx;
  }
  return (2 * w) / (i * i);
}

describe('concentricLeakageReluctance', () => {
  const geometry = { innerBuild: mm(3), outerBuild: mm(4.5), spacing: mm(1.2), height: mm(42), meanTurnLength: mm(115) };

  it('gives N^2/R equal to the classic L = mu0 N^2 MLT (a1/3 + a2/3 + d)/h_w', () => {
    // Textbook two-winding leakage inductance (e.g. Lee, Electronic Transformers and Circuits, sect. 4-8;
    // form FROM MEMORY, derived in docs/geometry.md). By hand: (3 + 4.5)/3 + 1.2 = 3.7 mm;
    // L/N^2 = mu0 * 0.115 * 3.7e-3 / 0.042 = 1.27309302e-8 H.
    const r = concentricLeakageReluctance(geometry);
    const turns = 64;
    const closed = (MU0 * turns ** 2 * 0.115 * 3.7e-3) / 0.042;
    expect(rel(turns ** 2 / r, closed)).toBeLessThan(1e-14);
    expect(rel(1 / r, 1.27309302e-8)).toBeLessThan(1e-8);
  });

  it('agrees with the energy of the ampere-turn diagram integrated numerically', () => {
    const r = concentricLeakageReluctance(geometry);
    const l = energyLeakage(mm(3), mm(1.2), mm(4.5), mm(42), mm(115), 10);
    expect(rel(100 / r, l)).toBeLessThan(1e-6);
  });

  it('does not depend on the turns (a reluctance per turn squared)', () => {
    const r = concentricLeakageReluctance(geometry);
    for (const n of [1, 7, 300]) expect(rel(n * n / r, energyLeakage(mm(3), mm(1.2), mm(4.5), mm(42), mm(115), n, 3000))).toBeLessThan(1e-5);
  });

  it('accepts zero spacing and rejects a non-positive build, naming it', () => {
    expect(concentricLeakageReluctance({ ...geometry, spacing: 0 })).toBeGreaterThan(0);
    try {
      concentricLeakageReluctance({ ...geometry, outerBuild: 0 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).elements).toEqual(['outerBuild']);
    }
    expect(() => concentricLeakageReluctance({ ...geometry, spacing: -1e-3 })).toThrow(/spacing/);
  });
});
