import { createNetwork, simulate, sine } from '../src/index.js';
for (const cap of [0, 1e-9]) for (const b2 of [false, true]) {
const net = createNetwork('x'); const n1 = net.node('n1');
net.voltageSource('source', n1, net.ground, sine({ amplitude: 1, frequency: 50 }));
net.diode('d', net.ground, n1, { junction: 'exponential', onResistance: 0.05, capacitance: cap });
if (b2) net.resistor('b2', net.node('n2'), net.ground, 200);
const r = simulate(net, { stopTime: 0.04 });
const e = r.energy();
console.log(cap, b2, r.status, r.stats.acceptedSteps, e.relativeError, e.sourceEnergy, e.dissipated.total);
}
