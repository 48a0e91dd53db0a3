/**
 * A full diode bridge with a capacitor-input filter (values invented for
 * the test), against two outside references:
 *
 * 1. The textbook capacitor-input filter relations for ideal diodes fed by
 *    a stiff source (Mohan, Undeland and Robbins, Power Electronics:
 *    Converters, Applications, and Design, ch. 5, line-frequency diode
 *    rectifiers; Sedra and Smith, Microelectronic Circuits, the peak
 *    rectifier; from memory), with the two conducting diodes' forward
 *    voltage: while they conduct the output is v = Vm sin(theta) - 2 Vf;
 *    they stop when the capacitor and load current reaches zero,
 *    w C Vm cos(theta) + (Vm sin(theta) - 2 Vf)/R = 0 (theta_off; without
 *    the drop the familiar pi - atan(w R C)); the capacitor then
 *    discharges as v(theta_off) exp(-(theta - theta_off)/(w R C)) until
 *    Vm |sin(theta)| - 2 Vf meets it again at theta_on; the peak is
 *    Vm - 2 Vf (the crest), the ripple the peak minus the voltage at
 *    theta_on, the conduction angle theta_off - theta_on. The common
 *    approximation dV = (Vm - 2 Vf)/(2 f R C) overestimates the ripple (it
 *    assumes discharge over the whole half period): 1.86 V against 1.5 V.
 * 2. odex (Hairer's extrapolation code) integrating the same piecewise
 *    circuit written by hand: C v' = max(0, (|vs| - 2 Vf - v)/(2 Ron)) - v/R.
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine } from '../../src/index.js';
import { acceptNetwork } from '../../src/simulation/accept-network.js';
import { NetworkRun } from '../../src/simulation/network-run.js';
import { Solver } from '../support/odex.js';

const Vm = 20;
const f = 50;
const w = 2 * Math.PI * f;
const Vf = 0.7;
/** On-resistance of the odex comparison; the textbook one uses 1e-4 ohm (its relations assume a stiff path: 2 Ron C = 0.2 us of lag). */
const Ron = 0.01;
const C = 1000e-6;
const R = 100;
const Vp = Vm - 2 * Vf;

function bridge(ron = Ron) {
  const net = createNetwork('bridge rectifier');
  const a = net.node('a');
  const b = net.node('b');
  const p = net.node('p');
  net.voltageSource('source', a, b, sine({ amplitude: Vm, frequency: f }));
  const opts = { forwardVoltage: Vf, onResistance: ron };
  net.diode('D1', a, p, opts);
  net.diode('D2', b, p, opts);
  net.diode('D3', net.ground, a, opts);
  net.diode('D4', net.ground, b, opts);
  const cap = net.capacitor('filter', p, net.ground, C);
  net.resistor('load', p, net.ground, R);
  return { net, cap };
}

/** The textbook steady state: turn-off and turn-on angles, peak and trough (see the header). */
function textbook(): { thetaOff: number; thetaOn: number; peak: number; trough: number } {
  const bisect = (g: (theta: number) => number, lo: number, hi: number): number => {
    const sLo = Math.sign(g(lo));
    for (let k = 0; k < 200; k++) {
      const mid = 0.5 * (lo + hi);
      if (Math.sign(g(mid)) === sLo) lo = mid;
      else hi = mid;
    }
    return 0.5 * (lo + hi);
  };
  // Turn-off after the crest: the diode current w C Vm cos + (Vm sin - 2 Vf)/R falls to zero.
  const thetaOff = bisect((th) => w * C * Vm * Math.cos(th) + (Vm * Math.sin(th) - 2 * Vf) / R, Math.PI / 2, Math.PI);
  const vOff = Vm * Math.sin(thetaOff) - 2 * Vf;
  const cap = (theta: number): number => vOff * Math.exp(-(theta - thetaOff) / (w * R * C));
  // Turn-on in the next half period: Vm |sin| - 2 Vf rises to meet the decaying capacitor voltage.
  const on = bisect((th) => Math.abs(Vm * Math.sin(th)) - 2 * Vf - cap(th), Math.PI, Math.PI * 1.5);
  return { thetaOff, thetaOn: on - Math.PI, peak: Vp, trough: cap(on) };
}

describe('ideal diodes: full bridge with a capacitor-input filter', () => {
  const periods = 8;

  it('turn-off angle, conduction angle and ripple match the textbook relations (steady state)', () => {
    const { net, cap } = bridge(1e-4);
    const run = new NetworkRun(acceptNetwork(net, 'test').compiled, { t0: 0, horizon: periods / f, rtol: 1e-6, atol: 1e-6 });
    run.advanceTo(periods / f, { steps: true, interpolants: false });
    expect(run.t).toBe(periods / f);
    const ref = textbook();
    // The last positive half period: the pair's turn-on is the last change to 'on' before the crest
    // (a diode of the pair may have stayed on since the last half period, carrying no current: an
    // ideal diode at zero current is consistent either way), its turn-off the first change to 'off' after.
    const angle = (t: number): number => w * t - 2 * Math.PI * (periods - 1);
    const last = run.deviceChanges.filter((c) => c.t > (periods - 1) / f && c.t < (periods - 0.5) / f);
    const on = last.filter((c) => c.on && angle(c.t) < Math.PI / 2).at(-1)!;
    const off = last.find((c) => !c.on && angle(c.t) > Math.PI / 2)!;
    expect(angle(on.t)).toBeCloseTo(ref.thetaOn, 2);
    expect(angle(off.t)).toBeCloseTo(ref.thetaOff, 2);
    expect(angle(off.t) - angle(on.t)).toBeCloseTo(ref.thetaOff - ref.thetaOn, 2);
    const capIndex = acceptNetwork(net, 'test').compiled.layout.potential[3]!; // node p
    const late = run.samples.filter((s) => s.t > (periods - 1) / f);
    const v = late.map((s) => s.y[capIndex]!);
    // Peak within 0.05 V (1e-4 ohm drops a few tenths of a mV; the crest is between samples).
    expect(Math.max(...v)).toBeCloseTo(ref.peak, 1);
    const ripple = Math.max(...v) - Math.min(...v);
    expect(Math.abs(ripple - (ref.peak - ref.trough)) / (ref.peak - ref.trough)).toBeLessThan(0.01);
    expect(cap.name).toBe('filter');
  });

  it('agrees with odex integrating the same piecewise circuit', () => {
    const { net, cap } = bridge();
    const odex = new Solver(1);
    odex.absoluteTolerance = 1e-12;
    odex.relativeTolerance = 1e-10;
    odex.denseOutput = true;
    odex.maxSteps = 1e7;
    const rhs = (t: number, y: number[]): number[] => {
      const rect = Math.abs(Vm * Math.sin(w * t)) - 2 * Vf;
      const charge = Math.max(0, (rect - y[0]!) / (2 * Ron));
      return [(charge - y[0]! / R) / C];
    };
    const ref: number[] = [];
    const times: number[] = [];
    const done = odex.solve(rhs, 0, [0], 2 / f, odex.grid(2 / (80 * f), (x: number, y: number[]) => {
      times.push(x);
      ref.push(y[0]!);
    }));
    expect(done.outcome).toBe(0);
    expect(times.length).toBeGreaterThan(70);
    const r = simulate(net, { stopTime: 2 / f, sampling: { times } });
    expect(r.status).toBe('success');
    const ours = r.voltage(cap);
    let worst = 0;
    ours.forEach((v, k) => (worst = Math.max(worst, Math.abs(v - ref[k]!))));
    // rtol 1e-6 on an 18 V output, plus the leakage of the blocking diodes (1e-9 S) the hand ODE omits.
    expect(worst).toBeLessThan(1e-3);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });
});
