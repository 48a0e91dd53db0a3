import { describe, expect, it } from 'vitest';
import { consistentInitialValues, solveDae } from '../../src/index.js';
import { TRANSAMP, transistorAmplifier } from './fixtures/test-set.js';

describe('consistentInitialValues', () => {
  it("gives TRANSAMP's consistent y'(0) (non-diagonal singular M): derived values to 1e-9, the Test Set's printed values to their stated relations", () => {
    const { problem } = transistorAmplifier();
    const init = consistentInitialValues(problem, { rtol: 1e-10, atol: 1e-12 });
    expect(init.ok).toBe(true);
    // The Test Set's y0 is already consistent: it must come back unchanged.
    const y0 = [0, 3, 3, 6, 3, 3, 6, 0];
    for (let i = 0; i < 8; i++) expect(init.y0[i]!).toBeCloseTo(y0[i]!, 12);
    const yp = init.yp0!;
    expect(yp).toBeDefined();
    const { UF, alpha, beta, R0, R } = TRANSAMP;
    const [, C2, , C4] = TRANSAMP.C;
    // DERIVED from the equations in /work/shared/REFERENCES.md sect. 1 (rows of M give y1' = y2', y4' = y5',
    // y7' = y8' and y3' = -y3/(C2 R3), y6' = -y6/(C4 R7); the three algebraic row sums phi1+phi2, phi4+phi5,
    // phi7+phi8 = 0 differentiated once at t = 0, where y2 = y3 and y5 = y6 so g' = (beta/UF) (difference)'):
    const k = beta / UF;
    const ue1 = 0.1 * 200 * Math.PI; // Ue'(0)
    const y3p = -3 / (C2 * R);
    const y6p = -3 / (C4 * R);
    const x1 = (ue1 / R0 + (1 - alpha) * k * y3p) / (1 / R0 + 2 / R + (1 - alpha) * k);
    const g1p = k * (x1 - y3p);
    const x2 = (-alpha * g1p + (1 - alpha) * k * y6p) / (3 / R + (1 - alpha) * k);
    const g2p = k * (x2 - y6p);
    const x3 = (-alpha * g2p * R) / 2;
    const derived = [x1, x1, y3p, x2, x2, y6p, x3, x3];
    for (let i = 0; i < 8; i++) expect(Math.abs(yp[i]! - derived[i]!) / Math.abs(derived[i]!)).toBeLessThan(1e-9);
    // Test Set, TRANSAMP, consistent y'(0) as printed (READ, /work/shared/REFERENCES.md sect. 1):
    // (51.338775, 51.338775, -y3(0)/(C2 R3), -24.9757667, -24.9757667, -y6(0)/(C4 R7), -10.00564453, -10.00564453).
    // The closed-form entries (3 and 6) and the equalities y1' = y2', y4' = y5', y7' = y8' hold exactly.
    // The other printed digits do not satisfy the differentiated algebraic equations as transcribed: they
    // differ from the derived values above (and from a difference quotient of the integrated solution,
    // 51.339277, -24.970323, -10.000278) by 1e-5, 2.2e-4 and 5.4e-4 relative. Those measured gaps are
    // asserted here so that any change in them is noticed; see docs/solver.md.
    const published = [51.338775, 51.338775, -3 / (C2 * R), -24.9757667, -24.9757667, -3 / (C4 * R), -10.00564453, -10.00564453];
    expect(yp[2]!).toBeCloseTo(published[2]!, 10);
    expect(yp[5]!).toBeCloseTo(published[5]!, 10);
    const gap = (i: number): number => Math.abs(yp[i]! - published[i]!) / Math.abs(published[i]!);
    expect(gap(0)).toBeCloseTo(9.8e-6, 6);
    expect(gap(3)).toBeCloseTo(2.18e-4, 5);
    expect(gap(6)).toBeCloseTo(5.36e-4, 5);
  });

  it('moves an inconsistent TRANSAMP y0 back along the null space of M, keeping M y0', () => {
    const { problem } = transistorAmplifier();
    // (1, 1, 0, ...) is in the null space of M: M y0 is unchanged, the algebraic relation phi1 + phi2 = 0 is violated.
    const y0 = [0.05, 3.05, 3, 6, 3, 3, 6, 0];
    const init = consistentInitialValues({ ...problem, y0 }, { rtol: 1e-10, atol: 1e-12 });
    expect(init.ok).toBe(true);
    const ref = [0, 3, 3, 6, 3, 3, 6, 0];
    for (let i = 0; i < 8; i++) expect(init.y0[i]!).toBeCloseTo(ref[i]!, 10);
  });

  it('solveDae starts TRANSAMP from the corrected state when y0 is inconsistent, and reaches the same y(0.2)', () => {
    const { problem, reference } = transistorAmplifier();
    const sol = solveDae({ ...problem, y0: [0.05, 3.05, 3, 6, 3, 3, 6, 0] }, { rtol: 1e-8, atol: 1e-8 });
    expect(sol.status).toBe('success');
    expect(sol.y[0]![0]!).toBeCloseTo(0, 10);
    const y = sol.y[sol.y.length - 1]!;
    for (let i = 0; i < 8; i++) expect(Math.abs(y[i]! - reference[i]!)).toBeLessThan(1e-6 * Math.max(1, Math.abs(reference[i]!)));
  });

  it('corrects the algebraic unknown of a semi-explicit DAE and gives y\' from the differentiated constraint (derived)', () => {
    // y1' = -y1, 0 = y2 - 2 y1  =>  y2 = 2 y1 = 2, y1' = -1, y2' = 2 y1' = -2.
    const init = consistentInitialValues({
      size: 2,
      y0: [1, 5],
      t0: 0,
      tEnd: 1,
      mass: [[1, 0], [0, 0]],
      rhs: (_t, y, out) => {
        out[0] = -y[0]!;
        out[1] = y[1]! - 2 * y[0]!;
      },
    });
    expect(init.ok).toBe(true);
    expect(init.y0[0]).toBe(1);
    expect(init.y0[1]!).toBeCloseTo(2, 12);
    expect(init.yp0![0]!).toBeCloseTo(-1, 7);
    expect(init.yp0![1]!).toBeCloseTo(-2, 7);
  });

  it('reports a constraint without solution (0 = y2^2 + 1) as not ok', () => {
    const init = consistentInitialValues({
      size: 2,
      y0: [1, 0.5],
      t0: 0,
      tEnd: 1,
      mass: [[1, 0], [0, 0]],
      rhs: (_t, y, out) => {
        out[0] = -y[0]!;
        out[1] = y[1]! * y[1]! + 1;
      },
    });
    expect(init.ok).toBe(false);
    expect(init.components).toContain(1);
    expect(init.message).toMatch(/converge/);
  });
});

describe('solveDae with consistentInit: false', () => {
  it('keeps the given y0 as the first point and still reaches the closed form (first step absorbs the inconsistency)', () => {
    // y1' = -y1, 0 = y2 - 2 y1 (DERIVED: y1 = exp(-t), y2 = 2 exp(-t)); y2(0) given as 5.
    const sol = solveDae(
      {
        size: 2,
        y0: [1, 5],
        t0: 0,
        tEnd: 2,
        mass: [[1, 0], [0, 0]],
        rhs: (_t, y, out) => {
          out[0] = -y[0]!;
          out[1] = y[1]! - 2 * y[0]!;
        },
        jacobian: (_t, _y, J) => {
          J.set([-1, 0, -2, 1]);
        },
      },
      { rtol: 1e-8, atol: 1e-10, consistentInit: false },
    );
    expect(sol.status).toBe('success');
    expect(Array.from(sol.y[0]!)).toEqual([1, 5]);
    const y = sol.y[sol.y.length - 1]!;
    expect(y[0]!).toBeCloseTo(Math.exp(-2), 7);
    expect(y[1]!).toBeCloseTo(2 * Math.exp(-2), 7);
  });
});
