import { describe, expect, it } from 'vitest';
import { createNetwork, handlesOf, simulate, sine } from '../../src/index.js';

function network() {
  const net = createNetwork('choke');
  const top = net.magneticNode('top');
  const bottom = net.magneticNode('bottom');
  const core = net.fluxTube('core', { from: bottom, to: top, length: 0.2, area: 1e-4, material: { kind: 'linear', relativePermeability: 2000 } });
  net.airGap('gap', { from: top, to: bottom, length: 1e-3, area: 1e-4 });
  const a = net.node('a');
  const source = net.voltageSource('supply', a, net.ground, sine({ amplitude: 10, frequency: 50 }));
  const coil = net.winding('coil', { tube: core, turns: 100, resistance: 0.5, plus: a, minus: net.ground });
  return { net, core, source, coil, top, a };
}

describe('handlesOf', () => {
  it('reads the result of simulate(description) by name, the same as the builder handles read simulate(builder)', () => {
    const { net, core, coil, source, top, a } = network();
    const d = JSON.parse(JSON.stringify(net.describe()));
    const h = handlesOf(d);
    const fromDescription = simulate(d, { stopTime: 0.02 });
    const fromBuilder = simulate(net, { stopTime: 0.02 });
    expect(fromDescription.current(h.winding('coil'))).toEqual(fromBuilder.current(coil));
    expect(fromDescription.fluxDensity(h.tube('core'))).toEqual(fromBuilder.fluxDensity(core));
    expect(fromDescription.current(h.element('supply'))).toEqual(fromBuilder.current(source));
    expect(fromDescription.potential(h.node('a'))).toEqual(fromBuilder.potential(a));
    expect(fromDescription.magneticPotential(h.magneticNode('top'))).toEqual(fromBuilder.magneticPotential(top));
    expect([...h.tubes.keys()]).toEqual(['core', 'gap']);
    expect(h.nodes.get('ground')?.index).toBe(0);
  });

  it('throws InputError for an unknown name (listing the names) or the wrong kind', () => {
    const h = handlesOf(network().net.describe());
    expect(() => h.tube('leg')).toThrow(expect.objectContaining({ code: 'unknown-name', elements: ['leg'], message: expect.stringContaining('"core", "gap"') }));
    expect(() => h.winding('supply')).toThrow(expect.objectContaining({ code: 'wrong-handle-kind' }));
    expect(h.element('supply', 'voltage-source').kind).toBe('voltage-source');
  });

  it('gives handles that a builder refuses (they belong to no builder)', () => {
    const { net } = network();
    const h = handlesOf(net.describe());
    expect(() => net.resistor('r', h.node('a'), net.ground, 1)).toThrow(expect.objectContaining({ code: 'foreign-handle' }));
  });
});
