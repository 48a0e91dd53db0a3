import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine, MU0 } from '../../src/index.js';
import { maxRelativeDeviation } from '../helpers/conservation.js';

describe('simulate: index-2 structures', () => {
  it('DC-bias inductor: a winding fed by a current source has phi = N I / R_m and v = R I + (N^2/R_m) dI/dt', () => {
    // Magnetic circuit law (Hopkinson): R_m phi = N i; Faraday: v = R i + N dphi/dt. With i forced by
    // the source, phi and v follow in closed form (DERIVED). The winding voltage is an index-2 unknown.
    const [I0, I1, f] = [2, 0.5, 1000];
    const w = 2 * Math.PI * f;
    const [N, R, area, mur, length] = [40, 0.3, 2e-4, 500, 0.08];
    const Rm = length / (MU0 * mur * area) + 0.5e-3 / (MU0 * area);
    const net = createNetwork('dc-bias inductor');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const core = net.fluxTube('core', {
      from: m1, to: m2, length, area, material: { kind: 'linear', relativePermeability: mur },
      initialFlux: (N * I0) / Rm, // the source current at t0 fixes the flux (a hidden constraint of index 2)
    });
    net.airGap('gap', { from: m2, to: m1, length: 0.5e-3, area });
    const a = net.node('a');
    net.currentSource('bias', a, net.ground, sine({ amplitude: I1, frequency: f, offset: I0 }));
    const coil = net.winding('coil', { tube: core, turns: N, resistance: R, plus: a, minus: net.ground });
    const r = simulate(net, { stopTime: 3 / f, rtol: 1e-8, sampling: { interval: 1 / (100 * f), exact: true } });
    expect(r.status).toBe('success');
    const I = r.time.map((t) => I0 + I1 * Math.sin(w * t));
    const dI = r.time.map((t) => I1 * w * Math.cos(w * t));
    expect(maxRelativeDeviation(r.flux(core), I.map((i) => (N * i) / Rm))).toBeLessThan(1e-7);
    expect(maxRelativeDeviation(r.voltage(coil), I.map((i, k) => R * i + ((N * N) / Rm) * dI[k]!))).toBeLessThan(1e-5);
    expect(r.energy().relativeError).toBeLessThan(1e-5);
  });

  it('DC-bias inductor without an initial flux: the flux is set from the source current at t0, with a warning', () => {
    // Same closed form; the model leaves the initial flux at 0, which the forced current contradicts.
    const [I0, f, N, area, mur, length] = [1.5, 500, 30, 1e-4, 800, 0.05];
    const Rm = length / (MU0 * mur * area);
    const net = createNetwork('dc-bias, no initial flux');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const core = net.fluxTube('core', { from: m1, to: m2, length: length / 2, area, material: { kind: 'linear', relativePermeability: mur } });
    net.fluxTube('return', { from: m2, to: m1, length: length / 2, area, material: { kind: 'linear', relativePermeability: mur } });
    const a = net.node('a');
    net.currentSource('bias', a, net.ground, sine({ amplitude: 0.2, frequency: f, offset: I0 }));
    net.winding('coil', { tube: core, turns: N, resistance: 0.1, plus: a, minus: net.ground });
    const r = simulate(net, { stopTime: 2 / f, rtol: 1e-8 });
    expect(r.status).toBe('success');
    expect(r.warnings.length).toBe(1);
    expect(r.warnings[0]).toMatch(/core/);
    expect(r.flux(core)[0]! / ((N * I0) / Rm)).toBeCloseTo(1, 9);
  });

  it('capacitor across a voltage source: the source current is C dv/dt + v/R', () => {
    // Capacitor law i = C dv/dt plus Ohm's law (DERIVED). The source current is an index-2 unknown.
    const [V, f, C, R] = [10, 50, 1e-4, 100];
    const w = 2 * Math.PI * f;
    const net = createNetwork('cv loop');
    const a = net.node('a');
    const src = net.voltageSource('supply', a, net.ground, sine({ amplitude: V, frequency: f }));
    net.capacitor('c', a, net.ground, C);
    net.resistor('r', a, net.ground, R);
    const r = simulate(net, { stopTime: 2 / f, rtol: 1e-8, sampling: { interval: 1 / (100 * f), exact: true } });
    expect(r.status).toBe('success');
    const exact = r.time.map((t) => C * V * w * Math.cos(w * t) + (V * Math.sin(w * t)) / R);
    expect(maxRelativeDeviation(r.current(src), exact)).toBeLessThan(1e-5);
    expect(r.energy().relativeError).toBeLessThan(1e-5);
  });
});
