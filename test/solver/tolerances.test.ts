import { describe, expect, it } from 'vitest';
import { solveDae, type DaeProblem } from '../../src/index.js';
import { hires, robertsonDae, transistorAmplifier, vanDerPol, type TestProblem } from './fixtures/test-set.js';

/** Largest absolute deviation of y(tEnd) from the Test Set reference (Mazzia and Magherini, Test Set 2.4). */
function finalError(tp: TestProblem, rtol: number): number {
  const sol = solveDae(tp.problem, { rtol, denseOutput: false });
  expect(sol.status).toBe('success');
  const y = sol.y[sol.y.length - 1]!;
  let err = 0;
  for (let i = 0; i < y.length; i++) err = Math.max(err, Math.abs(y[i]! - tp.reference[i]!));
  return err;
}

describe('tolerances mean what they say', () => {
  // With the default atol the absolute part of the error test no longer loosens as rtol tightens
  // (radau5's map atol' = rtol' atol/rtol gave HIRES 2.3e-9 at rtol 1e-8 but 1.4e-8 at 1e-10, and
  // TRANSAMP 4.7e-9 at 1e-10 but 1.8e-8 at 1e-12). Where the absolute tolerance dominates, the error
  // sits on a plateau and fluctuates: a factor 2 between neighbouring rtols is allowed for that
  // (measured worst: 1.6, VDPOL from 1e-8 to 1e-10); over four decades it must not grow at all.
  for (const tp of [hires(), robertsonDae(40), vanDerPol(), transistorAmplifier()]) {
    it(`${tp.name}: tightening rtol from 1e-6 to 1e-12 with the default atol never worsens the error`, () => {
      const rtols = [1e-6, 1e-8, 1e-10, 1e-12];
      const errs = rtols.map((r) => finalError(tp, r));
      for (let k = 1; k < errs.length; k++) expect(errs[k]!).toBeLessThanOrEqual(2 * errs[k - 1]!);
      expect(errs[3]!).toBeLessThanOrEqual(errs[1]!);
      expect(errs[3]!).toBeLessThan(errs[0]!);
    });
  }

  it('at rtol 1e-12 a DAE re-initialised at breakpoints does not end in inconsistent-init', () => {
    // x' = z - x, 0 = z^3 + z - u(t) - x with u a square wave switching every 0.1: Newton on the
    // algebraic equation converges to round-off, which the convergence test must accept (issue 15).
    const edges = Array.from({ length: 9 }, (_, k) => 0.1 * (k + 1));
    // The value after an edge from the edge on (the solver's breakpoint convention).
    const u = (t: number): number => (edges.filter((e) => e <= t).length % 2 === 0 ? 3 : -2);
    const problem: DaeProblem = {
      size: 2,
      y0: [0.5, 1],
      t0: 0,
      tEnd: 1,
      mass: [
        [1, 0],
        [0, 0],
      ],
      breakpoints: edges,
      rhs: (t, y, out) => {
        out[0] = y[1]! - y[0]!;
        out[1] = y[1]! ** 3 + y[1]! - u(t) - y[0]!;
      },
      jacobian: (_t, y, J) => {
        J[0] = -1;
        J[1] = 1;
        J[2] = -1;
        J[3] = 3 * y[1]! ** 2 + 1;
      },
    };
    for (const rtol of [1e-10, 1e-12, 1e-13]) {
      const sol = solveDae(problem, { rtol, atol: 1e-14 });
      expect(sol.status, `rtol ${rtol}: ${sol.message}`).toBe('success');
      // Every state satisfies the algebraic equation to round-off (the residual's own rounding level).
      for (let k = 0; k < sol.t.length; k++) {
        const [x, z] = [sol.y[k]![0]!, sol.y[k]![1]!];
        const tk = sol.t[k]!;
        // A breakpoint appears twice when z jumps there: left limit (old input), then right limit.
        const uk = edges.includes(tk) && sol.t[k + 1] === tk ? u(tk - 1e-9) : u(tk);
        expect(Math.abs(z ** 3 + z - uk - x)).toBeLessThan(1e-9 * (Math.abs(z) ** 3 + 4));
      }
    }
  });
});
