/**
 * Stepper threshold crossings at a diode's own commutation (issue 12): a
 * watched quantity that jumps across the level when an ideal diode turns on
 * inside an advance counts as a crossing, with the direction of the jump,
 * reported at the commutation instant with the stepper standing there.
 *
 * Circuit (values of our own): a source ramping 0 -> 2 V over 1 ms, an ideal
 * diode (Vf = 1 V, Ron = 1 ohm, Goff = 0.01 S) and a 10 ohm load in series.
 * It is piecewise linear and resistive, so Ohm's and Kirchhoff's laws give
 * every value in closed form (derived here, the diode model of docs/devices.md):
 *   off: i = Goff V / (1 + R Goff); the diode voltage V / (1 + R Goff) reaches
 *        Vf at V* = Vf (1 + R Goff) = 1.1 V, where i = Goff Vf = 10 mA;
 *   on:  i = (V - Vf) / (R + Ron), which at V* is Vf R Goff / (R + Ron) = 9.0909 mA.
 * So the load current drops from 10 mA to 9.0909 mA at the turn-on instant
 * t* = 1.1 V / (2 V/ms) = 0.55 ms: a 9.5 mA level is crossed falling there (a
 * jump), after being crossed rising before it (continuously, at
 * V = 9.5 mA (1 + R Goff) / Goff = 1.045 V, t = 0.5225 ms) and rising again
 * after it ((V - 1)/11 = 9.5 mA at V = 1.1045 V,
 * t = 0.55225 ms).
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, createStepper, piecewiseLinear, type Threshold } from '../../src/index.js';

const [VF, RON, GOFF, R] = [1, 1, 0.01, 10];
const SLOPE = 2 / 1e-3; // V/s

function rampIntoDiode() {
  const net = createNetwork('ramp into a diode');
  const [a, b] = [net.node('a'), net.node('b')];
  net.voltageSource('ramp', a, net.ground, piecewiseLinear({ times: [0, 1e-3], values: [0, 2] }));
  const diode = net.diode('D', a, b, { forwardVoltage: VF, onResistance: RON, offConductance: GOFF });
  const load = net.resistor('load', b, net.ground, R);
  return { net, diode, load };
}

type Seen = { time: number; rising: boolean; current: number; stepperTime: number };

function watch(load: ReturnType<typeof rampIntoDiode>['load'], level: number, seen: Seen[], direction?: Threshold['direction']): Threshold {
  return {
    name: `${level} A`, watch: { quantity: 'current', handle: load }, level,
    ...(direction ? { direction } : {}),
    onCross: (s, c) => { seen.push({ time: c.time, rising: c.rising, current: s.current(load), stepperTime: s.time }); },
  };
}

describe('stepper threshold crossings at a diode commutation', () => {
  const tOn = (VF * (1 + R * GOFF)) / SLOPE; // derived above: 0.55 ms
  const iOn = (VF * R * GOFF) / (R + RON); // 9.0909 mA just after turn-on

  it('the drop of the load current at the turn-on is a falling crossing at the commutation, between two continuous rising ones', () => {
    const { net, load } = rampIntoDiode();
    const seen: Seen[] = [];
    const stepper = createStepper(net, { horizon: 1e-3, thresholds: [watch(load, 9.5e-3, seen)] });
    expect(stepper.advanceTo(1e-3)).toBe('success');
    expect(seen.map((c) => c.rising)).toEqual([true, false, true]);
    // Continuous crossings: the closed forms above (located to the event tolerance).
    expect(seen[0]!.time).toBeCloseTo(((9.5e-3 * (1 + R * GOFF)) / GOFF) / SLOPE, 12);
    expect(seen[2]!.time).toBeCloseTo((VF + 9.5e-3 * (R + RON)) / SLOPE, 12);
    // The jump: at the diode's turn-on, the stepper standing there, after the jump.
    expect(seen[1]!.time).toBeCloseTo(tOn, 12);
    expect(seen[1]!.stepperTime).toBe(seen[1]!.time);
    expect(seen[1]!.current).toBeCloseTo(iOn, 9);
  });

  it('direction filters apply: a falling-only threshold sees the jump alone', () => {
    const { net, load } = rampIntoDiode();
    const seen: Seen[] = [];
    const stepper = createStepper(net, { horizon: 1e-3, thresholds: [watch(load, 9.5e-3, seen, 'falling')] });
    stepper.advanceTo(1e-3);
    expect(seen).toHaveLength(1);
    expect(seen[0]!.rising).toBe(false);
    expect(seen[0]!.time).toBeCloseTo(tOn, 12);
  });

  it('a jump that lands exactly on the level reports the direction it came from', () => {
    // The level is the value right after the jump (computed by the same stepper run up to just
    // after the turn-on, then used as the level of a second run): the jump ends on the level from above.
    const first = rampIntoDiode();
    const probe = createStepper(first.net, { horizon: 1e-3 });
    probe.advanceTo(0.7e-3);
    const after = probe.result();
    const level = after.current(first.load).find((_, k, all) => k > 0 && after.time[k] === after.time[k - 1] && all[k]! < all[k - 1]!);
    expect(level).toBeDefined();
    const { net, load } = rampIntoDiode();
    const seen: Seen[] = [];
    const stepper = createStepper(net, { horizon: 1e-3, thresholds: [watch(load, level!, seen, 'falling')] });
    stepper.advanceTo(1e-3);
    expect(seen).toHaveLength(1);
    expect(seen[0]!.current).toBe(level);
    expect(seen[0]!.rising).toBe(false);
  });

  it('without thresholds the same run is not cut at the commutation (one advance, same turn-on)', () => {
    const { net, diode } = rampIntoDiode();
    const stepper = createStepper(net, { horizon: 1e-3 });
    stepper.advanceTo(1e-3);
    const r = stepper.result();
    const i = r.current(diode);
    const k = i.findIndex((x, j) => j > 0 && r.time[j] === r.time[j - 1]);
    expect(r.time[k]).toBeCloseTo(tOn, 12);
    expect(i[k]).toBeCloseTo(iOn, 9);
  });
});
