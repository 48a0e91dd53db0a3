import { describe, expect, it } from 'vitest';
import { Solver } from '../support/odex.js';
import { createNetwork, simulate, sine, MU0 } from '../../src/index.js';
import { maxFluxImbalance } from '../helpers/conservation.js';

describe('simulate: three-leg core with finite reluctances against a hand-reduced ODE integrated by odex', () => {
  it('agrees with odex (Hairer and Wanner extrapolation code) to 1e-6 relative', () => {
    // Test data of our own: a gapped centre leg with the excitation, two outer legs with windings
    // and unequal resistive loads.
    const [V, f] = [50, 50];
    const w = 2 * Math.PI * f;
    const [Nc, Nl, Nr] = [120, 80, 60];
    const [Rwc, Rwl, Rwr] = [1.5, 0.8, 0.6];
    const [Rload1, Rload2] = [20, 45];
    const mur = 3000;
    const [Ac, Ao] = [8e-4, 4e-4];
    const [lc, lo, lg] = [0.12, 0.3, 0.4e-3];
    const material = { kind: 'linear', relativePermeability: mur } as const;

    const net = createNetwork('three-leg finite');
    const top = net.magneticNode('top');
    const mid = net.magneticNode('gap edge');
    const bottom = net.magneticNode('bottom');
    const centre = net.fluxTube('centre', { from: bottom, to: mid, length: lc, area: Ac, material });
    const gap = net.airGap('centre gap', { from: mid, to: top, length: lg, area: Ac });
    const left = net.fluxTube('left', { from: top, to: bottom, length: lo, area: Ao, material });
    const right = net.fluxTube('right', { from: top, to: bottom, length: lo, area: Ao, material });
    const s = net.node('s');
    const a = net.node('a');
    const b = net.node('b');
    net.voltageSource('supply', s, net.ground, sine({ amplitude: V, frequency: f }));
    net.winding('wc', { tube: centre, turns: Nc, resistance: Rwc, plus: s, minus: net.ground });
    net.winding('wl', { tube: left, turns: Nl, resistance: Rwl, plus: a, minus: net.ground });
    net.winding('wr', { tube: right, turns: Nr, resistance: Rwr, plus: b, minus: net.ground });
    net.resistor('load 1', a, net.ground, Rload1);
    net.resistor('load 2', b, net.ground, Rload2);

    const cycles = 3;
    const dt = 1 / (100 * f);
    const r = simulate(net, {
      stopTime: cycles / f, rtol: 1e-10, atol: { voltage: 1e-10, current: 1e-10, fluxDensity: 1e-12 },
      sampling: { interval: dt },
    });
    expect(r.status).toBe('success');

    // Hand reduction (magnetic circuit laws, Hopkinson and Kirchhoff; DERIVED here):
    // reluctances Rc = lc/(mu0 mur Ac) + lg/(mu0 Ac), Ro = lo/(mu0 mur Ao); states phiL, phiR with
    // phiC = phiL + phiR. Window loops: Rc phiC + Ro phiL = Nc ic + Nl il, Rc phiC + Ro phiR = Nc ic + Nr ir.
    // Windings: V(t) = Rwc ic + Nc phiC'; Nl phiL' = -(Rwl + Rload1) il; Nr phiR' = -(Rwr + Rload2) ir.
    // Eliminating the currents:
    //   (Nc^2/Rwc + Nl^2/Gl) phiL' + (Nc^2/Rwc) phiR' = Nc V/Rwc - Rc phiC - Ro phiL
    //   (Nc^2/Rwc) phiL' + (Nc^2/Rwc + Nr^2/Gr) phiR' = Nc V/Rwc - Rc phiC - Ro phiR
    // with Gl = Rwl + Rload1, Gr = Rwr + Rload2: a 2x2 linear system for the derivatives.
    const Rc = lc / (MU0 * mur * Ac) + lg / (MU0 * Ac);
    const Ro = lo / (MU0 * mur * Ao);
    const kc = (Nc * Nc) / Rwc;
    const a11 = kc + (Nl * Nl) / (Rwl + Rload1);
    const a22 = kc + (Nr * Nr) / (Rwr + Rload2);
    const det = a11 * a22 - kc * kc;
    const rhs = (t: number, y: number[]): number[] => {
      const [phiL, phiR] = y as [number, number];
      const drive = (Nc * V * Math.sin(w * t)) / Rwc - Rc * (phiL + phiR);
      const b1 = drive - Ro * phiL;
      const b2 = drive - Ro * phiR;
      return [(a22 * b1 - kc * b2) / det, (a11 * b2 - kc * b1) / det];
    };
    const odex = new Solver(2);
    odex.absoluteTolerance = 1e-14;
    odex.relativeTolerance = 1e-12;
    odex.denseOutput = true;
    const refL: number[] = [];
    const refR: number[] = [];
    odex.solve(rhs, 0, [0, 0], cycles / f, odex.grid(dt, (_x, y) => {
      refL.push(y[0]!);
      refR.push(y[1]!);
    }));

    const phiL = r.flux(left);
    const phiR = r.flux(right);
    const count = Math.min(refL.length, phiL.length);
    expect(count).toBeGreaterThan(290);
    const scale = Math.max(...refL.map(Math.abs), ...refR.map(Math.abs));
    let worst = 0;
    for (let k = 0; k < count; k++) {
      expect(Math.abs(r.time[k]! - k * dt)).toBeLessThan(1e-12);
      worst = Math.max(worst, Math.abs(phiL[k]! - refL[k]!), Math.abs(phiR[k]! - refR[k]!));
    }
    expect(worst / scale).toBeLessThan(1e-6);
    expect(maxFluxImbalance(r, [centre, gap, left, right])).toBeLessThan(1e-12);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });
});
