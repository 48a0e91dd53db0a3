/**
 * The energy audit on a switched magnetic circuit: a flyback with 1 uH of
 * primary leakage and an RCD clamp (our own test circuit, invented values;
 * the same as bench/devices.ts), 20 periods through every commutation
 * (gate edges, clamp and output diodes turning on and off). Conservation of
 * energy: source energy = resistors, switch and diode losses + winding
 * copper + the change of magnetic and capacitor energy.
 */
import { describe, expect, it } from 'vitest';
import { flybackWithClamp } from '../../bench/devices.js';
import { simulate } from '../../src/index.js';

describe('flyback with leakage and an RCD clamp', () => {
  it('balances the energy audit over 20 periods of commutations', () => {
    const net = flybackWithClamp({ forwardVoltage: 0.5, onResistance: 0.01 });
    const r = simulate(net, { stopTime: 20 * 10e-6 });
    expect(r.status).toBe('success');
    const audit = r.energy();
    // radau5's effective tolerance at the default rtol 1e-6: rtol' = 0.1 rtol^(2/3) = 1e-5.
    expect(audit.relativeError).toBeLessThan(0.1 * 1e-6 ** (2 / 3));
    expect(audit.dissipated.resistors).toBeGreaterThan(0);
    expect(audit.dissipated.windings).toBeGreaterThan(0);
  });
});
