import { describe, expect, it } from 'vitest';
import { createNetwork, MU0, simulate, sine } from '../../src/index.js';
import { maxRelativeDeviation } from '../helpers/conservation.js';

/**
 * Two windings on one tube with no leakage path: their voltage equations
 * have proportional mass-matrix rows (a hidden algebraic equation). Before
 * the solver recombined such rows, a start with a tiny non-zero state chose a
 * first step of ~1e-14 s, at which the iteration matrix was numerically
 * singular: simulate returned 'singular-matrix' at t = 0.
 */
function idealTransformer(phase: number) {
  const net = createNetwork('transformer without leakage');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const material = { kind: 'linear', relativePermeability: 2000 } as const;
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material });
  net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material });
  const p = net.node('p');
  const s = net.node('s');
  net.voltageSource('mains', p, net.ground, sine({ amplitude: 10, frequency: 50, phase }));
  net.winding('primary', { tube: leg, turns: 200, resistance: 1, plus: p, minus: net.ground });
  const secondary = net.winding('secondary', { tube: leg, turns: 100, resistance: 0.5, plus: s, minus: net.ground });
  net.resistor('load', s, net.ground, 5);
  return { net, leg, secondary };
}

describe('simulate: two windings on one flux path (no leakage)', () => {
  it('starts from a state that is zero but for round-off and follows the closed form of the loaded transformer', () => {
    // DERIVED (Faraday on each winding, Ampere on the loop, R_m = l/(mu0 mu_r A)):
    // N1 phi' = V sin(wt) - R1 i1, N2 phi' = -(R2 + R_L) i2, N1 i1 + N2 i2 = R_m phi, which reduce to
    // c phi' = V sin(wt) - k phi with c = N1 + R1 N2^2/(N1 (R2 + R_L)), k = R1 R_m / N1, so for phi(0) = 0
    // phi = V/c [a sin(wt) - w cos(wt) + w exp(-a t)]/(a^2 + w^2), a = k/c.
    const { net, leg } = idealTransformer(1e-11);
    const r = simulate(net, { stopTime: 0.04, rtol: 1e-9, atol: { voltage: 1e-9, current: 1e-9, fluxDensity: 1e-11 } });
    expect(r.status).toBe('success');
    const [N1, N2, R1, Rt, V, w] = [200, 100, 1, 5.5, 10, 2 * Math.PI * 50];
    const Rm = 0.2 / (MU0 * 2000 * 1e-4);
    const c = N1 + (R1 * N2 * N2) / (N1 * Rt);
    const a = (R1 * Rm) / N1 / c;
    const exact = r.time.map((t) => ((V / c) * (a * Math.sin(w * t) - w * Math.cos(w * t) + w * Math.exp(-a * t))) / (a * a + w * w));
    expect(maxRelativeDeviation(r.flux(leg), exact)).toBeLessThan(1e-6);
    expect(r.energy().relativeError).toBeLessThan(1e-6);
  });
});
