import { createNetwork, sine } from '../src/index.js';
import { acceptNetwork } from '../src/simulation/accept-network.js';
import { NetworkRun } from '../src/simulation/network-run.js';
const Vm = 20, f = 50, w = 2 * Math.PI * f, Vf = 0.7, Ron = Number(process.argv[2] ?? 0.01), C = 1000e-6, R = 100;
const net = createNetwork('b'); const a = net.node('a'); const b = net.node('b'); const p = net.node('p');
net.voltageSource('source', a, b, sine({ amplitude: Vm, frequency: f }));
const opts = { forwardVoltage: Vf, onResistance: Ron };
net.diode('D1', a, p, opts); net.diode('D2', b, p, opts); net.diode('D3', net.ground, a, opts); net.diode('D4', net.ground, b, opts);
net.capacitor('filter', p, net.ground, C); net.resistor('load', p, net.ground, R);
const run = new NetworkRun(acceptNetwork(net, 'test').compiled, { t0: 0, horizon: 8 / f, rtol: 1e-8, atol: 1e-8 });
run.advanceTo(8 / f, { steps: true, interpolants: false });
console.log(run.deviceChanges.slice(-12).map((c) => `${((w * c.t) % (2 * Math.PI)).toFixed(4)} ${c.element}${c.on ? '+' : '-'}`).join(' | '));
const thetaOff = Math.PI - Math.atan(w * R * C);
console.log('textbook off', thetaOff);
const pi = acceptNetwork(net, 'test').compiled.layout.potential[3]!;
const s = run.samples.filter((x) => x.t > 7 / f);
const vOff = (Vm - 2 * Vf) * Math.sin(thetaOff);
for (const x of s.filter((_, i) => i % 10 === 0)) { const th = (w * x.t) % (2 * Math.PI); const ref = th > thetaOff && th < Math.PI + 1.17 ? vOff * Math.exp(-(th - thetaOff) / (w * R * C)) : NaN; console.log(th.toFixed(4), x.y[pi]!.toFixed(5), ref.toFixed(5)); }
const L = acceptNetwork(net, 'test').compiled.layout;
const [ia, ib] = [L.potential[1]!, L.potential[2]!];
for (const x of run.samples.filter((x) => x.t > 7 / f && x.t < 7.2 / f)) { const th = (w * x.t) % (2 * Math.PI); console.log('m', th.toFixed(4), 'va', x.y[ia]!.toFixed(4), 'vb', x.y[ib]!.toFixed(4), 'vp', x.y[pi]!.toFixed(4), 'D1', (x.y[ia]! - x.y[pi]! - Vf).toFixed(4), 'D4', (-x.y[ib]! - Vf).toFixed(4), 'D2', (x.y[ib]! - x.y[pi]! - Vf).toFixed(4), 'D3', (-x.y[ia]! - Vf).toFixed(4)); }
