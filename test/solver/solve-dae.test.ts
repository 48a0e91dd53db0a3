import { Solver } from '../support/odex.js';
import { describe, expect, it } from 'vitest';
import { solveDae, type DaeProblem } from '../../src/index.js';

/**
 * Stiff scalar test equation y' = -lambda (y - cos t), y(0) = y0 (the
 * Prothero-Robinson type problem; cf. Hairer and Wanner II, sect. IV.15).
 * Closed form, DERIVED: the particular solution A cos t + B sin t satisfies
 * -A sin t + B cos t = -lambda (A - 1) cos t - lambda B sin t, so
 * B = lambda (1 - A) and A = lambda B, giving A = lambda^2/(1 + lambda^2),
 * B = lambda/(1 + lambda^2); the homogeneous part decays as exp(-lambda t):
 * y(t) = A cos t + B sin t + (y0 - A) exp(-lambda t).
 *
 * Accuracy bounds below: radau5 maps the requested rtol to an internal
 * 0.1 rtol^(2/3) (2e-8 for rtol = 1e-10) and on these problems the achieved
 * global error is of that size (measured 2.5e-8 on the stiff scalar); the
 * bounds sit a few times above the measured errors.
 */
function stiffScalar(lambda: number, y0: number, tEnd: number): { problem: DaeProblem; exact: (t: number) => number } {
  const A = (lambda * lambda) / (1 + lambda * lambda);
  const B = lambda / (1 + lambda * lambda);
  return {
    problem: {
      size: 1,
      y0: [y0],
      t0: 0,
      tEnd,
      rhs: (t, y, out) => {
        out[0] = -lambda * (y[0]! - Math.cos(t));
      },
      jacobian: (_t, _y, J) => {
        J[0] = -lambda;
      },
    },
    exact: (t) => A * Math.cos(t) + B * Math.sin(t) + (y0 - A) * Math.exp(-lambda * t),
  };
}

/** Measured 5.4e-9 (dense output at rtol 1e-10 on the lambda = 50 problem). */
const WORST_DENSE = 2e-8;
/** Measured 1.7e-12 with breakpoints (4e-9 without). */
const WORST_PULSE = 1e-10;

describe('solveDae', () => {
  it('integrates the stiff scalar y\' = -1e6 (y - cos t) to its closed form in few steps', () => {
    const { problem, exact } = stiffScalar(1e6, 2, 10);
    const sol = solveDae(problem, { rtol: 1e-10, atol: 1e-12 });
    expect(sol.status).toBe('success');
    let worst = 0;
    sol.t.forEach((t, k) => (worst = Math.max(worst, Math.abs(sol.y[k]![0]! - exact(t)))));
    expect(worst).toBeLessThan(1e-7); // measured 2.5e-8
    // An explicit method would need about 1e6 * 10 / 2.8 steps; the stiff solver needs a few hundred.
    expect(sol.stats.acceptedSteps).toBeLessThan(300);
  });

  it('dense output between steps follows the closed form (collocation polynomial, order 3 inside the step)', () => {
    const { problem, exact } = stiffScalar(50, 1, 5);
    const sol = solveDae(problem, { rtol: 1e-10, atol: 1e-12 });
    expect(sol.status).toBe('success');
    let worst = 0;
    for (let k = 1; k < sol.t.length; k++) {
      for (const s of [0.1, 0.37, 0.5, 0.81]) {
        const t = sol.t[k - 1]! + s * (sol.t[k]! - sol.t[k - 1]!);
        worst = Math.max(worst, Math.abs(sol.at(t)[0]! - exact(t)));
      }
    }
    expect(worst).toBeLessThan(WORST_DENSE);
    expect(sol.at(sol.t[3]!)[0]).toBe(sol.y[3]![0]);
    expect(() => sol.at(5.5)).toThrow(/covers/);
  });

  it('returns outputTimes sorted with states from the dense output, and component(i) as a time series', () => {
    const { problem, exact } = stiffScalar(50, 1, 5);
    const sol = solveDae(problem, { rtol: 1e-10, atol: 1e-12, outputTimes: [4, 0, 2.5, 1e-3, 5] });
    expect(Array.from(sol.output.t)).toEqual([0, 1e-3, 2.5, 4, 5]);
    sol.output.t.forEach((t, k) => expect(Math.abs(sol.output.y[k]![0]! - exact(t))).toBeLessThan(WORST_DENSE));
    const c = sol.component(0);
    expect(c.length).toBe(sol.t.length);
    expect(c[c.length - 1]).toBe(sol.y[sol.y.length - 1]![0]);
  });

  it('lands exactly on breakpoints and restarts there: a rectangular pulse into y\' = -y matches its closed form', () => {
    // y' = -y + u(t), u = 1 on [0.3, 0.7), 0 elsewhere; y(0) = 0. DERIVED closed form:
    // y = 0 (t < 0.3); 1 - exp(-(t - 0.3)) (0.3 <= t < 0.7); y(0.7) exp(-(t - 0.7)) after.
    const on = 0.3;
    const off = 0.7;
    const exact = (t: number): number =>
      t < on ? 0 : t < off ? 1 - Math.exp(-(t - on)) : (1 - Math.exp(-(off - on))) * Math.exp(-(t - off));
    const pulse: DaeProblem = {
      size: 1,
      y0: [0],
      t0: 0,
      tEnd: 2,
      // f at a breakpoint is the value after the switch (t >= on), the waveforms' convention.
      rhs: (t, y, out) => {
        out[0] = -y[0]! + (t >= on && t < off ? 1 : 0);
      },
      breakpoints: [off, on, on, 0, 2], // unsorted, a duplicate, and the span's ends (ignored)
    };
    const sol = solveDae(pulse, { rtol: 1e-10, atol: 1e-12 });
    const blind = solveDae({ ...pulse, breakpoints: [] }, { rtol: 1e-10, atol: 1e-12 });
    expect(sol.status).toBe('success');
    const ts = Array.from(sol.t);
    expect(ts).toContain(on);
    expect(ts).toContain(off);
    let worst = 0;
    sol.t.forEach((t, k) => (worst = Math.max(worst, Math.abs(sol.y[k]![0]! - exact(t)))));
    expect(worst).toBeLessThan(WORST_PULSE);
    // Without the breakpoints the discontinuities cost rejected steps (measured 46 vs 2) and accuracy.
    expect(sol.stats.rejectedSteps).toBeLessThanOrEqual(4);
    expect(blind.stats.rejectedSteps).toBeGreaterThan(5 * sol.stats.rejectedSteps);
    expect(sol.stats.acceptedSteps).toBeLessThan(blind.stats.acceptedSteps);
  });

  it('re-initialises the algebraic unknowns at a breakpoint: a 5 V step into an RC (DAE form) matches its closed form', () => {
    // C v1' = (v2 - v1)/R, 0 = v2 - u(t), u = 5 V from t = 1 ms (R C = 1 ms). DERIVED:
    // v1 = 0 before, 5 (1 - exp(-(t - 1 ms)/RC)) after; v2 jumps from 0 to 5 at the breakpoint.
    const R = 1e3;
    const C = 1e-6;
    const tb = 1e-3;
    const exact = (t: number): number => (t < tb ? 0 : 5 * (1 - Math.exp(-(t - tb) / (R * C))));
    const step: DaeProblem = {
      size: 2,
      y0: [0, 0],
      t0: 0,
      tEnd: 5e-3,
      mass: [[C, 0], [0, 0]],
      breakpoints: [tb],
      rhs: (t, y, out) => {
        out[0] = (y[1]! - y[0]!) / R;
        out[1] = y[1]! - (t >= tb ? 5 : 0);
      },
    };
    const sol = solveDae(step, { rtol: 1e-8, atol: 1e-10 });
    expect(sol.status).toBe('success');
    const k = Array.from(sol.t).indexOf(tb);
    expect(sol.t[k + 1]).toBe(tb); // left and right limits
    expect(sol.y[k]![1]).toBe(0);
    expect(sol.y[k + 1]![1]!).toBeCloseTo(5, 12);
    expect(sol.at(tb)[1]!).toBeCloseTo(5, 12);
    let worst = 0;
    sol.t.forEach((t, i) => (worst = Math.max(worst, Math.abs(sol.y[i]![0]! - exact(t)))));
    expect(worst).toBeLessThan(1e-7); // measured 7.2e-9
    expect(sol.stats.rejectedSteps).toBeLessThan(10); // measured 3 (28 without the breakpoint)
  });

  it('locates events on the dense output: y1 = sin t crosses 0.5 at pi/6 + 2k pi (rising) and 5pi/6 + 2k pi (falling)', () => {
    // Harmonic oscillator y1' = y2, y2' = -y1, y(0) = (0, 1): y1 = sin t exactly (DERIVED).
    const problem: DaeProblem = {
      size: 2,
      y0: [0, 1],
      t0: 0,
      tEnd: 13,
      rhs: (_t, y, out) => {
        out[0] = y[1]!;
        out[1] = -y[0]!;
      },
      events: [
        { name: 'up', fn: (_t, y) => y[0]! - 0.5, direction: 1 },
        { name: 'down', fn: (_t, y) => y[0]! - 0.5, direction: -1 },
        { name: 'any', fn: (_t, y) => y[0]! - 0.5 },
      ],
    };
    const sol = solveDae(problem, { rtol: 1e-11, atol: 1e-12, eventTolerance: 1e-13 });
    expect(sol.status).toBe('success');
    const times = (name: string): number[] => sol.events.filter((e) => e.name === name).map((e) => e.t);
    const up = [Math.PI / 6, Math.PI / 6 + 2 * Math.PI];
    const down = [(5 * Math.PI) / 6, (5 * Math.PI) / 6 + 2 * Math.PI];
    expect(times('up').length).toBe(2);
    expect(times('down').length).toBe(2);
    expect(times('any').length).toBe(4);
    times('up').forEach((t, k) => expect(Math.abs(t - up[k]!)).toBeLessThan(1e-9));
    times('down').forEach((t, k) => expect(Math.abs(t - down[k]!)).toBeLessThan(1e-9));
    for (const e of sol.events) expect(e.y[0]!).toBeCloseTo(0.5, 9);
    // In time order.
    const all = sol.events.map((e) => e.t);
    expect(all).toEqual([...all].sort((a, b) => a - b));
  });

  it('stops at a terminal event with status terminal-event, the event point as last point', () => {
    // y' = 1, y(0) = 0: y reaches 0.75 at t = 0.75 exactly.
    const sol = solveDae(
      {
        size: 1,
        y0: [0],
        t0: 0,
        tEnd: 2,
        rhs: (_t, _y, out) => {
          out[0] = 1;
        },
        events: [{ name: 'threshold', fn: (_t, y) => y[0]! - 0.75, terminal: true }],
      },
      { rtol: 1e-10, atol: 1e-12 },
    );
    expect(sol.status).toBe('terminal-event');
    expect(sol.message).toMatch(/threshold/);
    expect(sol.events.length).toBe(1);
    expect(sol.events[0]!.t).toBeCloseTo(0.75, 11);
    expect(sol.tReached).toBe(sol.events[0]!.t);
    expect(sol.t[sol.t.length - 1]).toBe(sol.tReached);
    expect(sol.y[sol.y.length - 1]![0]!).toBeCloseTo(0.75, 11);
    expect(sol.failure).toBeUndefined();
  });

  it('agrees with odex (Hairer\'s extrapolation code, npm odex 2.0.4) on non-stiff problems at tight tolerance', () => {
    // Lotka-Volterra and the Euler rigid body (Hairer, Norsett and Wanner I, sect. II.10; FROM MEMORY: the
    // comparison needs no published value, only the same equations in both solvers).
    const cases: { n: number; y0: number[]; tEnd: number; f: (t: number, y: ArrayLike<number>) => number[] }[] = [
      { n: 2, y0: [1, 1], tEnd: 15, f: (_t, y) => [1.5 * y[0]! - y[0]! * y[1]!, -3 * y[1]! + y[0]! * y[1]!] },
      { n: 3, y0: [1, 0, 0.9], tEnd: 20, f: (_t, y) => [-2 * y[1]! * y[2]!, 1.25 * y[0]! * y[2]!, -0.5 * y[0]! * y[1]!] },
    ];
    for (const c of cases) {
      const odex = new Solver(c.n);
      odex.relativeTolerance = 1e-13;
      odex.absoluteTolerance = 1e-13;
      odex.maxSteps = 100000;
      const ref = odex.solve((t, y) => c.f(t, y), 0, c.y0, c.tEnd);
      expect(ref.outcome).toBe(0);
      const sol = solveDae(
        {
          size: c.n,
          y0: c.y0,
          t0: 0,
          tEnd: c.tEnd,
          rhs: (t, y, out) => out.set(c.f(t, y)),
        },
        { rtol: 1e-12, atol: 1e-12 },
      );
      expect(sol.status).toBe('success');
      const y = sol.y[sol.y.length - 1]!;
      for (let i = 0; i < c.n; i++) expect(Math.abs(y[i]! - ref.y[i]!)).toBeLessThan(1e-9 * Math.max(1, Math.abs(ref.y[i]!)));
    }
  });

  it('calls onProgress with a growing fraction, throttled by progressIntervalMs', () => {
    const { problem } = stiffScalar(1e3, 0, 10);
    const seen: number[] = [];
    solveDae(problem, { rtol: 1e-10, onProgress: (p) => seen.push(p.fraction), progressIntervalMs: 0 });
    expect(seen.length).toBeGreaterThan(5);
    expect(seen).toEqual([...seen].sort((a, b) => a - b));
    expect(seen[seen.length - 1]).toBe(1);
    const few: number[] = [];
    solveDae(problem, { rtol: 1e-10, onProgress: (p) => few.push(p.fraction), progressIntervalMs: 60_000 });
    expect(few.length).toBeLessThanOrEqual(1);
  });

  it('gives the same answer with the ml-matrix kernels as with the flat kernels', () => {
    const { problem } = stiffScalar(1e4, 1, 3);
    const a = solveDae(problem, { rtol: 1e-9 });
    const b = solveDae(problem, { rtol: 1e-9, linearAlgebra: 'ml-matrix' });
    expect(b.t.length).toBe(a.t.length);
    expect(b.y[b.y.length - 1]![0]!).toBeCloseTo(a.y[a.y.length - 1]![0]!, 12);
  });
});
