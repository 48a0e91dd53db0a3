import { createNetwork, simulate, sine } from '../src/index.js';
for (const maxStep of [undefined, 1e-4, 1e-5]) for (const rtol of [1e-6, 1e-8]) {
const net = createNetwork('x'); const n1 = net.node('n1');
net.voltageSource('source', n1, net.ground, sine({ amplitude: 1, frequency: 50 }));
net.diode('d', net.ground, n1, { junction: 'exponential', onResistance: 0.05, capacitance: 1e-9 });
net.resistor('b2', net.node('n2'), net.ground, 200);
const r = simulate(net, { stopTime: 0.04, rtol, ...(maxStep ? { maxStep } : {}) });
console.log(maxStep, rtol, r.status, r.stats.acceptedSteps, r.energy().relativeError);
}
