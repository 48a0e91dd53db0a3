/**
 * Inputs as values (issue 11, defects 1 and 3): the inputs in force travel
 * with each evaluation and are recorded per interval, so a result read at
 * any time uses the inputs in force then, and no reader changes a live run.
 */
import { describe, expect, it } from 'vitest';
import { constant, createNetwork, createStepper, MU0, sine } from '../../src/index.js';

// A switch closing at 2 ms connects a 50 Hz sine to a winding on a linear core (an RL circuit with
// L = N^2 / R_m, magnetic circuit law). Test values of our own.
const N = 100;
const AREA = 1e-3;
const MUR = 2000;
const PATH = 0.3;
const L = (N * N) / (PATH / (MU0 * MUR * AREA));
const R = 5;
const V = 10;
const W = 2 * Math.PI * 50;
const T_CLOSE = 2e-3;

function switched() {
  const net = createNetwork('switched rl');
  const [top, bottom] = [net.magneticNode('top'), net.magneticNode('bottom')];
  const material = { kind: 'linear', relativePermeability: MUR } as const;
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: PATH / 2, area: AREA, material });
  net.fluxTube('yoke', { from: top, to: bottom, length: PATH / 2, area: AREA, material });
  const [a, b] = [net.node('a'), net.node('b')];
  net.voltageSource('mains', a, net.ground, sine({ amplitude: V, frequency: 50 }));
  const sw = net.switch('breaker', a, b, { closed: false, onResistance: 1e-6, offResistance: 1e9, schedule: [{ time: T_CLOSE, closed: true }] });
  const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: b, minus: net.ground });
  return { net, sw, coil };
}

/**
 * Series RL switched onto V sin(w t) at t0 from zero current (circuits textbook, complete response;
 * derived): i = V/Z [sin(w t - theta) - sin(w t0 - theta) exp(-(t - t0) R / L)], Z = |R + j w L|.
 */
function closedForm(t: number): number {
  const Rt = R + 1e-6;
  const Z = Math.hypot(Rt, W * L);
  const theta = Math.atan2(W * L, Rt);
  return (V / Z) * (Math.sin(W * t - theta) - Math.sin(W * T_CLOSE - theta) * Math.exp((-(t - T_CLOSE) * Rt) / L));
}

describe('inputs as values', () => {
  it('reading a past result does not change the live run: a switch closed at 2 ms keeps conducting (defect 1)', () => {
    const { net, sw, coil } = switched();
    const stepper = createStepper(net, { horizon: 0.02, rtol: 1e-9 });
    stepper.advanceTo(5e-3);
    // Read the history at 1 ms, while the switch was open.
    const before = stepper.result().evaluator({ quantity: 'current', handle: sw })(1e-3);
    expect(Math.abs(before)).toBeLessThan(1e-6);
    stepper.advanceTo(0.015);
    const scale = V / Math.hypot(R, W * L);
    expect(Math.abs(stepper.current(coil) - closedForm(0.015))).toBeLessThan(1e-6 * scale);
    expect(Math.abs(stepper.current(sw) - closedForm(0.015))).toBeLessThan(1e-6 * scale);
    // And the history read after the run says the same at 15 ms and still says "open" at 1 ms.
    const history = stepper.result();
    expect(Math.abs(history.evaluator({ quantity: 'current', handle: sw })(0.015) - closedForm(0.015))).toBeLessThan(1e-5 * scale);
    expect(Math.abs(history.evaluator({ quantity: 'current', handle: sw })(1e-3))).toBeLessThan(1e-6);
  });

  it('a stepper set-point is recorded with its interval: 10 V held 0.5 s on 10 ohm audits 5 J (defect 3)', () => {
    // Joule heating W = V^2 t / R = 100 x 0.5 / 10 = 5 J (Ohm's and Joule's laws).
    const net = createNetwork('set-point');
    const a = net.node('a');
    const supply = net.voltageSource('supply', a, net.ground, constant(0));
    const load = net.resistor('load', a, net.ground, 10);
    const stepper = createStepper(net, { horizon: 1 });
    stepper.setSource(supply, 10);
    stepper.advanceTo(0.5);
    const held = stepper.result().energy();
    expect(held.sourceEnergy).toBeCloseTo(5, 9);
    expect(held.dissipated.resistors).toBeCloseTo(5, 9);
    // Released at 0.5 s (back to the 0 V waveform): the first half keeps its 5 J in the history.
    stepper.setSource(supply, undefined);
    stepper.advanceTo(1);
    const history = stepper.result();
    expect(history.energy().sourceEnergy).toBeCloseTo(5, 9);
    const p = history.power(load);
    const t = history.time;
    for (let k = 0; k < t.length; k++) {
      // At the switching instant 0.5 s the record holds the state before (100 W), then after (0 W).
      if (t[k]! < 0.5 || (t[k] === 0.5 && t[k + 1] === 0.5)) expect(p[k]).toBeCloseTo(10, 9);
      else expect(p[k]).toBeCloseTo(0, 12);
    }
  });
});
