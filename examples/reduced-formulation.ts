/**
 * The reduced formulation (`formulation: 'reduced'`): a gate-drive
 * transformer's core, driven by a slightly unbalanced square wave, walks
 * towards saturation. The same run in the full formulation (the DAE, every
 * node potential and branch current an unknown of the integrator) and in
 * the reduced one (those solved inside f, the core flux alone integrated):
 * the results agree to the tolerance, the reduced run takes fewer Newton
 * iterations per step. Then a half-wave rectifier with an ideal diode runs
 * both ways (each commutation an event and a restart), and the same
 * rectifier with an exponential junction is refused, with the reason and
 * the fix.
 *
 *     npx tsx examples/reduced-formulation.ts
 *
 * All values are invented; the core is the demo ferrite. Caution:
 * saturation margins are engineering estimates from a model; verify them
 * against measurements of the actual part.
 */
import { createNetwork, demoMaterials, FluxstateError, pulse, simulate, sine, type SimulateOptions } from '../src/index.js';

/** The drive: +/-15 V at 50 kHz with a 51 % duty (a 2 % volt-second imbalance per period). */
function gateDrive() {
  const net = createNetwork('gate-drive transformer');
  const top = net.magneticNode('top');
  const bottom = net.magneticNode('bottom');
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: 0.02, area: 2e-5, material: demoMaterials.ferrite });
  net.fluxTube('return', { from: top, to: bottom, length: 0.03, area: 2e-5, material: demoMaterials.ferrite });
  const drive = net.node('drive');
  const a = net.node('a');
  net.voltageSource('driver', drive, net.ground, pulse({ low: -15, high: 15, period: 2e-5, duty: 0.51 }));
  net.resistor('gate resistor', drive, a, 2.2);
  const primary = net.winding('primary', { tube: leg, turns: 12, resistance: 0.1, plus: a, minus: net.ground });
  return { net, leg, primary };
}

/** A half-wave rectifier, 10 V 50 Hz into 10 ohm with 100 uF across it. */
function rectifier(junction: 'ideal' | 'exponential') {
  const net = createNetwork('half-wave rectifier');
  const a = net.node('a');
  const out = net.node('out');
  net.voltageSource('mains', a, net.ground, sine({ amplitude: 10, frequency: 50 }));
  net.diode('D1', a, out, junction === 'ideal'
    ? { forwardVoltage: 0.7, onResistance: 0.1 }
    : { junction: 'exponential', saturationCurrent: 1e-12, emissionCoefficient: 1.5, onResistance: 0.1 });
  const load = net.resistor('load', out, net.ground, 10);
  net.capacitor('filter', out, net.ground, 100e-6);
  return { net, load };
}

const { net, leg, primary } = gateDrive();
const options: SimulateOptions = { stopTime: 100 * 2e-5, rtol: 1e-6 };
console.log('formulation   peak B (T)   peak current (A)   steps   Newton/step');
const finals: number[] = [];
for (const formulation of ['full', 'reduced'] as const) {
  const r = simulate(net, { ...options, formulation });
  const b = r.fluxDensity(leg);
  const i = r.current(primary);
  const peak = (v: ArrayLike<number>): number => Math.max(...Array.from(v, Math.abs));
  finals.push(r.flux(leg)[b.length - 1]!);
  const s = r.stats;
  console.log(`${formulation.padEnd(12)}  ${peak(b).toFixed(4).padStart(10)}   ${peak(i).toFixed(4).padStart(16)}   ${String(s.acceptedSteps).padStart(5)}   ${(s.newtonIterations / s.acceptedSteps).toFixed(2).padStart(11)}`);
}
console.log(`final flux, reduced against full: ${(Math.abs(finals[1]! - finals[0]!) / Math.abs(finals[0]!)).toExponential(1)} relative`);

// An ideal diode is affine between its commutations: the rectifier runs reduced, each commutation a restart.
const rect = rectifier('ideal');
const outputs: number[] = [];
for (const formulation of ['full', 'reduced'] as const) {
  // The fifth crest's instant, sampled exactly (a step ends there).
  const r = simulate(rect.net, { stopTime: 0.1, rtol: 1e-6, formulation, sampling: { times: [0.085], exact: true } });
  const v = r.voltage(rect.load)[0]!;
  outputs.push(v);
  console.log(`rectifier, ${formulation.padEnd(7)}: output at the crest ${v.toFixed(4)} V (at the crest (Vm - Vf) R / (R + Ron) = ${(9.3 * 10 / 10.1).toFixed(4)} V), ${r.stats.acceptedSteps} steps`);
}
console.log(`rectifier output, reduced against full: ${(Math.abs(outputs[1]! - outputs[0]!) / Math.abs(outputs[0]!)).toExponential(1)} relative`);

// An exponential junction is nonlinear in the potentials the reduction would eliminate: refused.
try {
  simulate(rectifier('exponential').net, { stopTime: 0.1, formulation: 'reduced' });
} catch (e) {
  if (!(e instanceof FluxstateError)) throw e;
  console.log(`refused (${e.code}): ${e.message}`);
}
console.log('Caution: engineering estimates from a model; verify against measurements.');
