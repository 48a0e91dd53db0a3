import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine, MU0 } from '../../src/index.js';
import { maxFluxImbalance, maxRelativeDeviation } from '../helpers/conservation.js';

// A single winding on a closed linear core (a leg and a yoke in series).
// Values are ours (test data), chosen so time constants are a few cycles.
const V = 100; // V peak
const F = 50; // Hz
const W = 2 * Math.PI * F;
const N = 100;
const AREA = 1e-3; // m^2
const MUR = 2000;
const LEG = 0.2; // m
const YOKE = 0.1; // m
const RM = (LEG + YOKE) / (MU0 * MUR * AREA); // loop reluctance, A/Wb
const L = (N * N) / RM; // H, inductance of the winding: L = N^2 / R_m (magnetic circuit law)

function singleWinding(resistance: number, phase: number) {
  const net = createNetwork('single winding');
  const top = net.magneticNode('top');
  const bottom = net.magneticNode('bottom');
  const material = { kind: 'linear', relativePermeability: MUR } as const;
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: LEG, area: AREA, material });
  const yoke = net.fluxTube('yoke', { from: top, to: bottom, length: YOKE, area: AREA, material });
  const a = net.node('a');
  const source = net.voltageSource('mains', a, net.ground, sine({ amplitude: V, frequency: F, phase }));
  const coil = net.winding('coil', { tube: leg, turns: N, resistance, plus: a, minus: net.ground });
  return { net, leg, yoke, source, coil };
}

const tight = { rtol: 1e-9, atol: { voltage: 1e-9, current: 1e-9, fluxDensity: 1e-11 } } as const;

describe('simulate: one winding on a linear core', () => {
  it('doubles the flux when switched at voltage zero with no resistance (flux doubling)', () => {
    // Textbook transformer energisation (e.g. Fitzgerald, Kingsley and Umans, Electric Machinery,
    // ch. 2, and REFERENCES.md section 2, DERIVED): v = V sin(wt), N dphi/dt = v, phi(0) = 0
    // gives phi(t) = V/(N w) (1 - cos wt), peaking at twice the steady amplitude at wt = pi.
    const { net, leg, yoke } = singleWinding(0, 0);
    const r = simulate(net, { stopTime: 2 / F, ...tight, sampling: { interval: 1e-4, includeSteps: true } });
    expect(r.status).toBe('success');
    const phi = r.flux(leg);
    const exact = r.time.map((t) => (V / (N * W)) * (1 - Math.cos(W * t)));
    expect(maxRelativeDeviation(phi, exact)).toBeLessThan(1e-7);
    const peak = Math.max(...phi);
    expect(peak / (V / (N * W))).toBeCloseTo(2, 6);
    expect(maxFluxImbalance(r, [leg, yoke])).toBeLessThan(1e-12);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });

  it('decays the DC flux offset with the L/R time constant (closed-form RL response)', () => {
    // Series RL circuit driven by V sin(wt) from rest (any circuits text, e.g. Hayt and Kemmerly,
    // Engineering Circuit Analysis, complete response of RL circuits):
    // i(t) = V/Z [sin(wt - theta) + sin(theta) exp(-t/tau)], Z = sqrt(R^2 + (wL)^2),
    // theta = atan(wL/R), tau = L/R; the flux is phi = L i / N.
    const R = 2.1;
    const { net, leg, coil } = singleWinding(R, 0);
    const r = simulate(net, { stopTime: 5 / F, ...tight, sampling: { interval: 2e-4, includeSteps: true } });
    expect(r.status).toBe('success');
    const Z = Math.hypot(R, W * L);
    const theta = Math.atan2(W * L, R);
    const tau = L / R;
    const iExact = r.time.map((t) => (V / Z) * (Math.sin(W * t - theta) + Math.sin(theta) * Math.exp(-t / tau)));
    expect(maxRelativeDeviation(r.current(coil), iExact)).toBeLessThan(1e-6);
    expect(maxRelativeDeviation(r.flux(leg), iExact.map((i) => (L * i) / N))).toBeLessThan(1e-6);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });

  it('reaches the B_peak of the transformer EMF equation V_rms = 4.44 f N A B_peak', () => {
    // EMF equation (Fitzgerald, Kingsley and Umans, Electric Machinery, ch. 2; REFERENCES.md
    // section 2). Switched at the voltage peak there is no DC offset, so the first cycle is steady.
    const { net, leg } = singleWinding(0, Math.PI / 2);
    const r = simulate(net, { stopTime: 2 / F, ...tight, sampling: { interval: 5e-5, includeSteps: true } });
    const bPeak = Math.max(...r.fluxDensity(leg).map(Math.abs));
    const vRms = V / Math.SQRT2;
    // The handbook constant 4.44 is 2 pi / sqrt 2 = 4.4429 rounded: within 0.5 % as the issue asks,
    // and the unrounded constant to solver accuracy.
    expect(Math.abs(vRms / (4.44 * F * N * AREA * bPeak) - 1)).toBeLessThan(0.005);
    expect(vRms / (((2 * Math.PI) / Math.SQRT2) * F * N * AREA * bPeak)).toBeCloseTo(1, 6);
  });
});
