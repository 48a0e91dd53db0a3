import { describe, expect, it } from 'vitest';
import { createDaeIntegrator, InputError, solveDae, type DaeProblem } from '../../src/index.js';

/** y' = u - y with a set-point u the caller may change; y(0) = 0. DERIVED: y = u (1 - exp(-t)) for constant u. */
function firstOrder(): { problem: DaeProblem; setU: (u: number) => void } {
  let u = 1;
  return {
    problem: {
      size: 1,
      y0: [0],
      t0: 0,
      tEnd: 5,
      rhs: (_t, y, out) => {
        out[0] = u - y[0]!;
      },
    },
    setU: (v) => {
      u = v;
    },
  };
}

describe('createDaeIntegrator', () => {
  it('step() takes one accepted step at a time and reports success at tEnd', () => {
    const { problem } = firstOrder();
    const integ = createDaeIntegrator(problem, { rtol: 1e-10, atol: 1e-12 });
    expect(integ.t).toBe(0);
    expect(integ.status).toBe('running');
    let steps = 0;
    let last = integ.t;
    while (integ.status === 'running') {
      const r = integ.step();
      expect(r.status).toBe('accepted');
      expect(integ.t).toBeGreaterThan(last);
      last = integ.t;
      steps++;
    }
    expect(integ.status).toBe('success');
    expect(integ.t).toBe(5);
    expect(integ.stats.acceptedSteps).toBe(steps);
    expect(integ.y[0]!).toBeCloseTo(1 - Math.exp(-5), 9);
    expect(integ.step().status).toBe('success'); // nothing left to do
  });

  it('advanceTo(t) lands exactly on t (a stop time) and interpolate() works within the last step', () => {
    const { problem } = firstOrder();
    const integ = createDaeIntegrator(problem, { rtol: 1e-10, atol: 1e-12 });
    const stop = 0.1 + 0.2; // not representable exactly: must still be hit bit-exactly
    expect(integ.advanceTo(stop).status).toBe('success');
    expect(integ.t).toBe(stop);
    expect(integ.y[0]!).toBeCloseTo(1 - Math.exp(-stop), 10);
    const it = integ.interpolant!;
    const mid = 0.5 * (it.tOld + it.t);
    expect(integ.interpolate(mid)[0]!).toBeCloseTo(1 - Math.exp(-mid), 8);
    expect(() => integ.interpolate(it.t + 1)).toThrow(InputError);
    expect(() => integ.advanceTo(0.1)).toThrow(InputError); // behind us
    expect(() => integ.advanceTo(6)).toThrow(InputError); // past tEnd
  });

  it('restart() after a set-point change continues from the present state (piecewise closed form)', () => {
    // u = 1 on [0, 1), u = -2 after: y(1) = 1 - e^-1; then y = -2 + (y(1) + 2) exp(-(t - 1)). DERIVED.
    const { problem, setU } = firstOrder();
    const integ = createDaeIntegrator(problem, { rtol: 1e-10, atol: 1e-12 });
    integ.advanceTo(1);
    const y1 = 1 - Math.exp(-1);
    expect(integ.y[0]!).toBeCloseTo(y1, 10);
    setU(-2);
    expect(integ.restart()).toBe('running');
    expect(integ.interpolant).toBeUndefined();
    integ.advanceTo(3);
    expect(integ.y[0]!).toBeCloseTo(-2 + (y1 + 2) * Math.exp(-2), 9);
  });

  it('restart(y) replaces the state and re-initialises consistently (algebraic unknown recomputed)', () => {
    // y1' = -y1, 0 = y2 - 2 y1.
    const integ = createDaeIntegrator({
      size: 2,
      y0: [1, 2],
      t0: 0,
      tEnd: 2,
      mass: [[1, 0], [0, 0]],
      rhs: (_t, y, out) => {
        out[0] = -y[0]!;
        out[1] = y[1]! - 2 * y[0]!;
      },
    });
    integ.advanceTo(0.5);
    integ.restart([3, 0]);
    expect(integ.y[1]!).toBeCloseTo(6, 10);
    integ.advanceTo(1.5);
    expect(integ.y[0]!).toBeCloseTo(3 * Math.exp(-1), 5);
  });

  it('snapshot()/restore() replays the same trajectory bit for bit (what-if runs)', () => {
    const { problem } = firstOrder();
    const integ = createDaeIntegrator(problem, { rtol: 1e-8 });
    integ.advanceTo(1);
    const snap = structuredClone(integ.snapshot());
    integ.advanceTo(4);
    const firstRun = { t: integ.t, y: integ.y[0], stats: integ.stats };
    integ.restore(snap);
    expect(integ.t).toBe(1);
    integ.advanceTo(4);
    expect(integ.t).toBe(firstRun.t);
    expect(integ.y[0]).toBe(firstRun.y);
    // LU factors are rebuilt after restore, the rest of the work is identical.
    expect(integ.stats.acceptedSteps).toBe(firstRun.stats.acceptedSteps);
  });

  it('snapshot()/restore() lets one integrator explore two set-points from the same state', () => {
    const { problem, setU } = firstOrder();
    const integ = createDaeIntegrator(problem, { rtol: 1e-10, atol: 1e-12 });
    integ.advanceTo(1);
    const snap = integ.snapshot();
    const results: number[] = [];
    for (const u of [0, 3]) {
      integ.restore(snap);
      setU(u);
      integ.restart();
      integ.advanceTo(2);
      results.push(integ.y[0]!);
    }
    const y1 = 1 - Math.exp(-1);
    expect(results[0]!).toBeCloseTo(y1 * Math.exp(-1), 9);
    expect(results[1]!).toBeCloseTo(3 + (y1 - 3) * Math.exp(-1), 9);
  });

  it('solveDae is a loop over the integrator: same accepted points', () => {
    const { problem } = firstOrder();
    const integ = createDaeIntegrator(problem, { rtol: 1e-7 });
    const ts = [integ.t];
    while (integ.status === 'running') {
      integ.step();
      ts.push(integ.t);
    }
    expect(Array.from(solveDae(problem, { rtol: 1e-7 }).t)).toEqual(ts);
  });

  it('after a terminal event, step() continues from the event point', () => {
    const integ = createDaeIntegrator(
      {
        size: 1,
        y0: [0],
        t0: 0,
        tEnd: 3,
        rhs: (_t, _y, out) => {
          out[0] = 1;
        },
        events: [{ name: 'one', fn: (_t, y) => y[0]! - 1, terminal: true }],
      },
      { rtol: 1e-10 },
    );
    const r = integ.advanceTo(3);
    expect(r.status).toBe('terminal-event');
    expect(integ.t).toBeCloseTo(1, 11);
    expect(integ.advanceTo(3).status).toBe('success');
    expect(integ.y[0]!).toBeCloseTo(3, 10);
  });
});
