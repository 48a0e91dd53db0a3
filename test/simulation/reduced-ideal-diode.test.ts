/**
 * The reduced formulation with ideal diodes: each commutation is an event
 * located on the reduced integrator's expanded dense output, then a settle
 * and a restart, where the elimination's maps are formed again. Checked
 * against the full formulation and against closed forms. Values invented
 * for the tests.
 */
import { describe, expect, it } from 'vitest';
import { errorOf } from '../support/thrown-error.js';
import { constant, createNetwork, createStepper, pulse, simulate, sine, type NetworkBuilder } from '../../src/index.js';
import { acceptNetwork } from '../../src/simulation/accept-network.js';
import { NetworkRun } from '../../src/simulation/network-run.js';

/** Both formulations' runs of a network to `horizon`, with their commutations. */
function bothRuns(net: NetworkBuilder, horizon: number, rtol: number) {
  return (['full', 'reduced'] as const).map((formulation) => {
    const run = new NetworkRun(acceptNetwork(net, 'test').compiled, { t0: 0, horizon, rtol, atol: rtol, formulation });
    run.advanceTo(horizon, { steps: false, interpolants: false });
    return run;
  });
}

// Half-wave rectifier: 10 V, 50 Hz sine, an ideal diode (Vf 0.7 V, Ron 0.1 ohm) into 10 ohm with a small
// capacitance across the load (1e-7 F: it gives the reduced form its one differential unknown).
const [Vm, f, Vf, Ron, R, C] = [10, 50, 0.7, 0.1, 10, 1e-7];
const w = 2 * Math.PI * f;

function halfWave() {
  const net = createNetwork('half-wave rectifier');
  const a = net.node('a');
  const out = net.node('out');
  net.voltageSource('source', a, net.ground, sine({ amplitude: Vm, frequency: f }));
  const diode = net.diode('D1', a, out, { forwardVoltage: Vf, onResistance: Ron, offConductance: 1e-9 });
  const load = net.resistor('load', out, net.ground, R);
  net.capacitor('filter', out, net.ground, C);
  return { net, diode, load };
}

// A small flyback in discontinuous conduction (the secondary current falls to zero each period, so the
// diode turns off at a located event and on at the gate's edge): 24 V, 100 kHz, duty 0.4, a 2:1 transformer
// on a linear core of 100 uH seen from the primary, an ideal diode into 2 uF and 100 ohm.
const FLY = { vin: 24, frequency: 100e3, duty: 0.4, np: 20, ns: 10, magnetising: 100e-6, output: 2e-6, load: 100 };

function smallFlyback(junction: 'ideal' | 'exponential' = 'ideal') {
  const net = createNetwork('small flyback');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const reluctance = FLY.np ** 2 / FLY.magnetising;
  const core = net.reluctance('core', { from: m1, to: m2, reluctance: reluctance / 2 });
  net.reluctance('back', { from: m2, to: m1, reluctance: reluctance / 2 });
  const vin = net.node('vin');
  const drain = net.node('drain');
  const sec = net.node('sec');
  const out = net.node('out');
  const supply = net.voltageSource('supply', vin, net.ground, constant(FLY.vin));
  const primary = net.winding('primary', { tube: core, turns: FLY.np, resistance: 0.02, plus: vin, minus: drain });
  net.switch('Q1', drain, net.ground, { gate: pulse({ high: 1, period: 1 / FLY.frequency, duty: FLY.duty }), onResistance: 0.05, offConductance: 1e-7 });
  const secondary = net.winding('secondary', { tube: core, turns: FLY.ns, resistance: 0.01, plus: net.ground, minus: sec });
  const diode = junction === 'ideal'
    ? net.diode('D1', sec, out, { forwardVoltage: 0.5, onResistance: 0.01, offConductance: 1e-9 })
    : net.diode('D1', sec, out, { junction: 'exponential', saturationCurrent: 1e-9, emissionCoefficient: 1.5, onResistance: 0.01, offConductance: 1e-9 });
  const output = net.capacitor('Co', out, net.ground, FLY.output, { initialVoltage: 20 });
  const load = net.resistor('load', out, net.ground, FLY.load);
  return { net, supply, primary, secondary, diode, output, load };
}

describe("formulation 'reduced' with ideal diodes", () => {
  it('a half-wave rectifier commutates where the full formulation does and where the source crosses Vf', () => {
    const periods = 5;
    const rtol = 1e-8;
    const [full, reduced] = bothRuns(halfWave().net, periods / f, rtol);
    expect(full!.status).toBe('running');
    expect(reduced!.status).toBe('running');
    // One turn-on and one turn-off per period (ideal rectifier, common practice), each a located event.
    expect(reduced!.deviceChanges).toHaveLength(2 * periods);
    expect(reduced!.deviceEvents).toBe(2 * periods);
    expect(reduced!.deviceChanges.map((c) => c.on)).toEqual(full!.deviceChanges.map((c) => c.on));
    // Conduction from asin(Vf/Vm)/w to (pi - asin(Vf/Vm))/w (the diode conducts while the source exceeds Vf;
    // derived from the ideal-rectifier relation, common practice). The capacitor moves the turn-off earlier by
    // about R C (its current C dv/dt cancels the load's v/R there), the turn-on by about Ron C.
    const tOn = Math.asin(Vf / Vm) / w;
    const tOff = (Math.PI - Math.asin(Vf / Vm)) / w;
    reduced!.deviceChanges.forEach((c, k) => {
      const expected = Math.floor(k / 2) / f + (c.on ? tOn : tOff);
      expect(Math.abs(c.t - expected)).toBeLessThan(2 * (c.on ? Ron : R) * C + 1e-7 / f);
      // Against the full run: a state error of rtol Vm in the margin over the margin's slope there. Off, the
      // margin is Vf - v (slope w Vm cos(a), the source's); on, it is Ron i = (v - Vf) Ron / (R + Ron), whose
      // slope is that times Ron / (R + Ron), a hundredth: the turn-off is the less sharply located.
      const slope = w * Vm * Math.cos(Math.asin(Vf / Vm)) * (c.on ? 1 : Ron / (R + Ron));
      expect(Math.abs(c.t - full!.deviceChanges[k]!.t)).toBeLessThan((10 * rtol * Vm) / slope);
    });
  });

  it('a half-wave rectifier averages R/(R + Ron) (2 Vm cos(a) - Vf (pi - 2a)) / (2 pi), a = asin(Vf/Vm), and agrees with the full run', () => {
    const { net, load, diode } = halfWave();
    const periods = 4;
    const times = Array.from({ length: 400 * periods }, (_, k) => ((k + 0.5) / 400) / f);
    const rtol = 1e-8;
    const [full, reduced] = (['full', 'reduced'] as const).map((formulation) => simulate(net, { stopTime: periods / f, rtol, formulation, sampling: { times, exact: true } }));
    expect(reduced!.status).toBe('success');
    const v = reduced!.voltage(load);
    const vFull = full!.voltage(load);
    let worst = 0;
    for (let k = 0; k < v.length; k++) worst = Math.max(worst, Math.abs(v[k]! - vFull[k]!));
    // Exact samples (step ends, where the error is controlled), both to rtol 1e-8 on states of about Vm:
    // their difference a few tolerances of Vm.
    expect(worst).toBeLessThan(100 * rtol * Vm);
    const iFull = full!.current(diode);
    const i = reduced!.current(diode);
    // The diode current is its voltage beyond Vf over Ron: a voltage error of rtol Vm is rtol Vm / Ron there.
    for (let k = 0; k < i.length; k++) expect(Math.abs(i[k]! - iFull[k]!)).toBeLessThan(10 * rtol * (Vm / Ron));
    // Average output, midpoint rule on 400 points a period (its error on a sine about h^2 / 24 = 1e-5 relative,
    // h = 2 pi / 400; numerical analysis textbook bound, common practice). Half-wave rectifier into R: Vavg = Vm / pi ideal (common practice); with the
    // forward drop and the on-resistance the conducting piece is (v - Vf) R / (R + Ron) (Ohm's law), whose
    // mean over a period is the relation above (integrated by hand). The capacitance changes it by about
    // w R C = 3e-4 of itself at most (it shifts the turn-off by R C with the output near zero there).
    const mean = v.reduce((s, x) => s + x, 0) / v.length;
    const a = Math.asin(Vf / Vm);
    const expected = ((R / (R + Ron)) * (2 * Vm * Math.cos(a) - Vf * (Math.PI - 2 * a))) / (2 * Math.PI);
    expect(Math.abs(mean - expected) / expected).toBeLessThan(w * R * C + 1e-5);
    // The ideal limit, Vm / pi, lies above: the drop and the on-resistance take from it.
    expect(mean).toBeLessThan(Vm / Math.PI);
  });

  it('a flyback in discontinuous conduction commutates and carries the currents the full formulation does', () => {
    const { net, primary, diode, load } = smallFlyback();
    const periods = 10;
    const T = 1 / FLY.frequency;
    const rtol = 1e-7;
    const [full, reduced] = bothRuns(net, periods * T, rtol);
    expect(reduced!.status).toBe(full!.status);
    // Discontinuous conduction: the diode turns on at each gate turn-off and off when its current
    // reaches zero before the next turn-on (two changes a period; flyback operation, common practice).
    expect(reduced!.deviceChanges.length).toBe(2 * periods);
    expect(reduced!.deviceEvents).toBe(full!.deviceEvents);
    expect(reduced!.deviceEvents).toBeGreaterThanOrEqual(periods);
    reduced!.deviceChanges.forEach((c, k) => {
      const other = full!.deviceChanges[k]!;
      expect(c.on).toBe(other.on);
      // Located on dense outputs each within the tolerance: agreement to rtol of the period.
      expect(Math.abs(c.t - other.t)).toBeLessThan(10 * rtol * T);
    });
    // Exact samples: step ends, where each run's error is controlled.
    const times = Array.from({ length: 50 * periods }, (_, k) => ((k + 0.25) / 50) * T);
    const [rf, rr] = (['full', 'reduced'] as const).map((formulation) => simulate(net, { stopTime: periods * T, rtol, formulation, sampling: { times, exact: true } }));
    // Peak primary current Vin D T / Lm (volt-seconds on the magnetising inductance, common practice).
    const peak = (FLY.vin * FLY.duty * T) / FLY.magnetising;
    for (const handle of [primary, diode]) {
      const [a, b] = [rf!.current(handle), rr!.current(handle)];
      let worst = 0;
      for (let k = 0; k < a.length; k++) worst = Math.max(worst, Math.abs(a[k]! - b[k]!));
      expect(worst).toBeLessThan(100 * rtol * peak * (FLY.np / FLY.ns));
    }
    const [vf, vr] = [rf!.voltage(load), rr!.voltage(load)];
    expect(Math.abs(vf[vf.length - 1]! - vr[vr.length - 1]!)).toBeLessThan(100 * rtol * 20);
    expect(Math.max(...Array.from(rr!.current(primary)))).toBeGreaterThan(0.9 * peak);
  });

  it('the energy audit closes on the flyback in reduced form', () => {
    const { net } = smallFlyback();
    const r = simulate(net, { stopTime: 10 / FLY.frequency, rtol: 1e-8, formulation: 'reduced' });
    expect(r.status).toBe('success');
    const audit = r.energy();
    expect(audit.dissipated.resistors).toBeGreaterThan(0);
    // Conservation of energy: source energy = dissipated + change of stored energy (first law); the audit's
    // accuracy follows the tolerance (as for the full formulation).
    expect(audit.relativeError).toBeLessThan(1e-5);
  });

  it('a stepper in reduced form continues bit for bit from a snapshot taken before a commutation', () => {
    // Determinism of a restored run (the stepping interface's contract, docs/embedding.md): the restore
    // re-forms the elimination's maps, and the commutations after it repeat to the bit.
    const { net, diode, load } = halfWave();
    const stepper = createStepper(net, { horizon: 2 / f, formulation: 'reduced' });
    expect(stepper.advanceTo(0.1 / f)).toBe('running');
    const snap = stepper.snapshot();
    // Past a turn-off (at about 0.49 / f) and the next turn-on.
    stepper.advanceTo(1.2 / f);
    const first = [stepper.current(diode), stepper.voltage(load)];
    stepper.restore(snap);
    stepper.advanceTo(1.2 / f);
    expect([stepper.current(diode), stepper.voltage(load)]).toEqual(first);
    // Conducting at 1.2 periods: the load voltage is (v - Vf) R / (R + Ron) (Ohm's law) but for the
    // capacitor's lag, (R || Ron) C times the source's slope.
    const vs = Vm * Math.sin(w * 1.2 / f);
    const lag = ((R * Ron) / (R + Ron)) * C * w * Vm;
    expect(Math.abs(first[1]! - ((vs - Vf) * R) / (R + Ron))).toBeLessThan(2 * lag + 1e-6 * Vm);
  });

  it('still refuses an exponential junction whose potentials are algebraic, naming the diode', () => {
    const { net } = smallFlyback('exponential');
    // The full formulation takes it.
    expect(simulate(net, { stopTime: 2e-5 }).status).toBe('success');
    const e = errorOf(() => simulate(net, { stopTime: 2e-5, formulation: 'reduced' }));
    expect(e?.code).toBe('not-reducible');
    expect(e?.elements).toEqual(['D1']);
    expect(e?.message).toContain('diode "D1"');
    expect(e?.message).toContain('other than affinely');
  });
});
