/**
 * Quantities that need a state derivative (a tube's eddy term R_e dphi/dt, a
 * capacitor's current) stay finite when the mass matrix mixes entries of very
 * different sizes. Used to fail: an eddy resistance, a leakage reluctance and
 * a small RC snubber gave NaN mmf, eddyPower, magneticPotential and energy
 * audit at every sample with status 'success' (the functional's row and column
 * scaling turned a 1 pF entry into 1e12, and the SVD dropped the eddy rows
 * under its rank threshold).
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine } from '../../src/index.js';

/** Closed three-tube core with an eddy resistance on the wound leg, a leakage reluctance across it, a winding with an RC snubber. Invented values. */
function snubbered(eddyResistance: number, capacitance: number) {
  const net = createNetwork('snubbered winding');
  const a = net.magneticNode('a');
  const b = net.magneticNode('b');
  const c = net.magneticNode('c');
  const steel = { kind: 'linear' as const, relativePermeability: 2000 };
  const core = net.fluxTube('core', { from: a, to: b, length: 0.1, area: 1e-4, material: steel, eddyResistance });
  net.fluxTube('yoke', { from: b, to: c, length: 0.1, area: 1e-4, material: steel });
  net.fluxTube('return', { from: c, to: a, length: 0.1, area: 1e-4, material: steel });
  const leak = net.reluctance('leak', { from: b, to: a, reluctance: 1e7 });
  const p = net.node('p');
  const s = net.node('s');
  net.voltageSource('drive', p, net.ground, sine({ amplitude: 10, frequency: 1000 }));
  const coil = net.winding('coil', { tube: core, turns: 10, resistance: 0.1, plus: p, minus: net.ground });
  const snubberR = net.resistor('snubber R', p, s, 100);
  const cap = net.capacitor('snubber C', s, net.ground, capacitance);
  return { net, a, b, core, leak, coil, cap, snubberR };
}

const allFinite = (x: Float64Array): boolean => x.every(Number.isFinite);

describe('derivative functionals with badly scaled mass matrices', () => {
  for (const [eddy, capacitance] of [[5e3, 1e-12], [1e8, 1e-9], [1e6, 1e-12]] as const) {
    it(`eddy resistance ${eddy}, snubber ${capacitance} F: every quantity finite and consistent`, () => {
      const { net, a, b, core, leak, coil, cap, snubberR } = snubbered(eddy, capacitance);
      const r = simulate(net, { stopTime: 1e-3, rtol: 1e-8 });
      expect(r.status).toBe('success');
      const mmfCore = r.mmf(core);
      const mmfLeak = r.mmf(leak);
      const eddyPower = r.eddyPower(core);
      const ua = r.magneticPotential(a);
      const ub = r.magneticPotential(b);
      const iCoil = r.current(coil);
      const iCap = r.current(cap);
      for (const x of [mmfCore, mmfLeak, eddyPower, ua, ub, iCap]) expect(allFinite(x)).toBe(true);
      // Ampere's law around the loop core (a->b) + leak (b->a), which the winding links once:
      // the MMF drops add up to N i (magnetic Kirchhoff voltage law; any magnetic-circuit text).
      // Tolerances relative to the largest MMF of the run (round-off of the sums).
      const scale = Math.max(...iCoil.map((i) => 10 * Math.abs(i)));
      expect(scale).toBeGreaterThan(0);
      for (let k = 0; k < r.length; k++) {
        const ni = 10 * iCoil[k]!;
        expect(Math.abs(mmfCore[k]! + mmfLeak[k]! - ni)).toBeLessThanOrEqual(1e-9 * scale);
        // The leak's drop is the potential difference of its ends.
        expect(Math.abs(ub[k]! - ua[k]! - mmfLeak[k]!)).toBeLessThanOrEqual(1e-9 * scale);
        // Eddy power is R_e (dphi/dt)^2 >= 0 (definition).
        expect(eddyPower[k]!).toBeGreaterThanOrEqual(0);
      }
      // Kirchhoff's current law at the snubber's middle node: the capacitor carries the resistor's current.
      const iR = r.current(snubberR);
      const iScale = Math.max(...iR.map(Math.abs));
      for (let k = 0; k < r.length; k++) expect(Math.abs(iCap[k]! - iR[k]!)).toBeLessThanOrEqual(1e-6 * iScale);
      const audit = r.energy();
      expect(Number.isFinite(audit.relativeError)).toBe(true);
      expect(Number.isFinite(audit.dissipated.eddy)).toBe(true);
      expect(audit.dissipated.eddy).toBeGreaterThan(0);
      // Energy balance (conservation of energy): sources = dissipated + change of stored energy.
      expect(audit.relativeError).toBeLessThan(1e-5);
    });
  }
});
