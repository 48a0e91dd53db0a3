import { describe, expect, it } from 'vitest';
import { createNetwork, demoMaterials, pulse, sine } from '../../src/index.js';
import { networkFromDescription } from '../../src/sweep/index.js';
import { mainsTransformer } from '../../examples/scenarios/mains-inrush.js';

/** A network with every element kind, every tube kind and optional fields set. */
function everything() {
  const net = createNetwork('every kind');
  const m = [net.magneticNode('m0'), net.magneticNode('m1'), net.magneticNode('m2')];
  const leg = net.fluxTube('leg', { from: m[0]!, to: m[1]!, length: 0.1, area: 1e-4, material: demoMaterials.ferrite, eddyResistance: 40, initialFluxDensity: 0.1 });
  net.airGap('gap', { from: m[1]!, to: m[2]!, length: 1e-3, area: 1e-4, fringingFactor: 1.1 });
  net.reluctance('return', { from: m[2]!, to: m[0]!, reluctance: 1e5, area: 2e-4, initialFlux: 1e-6 });
  const a = net.node('a');
  const b = net.node('b');
  const c = net.node('c');
  net.voltageSource('v', a, net.ground, sine({ amplitude: 10, frequency: 1e3, phase: 0.3 }));
  net.currentSource('i', c, net.ground, pulse({ high: 1, period: 1e-3, duty: 0.4, rise: 1e-6 }));
  net.resistor('r', a, b, 5);
  net.capacitor('cap', c, net.ground, 1e-6, { initialVoltage: 2 });
  net.inductor('l', b, c, 1e-3, { initialCurrent: 0.1 });
  net.switch('s', b, net.ground, { closed: true, schedule: [{ time: 1e-4, closed: false }, { time: 2e-4, closed: true }] });
  net.winding('w', { tube: leg, turns: 20, resistance: 0.1, plus: c, minus: net.ground, orientation: -1 });
  return net;
}

describe('networkFromDescription', () => {
  it('rebuilds a network whose description equals the input (every element and tube kind)', () => {
    const d = everything().describe();
    expect(networkFromDescription(d).describe()).toEqual(d);
    const mains = mainsTransformer({ switchingAngleDeg: 30, remanence: 0.8 }).net.describe();
    expect(networkFromDescription(JSON.parse(JSON.stringify(mains))).describe()).toEqual(mains);
  });

  it("checks every value with the builder's own errors, naming the element", () => {
    const d = everything().describe();
    const bad = { ...d, elements: d.elements.map((e) => (e.kind === 'capacitor' ? { ...e, capacitance: -1 } : e)) };
    expect(() => networkFromDescription(bad)).toThrow(expect.objectContaining({ code: 'non-positive-value', elements: ['cap'] }));
    const unsorted = { ...d, elements: d.elements.map((e) => (e.kind === 'switch' ? { ...e, toggleTimes: [2e-4, 1e-4] } : e)) };
    expect(() => networkFromDescription(unsorted)).toThrow(expect.objectContaining({ code: 'unsorted-schedule', elements: ['s'] }));
    const both = { ...d, tubes: d.tubes.map((t, i) => (i === 0 ? { ...t, initialFlux: 1e-6 } : t)) };
    expect(() => networkFromDescription(both)).toThrow(expect.objectContaining({ code: 'conflicting-initial-flux', elements: ['leg'] }));
  });
});
