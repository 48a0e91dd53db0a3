/**
 * massRowCompression finds the rows of a mass matrix that are combinations
 * of other rows (hidden algebraic equations) and the solver recombines them.
 * Checked against hand elimination (derived) and against the closed form of a
 * small DAE with two proportional mass rows (derived in the comment).
 */
import { describe, expect, it } from 'vitest';
import { solveDae } from '../../src/index.js';
import {
  compressedJacobian,
  compressedMass,
  compressedRhs,
  compressedSparseMass,
  massRowCompression,
} from '../../src/solver/mass-row-compression.js';
import { sparseMassOfDense } from '../../src/solver/sparse-mass.js';

describe('massRowCompression', () => {
  it('finds nothing in a mass matrix whose non-zero rows are independent (the usual case)', () => {
    expect(massRowCompression(Float64Array.of(1, 0, 0, 0, 0, 0, 0, 0, 2), 3)).toBeUndefined();
    expect(massRowCompression(Float64Array.of(1, 2, 3, 4), 2)).toBeUndefined();
  });

  it('finds dependent rows block by block when the blocks of M interleave, from dense or compressed rows alike', () => {
    // Rows 0 and 2 share column 0 (row 2 = 2 row 0), rows 1 and 3 columns 1 and 2 (row 3 = 3 row 1),
    // row 4 is alone (derived by hand).
    // 5 x 5, column 4 all zero.
    const full = Float64Array.of(
      2, 0, 0, 0, 0,
      0, 1, 1, 0, 0,
      4, 0, 0, 0, 0,
      0, 3, 3, 0, 0,
      0, 0, 0, 5, 0,
    );
    for (const input of [full, sparseMassOfDense(full, 5)]) {
      const c = massRowCompression(input, 5)!;
      expect(c.dependent.map((d) => d.row)).toEqual([2, 3]);
      expect(Array.from(c.dependent[0]!.rows)).toEqual([0]);
      expect(c.dependent[0]!.coefficients[0]).toBe(2);
      expect(Array.from(c.dependent[1]!.rows)).toEqual([1]);
      expect(c.dependent[1]!.coefficients[0]).toBe(3);
    }
    const cm = compressedSparseMass(sparseMassOfDense(full, 5), massRowCompression(full, 5)!);
    expect(Array.from(cm.rowStart)).toEqual([0, 1, 3, 3, 3, 4]);
    expect(Array.from(cm.value)).toEqual([2, 1, 1, 5]);
  });

  it('turns the second of two proportional rows into row 2 - (row 2 / row 1) row 1', () => {
    // Two windings on one flux path: N1 = 200 and N2 = -202 on the same two loop fluxes.
    const c = massRowCompression(Float64Array.of(200, 200, -202, -202), 2)!;
    expect(c.dependent).toHaveLength(1);
    expect(c.dependent[0]!.row).toBe(1);
    expect(Array.from(c.dependent[0]!.rows)).toEqual([0]);
    expect(c.dependent[0]!.coefficients[0]).toBeCloseTo(-1.01, 14);
    expect(Array.from(compressedMass(Float64Array.of(200, 200, -202, -202), 2, c))).toEqual([200, 200, 0, 0]);
  });

  it('expresses a row that combines two others in those rows (row 3 = row 1 + 2 row 2)', () => {
    const m = Float64Array.of(1, 0, 0, 0, 1, 0, 1, 2, 0);
    const c = massRowCompression(m, 3)!;
    expect(c.dependent).toHaveLength(1);
    const d = c.dependent[0]!;
    expect(d.row).toBe(2);
    const byRow = new Map(Array.from(d.rows, (r, k) => [r, d.coefficients[k]!]));
    expect(byRow.get(0)).toBeCloseTo(1, 15);
    expect(byRow.get(1)).toBeCloseTo(2, 15);
  });

  it('recombines f and J the same way, and passes a non-finite f on unchanged', () => {
    const c = massRowCompression(Float64Array.of(1, 0, 0, 0, 1, 0, 1, 2, 0), 3)!;
    const f = compressedRhs((_t, y, out) => out.set([y[0]!, 10 * y[1]!, 100 * y[2]!]), c);
    const out = new Float64Array(3);
    f(0, Float64Array.of(1, 1, 1), out);
    expect(Array.from(out)).toEqual([1, 10, 100 - 1 - 20]);
    const bad = compressedRhs((_t, _y, o) => o.set([Number.NaN, 1, 1]), c);
    bad(0, new Float64Array(3), out);
    expect(Number.isNaN(out[0]!)).toBe(true);
    expect(out[2]).toBe(1);
    const J = compressedJacobian((_t, _y, o) => o.set([1, 0, 0, 0, 10, 0, 0, 0, 100]), 3, c);
    const jo = new Float64Array(9);
    J(0, new Float64Array(3), jo);
    expect(Array.from(jo)).toEqual([1, 0, 0, 0, 10, 0, -1, -20, 100]);
  });
});

describe('solveDae with proportional mass rows', () => {
  it('matches the closed form of N1 x\' = u(t) - R1 i1, N2 x\' = -Rt i2, N1 i1 + N2 i2 = Rm x', () => {
    // DERIVED: from the second row i2 = -N2 x'/Rt; with the third, i1 = (Rm x + N2^2 x'/Rt)/N1, so the
    // first row is c x' = u - k x with c = N1 + R1 N2^2/(N1 Rt), k = R1 Rm/N1. For u = V sin(w t),
    // x(0) = 0: x = V/c [a sin(wt) - w cos(wt) + w exp(-a t)]/(a^2 + w^2), a = k/c.
    const [N1, N2, R1, Rt, Rm, V, w] = [200, 100, 1, 5.5, 4e5, 10, 2 * Math.PI * 50];
    const c = N1 + (R1 * N2 * N2) / (N1 * Rt);
    const a = (R1 * Rm) / N1 / c;
    const exact = (t: number): number => ((V / c) * (a * Math.sin(w * t) - w * Math.cos(w * t) + w * Math.exp(-a * t))) / (a * a + w * w);
    const sol = solveDae(
      {
        size: 3, // x, i1, i2
        y0: [0, 0, 0],
        t0: 0,
        tEnd: 0.04,
        mass: [[N1, 0, 0], [N2, 0, 0], [0, 0, 0]],
        rhs: (t, y, out) => {
          out[0] = V * Math.sin(w * t) - R1 * y[1]!;
          out[1] = -Rt * y[2]!;
          out[2] = N1 * y[1]! + N2 * y[2]! - Rm * y[0]!;
        },
        jacobian: (_t, _y, J) => J.set([0, -R1, 0, 0, 0, -Rt, -Rm, N1, N2]),
      },
      { rtol: 1e-10, atol: 1e-14 },
    );
    expect(sol.status).toBe('success');
    const scale = Math.max(...Array.from(sol.t, exact).map(Math.abs));
    sol.t.forEach((t, k) => expect(Math.abs(sol.y[k]![0]! - exact(t)) / scale).toBeLessThan(1e-8));
  });
});
