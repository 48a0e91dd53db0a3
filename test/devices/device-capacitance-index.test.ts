/**
 * Device capacitances in the capacitor/voltage-source loop (index-2)
 * analysis (issue 12): a switch's output capacitance or a diode's junction
 * capacitance directly across an ideal voltage source closes a loop of
 * capacitances and sources, so the source current is an index-2 unknown
 * (it equals C dv/dt plus the conduction current, the derivative of an
 * input), exactly as with a plain capacitor there. Structural rule:
 * D. Estevez Schwarz and C. Tischendorf, "Structural analysis of electric
 * circuits and consequences for MNA", Int. J. Circuit Theory Appl. 28 (2000)
 * 131-162 (from memory).
 *
 * Closed form (values of our own): v = V sin(w t) across a closed switch
 * (Ron) with capacitance C draws i = v / Ron + C V w cos(w t) (Ohm's law and
 * the capacitor law i = C dv/dt).
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine } from '../../src/index.js';
import { compileNetwork } from '../../src/formulation/compile-network.js';

const [V, F, C, RON] = [10, 1000, 1e-6, 100];
const W = 2 * Math.PI * F;

/** A sine source across a closed switch, its capacitance given on the switch or as a capacitor beside it. */
function switchAcrossSource(capacitance: 'device' | 'capacitor' | 'none') {
  const net = createNetwork(`switch with ${capacitance} capacitance`);
  const a = net.node('a');
  const source = net.voltageSource('V', a, net.ground, sine({ amplitude: V, frequency: F }));
  net.switch('Q', a, net.ground, { closed: true, onResistance: RON, ...(capacitance === 'device' ? { capacitance: C } : {}) });
  if (capacitance === 'capacitor') net.capacitor('C', a, net.ground, C);
  return { net, source };
}

describe('device capacitances in the capacitor/voltage-source loop analysis', () => {
  it('a switch capacitance across a source makes its current index 2, as a capacitor there does', () => {
    const device = compileNetwork(switchAcrossSource('device').net.describe());
    const plain = compileNetwork(switchAcrossSource('capacitor').net.describe());
    const none = compileNetwork(switchAcrossSource('none').net.describe());
    expect(device.index2).toEqual(plain.index2);
    // The source (element 0) current is the index-2 unknown.
    expect(device.index2).toEqual([device.layout.branchCurrent[0]]);
    // Without a capacitance there is no loop of capacitances and sources.
    expect(none.index2).toEqual([]);
  });

  it('the run with the switch capacitance equals the run with a capacitor, and both follow the closed form from t = 0', () => {
    // maxStep: the error control of an index-2 unknown is scaled by h (radau5's rule), so without a cap the
    // solver takes a fifth of a period per step and the current between breakpoints is only roughly right.
    const options = { stopTime: 2e-3, rtol: 1e-8, maxStep: 1e-5 };
    const d = switchAcrossSource('device');
    const p = switchAcrossSource('capacitor');
    const rd = simulate(d.net, options);
    const rp = simulate(p.net, options);
    expect(rd.status).toBe('success');
    expect(rp.status).toBe('success');
    const id = rd.current(d.source);
    const ip = rp.current(p.source);
    expect(Array.from(rd.time)).toEqual(Array.from(rp.time));
    let worst = 0;
    rd.time.forEach((t, k) => {
      expect(id[k]).toBeCloseTo(ip[k]!, 12);
      worst = Math.max(worst, Math.abs(id[k]! - ((V * Math.sin(W * t)) / RON + C * V * W * Math.cos(W * t))));
    });
    // Measured 1.9e-7 A on a 0.16 A peak; before the fix the first sample missed C V w = 63 mA entirely.
    expect(id[0]).toBeCloseTo(C * V * W, 6);
    expect(worst).toBeLessThan(1e-6);
  });

  it('a diode junction capacitance across a source counts the same way', () => {
    // A blocking diode (cathode on a source that stays positive) with a junction capacitance.
    const build = (junction: boolean) => {
      const net = createNetwork('blocking diode');
      const k = net.node('k');
      net.voltageSource('V', k, net.ground, sine({ amplitude: V, frequency: F, offset: 2 * V }));
      net.diode('D', net.ground, k, { ...(junction ? { capacitance: C } : {}) });
      if (!junction) net.capacitor('C', k, net.ground, C);
      return compileNetwork(net.describe());
    };
    expect(build(true).index2).toEqual(build(false).index2);
    expect(build(true).index2).toHaveLength(1);
  });
});
