/**
 * The flux walk of the performance work through the public API: a winding
 * of 20 turns and 0.5 ohm on a saturating core, driven by a +/-12 V square
 * wave at 100 kHz with duty 0.52, so the flux walks up by the duty's
 * imbalance until the resistive drop of the saturating current stops it
 * (test values of our own, those of bench/flux-walk.ts). Every drive edge
 * is a restart of the solver. Reference: odex (Hairer's extrapolation code)
 * integrating the same physics written by hand as one ODE in the flux,
 *   N dphi/dt = v - R i,  i = le H(phi/A)/N  (Faraday's and Ampere's laws),
 * restarted at every edge.
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, MU0, pulse, simulate, type MaterialLaw } from '../../src/index.js';
import { Solver } from '../support/odex.js';

const turns = 20;
const resistance = 0.5;
const length = 0.025; // each of the two tubes: le = 0.05 m
const area = 1e-4;
const period = 1e-5;
const duty = 0.52;
const periods = 300;
/** Invented saturating law, H(B) = B/(mu0 2000) + 2 sinh(B/0.04). */
const field = (b: number): number => b / (MU0 * 2000) + 2 * Math.sinh(b / 0.04);
const law: MaterialLaw = {
  name: 'walk law',
  fieldStrength: field,
  fieldSlope: (b) => 1 / (MU0 * 2000) + (2 / 0.04) * Math.cosh(b / 0.04),
  energyDensity: (b) => (b * b) / (2 * MU0 * 2000) + 2 * 0.04 * (Math.cosh(b / 0.04) - 1),
};

/** odex over each half period in turn: the flux at the end of every period. */
function reference(): number[] {
  let phi = [0];
  const ends: number[] = [];
  for (let k = 0; k < periods; k++) {
    for (const [a, b, v] of [
      [k * period, (k + duty) * period, 12],
      [(k + duty) * period, (k + 1) * period, -12],
    ] as const) {
      const odex = new Solver(1);
      odex.absoluteTolerance = 1e-16;
      odex.relativeTolerance = 1e-12;
      odex.maxSteps = 1e6;
      const r = odex.solve((_t: number, y: number[]) => [(v - (resistance * 2 * length * field(y[0]! / area)) / turns) / turns], a, phi, b);
      expect(r.outcome).toBe(0);
      phi = r.y;
    }
    ends.push(phi[0]!);
  }
  return ends;
}

function fluxWalk() {
  const net = createNetwork('flux walk');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length, area, material: law });
  net.fluxTube('rest', { from: m2, to: m1, length, area, material: law });
  const d = net.node('drive');
  net.voltageSource('drive', d, net.ground, pulse({ low: -12, high: 12, period, duty }));
  net.winding('coil', { tube: leg, turns, resistance, plus: d, minus: net.ground });
  return { net, leg };
}

describe('flux walk: a restart at every drive edge', () => {
  it('walks as odex integrates the one-unknown ODE, at three f evaluations and one J per restart', () => {
    const { net, leg } = fluxWalk();
    const times = Array.from({ length: periods }, (_, k) => (k + 1) * period);
    const r = simulate(net, { stopTime: periods * period, rtol: 1e-6, sampling: { times } });
    expect(r.status).toBe('success');
    const phi = r.flux(leg);
    const ref = reference();
    let worst = 0;
    for (let k = 0; k < periods; k++) {
      // A sample on a drive edge is recorded on both sides of it; the flux is continuous there.
      const at = r.time.indexOf(times[k]!);
      expect(at).toBeGreaterThanOrEqual(0);
      worst = Math.max(worst, Math.abs(phi[at]! - ref[k]!) / Math.abs(ref[periods - 1]!));
    }
    // rtol 1e-6 is about 1e-5 relative per step in radau5's controller (rtol' = 0.1 rtol^(2/3)); measured 4e-8.
    expect(worst).toBeLessThan(1e-5);
    // The walk really walked into the knee: B about 0.19 T at the end (0.09 T after 40 periods).
    expect(ref[periods - 1]! / area).toBeGreaterThan(0.18);
    // f per Newton iteration 3 (one per stage), per accepted step 1 (at its end), per restart 3 (before and
    // after the algebraic re-solve, and df/dt for y'), plus the start (measured 9: the first initialisation).
    // Measured 1809 = 3 x 600 + 9 (before: 4 per restart, 2409).
    const s = r.stats;
    const restarts = 2 * periods;
    const beyond = s.rhsEvaluations - 3 * s.newtonIterations - s.acceptedSteps;
    expect(beyond).toBeLessThanOrEqual(3 * restarts + 10);
    expect(s.jacobianEvaluations).toBeLessThanOrEqual(restarts + s.acceptedSteps);
    expect(s.rejectedSteps).toBe(0);
  });
});
