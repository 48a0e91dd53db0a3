import { describe, expect, it } from 'vitest';
import { createCollocationWork, createNewtonOutcome, solveCollocation } from '../../src/solver/collocation-newton.js';
import { collocationComponent, evaluateCollocation } from '../../src/solver/collocation-polynomial.js';
import { createComplexLu } from '../../src/solver/complex-lu.js';
import { createDenseLu } from '../../src/solver/dense-lu.js';
import { MU_COMPLEX_IM, MU_COMPLEX_RE, MU_REAL, P } from '../../src/solver/radau-tableau.js';

/**
 * Stability function of the 3-stage Radau IIA method: the (2,3) Pade
 * approximant of e^z (Hairer and Wanner II, sect. IV.5, Theorem 5.3 and
 * Table 5.13 of Pade approximations):
 * R(z) = (1 + 2z/5 + z^2/20) / (1 - 3z/5 + 3z^2/20 - z^3/60).
 */
const radauR = (z: number): number => (1 + (2 * z) / 5 + (z * z) / 20) / (1 - (3 * z) / 5 + (3 * z * z) / 20 - (z * z * z) / 60);

describe('solveCollocation (one Radau IIA step as a pure function)', () => {
  for (const hl of [-0.5, -10, -1e4]) {
    it(`reproduces R(h lambda) for y' = lambda y at h lambda = ${hl}`, () => {
      const lambda = -2;
      const h = hl / lambda;
      const n = 1;
      const luReal = createDenseLu(1);
      const luComplex = createComplexLu(1);
      // Iteration matrices (gamma/h) M - J and ((alpha - i beta)/h) M - J with M = 1, J = lambda.
      expect(luReal.factor(Float64Array.of(MU_REAL / h - lambda))).toBe(-1);
      expect(luComplex.factor(Float64Array.of(MU_COMPLEX_RE / h - lambda), Float64Array.of(MU_COMPLEX_IM / h))).toBe(-1);
      const stats = { newtonIterations: 0 };
      const sys = {
        n,
        rhs: (_t: number, y: Float64Array, out: Float64Array) => {
          out[0] = lambda * y[0]!;
        },
        multiplyMass: (v: number[], off: number, out: number[]) => {
          out[0] = v[off]!;
        },
        luReal,
        luComplex,
        fnewt: 1e-10,
        stats,
      };
      const work = createCollocationWork(n);
      work.z.fill(0);
      const y = Float64Array.of(1);
      const out = solveCollocation(sys, work, y, Float64Array.of(1e-12), { t: 0, h, tLastStage: h, faccon: 1 }, createNewtonOutcome(n));
      expect(out.converged).toBe(true);
      // Linear problem, exact Jacobian: one iteration solves it, the second confirms.
      expect(out.iterations).toBeLessThanOrEqual(2);
      expect(stats.newtonIterations).toBe(out.iterations);
      const y1 = 1 + work.z[2]!;
      expect(Math.abs(y1 - radauR(hl))).toBeLessThan(1e-13 * Math.max(1, Math.abs(radauR(hl))));
      // Dense output: the collocation polynomial passes through the stage values and ends at y1.
      const q = new Float64Array(3);
      for (let k = 0; k < 3; k++) q[k] = work.z[0]! * P[k]! + work.z[1]! * P[3 + k]! + work.z[2]! * P[6 + k]!;
      const piece = { tOld: 0, h, yOld: y, q };
      expect(collocationComponent(piece, 1, 0)).toBeCloseTo(y1, 12);
      expect(evaluateCollocation(piece, h, new Float64Array(1))[0]).toBeCloseTo(y1, 12);
    });
  }
});
