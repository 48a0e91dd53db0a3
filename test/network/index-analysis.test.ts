import { describe, expect, it } from 'vitest';
import { constant, createNetwork, sine } from '../../src/index.js';
import { compileNetwork } from '../../src/formulation/compile-network.js';

// Index of the DAE, by the definition (Hairer and Wanner II, sect. VII.1): index 1 when the algebraic
// equations determine the algebraic unknowns (W0^T f_y V0 nonsingular). Networks of our own.
const material = { kind: 'linear', relativePermeability: 1000 } as const;
function core(name: string) {
  const net = createNetwork(name);
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material });
  net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material });
  return { net, leg };
}

describe('index-2 unknowns of a network', () => {
  it('marks the terminal potential of a winding fed by a current source (its voltage is dI/dt-driven)', () => {
    const { net, leg } = core('dc bias');
    const b = net.node('b');
    net.currentSource('bias', b, net.ground, constant(2));
    net.winding('w', { tube: leg, turns: 10, resistance: 0.1, plus: b, minus: net.ground });
    const c = compileNetwork(net.describe());
    expect(c.index2.map((i) => c.layout.labels[i])).toEqual(['potential of node "b"']);
  });

  it('marks the current of a voltage source with a capacitor across it', () => {
    const net = createNetwork('cv');
    const a = net.node('a');
    net.voltageSource('v', a, net.ground, sine({ amplitude: 1, frequency: 50 }));
    net.capacitor('c', a, net.ground, 1e-6);
    const c = compileNetwork(net.describe());
    expect(c.index2.map((i) => c.layout.labels[i])).toEqual(['current of voltage source "v"']);
  });

  it('marks nothing when magnetic coupling makes an inductive cut-set index 1 (secondary in series with an inductor)', () => {
    // Node s is cut off by the secondary winding and an inductor, but the secondary current is not fixed
    // by the flux alone (the primary shares the core): the algebraic equations determine v_s.
    const { net, leg } = core('coupled');
    const a = net.node('a');
    const s = net.node('s');
    const t = net.node('t');
    net.voltageSource('v', a, net.ground, sine({ amplitude: 1, frequency: 50 }));
    net.winding('primary', { tube: leg, turns: 10, resistance: 0.1, plus: a, minus: net.ground });
    net.winding('secondary', { tube: leg, turns: 10, resistance: 0.1, plus: s, minus: net.ground });
    net.inductor('leakage', s, t, 1e-3);
    net.resistor('load', t, net.ground, 5);
    expect(compileNetwork(net.describe()).index2).toEqual([]);
  });
});
