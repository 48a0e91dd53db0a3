import { describe, expect, it } from 'vitest';
import { createDaeIntegrator, type DaeProblem, type SolveDaeOptions } from '../../src/index.js';

/**
 * readRhsAtState: f at the state a step ended on, as the integrator
 * evaluated it when it accepted the step. The reference is the definition
 * itself: the problem's own f called afresh at (t, y) must give the same
 * numbers bit for bit (f is a function of t and y). Where the integrator's
 * copy of f is not known to be the problem's f at the present state (no
 * step yet, a restart, a restore, a breakpoint, an event in the step) it must
 * say so; where rows of a singular mass matrix are recombined it hands on
 * the problem's f, not the recombined rows.
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

/**
 * Step `problem` to its end (200 steps at most), checking after every accepted step that the f
 * handed on is the problem's f called afresh at (t, y), bit for bit, and passing it to `also`;
 * returns the number of steps.
 */
function stepsHandingFreshRhs(problem: DaeProblem, options: SolveDaeOptions, also?: (handed: Float64Array, y: Float64Array) => void): number {
  const integ = createDaeIntegrator(problem, options);
  const handed = new Float64Array(problem.size);
  const fresh = new Float64Array(problem.size);
  let steps = 0;
  while (integ.t < problem.tEnd && steps < 200) {
    expect(integ.step().status).toBe('accepted');
    steps++;
    expect(integ.readRhsAtState(handed)).toBe(true);
    problem.rhs(integ.t, integ.y, fresh);
    expect(Array.from(handed)).toEqual(Array.from(fresh));
    also?.(handed, integ.y);
  }
  return steps;
}

describe('the integrator hands on f at the state a step ended on', () => {
  it('gives the problem f at (t, y) bit for bit after every accepted step', () => {
    expect(stepsHandingFreshRhs(rlBranch(), { rtol: 1e-8, atol: 1e-10 })).toBeGreaterThan(10);
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

  it('hands on the problem f, not its recombined rows, where dependent rows of M are recombined', () => {
    // The integrator works on the recombined rows (see mass-row-compression.ts); what it hands on
    // must still be the problem's own f at (t, y), the same definition as above.
    const steps = stepsHandingFreshRhs(proportionalRows(), { rtol: 1e-6, atol: 1e-8 }, (handed, y) => {
      // The recombined second row is y_0 - y_1 (about 0 on the solution); the problem's is about -2 y_0.
      expect(Math.abs(handed[1]! + 2 * y[0]!)).toBeLessThan(1e-3 * Math.abs(y[0]!));
    });
    expect(steps).toBeGreaterThan(5);
  });

  it('hands on nothing with recombined rows after a restart, a restore, a breakpoint or an event in the step', () => {
    const out = new Float64Array(2);
    const restarted = createDaeIntegrator(proportionalRows(), { rtol: 1e-6, atol: 1e-8 });
    expect(restarted.readRhsAtState(out)).toBe(false);
    expect(restarted.step().status).toBe('accepted');
    const snap = restarted.snapshot();
    restarted.restart();
    expect(restarted.readRhsAtState(out)).toBe(false);
    expect(restarted.step().status).toBe('accepted');
    expect(restarted.readRhsAtState(out)).toBe(true);
    restarted.restore(snap);
    expect(restarted.readRhsAtState(out)).toBe(false);

    // A step that lands on a breakpoint starts the next one afresh (its state may be re-initialised).
    const withBreakpoint = createDaeIntegrator({ ...proportionalRows(), breakpoints: [0.25] }, { rtol: 1e-6, atol: 1e-8 });
    let landed = false;
    for (let k = 0; k < 200 && !landed; k++) {
      expect(withBreakpoint.step().status).toBe('accepted');
      landed = withBreakpoint.t === 0.25;
      expect(withBreakpoint.readRhsAtState(out)).toBe(!landed);
    }
    expect(landed).toBe(true);

    // y_0 = exp(-t) falls through 0.5 at t = ln 2: the step holding that crossing reports an event.
    const withEvent = createDaeIntegrator(
      { ...proportionalRows(), events: [{ name: 'half', fn: (_t, y) => y[0]! - 0.5 }] },
      { rtol: 1e-6, atol: 1e-8 },
    );
    let seen = false;
    for (let k = 0; k < 200 && !seen; k++) {
      const r = withEvent.step();
      seen = r.events.length > 0;
      expect(withEvent.readRhsAtState(out)).toBe(!seen);
    }
    expect(seen).toBe(true);
  });
});

/**
 * M = [[1, 0], [2, 0]]: row 2 is twice row 1, so 0 = f_2 - 2 f_1 = y_0 - y_1 is the hidden algebraic
 * equation, and y_0 = y_1 = exp(-t).
 */
function proportionalRows(): DaeProblem {
  return {
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
}
