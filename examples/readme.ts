// The builder example of README.md, kept identical to the README's first TypeScript block
// (test/examples/examples.test.ts checks it). Run: npx tsx examples/readme.ts
import { createNetwork, demoMaterials, mm, mm2, simulate, sine } from '../src/index.js';

const net = createNetwork('gapped choke');
const top = net.magneticNode('top');
const bottom = net.magneticNode('bottom');
const core = net.fluxTube('core', { from: bottom, to: top, length: mm(200), area: mm2(1600), material: demoMaterials.grainOrientedSteel });
net.airGap('gap', { from: top, to: bottom, length: mm(1), area: mm2(1600) });
const line = net.node('line');
net.voltageSource('mains', line, net.ground, sine({ amplitude: 325, frequency: 50 })); // switched on at a voltage zero
const coil = net.winding('coil', { tube: core, turns: 1000, resistance: 3, plus: line, minus: net.ground });
const result = simulate(net, { stopTime: 0.1 });
const peak = (x: Float64Array) => Math.max(...x.map(Math.abs));
console.log(`${result.status}: peak B ${peak(result.fluxDensity(core)).toFixed(2)} T, peak i ${peak(result.current(coil)).toFixed(2)} A`);
