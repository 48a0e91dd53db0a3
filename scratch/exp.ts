import { createNetwork, simulate, sine } from '../src/index.js';
const net = createNetwork('exp');
const a = net.node('a'); const out = net.node('out');
net.voltageSource('src', a, net.ground, sine({ amplitude: 5, frequency: 1000 }));
net.diode('D1', a, out, { junction: 'exponential', saturationCurrent: 1e-12, emissionCoefficient: 1.5, onResistance: 0.5, offConductance: 1e-9 });
const c = net.capacitor('C', out, net.ground, 10e-6);
net.resistor('load', out, net.ground, 100);
const r = simulate(net, { stopTime: 3e-3 });
console.log(r.status, r.message, r.stats.acceptedSteps, r.energy().relativeError, r.voltage(c).at(-1));
