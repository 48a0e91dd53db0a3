/**
 * The reduced formulation copies a step without the algebraic unknowns'
 * values at its two inner collocation nodes (each an evaluation of f): they
 * are solved when read, from a sample inside the step during the run, or
 * from a kept step (a reader of the last step, dense output, the energy
 * audit) under the inputs and expansion map the step was taken with. The
 * reference is the eager copy of the same step, and a run whose samples
 * are the same either way: deferring the same computation must not change a
 * bit (common practice for a lazy evaluation: the same function of the same
 * arguments). Values invented for the tests.
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, MU0, pulse, type MaterialLaw } from '../../src/index.js';
import { acceptNetwork } from '../../src/simulation/accept-network.js';
import { NetworkRun } from '../../src/simulation/network-run.js';
import type { SampleRecord } from '../../src/simulation/sample-record.js';
import { affinePartition, expandFromRhs, type AffinePartition } from '../../src/solver/affine-elimination.js';
import { createReducedIntegrator, InnerNodes } from '../../src/solver/reduced-integrator.js';

/** A saturating law of our own (the flux walk's, bench/flux-walk.ts): H(B) = B/(mu0 2000) + 2 sinh(B/0.04). */
const walkLaw: MaterialLaw = {
  name: 'walk law',
  fieldStrength: (b) => b / (MU0 * 2000) + 2 * Math.sinh(b / 0.04),
  fieldSlope: (b) => 1 / (MU0 * 2000) + (2 / 0.04) * Math.cosh(b / 0.04),
  energyDensity: (b) => (b * b) / (2 * MU0 * 2000) + 2 * 0.04 * (Math.cosh(b / 0.04) - 1),
};

/** A square wave on a winding through a series resistor (the winding's current and the node potentials are algebraic). */
function walk() {
  const net = createNetwork('deferred nodes');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.025, area: 1e-4, material: walkLaw });
  net.fluxTube('rest', { from: m2, to: m1, length: 0.025, area: 1e-4, material: walkLaw });
  const s = net.node('s');
  const d = net.node('d');
  net.voltageSource('drive', s, net.ground, pulse({ low: -12, high: 12, period: 1e-5, duty: 0.52 }));
  net.resistor('series', s, d, 0.25);
  net.winding('coil', { tube: leg, turns: 20, resistance: 0.5, plus: d, minus: net.ground });
  return net;
}

/** The bits of a record's samples (times, intervals and states). */
function sampleBits(r: SampleRecord): Uint8Array {
  const out: number[] = [];
  for (let k = 0; k < r.length; k++) out.push(r.time(k), r.interval(k), ...r.state(k, new Float64Array(r.size)));
  return new Uint8Array(Float64Array.from(out).buffer);
}

/** The bits of a step's span, start state and polynomial. */
function stepBits(step: { tOld: number; t: number; h: number; yOld: Float64Array; q: Float64Array }): Uint8Array {
  return new Uint8Array(Float64Array.from([step.tOld, step.t, step.h, ...step.yOld, ...step.q]).buffer);
}

describe("formulation 'reduced': the inner nodes' algebraic values computed when read", () => {
  const horizon = 20e-5;
  // Samples off the step ends (inside steps), and a stop in mid-run where the last step is read.
  const sampleTimes = Array.from({ length: 23 }, (_, k) => (horizon * (k + 0.5)) / 23);
  const runWith = (interpolants: boolean) => {
    const run = new NetworkRun(acceptNetwork(walk(), 'test').compiled, { t0: 0, horizon, rtol: 1e-6, atol: 1e-6, formulation: 'reduced' });
    run.advanceTo(horizon / 2, { steps: false, interpolants, sampleTimes });
    const middle = stepBits(run.lastStep()!);
    run.advanceTo(horizon, { steps: true, interpolants, sampleTimes });
    return { run, middle, last: stepBits(run.lastStep()!) };
  };
  const kept = runWith(true);
  const streamed = runWith(false);

  it('samples inside steps and at step ends are the same bits as when every step is kept', () => {
    expect(streamed.run.status).toBe('success');
    expect(streamed.run.sampleRecord.length).toBeGreaterThan(23);
    expect(Buffer.compare(sampleBits(streamed.run.sampleRecord), sampleBits(kept.run.sampleRecord))).toBe(0);
  });

  it('the last step read in mid-run and at the end is the same bits, with no value left out', () => {
    expect(Buffer.compare(streamed.middle, kept.middle)).toBe(0);
    expect(Buffer.compare(streamed.last, kept.last)).toBe(0);
    expect(new Float64Array(streamed.last.buffer).every(Number.isFinite)).toBe(true);
  });

  it('a streamed run and one keeping every step take the same steps and Newton iterations', () => {
    const a = kept.run.stats;
    const b = streamed.run.stats;
    expect(b.acceptedSteps).toBe(a.acceptedSteps);
    expect(b.newtonIterations).toBe(a.newtonIterations);
    expect(b.jacobianEvaluations).toBe(a.jacobianEvaluations);
  });
});

describe('the reduced integrator: a step copied in the deferred form and completed', () => {
  // An index-1 DAE of our own, affine in its algebraic unknown: y0' = -y0 + y1, 0 = y1 - sin(50 t) - 0.5 y0.
  const problem = {
    size: 2,
    mass: Float64Array.of(1, 0, 0, 0),
    y0: [1, 0.5],
    t0: 0,
    tEnd: 0.2,
    rhs: (t: number, y: Float64Array, out: Float64Array) => {
      out[0] = -y[0]! + y[1]!;
      out[1] = y[1]! - Math.sin(50 * t) - 0.5 * y[0]!;
    },
    jacobian: (_t: number, _y: Float64Array, out: Float64Array) => {
      out.set([-1, 1, -0.5, 1]);
    },
  };

  it('gives the eager copy bit for bit, by the integrator and by the expansion from the kept map', () => {
    const split = affinePartition(problem.mass, 2) as AffinePartition;
    const integ = createReducedIntegrator(problem, split, { rtol: 1e-6 });
    const nodes = new InnerNodes(split);
    const f = new Float64Array(2);
    const y = new Float64Array(2);
    let steps = 0;
    while (integ.status === 'running' && steps < 40) {
      expect(integ.step().status).toBe('accepted');
      steps++;
      const eager = integ.copyInterpolantInto(new Float64Array(2), new Float64Array(6))!;
      const deferred = integ.copyInterpolantInto(new Float64Array(2), new Float64Array(6), true)!;
      // The deferred form: the algebraic unknown's coefficient rows 1 and 2 are NaN until completed.
      expect(Number.isNaN(deferred.q[2 + 1]!)).toBe(true);
      const later = { ...deferred, yOld: deferred.yOld.slice(), q: deferred.q.slice() };
      integ.completeInside(deferred);
      expect(Buffer.compare(Buffer.from(deferred.q.buffer), Buffer.from(eager.q.buffer))).toBe(0);
      expect(Buffer.compare(Buffer.from(deferred.yOld.buffer), Buffer.from(eager.yOld.buffer))).toBe(0);
      // As a kept step is completed: f at (y_D, 0) by the problem itself, then y_A = Q f.
      const map = integ.expansionMap;
      nodes.complete(later, (t, yD, out) => {
        y[0] = yD[0]!;
        y[1] = 0;
        problem.rhs(t, y, f);
        expandFromRhs(split, map, yD, f, out);
      });
      expect(Buffer.compare(Buffer.from(later.q.buffer), Buffer.from(eager.q.buffer))).toBe(0);
    }
    expect(steps).toBeGreaterThan(5);
  });
});
