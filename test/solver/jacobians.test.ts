/**
 * The hand-derived analytic Jacobians of the test problems (test-set.ts)
 * against the finite-difference oracle finiteDifferenceJacobian, at the
 * initial state and at states along the solution.
 */
import { describe, expect, it } from 'vitest';
import { finiteDifferenceJacobian, solveDae } from '../../src/index.js';
import { hires, ringModulator, robertsonDae, robertsonOde, transistorAmplifier, vanDerPol, type TestProblem } from './fixtures/test-set.js';

/** Max over entries of |J - Jfd| / (|J| + row scale * 1e-3); the FD error is O(sqrt(eps)) relative. */
function jacobianMismatch(tp: TestProblem, t: number, y: Float64Array): number {
  const n = tp.problem.size;
  const f0 = new Float64Array(n);
  tp.problem.rhs(t, y, f0);
  const Ja = new Float64Array(n * n);
  tp.problem.jacobian!(t, y, Ja);
  const Jf = new Float64Array(n * n);
  finiteDifferenceJacobian(tp.problem.rhs, t, Float64Array.from(y), f0, Jf);
  let worst = 0;
  for (let i = 0; i < n; i++) {
    let rowScale = 0;
    for (let j = 0; j < n; j++) rowScale = Math.max(rowScale, Math.abs(Ja[i * n + j]!));
    for (let j = 0; j < n; j++) {
      const a = Ja[i * n + j]!;
      const e = Math.abs(a - Jf[i * n + j]!) / (Math.abs(a) + 1e-3 * rowScale + 1e-300);
      worst = Math.max(worst, e);
    }
  }
  return worst;
}

const problems = [robertsonOde(40), robertsonDae(40), vanDerPol(2), hires(), transistorAmplifier(), ringModulator()];

describe('analytic Jacobians of the test problems', () => {
  for (const tp of problems) {
    it(`${tp.name}: jacobian(t, y) agrees with finiteDifferenceJacobian along the solution`, () => {
      const span = tp.problem.tEnd - tp.problem.t0;
      const sol = solveDae({ ...tp.problem, tEnd: tp.problem.t0 + Math.min(span, tp.name === 'RINGMOD' ? 1e-5 : span) }, { rtol: 1e-6, atol: 1e-8 });
      expect(sol.status).toBe('success');
      const picks = [0, Math.floor(sol.t.length / 3), Math.floor((2 * sol.t.length) / 3), sol.t.length - 1];
      for (const k of picks) {
        // Perturb zeros so that every entry is exercised (y0 has many exact zeros).
        const y = Float64Array.from(sol.y[k]!, (v, i) => (v === 0 ? 1e-3 * (i + 1) : v));
        expect(jacobianMismatch(tp, sol.t[k]!, y)).toBeLessThan(1e-4);
      }
    });
  }
});
