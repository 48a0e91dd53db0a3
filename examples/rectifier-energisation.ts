/**
 * A mains transformer switched on at a voltage zero, with remanence in its
 * core, into a diode bridge and a smoothing capacitor: the magnetising
 * inrush of the primary and the capacitor's charging current arrive
 * together. Compared with switching at the voltage peak without remanence
 * (the mildest case for the core), so the two contributions can be told
 * apart.
 *
 *     npx tsx examples/rectifier-energisation.ts
 *
 * Everything is invented (a 1 kVA-class 230 V / 24 V transformer on a U core
 * of the demo grain-oriented steel, a 10 mF capacitor, a 5 ohm load); it
 * describes no real product.
 *
 * CAUTION: inrush and charging peaks are engineering estimates from a model
 * and its inputs (remanence, switching instant, source impedance). They do
 * not prove a fuse or breaker choice: verify against measurements; local
 * codes, standards and licensed engineering practice govern.
 */
import { addCoreLayout, createNetwork, demoMaterials, mm, simulate, sine, uCoreLayout } from '../src/index.js';

const F = 50;
const U_RMS = 230;
const CYCLES = 10;

function energisedRectifier(options: { angleDeg: number; remanence: number }) {
  const layout = uCoreLayout({
    legWidth: mm(40), yokeHeight: mm(40), depth: mm(50), stackingFactor: 0.96,
    windowWidth: mm(45), windowHeight: mm(110),
    windings: { left: { innerBuild: mm(12), outerBuild: mm(6), spacing: mm(2), clearance: mm(3) } },
  });
  const net = createNetwork('transformer into a bridge rectifier');
  const core = addCoreLayout(net, layout, { material: demoMaterials.grainOrientedSteel, initialFluxDensity: { left: options.remanence } });
  const line = net.node('line');
  const mains = net.voltageSource('mains', line, net.ground, sine({ amplitude: U_RMS * Math.SQRT2, frequency: F, phase: (options.angleDeg * Math.PI) / 180 }));
  // 360 turns for 1.5 T peak (EMF equation), 38 turns for about 24 V.
  const primary = net.winding('primary', { tube: core.windingTube('left'), turns: 360, resistance: 1.1, plus: line, minus: net.ground });
  const [a, b, dc] = [net.node('a'), net.node('b'), net.node('dc')];
  net.winding('secondary', { tube: core.outerWindingTube('left'), turns: 38, resistance: 0.02, plus: a, minus: b });
  // While all four diodes block, the secondary floats on their off-conductances alone: 1e-6 S keeps
  // that well conditioned (with 1e-8 S the run at rtol 1e-7 stops with a Newton failure).
  const diode = { forwardVoltage: 0.8, onResistance: 0.01, offConductance: 1e-6 };
  const upper = [net.diode('D1', a, dc, diode), net.diode('D2', b, dc, diode)];
  net.diode('D3', net.ground, a, diode);
  net.diode('D4', net.ground, b, diode);
  const capacitor = net.capacitor('C', dc, net.ground, 10e-3);
  net.resistor('load', dc, net.ground, 5);
  return { net, core, primary, upper, capacitor };
}

const rows: string[] = [];
for (const c of [{ angleDeg: 90, remanence: 0, label: 'at the voltage peak, no remanence' }, { angleDeg: 0, remanence: 0.8, label: 'at a voltage zero, remanence +0.8 T' }]) {
  const model = energisedRectifier(c);
  const r = simulate(model.net, { stopTime: CYCLES / F, rtol: 1e-7, maxStep: 1 / F / 100 });
  if (r.status !== 'success') throw new Error(`${c.label}: ${r.message}`);
  const t = r.time;
  const ip = r.current(model.primary);
  const ic = r.current(model.capacitor);
  const b = r.fluxDensity(model.core.windingTube('left'));
  let kp = 0;
  let kc = 0;
  let bPeak = 0;
  for (let k = 0; k < t.length; k++) {
    if (Math.abs(ip[k]!) > Math.abs(ip[kp]!)) kp = k;
    if (ic[k]! > ic[kc]!) kc = k;
    bPeak = Math.max(bPeak, Math.abs(b[k]!));
  }
  const vc = r.voltage(model.capacitor);
  rows.push(
    `${c.label.padEnd(38)} ${Math.abs(ip[kp]!).toFixed(1).padStart(7)} A at ${(t[kp]! * 1e3).toFixed(2).padStart(6)} ms` +
      `  ${ic[kc]!.toFixed(1).padStart(7)} A at ${(t[kc]! * 1e3).toFixed(2).padStart(6)} ms  ${bPeak.toFixed(3)} T  ${vc[vc.length - 1]!.toFixed(2)} V` +
      `  audit ${r.energy().relativeError.toExponential(1)}`,
  );
}
console.log(`switched on                             peak primary current     peak charging current     peak |B|  Vdc after ${CYCLES} cycles`);
for (const row of rows) console.log(row);
console.log(`\nB_sat of the demo steel ${demoMaterials.grainOrientedSteel.saturationFluxDensity} T; the capacitor charges through the bridge in the first half-cycles while the core saturates.`);
console.log('CAUTION: engineering estimates with invented values; local codes, standards and licensed practice govern protection choices.');
