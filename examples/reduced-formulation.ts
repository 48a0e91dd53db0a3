/**
 * The reduced formulation (`formulation: 'reduced'`): a gate-drive
 * transformer's core, driven by a slightly unbalanced square wave, walks
 * towards saturation. The same run in the full formulation (the DAE, every
 * node potential and branch current an unknown of the integrator) and in
 * the reduced one (those solved inside f, the core flux alone integrated):
 * the results agree to the tolerance, the reduced run takes fewer Newton
 * iterations per step. A network with an ideal diode is refused, with the
 * reason and the fix.
 *
 *     npx tsx examples/reduced-formulation.ts
 *
 * All values are invented; the core is the demo ferrite. Caution:
 * saturation margins are engineering estimates from a model; verify them
 * against measurements of the actual part.
 */
import { createNetwork, demoMaterials, FluxstateError, pulse, simulate, type SimulateOptions } from '../src/index.js';

/** The drive: +/-15 V at 50 kHz with a 51 % duty (a 2 % volt-second imbalance per period). */
function gateDrive(withRectifier: boolean) {
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
  if (withRectifier) {
    const s = net.node('s');
    const out = net.node('out');
    net.winding('secondary', { tube: leg, turns: 12, resistance: 0.1, plus: s, minus: net.ground });
    net.diode('rectifier', s, out);
    net.resistor('gate', out, net.ground, 1000);
  }
  return { net, leg, primary };
}

const { net, leg, primary } = gateDrive(false);
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

// A diode changes the equations' form at each commutation: the reduction refuses it.
try {
  simulate(gateDrive(true).net, { ...options, formulation: 'reduced' });
} catch (e) {
  if (!(e instanceof FluxstateError)) throw e;
  console.log(`refused (${e.code}): ${e.message}`);
}
console.log('Caution: engineering estimates from a model; verify against measurements.');
