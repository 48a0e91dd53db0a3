/**
 * The ideal diode against closed forms: a half-wave rectifier into a
 * resistor, whose output is max(0, v - Vf) R / (R + Ron) (a diode with a
 * forward voltage and an on-resistance in series with the load: Ohm's law
 * on the conducting piece, zero on the blocking one; common practice), and
 * whose commutations are the instants where the source crosses Vf:
 * t_on = asin(Vf/Vm)/w + kT, t_off = (pi - asin(Vf/Vm))/w + kT (derived).
 * Values invented for the test.
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine } from '../../src/index.js';
import { acceptNetwork } from '../../src/simulation/accept-network.js';
import { NetworkRun } from '../../src/simulation/network-run.js';

const Vm = 10;
const f = 50;
const Vf = 0.7;
const Ron = 0.1;
const R = 10;
const Goff = 1e-9;

function halfWave() {
  const net = createNetwork('half-wave rectifier');
  const a = net.node('a');
  const out = net.node('out');
  net.voltageSource('source', a, net.ground, sine({ amplitude: Vm, frequency: f }));
  const diode = net.diode('D1', a, out, { forwardVoltage: Vf, onResistance: Ron, offConductance: Goff });
  const load = net.resistor('load', out, net.ground, R);
  return { net, diode, load };
}

describe('ideal diode: half-wave rectifier into a resistor', () => {
  it('follows max(0, v - Vf) R/(R + Ron) at every step (closed form)', () => {
    const { net, load, diode } = halfWave();
    const r = simulate(net, { stopTime: 3 / f });
    expect(r.status).toBe('success');
    const v = r.voltage(load);
    const id = r.current(diode);
    let worst = 0;
    r.time.forEach((t, i) => {
      const vs = Vm * Math.sin(2 * Math.PI * f * t);
      const expected = (Math.max(0, vs - Vf) * R) / (R + Ron);
      // Blocking, the diode leaks Goff v: its share of the output is at most Goff R Vm = 1e-7 V.
      worst = Math.max(worst, Math.abs(v[i]! - expected));
      expect(id[i]!).toBeGreaterThan(-1e-6);
    });
    expect(worst).toBeLessThan(2 * Goff * R * Vm + 1e-9);
    // At the crest (a sampling instant): (Vm - Vf) R/(R + Ron).
    const crest = simulate(net, { stopTime: 1 / f, sampling: { times: [0.25 / f] } });
    expect(crest.voltage(load)[0]!).toBeCloseTo(((Vm - Vf) * R) / (R + Ron), 6);
  });

  it('stops at each commutation: two per period, at the instants where the source crosses Vf', () => {
    const { net } = halfWave();
    const periods = 5;
    const run = new NetworkRun(acceptNetwork(net, 'test').compiled, { t0: 0, horizon: periods / f, rtol: 1e-6, atol: 1e-6 });
    run.advanceTo(periods / f, { steps: false, interpolants: false });
    expect(run.status).toBe('running');
    expect(run.t).toBe(periods / f);
    // Analytic count: one turn-on and one turn-off per period.
    expect(run.deviceChanges).toHaveLength(2 * periods);
    expect(run.deviceEvents).toBe(2 * periods);
    const w = 2 * Math.PI * f;
    const tOn = Math.asin(Vf / Vm) / w;
    const tOff = (Math.PI - Math.asin(Vf / Vm)) / w;
    run.deviceChanges.forEach((c, k) => {
      const period = Math.floor(k / 2);
      const expected = period / f + (c.on ? tOn : tOff);
      expect(c.on).toBe(k % 2 === 0);
      // The event is located on the dense output (third-order for the node potentials between steps).
      expect(Math.abs(c.t - expected)).toBeLessThan(1e-7 / f);
    });
  });

  it('balances the energy audit (source = diode conduction loss + load)', () => {
    const { net, diode } = halfWave();
    const r = simulate(net, { stopTime: 2 / f, sampling: { times: [0.25 / f], includeSteps: true } });
    const audit = r.energy();
    expect(audit.relativeError).toBeLessThan(1e-8);
    // The diode's loss is Vf i + Ron i^2 while on: a tenth of the load's over a conduction (Vf + Ron i against R i).
    expect(audit.dissipated.resistors).toBeGreaterThan(0);
    const i = r.current(diode);
    expect(Math.max(...i)).toBeCloseTo((Vm - Vf) / (R + Ron), 6);
  });
});
