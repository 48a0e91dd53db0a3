/**
 * A smooth exponential junction that a gate-driven switch forces through
 * its knee: a boost stage (supply, inductor, switch to ground, exponential
 * diode into a capacitor and a load; test values of our own) whose node
 * between inductor, switch and diode has no capacitance. At each turn-off
 * the diode's anode swings from about 0 V to above the output within
 * picoseconds, at each turn-on back again; the run must cross these swings
 * and agree with odex (Hairer's extrapolation code) integrating the same
 * circuit written by hand as an ODE in the inductor current and the
 * capacitor voltage, with the node potential and the junction voltage found
 * by bisection (not the library's Newton), restarted at every gate edge.
 * Junction law: Shockley's, i = Is (exp(v_j/(n V_T)) - 1) with the series
 * resistance and the parallel conductance (e.g. Sedra and Smith,
 * Microelectronic Circuits, the diode's exponential model; from memory).
 */
import { describe, expect, it } from 'vitest';
import { constant, createNetwork, pulse, simulate } from '../../src/index.js';
import { Solver } from '../support/odex.js';

const Vs = 5;
const L = 20e-6;
const C = 2e-6;
const R = 20;
const Ron = 0.05; // switch
const Goff = 1e-7; // switch open
const period = 10e-6;
const duty = 0.4;
/** A turn-off at 4 us and a turn-on at 10 us. */
const stop = 12e-6;
const V0 = 8; // initial output: the diode starts reverse biased by 8 V
const junction = { saturationCurrent: 1e-9, emissionCoefficient: 1.5, thermalVoltage: 0.025852, onResistance: 0.02, offConductance: 1e-9 };

/** Root of an increasing function on [lo, hi] by bisection, `halvings` times (a method of its own, not the library's Newton). */
function increasingRoot(g: (x: number) => number, lo: number, hi: number, halvings: number): number {
  for (let k = 0; k < halvings; k++) {
    const mid = 0.5 * (lo + hi);
    if (g(mid) < 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Diode current at terminal voltage v: the junction voltage v_j of v_j + Rs Is (exp(v_j/(n Vt)) - 1) = v, in [min(v, 0), max(v, 0)]. */
function diodeCurrent(v: number): number {
  const { saturationCurrent: Is, emissionCoefficient: n, thermalVoltage: Vt, onResistance: Rs, offConductance: G } = junction;
  // 60 halvings of a bracket below 100 V: 1e-16 V.
  const vj = increasingRoot((x) => x + Rs * Is * Math.expm1(x / (n * Vt)) - v, Math.min(v, 0), Math.max(v, 0), 60);
  return Is * Math.expm1(vj / (n * Vt)) + G * v;
}

/** Potential of the switch node: the inductor current splits into the switch and the diode (both increasing in v). */
function nodePotential(iL: number, vc: number, closed: boolean): number {
  const g = closed ? 1 / Ron : Goff;
  // 52 halvings of 100 V: 2e-14 V.
  return increasingRoot((v) => g * v + diodeCurrent(v - vc) - iL, -20, 80, 52);
}

/** odex over each gate interval in turn, sampled on `times`: [iL, vC] per time. */
function reference(times: readonly number[]): number[][] {
  const out: number[][] = [];
  let y = [0, V0];
  let next = 0;
  const edges: number[] = [];
  for (let k = 0; k * period < stop; k++) edges.push(k * period, (k + duty) * period);
  while (edges[edges.length - 1]! >= stop) edges.pop();
  edges.push(stop);
  for (let e = 0; e + 1 < edges.length; e++) {
    const [a, b] = [edges[e]!, edges[e + 1]!];
    const closed = e % 2 === 0;
    const odex = new Solver(2);
    odex.absoluteTolerance = 1e-10;
    odex.relativeTolerance = 1e-10;
    odex.denseOutput = true;
    odex.maxSteps = 1e7;
    const rhs = (_t: number, s: number[]): number[] => {
      const v = nodePotential(s[0]!, s[1]!, closed);
      return [(Vs - v) / L, (diodeCurrent(v - s[1]!) - s[1]! / R) / C];
    };
    const r = odex.solve(rhs, a, y, b, (_n, _xOld, x, _y, dense) => {
      while (next < times.length && times[next]! <= x) {
        out.push([dense!(0, times[next]!), dense!(1, times[next]!)]);
        next++;
      }
    });
    expect(r.outcome).toBe(0);
    y = r.y;
  }
  return out;
}

function boost() {
  const net = createNetwork('boost with an exponential diode');
  const vin = net.node('vin');
  const sw = net.node('sw');
  const out = net.node('out');
  net.voltageSource('supply', vin, net.ground, constant(Vs));
  const choke = net.inductor('L', vin, sw, L);
  net.switch('Q', sw, net.ground, { gate: pulse({ high: 1, period, duty }), onResistance: Ron, offConductance: Goff });
  const diode = net.diode('D', sw, out, { junction: 'exponential', ...junction });
  const cap = net.capacitor('C', out, net.ground, C, { initialVoltage: V0 });
  net.resistor('load', out, net.ground, R);
  return { net, choke, diode, cap };
}

describe('exponential junction switched by a gate', () => {
  it('crosses a turn-off and a turn-on and agrees with odex', { timeout: 300_000 }, () => {
    const { net, choke, diode, cap } = boost();
    // Inside the intervals only: at a gate edge the two sides differ, and odex restarts there.
    const times: number[] = [];
    for (let k = 1; k < 48; k++) if (k !== 16 && k !== 40) times.push((k * period) / 40);
    const ref = reference(times);
    const r = simulate(net, { stopTime: stop, rtol: 1e-8, sampling: { times } });
    expect(r.status).toBe('success');
    const iL = r.current(choke);
    const vc = r.voltage(cap);
    let worstI = 0;
    let worstV = 0;
    times.forEach((_t, k) => {
      worstI = Math.max(worstI, Math.abs(iL[k]! - ref[k]![0]!));
      worstV = Math.max(worstV, Math.abs(vc[k]! - ref[k]![1]!));
    });
    // rtol 1e-8 maps to about 5e-7 relative in radau5's controller (rtol' = 0.1 rtol^(2/3)), on about 1 A and 8 V.
    expect(worstI).toBeLessThan(1e-5);
    expect(worstV).toBeLessThan(1e-5);
    // The diode really conducted (turn-off) and really blocked (turn-on): both sides of its knee were crossed.
    const id = r.current(diode);
    expect(Math.max(...id)).toBeGreaterThan(0.5);
    expect(Math.min(...id)).toBeLessThan(0);
    expect(r.energy().relativeError).toBeLessThan(0.1 * 1e-8 ** (2 / 3));
  });
});
