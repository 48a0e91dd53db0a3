/**
 * A half-wave rectifier with a smoothing capacitor: a 12 V (peak), 50 Hz
 * supply, one ideal diode (0.7 V, 50 mohm), 2200 uF and a 47 ohm load.
 * The diode's turn-on and turn-off are events the solver locates; the run
 * restarts exactly there. Prints the output's peak and ripple, the diode's
 * conduction per period and peak current, against the usual estimates
 * (ripple ~ V_peak / (f R C) for half-wave; from memory), and the energy
 * audit with the diode's conduction loss counted.
 *
 *     npx tsx examples/half-wave-rectifier.ts
 *
 * Values invented. Caution: a model estimate; at mains voltages defer to
 * local codes and licensed practice.
 */
import { createNetwork, simulate, sine } from '../src/index.js';

const VPEAK = 12; // V
const F = 50; // Hz
const VF = 0.7; // V
const C = 2200e-6; // F
const R = 47; // ohm

const net = createNetwork('half-wave rectifier');
const a = net.node('a');
const out = net.node('out');
net.voltageSource('supply', a, net.ground, sine({ amplitude: VPEAK, frequency: F }));
const diode = net.diode('D1', a, out, { forwardVoltage: VF, onResistance: 0.05 });
const filter = net.capacitor('filter', out, net.ground, C);
net.resistor('load', out, net.ground, R);

const periods = 10;
const result = simulate(net, { stopTime: periods / F });
if (result.status !== 'success') throw new Error(result.message);

// The last period: peak and trough of the output, the diode's conduction time and peak current.
const t0 = (periods - 1) / F;
const v = result.voltage(filter);
const i = result.current(diode);
let peak = -Infinity;
let trough = Infinity;
let peakCurrent = 0;
let conducting = 0;
for (let k = 1; k < result.time.length; k++) {
  const t = result.time[k]!;
  if (t <= t0) continue;
  peak = Math.max(peak, v[k]!);
  trough = Math.min(trough, v[k]!);
  peakCurrent = Math.max(peakCurrent, i[k]!);
  if (i[k]! > 1e-3 && i[k - 1]! > 1e-3) conducting += t - result.time[k - 1]!;
}
const audit = result.energy();
const estimate = (VPEAK - VF) / (F * R * C);
console.log(`output peak ${peak.toFixed(3)} V (supply peak minus Vf: ${(VPEAK - VF).toFixed(3)} V)`);
console.log(`ripple ${(peak - trough).toFixed(3)} V peak to peak (estimate V/(f R C) = ${estimate.toFixed(3)} V)`);
console.log(`diode conducts ${((conducting * F) * 360).toFixed(1)} deg per period, peak current ${peakCurrent.toFixed(2)} A`);
console.log(`energy audit: relative imbalance ${audit.relativeError.toExponential(1)}, dissipated in the load and diode ${audit.dissipated.resistors.toFixed(4)} J`);
console.log('Caution: model estimates with invented values; at mains voltages defer to local codes and licensed practice.');
