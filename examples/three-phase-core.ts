/**
 * A three-phase transformer on a three-limb core (threeLimbLayout +
 * addCoreLayout): three sine sources 120 degrees apart feed the star-connected
 * primaries (neutral grounded); the secondaries, also in star, feed
 * star-connected resistive loads whose star point floats. One load is half
 * the others, so the load star point shifts.
 *
 *     npx tsx examples/three-phase-core.ts
 *
 * The limb fluxes start at their steady-state values (computed from the EMF
 * equation), so the run starts without an energisation transient; see
 * examples/inrush-study.ts for that transient. The design is invented
 * (6 kVA, 400 V / 207 V, demo grain-oriented steel).
 *
 * Caution: engineering estimates from a model; local codes, standards and
 * licensed practice govern any design or protection decision.
 */
import {
  addCoreLayout,
  createNetwork,
  demoMaterials,
  fluxDensityMargin,
  mm,
  seriesRms,
  simulate,
  sine,
  threeLimbLayout,
  inductanceMatrix,
  zeroSequenceReluctance,
} from '../src/index.js';

const F = 50; // Hz
const W = 2 * Math.PI * F;
const PERIOD = 1 / F;
const U_PHASE = 400 / Math.sqrt(3); // V rms, primary line-to-neutral
const N1 = 172;
const N2 = 89; // 231 V * 89 / 172 = 119.5 V phase, 207 V line
const steel = demoMaterials.grainOrientedSteel;
const B_SAT = steel.saturationFluxDensity ?? 1.97;
const phases = [
  { limb: 'a', angle: 0 },
  { limb: 'b', angle: (-2 * Math.PI) / 3 },
  { limb: 'c', angle: (2 * Math.PI) / 3 },
] as const;
const loads = { a: 7.2, b: 7.2, c: 14.4 }; // ohm: phase c carries half the load

const layoutDimensions = {
  limbWidth: mm(60), yokeHeight: mm(60), depth: mm(70), stackingFactor: 0.96,
  windowWidth: mm(55), windowHeight: mm(150),
};
const layout = threeLimbLayout(layoutDimensions);
// Iron section of a limb, and the effective area of each limb's flux tube (IEC 60205 corners give the
// outer and middle limbs slightly different effective areas).
const limbArea = layout.legs.find((l) => l.name === 'a')!.area;
const tubeArea = (limb: string): number => {
  const path = layout.paths.find((p) => p.name === layout.legs.find((l) => l.name === limb)?.windingPath);
  if (path?.kind !== 'core') throw new Error(`no core path on limb ${limb}`);
  return path.area;
};

// Steady state of a winding on sine voltage U sqrt2 sin(wt + angle), resistance neglected:
// N dphi/dt = v gives phi = -(U sqrt2 / (N w)) cos(wt + angle). Starting every limb there avoids the
// DC offsets of an energisation; the three fluxes add up to zero, as the three-limb core requires.
// addCoreLayout takes a flux density per limb: the flux over that limb's tube area.
const phiPeak = (U_PHASE * Math.SQRT2) / (N1 * W);
const bPeak = phiPeak / limbArea;
const initialFluxDensity = Object.fromEntries(phases.map((p) => [p.limb, (-phiPeak * Math.cos(p.angle)) / tubeArea(p.limb)]));

const net = createNetwork('three-phase transformer');
const core = addCoreLayout(net, layout, { material: steel, initialFluxDensity });
const loadStar = net.node('load star point');
const model = phases.map(({ limb, angle }) => {
  const line = net.node(`line ${limb}`);
  const out = net.node(`out ${limb}`);
  net.voltageSource(`source ${limb}`, line, net.ground, sine({ amplitude: U_PHASE * Math.SQRT2, frequency: F, phase: angle }));
  // All limbs point upwards in the layout and all windings are wound the same way (orientation +1).
  const primary = net.winding(`primary ${limb}`, { tube: core.windingTube(limb), turns: N1, resistance: 0.35, plus: line, minus: net.ground });
  const secondary = net.winding(`secondary ${limb}`, { tube: core.windingTube(limb), turns: N2, resistance: 0.1, plus: out, minus: net.ground });
  const load = net.resistor(`load ${limb}`, out, loadStar, loads[limb]);
  return { limb, primary, secondary, load, tube: core.windingTube(limb) };
});

const cycles = 5;
const result = simulate(net, { stopTime: cycles * PERIOD, sampling: { interval: PERIOD / 400, includeSteps: true } });
if (result.status !== 'success') throw new Error(result.message);

const last = { from: (cycles - 1) * PERIOD };
console.log(`Three-limb core, ${(U_PHASE * Math.sqrt(3)).toFixed(0)} V / ${((U_PHASE * Math.sqrt(3) * N2) / N1).toFixed(0)} V, star-star, unbalanced star load (invented design)`);
console.log(`design peak flux density from the EMF equation: ${bPeak.toFixed(3)} T (limb area ${(limbArea * 1e6).toFixed(0)} mm^2)\n`);
console.log('limb   tube area mm^2   peak|B| T   margin T   I primary A rms   V load V rms   I load A rms   P load W');
for (const m of model) {
  const margin = fluxDensityMargin(result.time, result.fluxDensity(m.tube), { saturation: B_SAT, ...last });
  const power = seriesRms(result.time, result.voltage(m.load), last) ** 2 / loads[m.limb as keyof typeof loads];
  console.log(
    `${m.limb.padStart(4)}   ${(tubeArea(m.limb) * 1e6).toFixed(0).padStart(14)}   ${margin.peak.toFixed(3).padStart(9)}   ${margin.margin.toFixed(3).padStart(8)}` +
      `   ${seriesRms(result.time, result.current(m.primary), last).toFixed(2).padStart(15)}` +
      `   ${seriesRms(result.time, result.voltage(m.load), last).toFixed(1).padStart(12)}` +
      `   ${seriesRms(result.time, result.current(m.load), last).toFixed(2).padStart(12)}   ${power.toFixed(0).padStart(8)}`,
  );
}
console.log('(the middle limb\'s tube has a larger effective area, from the IEC 60205 treatment of its T junctions,\n so its flux density is lower for the same peak flux)');
const starShift = seriesRms(result.time, result.potential(loadStar), last);
console.log(`\nload star point to neutral: ${starShift.toFixed(1)} V rms (0 for a balanced load)`);

// Flux conservation at the yokes: the three limb fluxes add up to zero at every instant.
const fluxes = model.map((m) => result.flux(m.tube));
let worst = 0;
for (let k = 0; k < result.length; k++) worst = Math.max(worst, Math.abs(fluxes[0]![k]! + fluxes[1]![k]! + fluxes[2]![k]!));
console.log(`largest |phi_a + phi_b + phi_c|: ${worst.toExponential(2)} Wb (peak limb flux ${phiPeak.toExponential(3)} Wb)`);
console.log('(a three-limb core has no return path for a zero-sequence flux; fiveLimbLayout has one)');

const audit = result.energy();
console.log(
  `energy audit over ${cycles} cycles: sources ${audit.sourceEnergy.toFixed(1)} J = loads ${audit.dissipated.resistors.toFixed(1)} J` +
    ` + copper ${audit.dissipated.windings.toFixed(1)} J + stored change ${(audit.storedEnd - audit.storedStart).toFixed(3)} J` +
    ` (relative error ${audit.relativeError.toExponential(1)})`,
);

// Zero-sequence: the same three windings carrying one common current. Without a return path outside the iron the
// three-limb core carries no common flux at all; a tank path gives it (R0 from an assumed X0 of 0.5 per unit).
const zImpedance = (U_PHASE * U_PHASE) / (3000 / 3); // ohm per phase, for an invented 3 kVA rating
const r0 = zeroSequenceReluctance({ turns: N1, frequency: F, reactance: 0.5 * zImpedance });
for (const [label, zeroSequence] of [['without a tank path', undefined], [`with a tank path of ${r0.toExponential(2)} A/Wb`, { reluctance: r0 }]] as const) {
  const zsNet = createNetwork('zero-sequence check');
  const zsCore = addCoreLayout(zsNet, threeLimbLayout({ ...layoutDimensions, ...(zeroSequence ? { zeroSequence } : {}) }), { material: steel });
  for (const p of phases) zsNet.winding(`primary ${p.limb}`, { tube: zsCore.windingTube(p.limb), turns: N1, plus: zsNet.node(p.limb), minus: zsNet.ground });
  const m = inductanceMatrix(zsNet, phases.map((p) => `primary ${p.limb}`), { bias: [0.1, 0.1, 0.1] });
  const l0 = m.fluxLinkage.reduce((s, x) => s + x, 0) / (3 * 0.1);
  console.log(`zero-sequence inductance per phase ${label}: ${(l0 * 1e3).toFixed(3)} mH (X0 ${(W * l0).toFixed(2)} ohm)`);
}
console.log('\nCaution: engineering estimates from a model; local codes, standards and licensed practice govern.');
