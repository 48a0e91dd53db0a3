import { createNetwork, sine, type NetworkBuilder } from '../../src/index.js';

/**
 * The ladder of k transformers with saturating cores (n = 4k + 3 unknowns;
 * invented values), shared by the sparse-path tests and the ladder bench.
 */
export function transformerLadder(k: number): NetworkBuilder {
  const net = createNetwork(`ladder of ${k} transformers`);
  const material = { kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: 1.5 } as const;
  const s = net.node('s');
  net.voltageSource('src', s, net.ground, sine({ amplitude: 100, frequency: 50 }));
  let x = net.node('x0');
  net.resistor('rs', s, x, 1);
  for (let j = 0; j < k; j++) {
    const a = net.magneticNode(`a${j}`);
    const b = net.magneticNode(`b${j}`);
    const leg = net.fluxTube(`leg${j}`, { from: a, to: b, length: 0.1, area: 1e-3, material });
    net.fluxTube(`yoke${j}`, { from: b, to: a, length: 0.2, area: 1e-3, material });
    const next = net.node(`x${j + 1}`);
    net.winding(`p${j}`, { tube: leg, turns: 200, resistance: 0.5, plus: x, minus: net.ground });
    net.winding(`s${j}`, { tube: leg, turns: 200, resistance: 0.5, plus: next, minus: net.ground });
    net.resistor(`load${j}`, next, net.ground, 50);
    x = next;
  }
  return net;
}
