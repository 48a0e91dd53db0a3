/**
 * The smooth exponential (Shockley) junction, i = Is (exp(v_j/(n V_T)) - 1)
 * with the on-resistance in series (v = v_j + Ron i) and the
 * off-conductance in parallel (Shockley's diode law; e.g. Sedra and Smith,
 * Microelectronic Circuits, the diode's exponential model; from memory),
 * against odex (Hairer's extrapolation code) integrating the same half-wave
 * rectifier with a capacitor, written by hand with the junction voltage
 * found by bisection (not the library's Newton). Values invented.
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine } from '../../src/index.js';
import { Solver } from '../support/odex.js';

const Vm = 5;
const f = 1000;
const Is = 1e-12;
const n = 1.5;
const Vt = 0.025852;
const Ron = 0.5;
const Goff = 1e-9;
const C = 10e-6;
const R = 100;

/** Diode current at terminal voltage v: bisection on v_j in [min(v, 0), max(v, 0)] of v_j + Ron Is (exp(v_j/(n Vt)) - 1) = v. */
function diodeCurrent(v: number): number {
  let lo = Math.min(v, 0);
  let hi = Math.max(v, 0);
  for (let k = 0; k < 200; k++) {
    const mid = 0.5 * (lo + hi);
    if (mid + Ron * Is * Math.expm1(mid / (n * Vt)) < v) lo = mid;
    else hi = mid;
  }
  return Is * Math.expm1(0.5 * (lo + hi) / (n * Vt)) + Goff * v;
}

describe('exponential junction', () => {
  it('agrees with odex on a half-wave rectifier with a capacitor', () => {
    const net = createNetwork('smooth rectifier');
    const a = net.node('a');
    const out = net.node('out');
    net.voltageSource('source', a, net.ground, sine({ amplitude: Vm, frequency: f }));
    const d = net.diode('D1', a, out, { junction: 'exponential', saturationCurrent: Is, emissionCoefficient: n, thermalVoltage: Vt, onResistance: Ron, offConductance: Goff });
    const cap = net.capacitor('C', out, net.ground, C);
    net.resistor('load', out, net.ground, R);

    const odex = new Solver(1);
    odex.absoluteTolerance = 1e-12;
    odex.relativeTolerance = 1e-11;
    odex.denseOutput = true;
    odex.maxSteps = 1e7;
    const times: number[] = [];
    const ref: number[] = [];
    const done = odex.solve(
      (t: number, y: number[]) => [(diodeCurrent(Vm * Math.sin(2 * Math.PI * f * t) - y[0]!) - y[0]! / R) / C],
      0, [0], 3 / f,
      odex.grid(3 / (120 * f), (x: number, y: number[]) => {
        times.push(x);
        ref.push(y[0]!);
      }),
    );
    expect(done.outcome).toBe(0);
    const r = simulate(net, { stopTime: 3 / f, rtol: 1e-8, sampling: { times } });
    expect(r.status).toBe('success');
    const v = r.voltage(cap);
    let worst = 0;
    v.forEach((x, k) => (worst = Math.max(worst, Math.abs(x - ref[k]!))));
    // rtol 1e-8 maps to about 2e-7 relative in radau5's controller (rtol' = 0.1 rtol^(2/3)): 1e-5 V on 4 V.
    expect(worst).toBeLessThan(1e-5);
    // No events: the junction is smooth.
    expect(Math.max(...r.current(d))).toBeGreaterThan(0.03);
    // The audit is as good as the run: radau5's effective tolerance rtol' = 0.1 rtol^(2/3) = 4.6e-7.
    expect(r.energy().relativeError).toBeLessThan(0.1 * 1e-8 ** (2 / 3));
  });

  it('carries Is (exp(v/(n V_T)) - 1) at low current, where the series resistance drops nothing (Shockley law)', () => {
    const net = createNetwork('bias');
    const a = net.node('a');
    net.voltageSource('source', a, net.ground, { kind: 'constant', value: 0.3 });
    const d = net.diode('D1', a, net.ground, { junction: 'exponential', saturationCurrent: Is, emissionCoefficient: n, thermalVoltage: Vt, onResistance: Ron, offConductance: Goff });
    const r = simulate(net, { stopTime: 1e-6 });
    const shockley = Is * Math.expm1(0.3 / (n * Vt)) + Goff * 0.3;
    expect(r.current(d)[0]! / shockley).toBeCloseTo(1, 6);
  });
});
