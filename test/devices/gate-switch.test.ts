/**
 * The gate-driven switch: closed while its gate waveform is above 0.5, its
 * edges exact breakpoints (including a crossing inside a ramp), the
 * schedule form unchanged, the stepper changing a duty between advances,
 * and a chopper with a freewheeling diode against its closed form. Values
 * invented for the test.
 */
import { describe, expect, it } from 'vitest';
import { constant, createNetwork, createStepper, finiteDifferenceJacobian, piecewiseLinear, pulse, simulate } from '../../src/index.js';
import { compileNetwork } from '../../src/formulation/compile-network.js';
import { openInterval } from '../../src/formulation/network-inputs.js';

const V = 10;
const R = 5;
const Ron = 0.05;
const T = 100e-6;

function chopper(gate = pulse({ high: 1, period: T, duty: 0.3, delay: 10e-6 })) {
  const net = createNetwork('chopper');
  const a = net.node('a');
  const b = net.node('b');
  net.voltageSource('V', a, net.ground, constant(V));
  const q = net.switch('Q1', a, b, { gate, onResistance: Ron, offConductance: 1e-6 });
  const load = net.resistor('load', b, net.ground, R);
  return { net, q, load };
}

/** Times where the load voltage jumps up or down, read from the samples both sides of each breakpoint. */
function edges(time: Float64Array, v: Float64Array): { up: number[]; down: number[] } {
  const up: number[] = [];
  const down: number[] = [];
  for (let i = 1; i < time.length; i++) {
    if (time[i] !== time[i - 1]) continue;
    if (v[i]! > v[i - 1]! + 1) up.push(time[i]!);
    if (v[i]! < v[i - 1]! - 1) down.push(time[i]!);
  }
  return { up, down };
}

describe('gate-driven switch', () => {
  it('closes exactly at the pulse edges: Ohm on the on-resistance while the gate is high (closed form)', () => {
    const { net, load } = chopper();
    const r = simulate(net, { stopTime: 3 * T });
    expect(r.status).toBe('success');
    const { up, down } = edges(r.time, r.voltage(load));
    up.forEach((t, k) => expect(t).toBeCloseTo(10e-6 + k * T, 15));
    down.forEach((t, k) => expect(t).toBeCloseTo(10e-6 + 0.3 * T + k * T, 15));
    expect(up).toHaveLength(3);
    const on = r.voltage(load)[r.time.findIndex((t) => t > 20e-6)]!;
    expect(on).toBeCloseTo((V * R) / (R + Ron), 9);
    // Mean load power over whole periods: D V^2 R/(R + Ron)^2 (plus the off-state leakage, 1e-6 S).
    expect(r.energy().relativeError).toBeLessThan(1e-9);
  });

  it('takes a crossing of 0.5 inside a ramp as the edge (found to adjacent floats)', () => {
    // 0 -> 2 over 4 us from 10 us: the gate reads 0.5 at 11 us; 2 -> 0 over 8 us from 30 us: 0.5 at 36 us.
    const gate = piecewiseLinear({ times: [0, 10e-6, 14e-6, 30e-6, 38e-6], values: [0, 0, 2, 2, 0] });
    const { net, load } = chopper(gate);
    const r = simulate(net, { stopTime: 50e-6 });
    const { up, down } = edges(r.time, r.voltage(load));
    expect(up).toHaveLength(1);
    expect(down).toHaveLength(1);
    expect(up[0]!).toBeCloseTo(11e-6, 15);
    expect(down[0]!).toBeCloseTo(36e-6, 15);
    const schedule = compileNetwork(net.describe()).inputs.schedule;
    // The interval that starts at the edge sees the switch closed; just before it, open.
    expect(openInterval(schedule, up[0]!, 50e-6, 50e-6).switchClosed(1, up[0]!)).toBe(true);
  });

  it('keeps the schedule form working', () => {
    const net = createNetwork('scheduled');
    const a = net.node('a');
    const b = net.node('b');
    net.voltageSource('V', a, net.ground, constant(V));
    net.switch('S', a, b, { closed: false, schedule: [{ time: 1e-3, closed: true }], onResistance: Ron });
    const load = net.resistor('load', b, net.ground, R);
    const r = simulate(net, { stopTime: 2e-3 });
    expect(r.voltage(load).at(-1)!).toBeCloseTo((V * R) / (R + Ron), 9);
  });

  it('the stepper changes the duty between advances (setGate)', () => {
    const { net, q, load } = chopper(pulse({ high: 1, period: T, duty: 0.3 }));
    const stepper = createStepper(net, { horizon: 1e-3 });
    stepper.advanceTo(2 * T);
    stepper.setGate(q, pulse({ high: 1, period: T, duty: 0.6, delay: 2 * T }));
    stepper.advanceTo(2.5 * T);
    // With duty 0.6 the switch is still closed half way through the third period.
    expect(stepper.voltage(load)).toBeCloseTo((V * R) / (R + Ron), 9);
    stepper.advanceTo(2.65 * T);
    expect(stepper.voltage(load)).toBeLessThan(1e-3);
  });

  it('a chopper with a freewheeling diode into an RL load: the steady-state current ripple of the closed form', () => {
    // Buck chopper, continuous conduction: on, L di/dt = V - Ron i - R i; off, L di/dt = -Vf - Rd i - R i.
    // Each piece is exponential; the periodic solution follows from matching the ends (derived, common practice).
    const L = 1e-3;
    const Vf = 0.6;
    const Rd = 0.02;
    const D = 0.4;
    const net = createNetwork('buck chopper');
    const a = net.node('a');
    const sw = net.node('sw');
    const out = net.node('out');
    net.voltageSource('V', a, net.ground, constant(V));
    net.switch('Q1', a, sw, { gate: pulse({ high: 1, period: T, duty: D }), onResistance: Ron, offConductance: 1e-9 });
    net.diode('Dfw', net.ground, sw, { forwardVoltage: Vf, onResistance: Rd, offConductance: 1e-9 });
    const ind = net.inductor('L', sw, out, L);
    net.resistor('R', out, net.ground, R);
    const periods = 60;
    const r = simulate(net, { stopTime: periods * T, sampling: { times: [(periods - 1) * T, (periods - 1 + D) * T] } });
    expect(r.status).toBe('success');
    const tauOn = L / (R + Ron);
    const tauOff = L / (R + Rd);
    const iOnInf = V / (R + Ron);
    const iOffInf = -Vf / (R + Rd);
    const aOn = Math.exp((-D * T) / tauOn);
    const aOff = Math.exp((-(1 - D) * T) / tauOff);
    // i_min -> on -> i_max -> off -> i_min.
    const iMin = (iOffInf * (1 - aOff) + aOff * iOnInf * (1 - aOn)) / (1 - aOff * aOn);
    const iMax = iOnInf + (iMin - iOnInf) * aOn;
    const i = r.current(ind);
    // Each sampling instant is a gate edge: the result holds it twice (both sides of the jump); i is continuous.
    expect(Array.from(r.time)).toEqual([(periods - 1) * T, (periods - 1) * T, (periods - 1 + D) * T, (periods - 1 + D) * T]);
    // 60 periods with L/R = 0.2 ms: the start-up transient has decayed to exp(-6000/200) of itself.
    expect(i[0]!).toBeCloseTo(iMin, 6);
    expect(i[1]!).toBeCloseTo(iMin, 6);
    expect(i[2]!).toBeCloseTo(iMax, 6);
    expect(i[3]!).toBeCloseTo(iMax, 6);
    expect(r.energy().relativeError).toBeLessThan(1e-7);
  });

  it('the analytic Jacobian of diodes (both junctions, both states) and gated switches matches finite differences', () => {
    const net = createNetwork('jacobian');
    const a = net.node('a');
    const b = net.node('b');
    const c = net.node('c');
    net.voltageSource('V', a, net.ground, constant(3));
    net.switch('Q1', a, b, { gate: pulse({ high: 1, period: T, duty: 0.5 }), capacitance: 1e-9 });
    net.diode('D1', b, c, { forwardVoltage: 0.7, onResistance: 0.1, capacitance: 1e-10 });
    net.diode('D2', b, c, { junction: 'exponential', onResistance: 0.2, emissionCoefficient: 1.3 });
    net.diode('D3', c, net.ground, { initiallyOn: true });
    net.resistor('R', c, net.ground, 7);
    const compiled = compileNetwork(net.describe());
    const n = compiled.layout.size;
    for (const y of [Float64Array.from({ length: n }, (_, i) => 0.3 + 0.2 * i), Float64Array.from({ length: n }, (_, i) => -0.5 + 0.4 * i)]) {
      for (const t of [0.2 * T, 0.7 * T]) {
        const Ja = new Float64Array(n * n);
        compiled.jacobian(t, y, Ja);
        const f0 = new Float64Array(n);
        compiled.rhs(t, y, f0);
        const Jfd = new Float64Array(n * n);
        finiteDifferenceJacobian((tt, yy, out) => compiled.rhs(tt, yy, out), t, y, f0, Jfd);
        for (let k = 0; k < n * n; k++) expect(Math.abs(Ja[k]! - Jfd[k]!)).toBeLessThan(1e-5 * Math.max(1, Math.abs(Ja[k]!)));
      }
    }
  });
});
