/**
 * Current transformer under a fully offset fault current, with and without
 * remanence in its hysteretic core: the time to saturate from the
 * simulation against the flux-demand estimate (the ideal-CT secondary
 * voltage integrated into core flux until the flux reaches saturation, the
 * reasoning behind the time-to-saturate estimate of IEEE Std C37.110; the
 * formula is derived here, the standard's text was not at hand).
 *
 *     npx tsx examples/current-transformer.ts
 *
 * Everything is invented (a 1/200 CT on a core of the demo hysteretic steel,
 * 10 cm^2 x 0.3 m, 2.5 ohm secondary loop, 4 kA peak fault with X/R = 15.7);
 * it describes no real product.
 *
 * CAUTION: times to saturate are engineering estimates from a model and its
 * inputs (material parameters, remanence, fault asymmetry, burden). They do
 * not prove a protection setting. Verify against measurements and the
 * relay maker's CT requirements; local codes, standards and licensed
 * engineering practice govern.
 */
import {
  createNetwork,
  demoHystereticMaterials,
  hysteresisLoopFeatures,
  inverseJilesAtherton,
  simulate,
  traceFluxDensityPath,
  userFunction,
} from '../src/index.js';

const steel = demoHystereticMaterials.steel; // invented demo data
const OMEGA = 2 * Math.PI * 50;
const FAULT_PEAK = 4000; // A, symmetrical peak
const T1 = 0.05; // s, primary time constant (X/R = OMEGA T1 = 15.7)
const N2 = 200;
const AREA = 10e-4; // m^2
const LENGTH = 0.3; // m
const R_LOOP = 2.5; // ohm, secondary winding + burden
const LIMIT = 0.1; // saturated when the magnetising MMF exceeds 10 % of the fault's peak MMF
const faultCurrent = (t: number): number => FAULT_PEAK * (Math.exp(-t / T1) - Math.cos(OMEGA * t));

/**
 * Simulated time to saturate: first instant with |l H| > LIMIT x FAULT_PEAK (ratio error above 10 %),
 * and the sign of the core flux density there (the direction the offset drives the flux).
 */
function simulatedTime(initialFluxDensity: number): { time: number; sign: number } {
  const net = createNetwork('current transformer');
  net.magneticNode('a');
  net.magneticNode('b');
  const law = { kind: 'hysteretic' as const, length: LENGTH / 2, area: AREA, material: steel };
  const core = net.tube({ name: 'core', from: 0, to: 1, eddyResistance: 1e-3, initialFluxDensity, law });
  net.tube({ name: 'core return', from: 1, to: 0, eddyResistance: 1e-3, initialFluxDensity, law });
  const bar = net.node('bar');
  const secondary = net.node('secondary');
  net.currentSource('fault', net.ground, bar, userFunction({ fn: faultCurrent, breakpoints: [0], name: 'offset fault' }));
  net.winding('primary', { tube: core, turns: 1, resistance: 1e-4, plus: bar, minus: net.ground });
  net.winding('secondary', { tube: core, turns: N2, resistance: 0.5, plus: secondary, minus: net.ground });
  net.resistor('burden', secondary, net.ground, R_LOOP - 0.5);
  const r = simulate(net, { stopTime: 0.03, rtol: 1e-7, maxStep: 1e-4 });
  if (r.status !== 'success') throw new Error(`run failed: ${r.message}`);
  const h = r.fieldStrength(core);
  const k = h.findIndex((v) => Math.abs(v) * LENGTH > LIMIT * FAULT_PEAK);
  return k < 0 ? { time: Number.NaN, sign: 0 } : { time: r.time[k]!, sign: Math.sign(r.fluxDensity(core)[k]!) };
}

// The same criterion on the material: the flux density where l H = LIMIT x FAULT_PEAK on a rising major branch.
const model = inverseJilesAtherton(steel);
const trace = traceFluxDensityPath(model, [0, 2.4, -2.4, 2.4], { stepsPerSegment: 4000 });
const start = trace.turningIndices[2]!;
let bSat = Number.NaN;
for (let i = start; i < trace.fluxDensity.length; i++) {
  if (trace.fieldStrength[i]! * LENGTH > LIMIT * FAULT_PEAK) {
    bSat = trace.fluxDensity[i]!;
    break;
  }
}

/** Flux-demand estimate: B(t) = B0 + R I (T1 (1 - e^(-t/T1)) - sin(wt)/w) / (N2^2 A) reaches bSat (derived). */
function estimatedTime(b0: number): number {
  const demand = (t: number): number => b0 + (R_LOOP * FAULT_PEAK * (T1 * (1 - Math.exp(-t / T1)) - Math.sin(OMEGA * t) / OMEGA)) / (N2 * N2 * AREA);
  for (let t = 0; t < 0.1; t += 1e-6) if (demand(t) >= bSat) return t;
  return Number.NaN;
}

const residual = hysteresisLoopFeatures(model, 1.5).remanence;
console.log(`${model.name}: saturation criterion at ${bSat.toFixed(3)} T; remanence of a 1.5 T loop ${residual.toFixed(3)} T`);
const none = simulatedTime(0);
console.log('remanence                 time to saturate: simulated   flux-demand estimate');
const rows: [string, number][] = [['none', 0], ['aiding the offset', residual], ['opposing the offset', -residual]];
for (const [label, b0] of rows) {
  // b0 > 0 aids: the core starts with remanence in the direction the offset drives the flux.
  const sim = b0 === 0 ? none : simulatedTime(none.sign * b0);
  const est = estimatedTime(b0);
  console.log(`${label.padEnd(20)} ${b0.toFixed(3).padStart(6)} T ${(sim.time * 1e3).toFixed(2).padStart(16)} ms ${(est * 1e3).toFixed(2).padStart(18)} ms`);
}
console.log('Caution: engineering estimates from an invented model; verify against measurements and follow local codes and licensed practice.');
