/**
 * Known defects, found by the soak run (test/soak/soak.ts) and not fixed yet:
 * each is an expected failure (`it.fails`), so the suite stays green while
 * the defect exists and turns red the day it is fixed (then turn the test
 * into a plain regression test and drop the exclusion from the random
 * network properties).
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine } from '../../src/index.js';

/** A winding on a closed linear core, fed through a switch that opens at 0.4 ms, with an RC snubber across it. Invented values. */
function openingOnSnubber(capacitance: number) {
  const net = createNetwork('opening switch');
  const a = net.magneticNode('a');
  const b = net.magneticNode('b');
  const steel = { kind: 'linear' as const, relativePermeability: 2000 };
  const leg = net.fluxTube('leg', { from: a, to: b, length: 0.1, area: 4e-4, material: steel });
  net.fluxTube('yoke', { from: b, to: a, length: 0.1, area: 4e-4, material: steel });
  const s = net.node('s');
  const w = net.node('w');
  const m = net.node('m');
  net.voltageSource('mains', s, net.ground, sine({ amplitude: 100, frequency: 1000, phase: Math.PI / 2 }));
  net.switch('breaker', s, w, { closed: true, schedule: [{ time: 0.4e-3, closed: false }] });
  net.winding('coil', { tube: leg, turns: 100, resistance: 1, plus: w, minus: net.ground });
  net.resistor('snubber R', w, m, 1);
  net.capacitor('snubber C', m, net.ground, capacitance);
  return net;
}

describe('known defects (expected failures)', () => {
  it('control: with a 1 nF snubber the same opening balances energy', () => {
    const r = simulate(openingOnSnubber(1e-9), { stopTime: 1e-3, maxStep: 5e-5 });
    expect(r.status).toBe('success');
    // Conservation of energy: measured relative error 1e-5.
    expect(r.energy().relativeError).toBeLessThan(1e-3);
  });

  // Measured: status 'success', relativeError 0.997: the resistors dissipate 0.32 J while the
  // source delivers 0.9 mJ and the winding's inductance (L = N^2 / R_m = 0.05 H, i <= 0.32 A)
  // stores at most 2.5 mJ. Same at rtol 1e-9, so it is no tolerance effect. A run must either
  // balance energy or not report success (RULES: never report success for a wrong run).
  it.fails('a switch opening on a winding with a 1 pF snubber balances energy (or does not report success)', () => {
    const r = simulate(openingOnSnubber(1e-12), { stopTime: 1e-3, maxStep: 5e-5 });
    if (r.status === 'success') expect(r.energy().relativeError).toBeLessThan(1e-3);
  });
});
