import { createNetwork, simulate, pulse } from '../src/index.js';
import { NetworkRun } from '../src/simulation/network-run.js';
import { acceptNetwork } from '../src/simulation/accept-network.js';
export function flyback(clamp: boolean, smooth = false) {
  const net = createNetwork('flyback');
  const m1 = net.magneticNode('m1'); const m2 = net.magneticNode('m2');
  const legP = net.reluctance('legP', { from: m1, to: m2, reluctance: 1e3 });
  net.reluctance('leak', { from: m2, to: m1, reluctance: 4e8 });
  const legS = net.reluctance('gap', { from: m2, to: m1, reluctance: 4e6 });
  const vin = net.node('vin'); const drain = net.node('drain'); const sec = net.node('sec'); const out = net.node('out');
  net.voltageSource('Vin', vin, net.ground, { kind: 'constant', value: 24 });
  net.winding('P', { tube: legP, turns: 20, resistance: 0.05, plus: vin, minus: drain });
  net.winding('S', { tube: legS, turns: 10, resistance: 0.02, plus: net.ground, minus: sec, orientation: 1 });
  net.switch('Q1', drain, net.ground, { gate: pulse({ high: 1, period: 10e-6, duty: 0.4 }), onResistance: 0.05, offResistance: 1e6 });
  const d = smooth ? { junction: 'exponential' as const, saturationCurrent: 1e-9, emissionCoefficient: 1.5, onResistance: 0.01, capacitance: Number(process.env.CJ ?? 0) } : { forwardVoltage: 0.5, onResistance: 0.01 };
  net.diode('Dout', sec, out, d);
  net.capacitor('Cout', out, net.ground, 100e-6, { initialVoltage: 5.5 });
  net.resistor('Rload', out, net.ground, 10);
  if (clamp) {
    const cl = net.node('clamp');
    net.diode('Dclamp', drain, cl, d);
    net.capacitor('Cclamp', cl, vin, 100e-9, { initialVoltage: 30 });
    net.resistor('Rclamp', cl, vin, 2e3);
  }
  return net;
}
const periods = Number(process.argv[2] ?? 300);
for (const smooth of [false, true]) {
  const net = flyback(true, smooth);
  const t0 = Date.now();
  const run = new NetworkRun(acceptNetwork(net, 'x').compiled, { t0: 0, horizon: periods * 10e-6, rtol: 1e-6, atol: 1e-6 } as any);
  run.advanceTo(periods * 10e-6, { steps: false, interpolants: false });
  console.log(smooth ? 'smooth' : 'ideal', run.status, run.message, Date.now() - t0, 'ms', 'events', run.deviceEvents, 'changes', run.deviceChanges.length, run.stats);
  const out = acceptNetwork(net, 'x').compiled.layout;
  console.log('vout', run.y[net.describe().electricNodes.findIndex((n) => n.name === 'out') - 1]);
}
const r = simulate(flyback(false), { stopTime: 50e-6 });
console.log(r.status, r.message);
