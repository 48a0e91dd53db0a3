import { describe, expect, it } from 'vitest';
import { createNetwork, MU0, simulate, sine } from '../../src/index.js';

describe('initial fluxes', () => {
  it('divide remanent flux between parallel paths in inverse proportion to their reluctances (least magnetic energy)', () => {
    // A leg with remanence feeds two parallel return paths: an iron yoke and an air leakage path, with no
    // winding on that loop. Minimising the stored energy R_y phi_y^2 + R_a phi_a^2 subject to
    // phi_y + phi_a = phi_leg (flux conservation) gives phi_a / phi_y = R_y / R_a, the division of a
    // magnetic circuit with no MMF in that loop (DERIVED; Thomson's minimum-energy principle).
    const area = 4e-4;
    const mur = 3000;
    const net = createNetwork('remanence split');
    const top = net.magneticNode('top');
    const bottom = net.magneticNode('bottom');
    const material = { kind: 'linear', relativePermeability: mur } as const;
    const leg = net.fluxTube('leg', { from: bottom, to: top, length: 0.1, area, material, initialFluxDensity: 0.7 });
    const yoke = net.fluxTube('yoke', { from: top, to: bottom, length: 0.2, area, material });
    const air = net.reluctance('leakage', { from: top, to: bottom, reluctance: 5e7 });
    const a = net.node('a');
    net.voltageSource('off', a, net.ground, sine({ amplitude: 1, frequency: 50, start: 1 }));
    net.winding('coil', { tube: leg, turns: 100, resistance: 1, plus: a, minus: net.ground });
    const r = simulate(net, { stopTime: 1e-6 });
    const Ry = 0.2 / (MU0 * mur * area);
    const phiLeg = 0.7 * area;
    expect(r.flux(leg)[0]).toBeCloseTo(phiLeg, 12);
    expect(r.flux(air)[0]! / (phiLeg * (Ry / (Ry + 5e7)))).toBeCloseTo(1, 6);
    expect(r.flux(yoke)[0]! / (phiLeg * (5e7 / (Ry + 5e7)))).toBeCloseTo(1, 9);
  });
});
