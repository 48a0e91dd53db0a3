import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine, MU0 } from '../../src/index.js';
import { maxFluxImbalance, maxRelativeDeviation, sampleAt } from '../helpers/conservation.js';

/** Complex numbers for the phasor reference (kept tiny and local to the test). */
type C = { re: number; im: number };
const c = (re: number, im = 0): C => ({ re, im });
const add = (a: C, b: C): C => c(a.re + b.re, a.im + b.im);
const mul = (a: C, b: C): C => c(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return c((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d);
};

describe('simulate: two-winding transformer with finite permeability and a resistive load', () => {
  it('matches the phasor solution of the coupled-circuit equivalent with L = N^2 / R_m', () => {
    // Test data of our own.
    const V = 230 * Math.SQRT2;
    const f = 50;
    const w = 2 * Math.PI * f;
    const [N1, N2] = [100, 50];
    const [R1, R2, RL] = [5, 0.2, 10];
    const area = 1e-3;
    const mur = 1000;
    const [legLength, yokeLength] = [0.2, 0.1];
    const net = createNetwork('transformer');
    const top = net.magneticNode('top');
    const bottom = net.magneticNode('bottom');
    const material = { kind: 'linear', relativePermeability: mur } as const;
    const leg = net.fluxTube('leg', { from: bottom, to: top, length: legLength, area, material });
    const yoke = net.fluxTube('yoke', { from: top, to: bottom, length: yokeLength, area, material });
    const p = net.node('p');
    const s = net.node('s');
    net.voltageSource('mains', p, net.ground, sine({ amplitude: V, frequency: f }));
    const primary = net.winding('primary', { tube: leg, turns: N1, resistance: R1, plus: p, minus: net.ground });
    const secondary = net.winding('secondary', { tube: leg, turns: N2, resistance: R2, plus: s, minus: net.ground });
    const load = net.resistor('load', s, net.ground, RL);

    const cycles = 20;
    const r = simulate(net, {
      stopTime: cycles / f, rtol: 1e-9, atol: { voltage: 1e-9, current: 1e-9, fluxDensity: 1e-11 },
      sampling: { interval: 1 / (200 * f) },
    });
    expect(r.status).toBe('success');

    // Coupled-inductor equivalent of one core (textbook magnetic circuit -> circuit reduction, e.g.
    // Fitzgerald, Kingsley and Umans, Electric Machinery, sect. 2.5; Hayt and Kemmerly, magnetically
    // coupled circuits): L1 = N1^2/Rm, L2 = N2^2/Rm, M = N1 N2/Rm (perfect coupling, one core path).
    // Winding 2's current enters its plus terminal and the load carries -i2, so
    //   V  = (R1 + jwL1) I1 + jwM I2
    //   0  = jwM I1 + (R2 + RL + jwL2) I2
    // with v(t) = Im(V e^{jwt}).
    const Rm = (legLength + yokeLength) / (MU0 * mur * area);
    const [L1, L2, M] = [(N1 * N1) / Rm, (N2 * N2) / Rm, (N1 * N2) / Rm];
    const z11 = c(R1, w * L1);
    const z12 = c(0, w * M);
    const z22 = c(R2 + RL, w * L2);
    const det = add(mul(z11, z22), mul(c(-1), mul(z12, z12)));
    const I1 = div(mul(c(V), z22), det);
    const I2 = div(mul(c(-V), z12), det);
    const at = (I: C, t: number): number => I.re * Math.sin(w * t) + I.im * Math.cos(w * t);

    const k0 = sampleAt(r.time, (cycles - 1) / f);
    const t = r.time.slice(k0);
    const i1 = r.current(primary).slice(k0);
    const i2 = r.current(secondary).slice(k0);
    expect(maxRelativeDeviation(i1, t.map((x) => at(I1, x)))).toBeLessThan(1e-5);
    expect(maxRelativeDeviation(i2, t.map((x) => at(I2, x)))).toBeLessThan(1e-5);
    // The load voltage is -RL * i2 by Ohm's law: a consistency check of the result accessors.
    expect(maxRelativeDeviation(r.voltage(load), r.current(secondary).map((x) => -RL * x))).toBeLessThan(1e-9);
    expect(maxFluxImbalance(r, [leg, yoke])).toBeLessThan(1e-12);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });
});

describe('simulate: three-leg core with centre excitation and unequal resistive loads', () => {
  it('gives equal winding currents and outer voltages that add to the source and divide as the loads (ideal limit)', () => {
    // Ideal-transformer limit of a three-leg (shell) core, a fact of the trade (REFERENCES.md section 2):
    // with very high permeability the MMF around each window is ~0, so with equal turns the outer
    // currents equal the centre current; the centre flux is the sum of the outer fluxes, so the outer
    // voltages add to the centre voltage; equal currents make them divide as the load resistances.
    const V = 100;
    const f = 50;
    const N = 100;
    const area = 1e-3;
    const [R1, R2] = [10, 30];
    // mu_r = 1e10 makes the magnetising MMF ~1e-7 of the load MMF, far below the checked 1e-5.
    const material = { kind: 'linear', relativePermeability: 1e10 } as const;
    const net = createNetwork('three-leg');
    const top = net.magneticNode('top yoke');
    const bottom = net.magneticNode('bottom yoke');
    const centre = net.fluxTube('centre', { from: bottom, to: top, length: 0.15, area: 2 * area, material });
    const left = net.fluxTube('left', { from: top, to: bottom, length: 0.25, area, material });
    const right = net.fluxTube('right', { from: top, to: bottom, length: 0.25, area, material });
    const src = net.node('src');
    const a = net.node('a');
    const b = net.node('b');
    const mains = net.voltageSource('mains', src, net.ground, sine({ amplitude: V, frequency: f, phase: Math.PI / 2 }));
    const wc = net.winding('centre winding', { tube: centre, turns: N, plus: src, minus: net.ground });
    const wl = net.winding('left winding', { tube: left, turns: N, plus: a, minus: net.ground });
    const wr = net.winding('right winding', { tube: right, turns: N, plus: b, minus: net.ground });
    net.resistor('load 1', a, net.ground, R1);
    net.resistor('load 2', b, net.ground, R2);

    const r = simulate(net, { stopTime: 2 / f, rtol: 1e-9, sampling: { interval: 1e-4 } });
    expect(r.status).toBe('success');
    const ic = r.current(wc);
    const il = r.current(wl);
    const ir = r.current(wr);
    // Window MMF balance: N ic + N il = 0 and N ic + N ir = 0 (orientations as built).
    expect(maxRelativeDeviation(il.map((x) => -x), ic)).toBeLessThan(1e-5);
    expect(maxRelativeDeviation(ir.map((x) => -x), ic)).toBeLessThan(1e-5);
    // Hence ic = v / (R1 + R2).
    expect(maxRelativeDeviation(ic, r.voltage(mains).map((v) => v / (R1 + R2)))).toBeLessThan(1e-5);
    const vl = r.voltage(wl);
    const vr = r.voltage(wr);
    expect(maxRelativeDeviation(vl.map((x, k) => x + vr[k]!), r.voltage(mains))).toBeLessThan(1e-9);
    expect(maxRelativeDeviation(vl.map((x) => x * (R2 / R1)), vr)).toBeLessThan(1e-5);
    // The centre flux splits in the ratio of the loads, not equally.
    const phiL = r.flux(left);
    const phiR = r.flux(right);
    expect(maxRelativeDeviation(phiL.map((x) => x * (R2 / R1)), phiR)).toBeLessThan(1e-5);
    expect(maxFluxImbalance(r, [centre, left, right])).toBeLessThan(1e-12);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });
});
