import { describe, expectTypeOf, it } from 'vitest';
import { createNetwork } from '../../src/index.js';
import type { ElectricNode, FluxTube, MagneticNode, Winding, SimulationResult } from '../../src/index.js';

describe('handle types', () => {
  it('returns typed handles from the builder', () => {
    const net = createNetwork();
    const m = net.magneticNode('m');
    const a = net.node('a');
    expectTypeOf(m).toEqualTypeOf<MagneticNode>();
    expectTypeOf(a).toEqualTypeOf<ElectricNode>();
    expectTypeOf(net.ground).toEqualTypeOf<ElectricNode>();
  });

  it('does not let a magnetic node stand for an electric node, nor a tube for a winding', () => {
    const net = createNetwork();
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const tube = net.fluxTube('t', { from: m1, to: m2, length: 1, area: 1, material: { kind: 'linear', relativePermeability: 1 } });
    // @ts-expect-error a magnetic node is not an electric terminal
    net.resistor('r', m1, net.ground, 1);
    // @ts-expect-error an electric node is not a magnetic node
    net.airGap('g', { from: net.ground, to: m2, length: 1, area: 1 });
    expectTypeOf<SimulationResult['emf']>().parameter(0).toEqualTypeOf<Winding>();
    // @ts-expect-error a tube has no emf: emf takes a winding
    expectTypeOf<SimulationResult['emf']>().parameter(0).toEqualTypeOf<FluxTube>();
    expectTypeOf(tube).toEqualTypeOf<FluxTube>();
  });
});
