/**
 * Tolerances that mean what they say: with the default (per-quantity)
 * absolute tolerances, a tighter rtol must not give a worse answer. Before,
 * radau5's tolerance map (atol' = rtol'/rtol atol, Hairer and Wanner's
 * radau5.f) was applied to the fixed defaults, so they loosened as rtol
 * tightened and rtol 1e-12 gave a worse final current than 1e-8.
 *
 * Reference: an RL circuit switched onto a DC source, i(t) = (V/R)(1 - exp(-R t / L))
 * (closed form; any circuits text, e.g. Hayt and Kemmerly, Engineering Circuit
 * Analysis, first-order RL circuits). The inductor is a winding on a linear
 * core, L = N^2 / R_m (derived: magnetic Ohm's law).
 */
import { describe, expect, it } from 'vitest';
import { MU0, constant, createNetwork, simulate } from '../../src/index.js';

const N = 100;
const LENGTH = 0.2;
const AREA = 4e-4;
const MU_R = 2000;
const R = 2;
const V = 10;

function rlCircuit() {
  const net = createNetwork('RL step');
  const a = net.magneticNode('a');
  const b = net.magneticNode('b');
  const leg = net.fluxTube('leg', { from: a, to: b, length: LENGTH / 2, area: AREA, material: { kind: 'linear', relativePermeability: MU_R } });
  net.fluxTube('yoke', { from: b, to: a, length: LENGTH / 2, area: AREA, material: { kind: 'linear', relativePermeability: MU_R } });
  const top = net.node('top');
  net.voltageSource('supply', top, net.ground, constant(V));
  const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: top, minus: net.ground });
  return { net, coil };
}

describe('tightening rtol', () => {
  it('never worsens the error of an RL step against its closed form (default absolute tolerances)', () => {
    const L = (N * N * MU0 * MU_R * AREA) / LENGTH;
    const tau = L / R;
    const stopTime = 3 * tau;
    const exact = (V / R) * (1 - Math.exp(-stopTime / tau));
    const { net, coil } = rlCircuit();
    const errors = [1e-6, 1e-8, 1e-10, 1e-12].map((rtol) => {
      const r = simulate(net, { stopTime, rtol });
      expect(r.status).toBe('success');
      const i = r.current(coil);
      return Math.abs(i[i.length - 1]! - exact) / exact;
    });
    // Each tightening must not make the answer worse, beyond a factor 2 of the noise in the error
    // estimate where atol and round-off take over (our choice; the solver's own test uses the same bound).
    for (let k = 1; k < errors.length; k++) expect(errors[k]!).toBeLessThanOrEqual(2 * errors[k - 1]! + 1e-15);
    expect(errors[3]!).toBeLessThan(errors[0]!);
    expect(errors[3]!).toBeLessThan(1e-9);
  });
});
