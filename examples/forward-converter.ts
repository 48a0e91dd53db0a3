/**
 * A single-switch forward converter with a reset winding of as many turns
 * as the primary, at D = 0.4 and D = 0.6. While the switch is off the reset
 * winding returns the magnetising energy to the supply and clamps the switch
 * at Vin + (Vin + Vf) N1/N3 = 2 Vin + Vf; the core resets in
 * D T Vin N3 / ((Vin + Vf) N1), inside the off-time only when D < 0.5. At
 * D = 0.6 every period leaves a volt-second excess on the core and the flux
 * density walks up until the core saturates (Mohan, Undeland and Robbins,
 * Power Electronics, ch. 10.4; from memory).
 *
 *     npx tsx examples/forward-converter.ts
 *
 * Everything is invented (24 V in, 100 kHz, 20:20:10 turns on an ungapped
 * demo ferrite core of 50 mm^2 and 50 mm path); it describes no real product.
 *
 * CAUTION: engineering estimates from a model and its inputs. A converter
 * that runs its core into saturation draws destructive currents: verify
 * duty-cycle limits and switch ratings against measurements and the parts'
 * data; local codes and licensed practice govern.
 */
import { constant, createNetwork, createStepper, demoMaterials, pulse, simulate } from '../src/index.js';

const VIN = 24;
const T = 10e-6;
const N1 = 20;
const N3 = 20;
const N2 = 10;
const VF = 0.7;
const AREA = 50e-6;
const LENGTH = 0.05;
const LOAD = 10;
const ferrite = demoMaterials.ferrite; // invented demo data

function forwardConverter(duty: number) {
  const net = createNetwork(`forward converter, D = ${duty}`);
  const [m1, m2] = [net.magneticNode('m1'), net.magneticNode('m2')];
  const leg = net.fluxTube('wound leg', { from: m1, to: m2, length: LENGTH / 2, area: AREA, material: ferrite });
  net.fluxTube('return', { from: m2, to: m1, length: LENGTH / 2, area: AREA, material: ferrite });
  const [vin, drain, reset, sec, x, out] = ['vin', 'drain', 'reset', 'sec', 'x', 'out'].map((n) => net.node(n)) as [
    ReturnType<typeof net.node>, ReturnType<typeof net.node>, ReturnType<typeof net.node>, ReturnType<typeof net.node>, ReturnType<typeof net.node>, ReturnType<typeof net.node>,
  ];
  net.voltageSource('supply', vin, net.ground, constant(VIN));
  net.winding('primary', { tube: leg, turns: N1, resistance: 0.01, plus: vin, minus: drain });
  const sw = net.switch('Q1', drain, net.ground, { gate: pulse({ high: 1, period: T, duty }), onResistance: 0.01, offConductance: 1e-7 });
  const diode = { forwardVoltage: VF, onResistance: 0.01, offConductance: 1e-9 };
  // The reset winding: current from ground through D3 keeps the flux on and flows back into the supply.
  const resetWinding = net.winding('reset winding', { tube: leg, turns: N3, resistance: 0.01, plus: reset, minus: vin });
  net.diode('D3', net.ground, reset, diode);
  net.winding('secondary', { tube: leg, turns: N2, resistance: 0.005, plus: sec, minus: net.ground });
  net.diode('D1', sec, x, diode);
  net.diode('D2', net.ground, x, diode);
  // Output filter started at its running point (n D Vin - Vf), so the study looks at the core.
  const vo = (N2 / N1) * duty * VIN - VF;
  net.inductor('Lo', x, out, 20e-6, { initialCurrent: vo / LOAD });
  const output = net.capacitor('Co', out, net.ground, 47e-6, { initialVoltage: vo });
  net.resistor('load', out, net.ground, LOAD);
  return { net, leg, sw, resetWinding, output };
}

/** The first time in (a, b) where f falls to `level` (f(a) above it), by bisection on the dense output. */
function fallTime(f: (t: number) => number, a: number, b: number, level: number): number {
  for (let k = 0; k < 60; k++) {
    const m = 0.5 * (a + b);
    if (f(m) > level) a = m;
    else b = m;
  }
  return a;
}

// D = 0.4: the core resets inside the off-time.
{
  const duty = 0.4;
  const model = forwardConverter(duty);
  const r = simulate(model.net, { stopTime: 20 * T, rtol: 1e-8 });
  if (r.status !== 'success') throw new Error(`D = 0.4 run: ${r.message}`);
  const off = 19 * T + duty * T;
  const i3 = r.evaluator({ quantity: 'current', handle: model.resetWinding });
  const reset = fallTime(i3, off + 1e-12, 20 * T - 1e-9, 1e-6 * i3(off + 1e-12)) - off;
  const vsw = r.evaluator({ quantity: 'voltage', handle: model.sw });
  const b = r.evaluator({ quantity: 'fluxDensity', handle: model.leg });
  console.log(`D = 0.4: reset time ${(reset * 1e6).toFixed(3)} us, closed form D T Vin/(Vin + Vf) = ${((duty * T * VIN) / (VIN + VF) * 1e6).toFixed(3)} us (off-time ${((1 - duty) * T * 1e6).toFixed(1)} us)`);
  console.log(`         switch voltage during reset ${vsw(off + reset / 2).toFixed(2)} V (2 Vin + Vf = ${(2 * VIN + VF).toFixed(2)} V), after it ${vsw(20 * T - 0.5e-6).toFixed(2)} V`);
  console.log(`         flux density at the period start ${b(20 * T - 1e-9).toExponential(1)} T, peak ${b(off).toFixed(4)} T: the core resets`);
  console.log(`         energy audit: relative error ${r.energy().relativeError.toExponential(1)}`);
}

// D = 0.6: the reset cannot finish; the flux walks up until the core saturates.
{
  const duty = 0.6;
  const model = forwardConverter(duty);
  const walk = (VIN * duty * T - (VIN + VF) * (1 - duty) * T * (N1 / N3)) / (N1 * AREA);
  const bSat = ferrite.saturationFluxDensity!;
  let crossing = NaN;
  const stepper = createStepper(model.net, {
    horizon: 12 * T, rtol: 1e-8,
    thresholds: [{
      name: '0.85 B_sat', watch: { quantity: 'fluxDensity', handle: model.leg }, level: 0.85 * bSat, direction: 'rising',
      onCross: (_s, c) => { if (Number.isNaN(crossing)) crossing = c.time; },
    }],
  });
  const rows: string[] = [];
  for (let k = 1; k <= 12; k++) {
    stepper.advanceTo(k * T);
    if (stepper.status !== 'running' && stepper.status !== 'success') throw new Error(`D = 0.6 run: ${stepper.message}`);
    rows.push(`  ${String(k).padStart(2)}  ${stepper.fluxDensity(model.leg).toFixed(4)} T  ${(k * walk).toFixed(4)} T`);
  }
  console.log(`\nD = 0.6: walk per period (Vin D T - (Vin + Vf)(1 - D) T) / (N1 A) = ${walk.toFixed(4)} T`);
  console.log('  period  B at its end  k x walk');
  for (const row of rows) console.log(row);
  console.log(`  the core passes 0.85 B_sat (${(0.85 * bSat).toFixed(3)} T) at ${(crossing * 1e6).toFixed(2)} us; beyond it the magnetising current rises steeply`);
  console.log(`  energy audit: relative error ${stepper.result().energy().relativeError.toExponential(1)}`);
}
console.log('\nCaution: engineering estimates from a model with invented values; a saturating core draws destructive currents.');
