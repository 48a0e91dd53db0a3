/**
 * A full-bridge converter whose gates are driven by a controller running on
 * the stepper: once a period the controller reads the output voltage and
 * sets a new duty cycle on the four gate-driven switches (`setGate`), an
 * integral control law holding 12 V through a load step. The switches have
 * antiparallel diodes that carry the transformer's current while both
 * diagonals are off; the secondary feeds a diode bridge, an LC filter and
 * the load.
 *
 *     npx tsx examples/full-bridge-closed-loop.ts
 *
 * Everything is invented (48 V in, 100 kHz, 10:5 turns on an ungapped demo
 * ferrite core, 10 uH and 100 uF filter, 3 ohm load stepping to 1.5 ohm at
 * 1.5 ms); it describes no real product. The steady duty is checked against
 * the textbook relation of the full bridge in continuous conduction,
 * Vout = n D Vin - 2 Vf (Mohan, Undeland and Robbins, Power Electronics,
 * ch. 10.6, with the two bridge diodes' drop; from memory); the remaining
 * difference is the resistive drops.
 *
 * CAUTION: engineering estimates from a model and its inputs; a control
 * loop designed on a model must be verified on hardware.
 */
import { constant, createNetwork, createStepper, demoMaterials, pulse } from '../src/index.js';

const VIN = 48;
const T = 10e-6;
const N1 = 10;
const N2 = 5;
const VF = 0.7;
const V_REF = 12;
const PERIODS = 300;
const LOAD_STEP = 1.5e-3;

const net = createNetwork('full bridge');
const [m1, m2] = [net.magneticNode('m1'), net.magneticNode('m2')];
const ferrite = demoMaterials.ferrite; // invented demo data
const leg = net.fluxTube('wound leg', { from: m1, to: m2, length: 0.04, area: 1e-4, material: ferrite });
net.fluxTube('return', { from: m2, to: m1, length: 0.04, area: 1e-4, material: ferrite });
const [p, a, b, s1, s2, dc, out] = ['p', 'a', 'b', 's1', 's2', 'dc', 'out'].map((name) => net.node(name)) as [
  ReturnType<typeof net.node>, ReturnType<typeof net.node>, ReturnType<typeof net.node>, ReturnType<typeof net.node>,
  ReturnType<typeof net.node>, ReturnType<typeof net.node>, ReturnType<typeof net.node>,
];
net.voltageSource('supply', p, net.ground, constant(VIN));

/** Diagonal gates for duty D: each diagonal conducts D T / 2 per period, the second half a period later. */
const gates = (duty: number) => ({
  first: pulse({ high: 1, period: T, duty: duty / 2 }),
  second: pulse({ high: 1, period: T, duty: duty / 2, delay: T / 2 }),
});
let duty = 0.3;
const switchOptions = { onResistance: 0.02, offConductance: 1e-7 };
const body = { forwardVoltage: VF, onResistance: 0.01, offConductance: 1e-9 };
const g = gates(duty);
const q1 = net.switch('Q1', p, a, { ...switchOptions, gate: g.first });
const q2 = net.switch('Q2', a, net.ground, { ...switchOptions, gate: g.second });
const q3 = net.switch('Q3', p, b, { ...switchOptions, gate: g.second });
const q4 = net.switch('Q4', b, net.ground, { ...switchOptions, gate: g.first });
// Antiparallel (body) diodes: the primary current returns to the supply while both diagonals are off.
net.diode('D1', a, p, body);
net.diode('D2', net.ground, a, body);
net.diode('D3', b, p, body);
net.diode('D4', net.ground, b, body);
net.winding('primary', { tube: leg, turns: N1, resistance: 0.02, plus: a, minus: b });
net.winding('secondary', { tube: leg, turns: N2, resistance: 0.01, plus: s1, minus: s2 });
net.diode('R1', s1, dc, body);
net.diode('R2', s2, dc, body);
net.diode('R3', net.ground, s1, body);
net.diode('R4', net.ground, s2, body);
net.inductor('Lo', dc, out, 10e-6);
const output = net.capacitor('Co', out, net.ground, 100e-6);
net.resistor('load', out, net.ground, 3);
// A second 3 ohm load joins at LOAD_STEP.
const extra = net.node('extra');
net.switch('load switch', out, extra, { closed: false, onResistance: 1e-3, offResistance: 1e9, schedule: [{ time: LOAD_STEP, closed: true }] });
net.resistor('extra load', extra, net.ground, 3);

const stepper = createStepper(net, { horizon: PERIODS * T, rtol: 1e-6, record: false });
// Integral control, once a period at its start (the gates' phase is tied to absolute time).
const GAIN = 0.002; // duty per volt of error per period
const history: { t: number; v: number; d: number }[] = [];
stepper.every(T, (s) => {
  const v = s.voltage(output);
  duty = Math.min(0.9, Math.max(0.05, duty + GAIN * (V_REF - v)));
  const next = gates(duty);
  s.setGate(q1, next.first);
  s.setGate(q4, next.first);
  s.setGate(q2, next.second);
  s.setGate(q3, next.second);
  history.push({ t: s.time, v, d: duty });
});
for (let k = 1; k <= PERIODS; k++) {
  if (stepper.advanceTo(k * T) !== 'running' && stepper.status !== 'success') throw new Error(`full bridge: ${stepper.message}`);
}
const at = (t: number) => history.reduce((best, h) => (Math.abs(h.t - t) < Math.abs(best.t - t) ? h : best));
console.log(' time ms   Vout V   duty');
for (const t of [0.25e-3, 0.5e-3, 1e-3, 1.45e-3, 1.55e-3, 2e-3, 2.5e-3, 2.99e-3]) {
  const h = at(t);
  console.log(`${(h.t * 1e3).toFixed(2).padStart(7)}  ${h.v.toFixed(3).padStart(7)}  ${h.d.toFixed(4)}`);
}
const end = history[history.length - 1]!;
const ideal = (V_REF + 2 * VF) / ((N2 / N1) * VIN);
console.log(`closed loop at ${(end.t * 1e3).toFixed(2)} ms: Vout ${end.v.toFixed(3)} V (set point ${V_REF} V), duty ${end.d.toFixed(4)}; n D Vin - 2 Vf gives D = ${ideal.toFixed(4)} without resistive drops`);
console.log(`solver: ${stepper.stats.acceptedSteps} steps for ${PERIODS} periods`);
console.log('\nCaution: engineering estimate with invented values; verify a control design on hardware.');
