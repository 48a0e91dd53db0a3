/**
 * The stepper changes a gate between advances (issue 12): a switch driven by
 * a pulse train into a resistor, so the load current is V / R while the gate
 * is high and (almost) zero otherwise (Ohm's law); the charge delivered per
 * period is D T V / R, with D the duty in force. Test values of our own.
 */
import { describe, expect, it } from 'vitest';
import { constant, createNetwork, createStepper, InputError, pulse } from '../../src/index.js';

const V = 10;
const R = 5;
const T = 10e-6;

describe('stepper gate changes', () => {
  it('a new duty takes effect from the present time: charge per period D T V / R before and after', () => {
    const net = createNetwork('chopper');
    const [a, b] = [net.node('a'), net.node('b')];
    net.voltageSource('supply', a, net.ground, constant(V));
    const sw = net.switch('Q1', a, b, { gate: pulse({ high: 1, period: T, duty: 0.25 }), onResistance: 1e-6, offConductance: 1e-9 });
    const load = net.resistor('load', b, net.ground, R);
    const stepper = createStepper(net, { horizon: 4 * T, rtol: 1e-9 });
    stepper.advanceTo(2 * T);
    stepper.setGate(sw, pulse({ high: 1, period: T, duty: 0.6 }));
    stepper.advanceTo(4 * T);
    const r = stepper.result();
    const i = r.evaluator({ quantity: 'current', handle: load });
    const charge = (t0: number, t1: number): number => {
      // Midpoint rule on a fine grid: the current is piecewise constant with edges on the grid.
      const n = 4000;
      let s = 0;
      for (let k = 0; k < n; k++) s += i(t0 + ((k + 0.5) * (t1 - t0)) / n);
      return (s * (t1 - t0)) / n;
    };
    const on = V / (R + 1e-6);
    expect(charge(T, 2 * T) / (0.25 * T * on)).toBeCloseTo(1, 6);
    expect(charge(3 * T, 4 * T) / (0.6 * T * on)).toBeCloseTo(1, 6);
  });

  it('a gate change is an input change: a load current jumping across a threshold level is a crossing there', () => {
    const net = createNetwork('chopper');
    const [a, b] = [net.node('a'), net.node('b')];
    net.voltageSource('supply', a, net.ground, constant(V));
    // Delay 0.5 T: low at first; the new gate with no delay is high at once.
    const sw = net.switch('Q1', a, b, { gate: pulse({ high: 1, period: T, duty: 0.3, delay: 0.5 * T }), onResistance: 1e-6, offConductance: 1e-9 });
    const load = net.resistor('load', b, net.ground, R);
    const seen: { time: number; rising: boolean }[] = [];
    const stepper = createStepper(net, {
      horizon: 2 * T,
      thresholds: [{ name: '1 A', watch: { quantity: 'current', handle: load }, level: 1, onCross: (_s, c) => { seen.push({ time: c.time, rising: c.rising }); } }],
    });
    stepper.advanceTo(0.2 * T);
    stepper.setGate(sw, pulse({ high: 1, period: T, duty: 0.5 }));
    stepper.advanceTo(0.4 * T);
    expect(seen).toEqual([{ time: 0.2 * T, rising: true }]);
    expect(stepper.current(load)).toBeCloseTo(V / R, 5);
  });

  it('refuses a switch without a gate, naming it', () => {
    const net = createNetwork('scheduled');
    const a = net.node('a');
    net.voltageSource('supply', a, net.ground, constant(V));
    const b = net.node('b');
    const sw = net.switch('breaker', a, b, { closed: true });
    net.resistor('load', b, net.ground, R);
    const stepper = createStepper(net, { horizon: T });
    expect(() => stepper.setGate(sw, pulse({ high: 1, period: T, duty: 0.5 }))).toThrow(InputError);
    expect(() => stepper.setGate(sw, pulse({ high: 1, period: T, duty: 0.5 }))).toThrow(/breaker/);
  });
});
