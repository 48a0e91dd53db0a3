// A single winding on a closed linear core (a leg and a yoke in series) fed by a
// sine source: a series RL circuit with L = N^2 / R_m. Values are ours (test data),
// the same as test/network/single-winding.test.ts, so that L/R is two 50 Hz cycles.
import { createNetwork, MU0, sine, type NetworkDescription } from '../../src/index.js';
import type { SweepJob } from '../../src/sweep/index.js';

export const V = 100; // V peak
export const F = 50; // Hz
export const W = 2 * Math.PI * F;
export const N = 100;
export const AREA = 1e-3; // m^2
export const MUR = 2000;
export const LEG = 0.2; // m
export const YOKE = 0.1; // m
/** Loop reluctance, A/Wb. */
export const RM = (LEG + YOKE) / (MU0 * MUR * AREA);
/** Winding inductance, H (magnetic circuit law L = N^2 / R_m). */
export const L = (N * N) / RM;
export const R = 2.1; // ohm

export function rlDescription(): NetworkDescription {
  const net = createNetwork('rl winding');
  const top = net.magneticNode('top');
  const bottom = net.magneticNode('bottom');
  const material = { kind: 'linear', relativePermeability: MUR } as const;
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: LEG, area: AREA, material });
  net.fluxTube('yoke', { from: top, to: bottom, length: YOKE, area: AREA, material });
  const a = net.node('a');
  net.voltageSource('mains', a, net.ground, sine({ amplitude: V, frequency: F }));
  net.winding('coil', { tube: leg, turns: N, resistance: R, plus: a, minus: net.ground });
  return net.describe();
}

/** A sweep over the switching angle (the source's phase at t = 0) of the RL winding. */
export function angleJob(angles: readonly number[], extra: Partial<SweepJob> = {}): SweepJob {
  return {
    format: 'fluxstate-sweep/1',
    name: 'rl switching angle',
    network: rlDescription(),
    simulate: { stopTime: 2 / F },
    parameters: { axes: [{ name: 'angle', target: { element: 'mains', field: 'waveform.phase' } }], grid: { angle: angles } },
    outputs: [
      { name: 'peak current', quantity: 'current', of: { element: 'coil' }, metric: 'peak' },
      { name: 'peak B', quantity: 'fluxDensity', of: { tube: 'leg' }, metric: 'peak' },
      { name: 'final current', quantity: 'current', of: { element: 'coil' }, metric: 'final' },
    ],
    ...extra,
  };
}

/**
 * Winding current of the RL circuit switched on at t = 0 by v = V sin(w t + theta),
 * from rest (DERIVED; the complete response of a series RL circuit, e.g. Hayt and
 * Kemmerly, Engineering Circuit Analysis, RL circuits with sinusoidal forcing):
 * the forced part is (V/Z) sin(w t + theta - phi) with Z = sqrt(R^2 + (w L)^2),
 * phi = atan(w L / R); the natural part A exp(-t/tau), tau = L/R; i(0) = 0 gives
 * A = -(V/Z) sin(theta - phi).
 */
export function rlCurrent(t: number, theta: number): number {
  const z = Math.hypot(R, W * L);
  const phi = Math.atan2(W * L, R);
  return (V / z) * (Math.sin(W * t + theta - phi) - Math.sin(theta - phi) * Math.exp((-t * R) / L));
}

/** max |i(t)| over [0, tEnd] of the closed form: a fine scan, then golden-section refinement. */
export function rlPeak(theta: number, tEnd: number): number {
  const f = (t: number): number => Math.abs(rlCurrent(t, theta));
  const n = 20000;
  let best = 0;
  for (let k = 1; k <= n; k++) if (f((k * tEnd) / n) > f((best * tEnd) / n)) best = k;
  let lo = (Math.max(0, best - 1) * tEnd) / n;
  let hi = (Math.min(n, best + 1) * tEnd) / n;
  const g = (Math.sqrt(5) - 1) / 2;
  for (let k = 0; k < 100; k++) {
    const c = hi - g * (hi - lo);
    const d = lo + g * (hi - lo);
    if (f(c) >= f(d)) hi = d;
    else lo = c;
  }
  return f((lo + hi) / 2);
}
