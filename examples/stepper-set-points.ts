// Embedding example: a controller holds a choke's supply at a set-point for a while, then
// releases it to its own waveform (0 V). The stepper records the inputs in force over each
// interval, so the history read afterwards (series and energy audit) uses the set-point where it
// was in force, however the inputs changed later. Our own invented values: a winding on a linear
// core with an air gap (an RL circuit, L = N^2 / R_m), supplied through its winding resistance.
// Run: npx tsx examples/stepper-set-points.ts
// Results are an engineering estimate: verify against measurements before relying on them.
import { constant, createNetwork, createStepper, MU0 } from '../src/index.js';

const TURNS = 200;
const AREA = 4e-4; // m^2
const GAP = 1e-3; // m
const RESISTANCE = 4; // ohm
const SET_POINT = 12; // V
const HELD = 0.02; // s

const net = createNetwork('choke on a controlled supply');
const top = net.magneticNode('top');
const bottom = net.magneticNode('bottom');
const leg = net.fluxTube('core', { from: bottom, to: top, length: 0.12, area: AREA, material: { kind: 'linear', relativePermeability: 3000 } });
net.airGap('gap', { from: top, to: bottom, length: GAP, area: AREA, fringingFactor: 1 });
const a = net.node('a');
const supply = net.voltageSource('supply', a, net.ground, constant(0));
const coil = net.winding('coil', { tube: leg, turns: TURNS, resistance: RESISTANCE, plus: a, minus: net.ground });

const stepper = createStepper(net, { horizon: 2 * HELD, rtol: 1e-8 });
stepper.setSource(supply, SET_POINT); // the controller switches the supply on at t = 0 ...
stepper.advanceTo(HELD);
const peak = stepper.current(coil);
stepper.setSource(supply, undefined); // ... and hands it back to its 0 V waveform at t = 20 ms
stepper.advanceTo(2 * HELD);
if (stepper.status !== 'running' && stepper.status !== 'success') throw new Error(`${stepper.status}: ${stepper.message}`);

// Closed form (derived, first-order RL step response): i = V/R (1 - exp(-t/tau)), tau = L/R, so the
// supply delivers E = V^2/R [t1 - tau (1 - exp(-t1/tau))] while held, and nothing after.
const reluctance = 0.12 / (MU0 * 3000 * AREA) + GAP / (MU0 * AREA);
const inductance = (TURNS * TURNS) / reluctance;
const tau = inductance / RESISTANCE;
const expected = ((SET_POINT * SET_POINT) / RESISTANCE) * (HELD - tau * (1 - Math.exp(-HELD / tau)));
const history = stepper.result();
const audit = history.energy();
console.log(`L = ${(inductance * 1e3).toFixed(3)} mH, tau = ${(tau * 1e3).toFixed(3)} ms, current when released ${peak.toFixed(4)} A`);
console.log(`supply energy from the record ${audit.sourceEnergy.toFixed(6)} J, closed form ${expected.toFixed(6)} J`);
console.log(`energy audit relative error ${audit.relativeError.toExponential(2)}; status ${history.status}`);
console.log('Engineering estimate: verify against measurements before relying on it.');
