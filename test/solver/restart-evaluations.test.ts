import { describe, expect, it } from 'vitest';
import { createDaeIntegrator, type DaeProblem } from '../../src/index.js';

/**
 * What a restart after a source jump costs and gives, on an RL branch with
 * the source voltage as an algebraic unknown: L i' = v - R i, 0 = u - v
 * (u jumps between +10 and -10). References: the algebraic equation itself
 * (v = u right after the jump, exact: it is linear), and the starting-step
 * algorithm of Hairer, Norsett and Wanner, Solving ODEs I, sect. II.4,
 * worked by hand below for this problem.
 */
function squareDrivenRl(analyticJacobian: boolean): { problem: DaeProblem; setU: (u: number) => void; R: number; L: number } {
  const R = 2;
  const L = 1e-3;
  let u = 10;
  const base = {
    size: 2,
    y0: [0, 0],
    t0: 0,
    tEnd: 0.02,
    mass: [
      [L, 0],
      [0, 0],
    ],
    rhs: (_t: number, y: Float64Array, out: Float64Array) => {
      out[0] = y[1]! - R * y[0]!;
      out[1] = u - y[1]!;
    },
  };
  const jacobian = (_t: number, _y: Float64Array, J: Float64Array): void => {
    J[0] = -R;
    J[1] = 1;
    J[3] = -1;
  };
  const problem: DaeProblem = analyticJacobian ? { ...base, jacobian } : base;
  return { problem, R, L, setU: (v) => void (u = v) };
}

describe('restart after a source jump: evaluations and the consistent state', () => {
  for (const analytic of [true, false]) {
    it(`moves the algebraic unknown onto the new source value (${analytic ? 'analytic' : 'finite-difference'} Jacobian)`, () => {
      const { problem, setU } = squareDrivenRl(analytic);
      const integ = createDaeIntegrator(problem, { rtol: 1e-8, atol: 1e-10 });
      let u = 10;
      for (let k = 1; k <= 6; k++) {
        expect(integ.advanceTo(k * 2.5e-4).status).toBe('success');
        u = -u;
        setU(u);
        const before = integ.stats;
        expect(integ.restart(undefined, { capStepByEstimate: true })).toBe('running');
        const after = integ.stats;
        // 0 = u - v: v is the new source value at once. (Before the finite differences were taken from
        // f with the new inputs, the difference quotients held the jump itself and v stayed at the old value.)
        expect(integ.y[1]!).toBeCloseTo(u, 9);
        // f twice (before and after the re-solve), f once more for df/dt of y', J once (plus its
        // finite-difference columns, n = 2 evaluations of f, without an analytic Jacobian).
        expect(after.jacobianEvaluations - before.jacobianEvaluations).toBe(1);
        expect(after.rhsEvaluations - before.rhsEvaluations).toBe(3 + (analytic ? 0 : 2));
      }
    });
  }

  it('without the step cap a restart costs f twice and J once', () => {
    const { problem, setU } = squareDrivenRl(true);
    const integ = createDaeIntegrator(problem, { rtol: 1e-8, atol: 1e-10 });
    integ.advanceTo(2.5e-4);
    setU(-10);
    const before = integ.stats;
    integ.restart();
    expect(integ.stats.rhsEvaluations - before.rhsEvaluations).toBe(2);
    expect(integ.stats.jacobianEvaluations - before.jacobianEvaluations).toBe(1);
    expect(integ.y[1]!).toBe(-10);
  });

  it('caps the kept step by the starting-step estimate of Hairer, Norsett and Wanner (sect. II.4)', () => {
    const { problem, setU, R, L } = squareDrivenRl(true);
    const rtol = 1e-8;
    const atol = 1e-10;
    const integ = createDaeIntegrator(problem, { rtol, atol });
    integ.advanceTo(4e-3); // near the steady state i = 5 A: long steps
    const hBefore = integ.h;
    const u = -10;
    setU(u);
    integ.restart(undefined, { capStepByEstimate: true });
    // By hand: y = (i, u), y' = (i', 0) with L i' = u - R i; f along the solution changes at
    // d/dt (v - R i, u - v) = (-R i', 0) (the algorithm's (f(y0 + h0 y') - f(y0))/h0 is exactly that here:
    // f is linear). Norms weighted by atol + rtol |y|, root mean square over the two components.
    const i = integ.y[0]!;
    const ip = (u - R * i) / L;
    const s = [atol + rtol * Math.abs(i), atol + rtol * Math.abs(u)];
    const rms = (v: number[]): number => Math.sqrt((v[0]! / s[0]!) ** 2 / 2 + (v[1]! / s[1]!) ** 2 / 2);
    const d0 = rms([i, u]);
    const d1 = rms([ip, 0]);
    const d2 = rms([-R * ip, 0]);
    const h0 = (0.01 * d0) / d1;
    const h1 = (0.01 / Math.max(d1, d2)) ** (1 / 6); // order 5: exponent 1/(p + 1)
    const estimate = Math.min(100 * h0, h1, 0.02);
    expect(estimate).toBeLessThan(hBefore); // the cap binds: the check below tests the estimate
    expect(integ.h / estimate - 1).toBeCloseTo(0, 6);
  });
});
