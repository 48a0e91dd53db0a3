import { describe, expect, it } from 'vitest';
import { Solver } from '../support/odex.js';
import { createNetwork, simulate, sine, MU0 } from '../../src/index.js';
import type { FrohlichKennellySpec } from '../../src/index.js';

/**
 * Frohlich-Kennelly law with the air line, B = mu0 H + J_s H / (H_a + |H|),
 * H_a = J_s / (mu0 (mu_ri - 1)), solved for H by hand here (the positive
 * root of mu0 H^2 + (mu0 H_a + J_s - B) H - H_a B = 0 for B >= 0, odd
 * extension), independently of src/materials.
 */
function frohlichH(b: number, murI: number, js: number): number {
  const ha = js / (MU0 * (murI - 1));
  const x = Math.abs(b);
  const p = MU0 * ha + js - x;
  const h = (-p + Math.sqrt(p * p + 4 * MU0 * ha * x)) / (2 * MU0);
  return Math.sign(b) * h;
}

/** One winding on a closed core of one material tube (length l, area A) fed by a sine source. */
function saturatingInductor(p: { murI: number; js: number; l: number; area: number; turns: number; resistance: number; amplitude: number; frequency: number; phase: number; remanence?: number }) {
  const net = createNetwork('saturating inductor');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const material: FrohlichKennellySpec = { kind: 'frohlich-kennelly', initialRelativePermeability: p.murI, saturationPolarisation: p.js };
  // The core path is split into a leg and a yoke of equal area; their lengths add up to l.
  const leg = net.fluxTube('leg', {
    from: m1, to: m2, length: 0.6 * p.l, area: p.area, material,
    ...(p.remanence !== undefined ? { initialFluxDensity: p.remanence } : {}),
  });
  net.fluxTube('yoke', { from: m2, to: m1, length: 0.4 * p.l, area: p.area, material });
  const a = net.node('a');
  net.voltageSource('mains', a, net.ground, sine({ amplitude: p.amplitude, frequency: p.frequency, phase: p.phase }));
  const coil = net.winding('coil', { tube: leg, turns: p.turns, resistance: p.resistance, plus: a, minus: net.ground });
  return { net, leg, coil };
}

describe('simulate: saturating single-winding inductor', () => {
  it('agrees with the same scalar ODE written by hand and integrated by odex', () => {
    // Test data of our own: a core driven to about 2.6 T by switching at voltage zero.
    const p = { murI: 5000, js: 1.6, l: 0.3, area: 2e-3, turns: 400, resistance: 1, amplitude: 325, frequency: 50, phase: 0 };
    const { net, leg, coil } = saturatingInductor(p);
    const w = 2 * Math.PI * p.frequency;
    const cycles = 3;
    const dt = 1 / (200 * p.frequency);
    const r = simulate(net, {
      stopTime: cycles / p.frequency, rtol: 1e-10, atol: { voltage: 1e-10, current: 1e-10, fluxDensity: 1e-12 },
      sampling: { interval: dt },
    });
    expect(r.status).toBe('success');

    // Faraday and Ampere for one loop: N dphi/dt = v(t) - R i, N i = l H(phi / A).
    const current = (phi: number): number => (p.l * frohlichH(phi / p.area, p.murI, p.js)) / p.turns;
    const odex = new Solver(1);
    odex.absoluteTolerance = 1e-15;
    odex.relativeTolerance = 1e-12;
    odex.denseOutput = true;
    const ref: number[] = [];
    odex.solve((t, y) => [(p.amplitude * Math.sin(w * t) - p.resistance * current(y[0]!)) / p.turns], 0, [0], cycles / p.frequency,
      odex.grid(dt, (_x, y) => { ref.push(y[0]!); }));

    const phi = r.flux(leg);
    const i = r.current(coil);
    const n = Math.min(ref.length, phi.length);
    expect(n).toBeGreaterThan(590);
    let worstPhi = 0;
    let worstI = 0;
    const phiScale = Math.max(...ref.map(Math.abs));
    const iScale = Math.max(...ref.map((x) => Math.abs(current(x))));
    for (let k = 0; k < n; k++) {
      worstPhi = Math.max(worstPhi, Math.abs(phi[k]! - ref[k]!));
      worstI = Math.max(worstI, Math.abs(i[k]! - current(ref[k]!)));
    }
    // The core is driven past saturation: the peak flux density exceeds J_s.
    expect(phiScale / p.area).toBeGreaterThan(p.js);
    expect(worstPhi / phiScale).toBeLessThan(1e-7);
    expect(worstI / iScale).toBeLessThan(1e-6);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });
});

describe('simulate: inrush peak on energisation at voltage zero with remanence', () => {
  // A near-two-slope core: a very high initial permeability makes the Frohlich-Kennelly knee sharp,
  // so above saturation the flux linkage is lambda_s + L_air i with lambda_s = N A J_s and the
  // air-line inductance L_air = mu0 N^2 A / l. Test data of our own.
  const base = { murI: 1e5, js: 1.7, l: 0.5, area: 4e-3, turns: 250, frequency: 50, phase: 0, remanence: 0.6 };
  const w = 2 * Math.PI * base.frequency;
  const lAir = (MU0 * base.turns * base.turns * base.area) / base.l;
  const uRms = 230;
  const lambdaN = (Math.SQRT2 * uRms) / w; // peak flux linkage of the steady state
  const bN = lambdaN / (base.turns * base.area);

  it('matches the exact two-slope result i_peak = (2 lambda_N + lambda_r - lambda_s) / L_air when R = 0', () => {
    // DERIVED (REFERENCES.md section 2): with R = 0, lambda(t) = lambda_r + lambda_N (1 - cos wt) peaks at
    // wt = pi; above the knee i = (lambda - lambda_s) / L_air.
    const { net, coil } = saturatingInductor({ ...base, resistance: 0, amplitude: Math.SQRT2 * uRms });
    const r = simulate(net, { stopTime: 1 / base.frequency, rtol: 1e-9, sampling: { interval: 1e-5, includeSteps: true } });
    expect(r.status).toBe('success');
    const peak = Math.max(...r.current(coil));
    const lambdaR = base.turns * base.area * base.remanence;
    const lambdaS = base.turns * base.area * base.js;
    const exact = (2 * lambdaN + lambdaR - lambdaS) / lAir;
    // The Frohlich-Kennelly curve approaches its asymptote as J_s H_a / H; at the peak H_a/H ~ 1e-4.
    expect(Math.abs(peak / exact - 1)).toBeLessThan(2e-3);
  });

  it('stays just below the published approximate formula with winding resistance (ratio printed)', () => {
    // Y. Wang, S. G. Abdulsalam, W. Xu, "Analytical formula to estimate the maximum inrush current",
    // IEEE Trans. Power Delivery 23(2), 2008, pp. 1266-1268 (form FROM MEMORY, REFERENCES.md section 2):
    //   i_peak = sqrt(2) U / sqrt((w L_air)^2 + R^2) * (2 B_N + B_R - B_S) / B_N.
    // It scales the lossless peak by the impedance of the saturated circuit and neglects the flux the
    // resistance takes away during the saturated interval, so it over-estimates increasingly with
    // R / (w L_air). We check R / (w L_air) = 0.025 .. 0.1 (a range we take as typical of power
    // transformers, from memory) and assert 0.85 <= simulated / formula <= 1: our stated band, not
    // the authors'. Measured when the test was written: 0.977, 0.955, 0.916.
    for (const ratioToReactance of [0.025, 0.05, 0.1]) {
      const resistance = ratioToReactance * w * lAir;
      const { net, coil } = saturatingInductor({ ...base, resistance, amplitude: Math.SQRT2 * uRms });
      const r = simulate(net, { stopTime: 1 / base.frequency, rtol: 1e-8, sampling: { interval: 1e-5, includeSteps: true } });
      expect(r.status).toBe('success');
      const peak = Math.max(...r.current(coil));
      const formula = ((Math.SQRT2 * uRms) / Math.hypot(w * lAir, resistance)) * ((2 * bN + base.remanence - base.js) / bN);
      console.info(`inrush R = ${resistance.toFixed(4)} ohm (R/wL_air = ${ratioToReactance}): simulated ${peak.toFixed(1)} A, formula ${formula.toFixed(1)} A, ratio ${(peak / formula).toFixed(4)}`);
      expect(peak / formula).toBeLessThanOrEqual(1);
      expect(peak / formula).toBeGreaterThanOrEqual(0.85);
    }
  });
});

describe('simulate: eddy-current element', () => {
  it('acts as the core-loss resistance R_c = N^2 / R_e in parallel with L_m = N^2 / R_m (steady state)', () => {
    // Transformer no-load equivalent circuit: magnetising inductance in parallel with a core-loss
    // resistance (Fitzgerald, Kingsley and Umans, Electric Machinery, sect. 2.4). Here the magnetic
    // loop reads R_m phi + R_e dphi/dt = N i, which is that circuit with L_m = N^2/R_m, R_c = N^2/R_e
    // behind the winding resistance R (DERIVED). Test data of our own.
    // R_c = N^2/R_e = 100 ohm is comparable with w L_m = 59 ohm, and R || R_c makes the DC offset decay
    // with tau = L_m / (R || R_c) = 11 ms, so after 12 cycles the transient is below 1e-9.
    const [V, f, N, R, Re] = [100, 50, 150, 20, 225];
    const w = 2 * Math.PI * f;
    const area = 1e-3;
    const mur = 2000;
    const length = 0.3;
    const net = createNetwork('eddy');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const core = net.fluxTube('core', { from: m1, to: m2, length: 0.2, area, material: { kind: 'linear', relativePermeability: mur }, eddyResistance: Re });
    net.fluxTube('yoke', { from: m2, to: m1, length: length - 0.2, area, material: { kind: 'linear', relativePermeability: mur } });
    const a = net.node('a');
    net.voltageSource('mains', a, net.ground, sine({ amplitude: V, frequency: f }));
    const coil = net.winding('coil', { tube: core, turns: N, resistance: R, plus: a, minus: net.ground });
    const cycles = 12;
    const r = simulate(net, { stopTime: cycles / f, rtol: 1e-9, sampling: { interval: 1 / (400 * f) } });
    expect(r.status).toBe('success');

    const Rm = length / (MU0 * mur * area);
    const Lm = (N * N) / Rm;
    const Rc = (N * N) / Re;
    // Z = R + (jw Lm || Rc); I = V / Z with v = Im(V e^{jwt}).
    const zpRe = (Rc * (w * Lm) ** 2) / (Rc * Rc + (w * Lm) ** 2);
    const zpIm = (Rc * Rc * w * Lm) / (Rc * Rc + (w * Lm) ** 2);
    const zRe = R + zpRe;
    const d = zRe * zRe + zpIm * zpIm;
    const [iRe, iIm] = [(V * zRe) / d, (-V * zpIm) / d];
    const last = r.time.map((t) => iRe * Math.sin(w * t) + iIm * Math.cos(w * t));
    // The grid has 400 intervals per period, so the last 401 samples span exactly the last cycle.
    const k0 = r.time.length - 401;
    let worst = 0;
    let scale = 0;
    const i = r.current(coil);
    for (let k = k0; k < r.time.length; k++) {
      worst = Math.max(worst, Math.abs(i[k]! - last[k]!));
      scale = Math.max(scale, Math.abs(last[k]!));
    }
    expect(worst / scale).toBeLessThan(1e-5);
    // Mean eddy power over the last cycle equals |E|^2 / (2 Rc) with E the phasor across the parallel branch.
    const eAmp = Math.hypot(iRe * zpRe - iIm * zpIm, iRe * zpIm + iIm * zpRe);
    const pe = r.eddyPower(core);
    let energy = 0;
    for (let k = k0; k + 1 < r.time.length; k++) energy += 0.5 * (pe[k]! + pe[k + 1]!) * (r.time[k + 1]! - r.time[k]!);
    const meanPower = energy / (r.time[r.time.length - 1]! - r.time[k0]!);
    expect(meanPower / ((eAmp * eAmp) / (2 * Rc)) - 1).toBeLessThan(1e-4);
    expect(meanPower / ((eAmp * eAmp) / (2 * Rc)) - 1).toBeGreaterThan(-1e-4);
    expect(r.energy().dissipated.eddy).toBeGreaterThan(0);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });
});
