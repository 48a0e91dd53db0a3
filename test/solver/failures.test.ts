/**
 * Every failure status of solveDae is reachable, comes back as a status (no
 * throw) with a one-line message, `failure` details, and all data up to the
 * last accepted step. Closed forms are DERIVED by hand.
 */
import { describe, expect, it } from 'vitest';
import { solveDae, type DaeSolution } from '../../src/index.js';

/** y' = -y, y(0) = 1: y = exp(-t). Checks that the kept data is the true solution. */
function expectDecayDataKept(sol: DaeSolution, rtol = 1e-5): void {
  expect(sol.t.length).toBe(sol.y.length);
  expect(sol.t[0]).toBe(0);
  expect(sol.tReached).toBe(sol.t[sol.t.length - 1]);
  sol.t.forEach((t, k) => expect(Math.abs(sol.y[k]![0]! - Math.exp(-t))).toBeLessThan(rtol));
  expect(sol.failure).toBeDefined();
  expect(sol.failure!.t).toBe(sol.tReached);
  expect(sol.message).not.toMatch(/\n/);
}

const decay = (rhs?: (t: number, y: Float64Array, out: Float64Array) => void) => ({
  size: 1,
  y0: [1],
  t0: 0,
  tEnd: 1,
  rhs:
    rhs ??
    ((_t: number, y: Float64Array, out: Float64Array) => {
      out[0] = -y[0]!;
    }),
});

describe('solveDae failure statuses', () => {
  it("'step-size-underflow' for a solution that blows up (y' = y^2, y(0) = 1, y = 1/(1 - t)), data before kept", () => {
    const sol = solveDae({ size: 1, y0: [1], t0: 0, tEnd: 2, rhs: (_t, y, out) => (out[0] = y[0]! * y[0]!) }, { rtol: 1e-6 });
    expect(sol.status).toBe('step-size-underflow');
    expect(sol.message).toMatch(/round-off limit/);
    expect(sol.failure!.components).toEqual([0]);
    expect(sol.tReached).toBeGreaterThan(0.999);
    expect(sol.tReached).toBeLessThan(1.001);
    // Data before the blow-up follows 1/(1 - t) within the tolerance, relatively.
    sol.t.forEach((t, k) => {
      if (t < 0.99) expect(Math.abs(sol.y[k]![0]! * (1 - t) - 1)).toBeLessThan(1e-4);
    });
  });

  it("'non-finite' when f returns NaN from t = 0.5 on, naming the component, data up to 0.5 kept", () => {
    const sol = solveDae(decay((t, y, out) => (out[0] = t > 0.5 ? NaN : -y[0]!)), { rtol: 1e-8 });
    expect(sol.status).toBe('non-finite');
    expect(sol.failure!.components).toEqual([0]);
    expect(sol.tReached).toBeLessThanOrEqual(0.5);
    expect(sol.tReached).toBeGreaterThan(0.49);
    expectDecayDataKept(sol);
  });

  it("'non-finite' at once when f(t0, y0) is NaN", () => {
    const sol = solveDae(decay((_t, _y, out) => (out[0] = NaN)));
    expect(sol.status).toBe('non-finite');
    expect(sol.t.length).toBe(1);
    expect(sol.failure!.components).toEqual([0]);
  });

  it("'rhs-error' when f throws, with the thrown error as cause, data before kept", () => {
    const boom = new Error('table lookup out of range');
    const sol = solveDae(
      decay((t, y, out) => {
        if (t > 0.5) throw boom;
        out[0] = -y[0]!;
      }),
      { rtol: 1e-8 },
    );
    expect(sol.status).toBe('rhs-error');
    expect(sol.failure!.cause).toBe(boom);
    expect(sol.message).toMatch(/table lookup out of range/);
    expect(sol.tReached).toBeLessThanOrEqual(0.5);
    expectDecayDataKept(sol);
  });

  it("'rhs-error' when the Jacobian throws", () => {
    const sol = solveDae({
      ...decay(),
      jacobian: () => {
        throw new Error('bad stamp');
      },
    });
    expect(sol.status).toBe('rhs-error');
    expect(sol.message).toMatch(/Jacobian threw.*bad stamp/);
    expect(sol.t.length).toBe(1);
  });

  it("'newton-failure' when the Jacobian turns wrong at a breakpoint (J = +1e10 for f = -y from t = 0.5), data before kept", () => {
    // The Jacobian is re-evaluated at every breakpoint, so the wrong one is used from 0.5 on.
    const sol = solveDae(
      { ...decay(), breakpoints: [0.5], jacobian: (t, _y, J) => (J[0] = t >= 0.5 ? 1e10 : -1) },
      { rtol: 1e-8 },
    );
    expect(sol.status).toBe('newton-failure');
    expect(sol.failure!.components).toEqual([0]);
    expect(sol.message).toMatch(/finiteDifferenceJacobian/);
    expect(sol.stats.newtonFailures).toBeGreaterThanOrEqual(10);
    expect(sol.tReached).toBe(0.5);
    expectDecayDataKept(sol, 1e-8);
  });

  it("'singular-matrix' for an unknown that no equation constrains (M = diag(1, 0), f2 = 0), naming it", () => {
    const sol = solveDae({
      size: 2,
      y0: [1, 0],
      t0: 0,
      tEnd: 1,
      mass: [[1, 0], [0, 0]],
      rhs: (_t, y, out) => {
        out[0] = -y[0]!;
        out[1] = 0;
      },
    });
    expect(sol.status).toBe('singular-matrix');
    expect(sol.failure!.components).toEqual([1]);
    expect(sol.message).toMatch(/component 1/);
  });

  it("'singular-matrix' when an unknown loses its equation at a breakpoint (a switch opening at t = 0.5), data before kept", () => {
    // y1' = -y1, 0 = y2 - y1 until 0.5, then 0 = 0: y2 is no longer constrained.
    const sol = solveDae(
      {
        size: 2,
        y0: [1, 1],
        t0: 0,
        tEnd: 1,
        mass: [[1, 0], [0, 0]],
        breakpoints: [0.5],
        rhs: (t, y, out) => {
          out[0] = -y[0]!;
          out[1] = t >= 0.5 ? 0 : y[1]! - y[0]!;
        },
        jacobian: (t, _y, J) => {
          J[0] = -1;
          if (t < 0.5) {
            J[2] = -1;
            J[3] = 1;
          }
        },
      },
      { rtol: 1e-8 },
    );
    expect(sol.status).toBe('singular-matrix');
    expect(sol.failure!.components).toEqual([1]);
    expect(sol.tReached).toBe(0.5);
    sol.t.forEach((t, k) => {
      expect(Math.abs(sol.y[k]![0]! - Math.exp(-t))).toBeLessThan(1e-6);
      expect(Math.abs(sol.y[k]![1]! - Math.exp(-t))).toBeLessThan(1e-6);
    });
  });

  it("'singular-matrix' for a floating pair of nodes (rows summing to zero at round-off level)", () => {
    // Two capacitor-free nodes joined only by a 0.1 S conductance (no path to ground): G is singular.
    const g = 0.1 + 0.2 - 0.2;
    const sol = solveDae({
      size: 3,
      y0: [0, 0, 1],
      t0: 0,
      tEnd: 1,
      mass: [[0, 0, 0], [0, 0, 0], [0, 0, 1]],
      rhs: (_t, y, out) => {
        out[0] = -(g * y[0]! - 0.1 * y[1]!);
        out[1] = -(-0.1 * y[0]! + 0.1 * y[1]!);
        out[2] = -y[2]!;
      },
      jacobian: (_t, _y, J) => {
        J.set([-g, 0.1, 0, 0.1, -0.1, 0, 0, 0, -1]);
      },
    });
    // y0 = 0 satisfies the algebraic rows, so initialisation passes; the iteration matrix then is singular.
    expect(sol.status).toBe('singular-matrix');
    expect(sol.failure!.components).toEqual([1]);
  });

  it("'inconsistent-init' when the algebraic equation has no solution (0 = y2^2 + 1)", () => {
    const sol = solveDae({
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
    expect(sol.status).toBe('inconsistent-init');
    expect(sol.failure!.components).toEqual([1]);
    expect(Array.from(sol.y[0]!)).toEqual([1, 0.5]);
  });

  it("'step-budget' after maxSteps attempted steps, data kept", () => {
    const sol = solveDae({ ...decay(), tEnd: 10 }, { rtol: 1e-10, maxSteps: 10 });
    expect(sol.status).toBe('step-budget');
    expect(sol.stats.acceptedSteps + sol.stats.rejectedSteps).toBe(10);
    expect(sol.message).toMatch(/maxSteps = 10/);
    expectDecayDataKept(sol, 1e-8);
  });

  it("'time-budget' after maxWallTimeMs, data kept", () => {
    const slow = (_t: number, y: Float64Array, out: Float64Array): void => {
      const until = performance.now() + 0.2;
      while (performance.now() < until);
      out[0] = -y[0]!;
    };
    const sol = solveDae({ ...decay(slow), tEnd: 10 }, { rtol: 1e-10, maxWallTimeMs: 20 });
    expect(sol.status).toBe('time-budget');
    expect(sol.tReached).toBeLessThan(10);
    expectDecayDataKept(sol, 1e-8);
  });

  it("'aborted' when the AbortSignal fires (checked between steps), data kept", () => {
    const ac = new AbortController();
    let calls = 0;
    const sol = solveDae(
      { ...decay(), tEnd: 10 },
      {
        rtol: 1e-10,
        signal: ac.signal,
        progressIntervalMs: 0,
        onProgress: () => {
          if (++calls === 5) ac.abort();
        },
      },
    );
    expect(sol.status).toBe('aborted');
    expect(sol.stats.acceptedSteps).toBe(5);
    expectDecayDataKept(sol, 1e-8);
  });
});

describe('solveDae non-finite Jacobian', () => {
  it("'non-finite' when the analytic Jacobian has a NaN entry, naming its row", () => {
    const sol = solveDae({
      size: 2,
      y0: [1, 1],
      t0: 0,
      tEnd: 1,
      rhs: (_t, y, out) => {
        out[0] = -y[0]!;
        out[1] = -y[1]!;
      },
      jacobian: (_t, _y, J) => {
        J[0] = -1;
        J[3] = NaN;
      },
    });
    expect(sol.status).toBe('non-finite');
    expect(sol.failure!.components).toEqual([1]);
    expect(sol.message).toMatch(/Jacobian/);
  });
});
