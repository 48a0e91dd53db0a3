import { describe, expect, it } from 'vitest';
import { constant, createNetwork, createStepper, InputError, MU0, simulate, sine } from '../../src/index.js';

// A winding on a linear core driven through a switch from a source: an RL circuit with
// L = N^2 / R_m (magnetic circuit law). Test data of our own.
const N = 100;
const AREA = 1e-3;
const MUR = 2000;
const PATH = 0.3;
const RM = PATH / (MU0 * MUR * AREA);
const L = (N * N) / RM;
const R = 5;
const TAU = L / R;

function rl(source: 'dc' | 'sine') {
  const net = createNetwork('rl');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const material = { kind: 'linear', relativePermeability: MUR } as const;
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: PATH / 2, area: AREA, material });
  net.fluxTube('yoke', { from: m2, to: m1, length: PATH / 2, area: AREA, material });
  const a = net.node('a');
  const b = net.node('b');
  const supply = net.voltageSource('supply', a, net.ground, source === 'dc' ? constant(10) : sine({ amplitude: 10, frequency: 50 }));
  const sw = net.switch('switch', a, b, { closed: true, onResistance: 1e-6 });
  const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: b, minus: net.ground });
  return { net, leg, supply, sw, coil };
}

describe('createStepper', () => {
  it('advancing in many small steps gives the closed-form RL energisation (same as simulate)', () => {
    // Series RL circuit switched onto V sin(wt) at t = 0 (circuits textbook, complete response):
    // i(t) = V/Z [sin(wt - theta) + sin(theta) exp(-t/tau)].
    const { net, coil } = rl('sine');
    const w = 2 * Math.PI * 50;
    const Rt = R + 1e-6;
    const Z = Math.hypot(Rt, w * L);
    const theta = Math.atan2(w * L, Rt);
    const exact = (t: number) => (10 / Z) * (Math.sin(w * t - theta) + Math.sin(theta) * Math.exp((-t * Rt) / L));
    const stepper = createStepper(net, { horizon: 0.06, rtol: 1e-9 });
    let worst = 0;
    for (let k = 1; k <= 300; k++) {
      stepper.advanceTo(Math.min(k * 2e-4, 0.06));
      worst = Math.max(worst, Math.abs(stepper.current(coil) - exact(stepper.time)));
    }
    expect(stepper.time).toBe(0.06);
    expect(worst / (10 / Z)).toBeLessThan(1e-6);
    const history = stepper.result();
    const r = simulate(net, { stopTime: 0.06, rtol: 1e-9 });
    const iLast = history.current(coil);
    const jLast = r.current(coil);
    expect(Math.abs(iLast[iLast.length - 1]! - jLast[jLast.length - 1]!)).toBeLessThan(1e-7);
  });

  it('a set-point change takes effect at the present time (RL step response from there)', () => {
    // DC: i settles to V/R; at t1 the source is set to 0 and i decays as (V/R) e^{-(t - t1)/tau}.
    const { net, supply, coil } = rl('dc');
    const stepper = createStepper(net, { horizon: 1, rtol: 1e-9 });
    const t1 = 10 * TAU;
    stepper.advanceTo(t1);
    // rtol 1e-9 maps to the solver's internal 0.1 rtol^(2/3) = 1e-7 (radau5 convention, docs/solver.md),
    // the size of the error to expect: checked to 5e-7.
    const i1 = (10 / (R + 1e-6)) * (1 - Math.exp(-10));
    expect(stepper.current(coil) / i1).toBeCloseTo(1, 6);
    stepper.setSource(supply, 0);
    stepper.advanceTo(t1 + TAU);
    expect(stepper.current(coil) / (i1 * Math.exp(-1))).toBeCloseTo(1, 6);
    expect(stepper.voltage(supply)).toBe(0);
  });

  it('opening a switch from the stepper equals a scheduled opening in simulate', () => {
    const t1 = 3 * TAU;
    const a = rl('dc');
    const stepper = createStepper(a.net, { horizon: 5 * TAU, rtol: 1e-8 });
    stepper.advanceTo(t1);
    stepper.setSwitch(a.sw, false);
    stepper.advanceTo(5 * TAU);
    const net2 = createNetwork('scheduled');
    const m1 = net2.magneticNode('m1');
    const m2 = net2.magneticNode('m2');
    const material = { kind: 'linear', relativePermeability: MUR } as const;
    const leg = net2.fluxTube('leg', { from: m1, to: m2, length: PATH / 2, area: AREA, material });
    net2.fluxTube('yoke', { from: m2, to: m1, length: PATH / 2, area: AREA, material });
    const x = net2.node('a');
    const y = net2.node('b');
    net2.voltageSource('supply', x, net2.ground, constant(10));
    net2.switch('switch', x, y, { closed: true, onResistance: 1e-6, schedule: [{ time: t1, closed: false }] });
    const coil2 = net2.winding('coil', { tube: leg, turns: N, resistance: R, plus: y, minus: net2.ground });
    const r = simulate(net2, { stopTime: 5 * TAU, rtol: 1e-8 });
    const i2 = r.current(coil2);
    expect(Math.abs(stepper.current(a.coil) - i2[i2.length - 1]!)).toBeLessThan(1e-9);
  });

  it('calls a controller at every sample instant, exactly', () => {
    const { net } = rl('dc');
    const stepper = createStepper(net, { horizon: 0.01 });
    const times: number[] = [];
    stepper.every(1e-3, (s) => times.push(s.time));
    stepper.advanceTo(0.0055);
    expect(times.length).toBe(5);
    times.forEach((t, k) => expect(t).toBeCloseTo((k + 1) * 1e-3, 15));
  });

  it('locates a threshold crossing at the closed-form time and lets the callback act there', () => {
    // RL charging from rest: i(t) = (V/R)(1 - e^{-t/tau}) reaches i* at t* = -tau ln(1 - i* R / V).
    const { net, supply, coil } = rl('dc');
    const Rt = R + 1e-6;
    const level = 0.5 * (10 / Rt);
    let crossing = NaN;
    // Crossings are located on the step's collocation polynomial (third-order interpolation), so
    // their accuracy follows the step size: maxStep = tau/50 keeps that error near 1e-9 here.
    const stepper = createStepper(net, {
      horizon: 10 * TAU, rtol: 1e-9, maxStep: TAU / 50,
      thresholds: [{
        name: 'half current', watch: { quantity: 'current', handle: coil }, level, direction: 'rising',
        onCross: (s, c) => { crossing = c.time; s.setSource(supply, 0); },
      }],
    });
    stepper.advanceTo(3 * TAU);
    const tStar = -(L / Rt) * Math.log(1 - (level * Rt) / 10);
    expect(Math.abs(crossing - tStar) / tStar).toBeLessThan(1e-8);
    // After the callback switched the source off, the current decays from the level.
    const expected = level * Math.exp(-(3 * TAU - tStar) / (L / Rt));
    expect(stepper.current(coil) / expected).toBeCloseTo(1, 6);
  });

  it('restores a snapshot exactly and drops the abandoned history', () => {
    const { net, supply, coil } = rl('sine');
    const stepper = createStepper(net, { horizon: 0.1 });
    stepper.advanceTo(0.01);
    const snap = stepper.snapshot();
    stepper.advanceTo(0.02);
    const first = stepper.current(coil);
    stepper.setSource(supply, 0);
    stepper.restore(snap);
    expect(stepper.time).toBe(0.01);
    expect(stepper.result().time.every((t) => t <= 0.01)).toBe(true);
    stepper.advanceTo(0.02);
    expect(stepper.current(coil)).toBe(first);
  });

  it('refuses to advance backwards, past the horizon, or from a callback', () => {
    const { net } = rl('dc');
    const stepper = createStepper(net, { horizon: 0.01 });
    stepper.advanceTo(0.005);
    expect(() => stepper.advanceTo(0.001)).toThrow(InputError);
    expect(() => stepper.advanceTo(0.02)).toThrow(/horizon/);
    stepper.every(1e-3, (s) => { s.advanceTo(0.009); });
    expect(() => stepper.advanceTo(0.008)).toThrow(/callback/);
  });
});
