import { describe, expect, it } from 'vitest';
import { bipolarSquare, createNetwork, cycleMeans, MU0, periodicSteadyState, simulate, sine } from '../../src/index.js';

describe('periodicSteadyState', () => {
  it.each(['full', 'reduced'] as const)('reaches the DC flux offset that the winding resistance sets under a volt-second imbalance (linear core, %s formulation)', (formulation) => {
    // Push-pull style drive with the positive on-time longer by `mismatch`: the drive has a mean
    // V_dc = A * mismatch / T. In the periodic steady state the mean of N1 dphi/dt is zero, so
    // V_dc = R1 <i1>; the resistive secondary carries no DC (its mean voltage is zero); the magnetic
    // circuit law R_m <phi> = N1 <i1> then gives <phi> = N1 V_dc / (R1 R_m) (DERIVED, linear core).
    const [A, T, dead, mismatch] = [24, 2e-5, 3e-7, 60e-9];
    const [N1, N2, R1, R2, RL] = [6, 3, 0.05, 0.02, 1.5];
    const area = 1.2e-4;
    const mur = 2500;
    const path = 0.06;
    const net = createNetwork('push-pull, linear core');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const material = { kind: 'linear', relativePermeability: mur } as const;
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: path / 2, area, material });
    net.fluxTube('yoke', { from: m2, to: m1, length: path / 2, area, material });
    const d = net.node('drive');
    const o = net.node('out');
    net.voltageSource('bridge', d, net.ground, bipolarSquare({ amplitude: A, period: T, deadTime: dead, mismatch }));
    net.winding('primary', { tube: leg, turns: N1, resistance: R1, plus: d, minus: net.ground });
    net.winding('secondary', { tube: leg, turns: N2, resistance: R2, plus: o, minus: net.ground });
    net.resistor('load', o, net.ground, RL);

    // The reduced formulation solves the currents and potentials inside f (the two windings' rows
    // recombined: one flux derivative); the same derived offset must come out.
    const pss = periodicSteadyState(net, { period: T, samplesPerPeriod: 400, formulation });
    expect(pss.status).toBe('converged');
    const Rm = path / (MU0 * mur * area);
    const vdc = (A * mismatch) / T;
    const expected = (N1 * vdc) / (R1 * Rm);
    const phi = pss.result.flux(leg);
    const mean = cycleMeans(pss.result.time, phi, { period: T }).means[0]!;
    // Per-cycle mean by the trapezoid rule on exact samples that include both sides of every edge.
    expect(Math.abs(mean / expected - 1)).toBeLessThan(1e-6);
    // Periodicity: the period ends where it began.
    expect(Math.abs(phi[phi.length - 1]! - phi[0]!) / Math.max(...phi.map(Math.abs))).toBeLessThan(1e-5);
    // The time constant L/R is many periods long: a brute-force run would need hundreds of periods.
    const tau = (N1 * N1) / Rm / (R1 * 1);
    expect(tau / T).toBeGreaterThan(100);
    expect(pss.periods).toBeLessThan(30);
  });

  it('finds the same steady state as a long brute-force run of a saturating inductor, in a fraction of its periods', () => {
    // Reference: simulate 120 periods (about 9 time constants of the DC offset) and take the last one.
    const f = 50;
    const T = 1 / f;
    const net = createNetwork('saturating choke');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const material = { kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: 1.5 } as const;
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.2, area: 1e-3, material });
    net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-3, material });
    const a = net.node('a');
    net.voltageSource('mains', a, net.ground, sine({ amplitude: 60, frequency: f }));
    const coil = net.winding('coil', { tube: leg, turns: 200, resistance: 2, plus: a, minus: net.ground });
    const periodsBrute = 120;
    const brute = simulate(net, { stopTime: periodsBrute * T, rtol: 1e-8, sampling: { interval: T / 200, exact: true } });
    expect(brute.status).toBe('success');
    const pss = periodicSteadyState(net, { period: T, samplesPerPeriod: 200 });
    expect(pss.status).toBe('converged');
    const iB = brute.current(coil).slice(-201);
    const iP = pss.result.current(coil);
    expect(iP.length).toBe(201);
    let worst = 0;
    let scale = 0;
    for (let k = 0; k < iP.length; k++) {
      worst = Math.max(worst, Math.abs(iB[k]! - iP[k]!));
      scale = Math.max(scale, Math.abs(iB[k]!));
    }
    expect(worst / scale).toBeLessThan(1e-4);
    expect(pss.periods).toBeLessThan(periodsBrute / 4);
  });
});
