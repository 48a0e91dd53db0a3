/**
 * The stepper with devices: its threshold crossings and the diodes' own
 * events share the integrator (thresholds first, device events after), a
 * threshold callback that changes a gate takes effect at the crossing, and
 * snapshot/restore carries the diode states. A bang-bang charger of our own
 * (invented values): a gated switch charges a capacitor through an inductor
 * with a freewheeling diode; the controller opens the switch when the
 * capacitor reaches 5 V. Checked against the closed forms of its pieces.
 */
import { describe, expect, it } from 'vitest';
import { constant, createNetwork, createStepper, pulse } from '../../src/index.js';

function charger() {
  const net = createNetwork('charger');
  const a = net.node('a');
  const sw = net.node('sw');
  const out = net.node('out');
  net.voltageSource('V', a, net.ground, constant(12));
  const q = net.switch('Q1', a, sw, { gate: pulse({ high: 1, period: 20e-6, duty: 0.5 }), onResistance: 0.01 });
  const d = net.diode('Dfw', net.ground, sw, { forwardVoltage: 0.5, onResistance: 0.01 });
  net.inductor('L', sw, out, 100e-6);
  const c = net.capacitor('C', out, net.ground, 100e-6);
  net.resistor('R', out, net.ground, 100);
  return { net, q, d, c };
}

describe('stepper with diodes and a gated switch', () => {
  it('a threshold on the output stops the gate at 5 V while the freewheeling diode keeps commutating', () => {
    const { net, q, d, c } = charger();
    let crossedAt = NaN;
    const stepper = createStepper(net, {
      horizon: 2e-3,
      thresholds: [{
        name: 'output at 5 V',
        watch: { quantity: 'voltage', handle: c },
        level: 5,
        direction: 'rising',
        onCross: (s, crossing) => {
          crossedAt = crossing.time;
          // Gate off from now on: a pulse of zero duty.
          s.setGate(q, pulse({ high: 1, period: 20e-6, duty: 0 }));
        },
      }],
    });
    stepper.advanceTo(1.5e-3);
    expect(stepper.status).toBe('running');
    expect(crossedAt).toBeGreaterThan(0);
    expect(crossedAt).toBeLessThan(1.5e-3);
    // After the gate stopped, the inductor current freewheels through the diode until it reaches zero,
    // then the diode blocks and the capacitor discharges into R, fed by the supply through the open
    // switch's 1 Mohm: v(t2) = v_inf + (v(t1) - v_inf) exp(-(t2 - t1)/tau) with v_inf = 12 R/(R + Roff),
    // tau = C R Roff/(R + Roff) (closed form; the diode's 1e-9 S leakage shifts it by 1e-7).
    expect(Math.abs(stepper.current(d))).toBeLessThan(1e-6);
    expect(Math.abs(stepper.current(q))).toBeLessThan(1e-3);
    const v1 = stepper.voltage(c);
    expect(v1).toBeGreaterThan(5);
    stepper.advanceTo(2e-3);
    const [R, Roff, C] = [100, 1e6, 100e-6];
    const vInf = (12 * R) / (R + Roff);
    const tau = (C * R * Roff) / (R + Roff);
    expect(stepper.voltage(c)).toBeCloseTo(vInf + (v1 - vInf) * Math.exp(-0.5e-3 / tau), 6);
  });

  it('snapshot and restore carry the diode states: the same continuation twice', () => {
    const { net, c } = charger();
    const stepper = createStepper(net, { horizon: 1e-3 });
    stepper.advanceTo(0.3e-3 + 13e-6); // inside a period, freewheeling
    const snap = stepper.snapshot();
    stepper.advanceTo(0.6e-3);
    const first = stepper.voltage(c);
    stepper.restore(snap);
    stepper.advanceTo(0.6e-3);
    expect(stepper.voltage(c)).toBe(first);
  });
});
