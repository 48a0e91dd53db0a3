import { describe, expect, it } from 'vitest';
import { createNetwork, simulate, sine, constant, TopologyError } from '../../src/index.js';

const material = { kind: 'linear', relativePermeability: 1000 } as const;

/** A closed two-tube core with one driven winding: a valid base to break in each test. */
function base() {
  const net = createNetwork('validation');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material });
  const yoke = net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material });
  const a = net.node('a');
  const mains = net.voltageSource('mains', a, net.ground, sine({ amplitude: 10, frequency: 50 }));
  const primary = net.winding('primary', { tube: leg, turns: 50, resistance: 1, plus: a, minus: net.ground });
  return { net, m1, m2, leg, yoke, a, mains, primary };
}

function topologyError(fn: () => unknown): TopologyError {
  try {
    fn();
  } catch (e) {
    if (e instanceof TopologyError) return e;
    throw e;
  }
  throw new Error('expected a TopologyError');
}

const run = (net: ReturnType<typeof base>['net']) => () => simulate(net, { stopTime: 1e-3 });

describe('simulate: topology checks name the elements and the fix', () => {
  it('accepts the valid base network', () => {
    expect(simulate(base().net, { stopTime: 1e-3 }).status).toBe('success');
  });

  it('floating electric node: a secondary circuit with no ground reference', () => {
    const { net, leg } = base();
    const s1 = net.node('s1');
    const s2 = net.node('s2');
    net.winding('secondary', { tube: leg, turns: 10, resistance: 0.1, plus: s1, minus: s2 });
    net.resistor('load', s1, s2, 5);
    const e = topologyError(run(net));
    expect(e.code).toBe('floating-node');
    expect(e.elements).toEqual(expect.arrayContaining(['s1', 's2', 'secondary']));
    expect(e.message).toMatch(/ground/);
  });

  it('a node connected to nothing', () => {
    const { net } = base();
    net.node('lonely');
    const e = topologyError(run(net));
    expect(e.code).toBe('floating-node');
    expect(e.elements).toContain('lonely');
  });

  it('winding with an open terminal', () => {
    const { net, leg } = base();
    const s = net.node('s');
    net.winding('open secondary', { tube: leg, turns: 10, plus: s, minus: net.ground });
    const e = topologyError(run(net));
    expect(e.code).toBe('open-winding');
    expect(e.elements).toEqual(['open secondary', 's']);
    expect(e.message).toMatch(/large resistor/);
  });

  it('loop of ideal voltage sources', () => {
    const { net, a } = base();
    net.voltageSource('second supply', a, net.ground, constant(5));
    const e = topologyError(run(net));
    expect(e.code).toBe('voltage-source-loop');
    expect(e.elements).toEqual(expect.arrayContaining(['mains', 'second supply']));
  });

  it('cut-set of current sources', () => {
    const { net } = base();
    const b = net.node('b');
    const c = net.node('c');
    net.currentSource('i1', b, net.ground, constant(1));
    net.currentSource('i2', c, b, constant(1));
    net.resistor('rc', c, net.ground, 1e3);
    // b is reached only through current sources i1 and i2 (c has a resistor to ground).
    const e = topologyError(run(net));
    expect(e.code).toBe('current-source-cutset');
    expect(e.elements).toEqual(expect.arrayContaining(['i1', 'i2', 'b']));
  });

  it('ideal voltage-driven windings over-constraining one flux', () => {
    const { net, leg } = base();
    const b = net.node('b');
    net.voltageSource('aux', b, net.ground, sine({ amplitude: 5, frequency: 50 }));
    net.winding('ideal 1', { tube: leg, turns: 20, plus: b, minus: net.ground });
    const c = net.node('c');
    net.voltageSource('aux 2', c, net.ground, sine({ amplitude: 5, frequency: 50 }));
    net.winding('ideal 2', { tube: leg, turns: 30, plus: c, minus: net.ground });
    const e = topologyError(run(net));
    expect(e.code).toBe('over-constrained-flux');
    expect(e.elements).toEqual(expect.arrayContaining(['ideal 1', 'ideal 2']));
  });

  it('zero-resistance windings whose voltages cancel around a loop', () => {
    const { net, leg } = base();
    const b = net.node('b');
    net.winding('w+', { tube: leg, turns: 10, plus: b, minus: net.ground });
    net.winding('w-', { tube: leg, turns: 10, plus: b, minus: net.ground });
    const e = topologyError(run(net));
    expect(e.code).toBe('cancelling-winding-loop');
    expect([...e.elements].sort()).toEqual(['w+', 'w-']);
  });

  it('magnetic node with a single tube', () => {
    const { net, m2 } = base();
    const m3 = net.magneticNode('m3');
    net.fluxTube('stub', { from: m2, to: m3, length: 0.01, area: 1e-4, material });
    const e = topologyError(run(net));
    expect(e.code).toBe('dangling-magnetic-node');
    expect(e.elements).toEqual(['m3', 'stub']);
  });

  it('magnetic node with no tube', () => {
    const { net } = base();
    net.magneticNode('orphan');
    const e = topologyError(run(net));
    expect(e.code).toBe('unused-magnetic-node');
    expect(e.elements).toEqual(['orphan']);
  });

  it('winding on a tube that is on no closed magnetic path', () => {
    const net = createNetwork('bridge');
    const [m1, m2, m3, m4] = ['m1', 'm2', 'm3', 'm4'].map((n) => net.magneticNode(n)) as [never, never, never, never];
    net.fluxTube('ring a1', { from: m1, to: m2, length: 0.1, area: 1e-4, material });
    net.fluxTube('ring a2', { from: m2, to: m1, length: 0.1, area: 1e-4, material });
    net.fluxTube('ring b1', { from: m3, to: m4, length: 0.1, area: 1e-4, material });
    net.fluxTube('ring b2', { from: m4, to: m3, length: 0.1, area: 1e-4, material });
    const bridge = net.fluxTube('bridge', { from: m2, to: m3, length: 0.1, area: 1e-4, material });
    const a = net.node('a');
    net.voltageSource('v', a, net.ground, sine({ amplitude: 1, frequency: 50 }));
    net.winding('w', { tube: bridge, turns: 10, resistance: 1, plus: a, minus: net.ground });
    const e = topologyError(() => simulate(net, { stopTime: 1e-3 }));
    expect(e.code).toBe('winding-on-open-path');
    expect(e.elements).toEqual(['w', 'bridge']);
  });

  it('initial fluxes that break flux conservation', () => {
    const net = createNetwork('bad remanence');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material, initialFluxDensity: 1 });
    net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material, initialFluxDensity: 0.5 });
    const a = net.node('a');
    net.voltageSource('v', a, net.ground, sine({ amplitude: 1, frequency: 50 }));
    net.winding('w', { tube: leg, turns: 10, resistance: 1, plus: a, minus: net.ground });
    const e = topologyError(() => simulate(net, { stopTime: 1e-3 }));
    expect(e.code).toBe('inconsistent-initial-flux');
    expect(e.elements).toEqual(expect.arrayContaining(['leg', 'yoke']));
  });

  it('capacitor initial voltages that do not add up around a loop', () => {
    const { net, a } = base();
    const b = net.node('b');
    net.capacitor('c1', a, b, 1e-6, { initialVoltage: 1 });
    net.capacitor('c2', b, net.ground, 1e-6, { initialVoltage: 1 });
    net.capacitor('c3', a, net.ground, 1e-6, { initialVoltage: 5 });
    const e = topologyError(run(net));
    expect(e.code).toBe('inconsistent-capacitor-voltages');
    expect(e.elements.length).toBeGreaterThan(0);
  });
});
