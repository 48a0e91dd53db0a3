import { describe, expect, it } from 'vitest';
import { createDaeIntegrator, type DaeProblem } from '../../src/index.js';

/**
 * readRhsAtState: f at the state a step ended on, as the integrator
 * evaluated it when it accepted the step. The reference is the definition
 * itself: the problem's own f called afresh at (t, y) must give the same
 * numbers bit for bit (f is a function of t and y). Where the integrator's
 * copy of f is not the problem's f at the present state (rows of a singular
 * mass matrix recombined, a restart, no step yet) it must say so.
 */

/** An RL branch with the source voltage as an algebraic unknown: L i' = v - R i, 0 = u - v. */
function rlBranch(): DaeProblem {
  const R = 2;
  const L = 1e-3;
  return {
    size: 2,
    y0: [0, 10],
    t0: 0,
    tEnd: 0.01,
    mass: [
      [L, 0],
      [0, 0],
    ],
    rhs: (t, y, out) => {
      out[0] = y[1]! - R * y[0]!;
      out[1] = 10 * Math.cos(1000 * t) - y[1]!;
    },
  };
}

describe('the integrator hands on f at the state a step ended on', () => {
  it('gives the problem f at (t, y) bit for bit after every accepted step', () => {
    const problem = rlBranch();
    const integ = createDaeIntegrator(problem, { rtol: 1e-8, atol: 1e-10 });
    const handed = new Float64Array(2);
    const fresh = new Float64Array(2);
    let steps = 0;
    while (integ.t < problem.tEnd && steps < 200) {
      expect(integ.step().status).toBe('accepted');
      steps++;
      expect(integ.readRhsAtState(handed)).toBe(true);
      problem.rhs(integ.t, integ.y, fresh);
      expect(Array.from(handed)).toEqual(Array.from(fresh));
    }
    expect(steps).toBeGreaterThan(10);
  });

  it('has nothing to hand on before the first step and after a restart', () => {
    const integ = createDaeIntegrator(rlBranch(), { rtol: 1e-8, atol: 1e-10 });
    const out = new Float64Array(2);
    expect(integ.readRhsAtState(out)).toBe(false);
    expect(integ.step().status).toBe('accepted');
    expect(integ.readRhsAtState(out)).toBe(true);
    integ.restart();
    expect(integ.readRhsAtState(out)).toBe(false);
  });

  it('hands on nothing when dependent rows of M are recombined (its f is then not the problem f)', () => {
    // M = [[1, 0], [2, 0]]: row 2 is twice row 1, so 0 = f_2 - 2 f_1 = y_1 - y_2 is the hidden
    // algebraic equation; the integrator works on the recombined rows (see mass-row-compression.ts).
    const problem: DaeProblem = {
      size: 2,
      y0: [1, 1],
      t0: 0,
      tEnd: 1,
      mass: [
        [1, 0],
        [2, 0],
      ],
      rhs: (_t, y, out) => {
        out[0] = -y[0]!;
        out[1] = -2 * y[0]! + (y[0]! - y[1]!);
      },
    };
    const integ = createDaeIntegrator(problem, { rtol: 1e-6, atol: 1e-8 });
    expect(integ.step().status).toBe('accepted');
    expect(integ.readRhsAtState(new Float64Array(2))).toBe(false);
  });
});
