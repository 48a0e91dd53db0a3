/**
 * Residual flux and re-energisation inrush of a single-leg reactor with a
 * hysteretic core (the demo hysteretic steel): energise at a voltage peak,
 * switch off at a chosen instant (source removed, a discharge resistor stays
 * across the winding), read the residual flux density the loop leaves, then
 * close again at several angles and compare the inrush peaks with those of a
 * first energisation from the demagnetised core.
 *
 *     npx tsx examples/residual-flux.ts
 *
 * Everything is invented (400 turns on a 0.4 m x 20 cm^2 core, 267 V rms,
 * 50 Hz); it describes no real product. Until the element registry carries a
 * hysteretic tube into networks, this runs the constant-mass reactor form
 * (`hystereticReactorProblem`) with the DAE solver directly.
 *
 * CAUTION: residual flux and inrush peaks are engineering estimates from a
 * model and its inputs (material parameters, switching instants, source
 * impedance). They do not prove a protection setting or a design safe.
 * Verify them against measurements; local codes, standards and licensed
 * engineering practice govern.
 */
import {
  HYSTERETIC_REACTOR_UNKNOWNS as Y,
  demoHystereticMaterials,
  hystereticReactorProblem,
  hysteresisLoopFeatures,
  inverseJilesAtherton,
  solveDae,
  type HystereticReactorSpec,
} from '../src/index.js';

const steel = inverseJilesAtherton(demoHystereticMaterials.steel);
const FREQUENCY = 50;
const OMEGA = 2 * Math.PI * FREQUENCY;
const TURNS = 400;
const AREA = 20e-4; // m^2
const LENGTH = 0.4; // m
const PEAK_B = 1.5; // T in steady state
const AMPLITUDE = TURNS * AREA * OMEGA * PEAK_B; // V peak
const R_CLOSED = 2; // ohm, source and winding
const R_OPEN = 1000; // ohm, discharge path while open
const T_CLOSE = 0.1; // s, re-energisation instant
const OPTIONS = { rtol: 1e-7, atol: [1e-12, 1e-7, 1e-2, 1e-5], maxSteps: 200_000 };

/** Energised at a voltage peak from t = 0, opened at tOpen, closed again at T_CLOSE at `angle` (rad after a rising voltage zero). */
function scenario(tOpen: number, angle: number, tEnd: number): HystereticReactorSpec {
  return {
    material: steel,
    pathLength: LENGTH,
    area: AREA,
    turns: TURNS,
    voltage: (t) => (t < tOpen ? AMPLITUDE * Math.cos(OMEGA * t) : t >= T_CLOSE ? AMPLITUDE * Math.sin(OMEGA * (t - T_CLOSE) + angle) : 0),
    resistance: (t) => (t < tOpen || t >= T_CLOSE ? R_CLOSED : R_OPEN),
    t0: 0,
    tEnd,
    breakpoints: [tOpen, T_CLOSE].filter((t) => t < tEnd),
  };
}

function solve(spec: HystereticReactorSpec) {
  const s = solveDae(hystereticReactorProblem(spec), OPTIONS);
  if (s.status !== 'success') throw new Error(`run failed: ${s.status} at t = ${s.tReached}`);
  return s;
}

function peakCurrentAfter(s: ReturnType<typeof solve>, t0: number): number {
  const i = s.component(Y.current);
  let peak = 0;
  s.t.forEach((t, k) => {
    if (t >= t0) peak = Math.max(peak, Math.abs(i[k]!));
  });
  return peak;
}

const loop = hysteresisLoopFeatures(steel, PEAK_B);
console.log(`${steel.name}: loop at ${PEAK_B} T has remanence ${loop.remanence.toFixed(3)} T, coercive field ${loop.coerciveField.toFixed(1)} A/m`);
console.log('switch-off instant  flux density at opening  residual flux density');
let residualAtPeak = 0;
for (const tOpen of [0.045, 0.0475, 0.05]) {
  const s = solve(scenario(tOpen, 0, T_CLOSE - 1e-6));
  const yOpen = s.at(tOpen);
  const yEnd = s.y[s.y.length - 1]!;
  const residual = yEnd[Y.flux]! / AREA;
  if (tOpen === 0.045) residualAtPeak = residual;
  console.log(`${(tOpen * 1e3).toFixed(1).padStart(8)} ms ${(yOpen[Y.flux]! / AREA).toFixed(3).padStart(18)} T ${residual.toFixed(3).padStart(22)} T`);
}

console.log(`re-energised at ${T_CLOSE * 1e3} ms after switch-off at 45 ms (residual ${residualAtPeak.toFixed(3)} T):`);
console.log('closing angle  inrush peak, demagnetised core  inrush peak, with residual flux');
for (const degrees of [0, 45, 90, 180]) {
  const angle = (degrees * Math.PI) / 180;
  // First energisation at the same angle from the demagnetised core.
  const first = solve({
    ...scenario(0, 0, 0.04),
    voltage: (t) => AMPLITUDE * Math.sin(OMEGA * t + angle),
    resistance: () => R_CLOSED,
    breakpoints: [],
  });
  const again = solve(scenario(0.045, angle, T_CLOSE + 0.04));
  console.log(`${String(degrees).padStart(8)} deg ${peakCurrentAfter(first, 0).toFixed(1).padStart(24)} A ${peakCurrentAfter(again, T_CLOSE).toFixed(1).padStart(28)} A`);
}
console.log('Caution: engineering estimates from an invented model; verify against measurements and follow local codes and licensed practice.');
