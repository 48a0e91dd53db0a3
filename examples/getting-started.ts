// Getting started: the code of docs/guide/getting-started.md, block after block (the examples test
// checks that the two stay identical). A small transformer switched onto 230 V with a resistive load:
// flux density and currents by handle, the energy audit, CSV and an HTML report in out/getting-started/.
// Invented values. Run: npx tsx examples/getting-started.ts

import { mkdirSync, writeFileSync } from 'node:fs';
import { createNetwork, demoMaterials, fluxDensityMargin, mm, mm2, seriesRms, simulate, sine } from '../src/index.js';
import { resultReport, writeReport } from '../src/report/index.js';

const net = createNetwork('first transformer');

// Magnetic half: a closed core of two flux tubes between two magnetic nodes.
// Positive flux runs from a tube's `from` node to its `to` node.
const bottom = net.magneticNode('bottom');
const top = net.magneticNode('top');
const steel = demoMaterials.grainOrientedSteel; // invented demo material, B_sat 1.97 T
const leg = net.fluxTube('wound leg', { from: bottom, to: top, length: mm(150), area: mm2(900), material: steel });
net.fluxTube('rest of core', { from: top, to: bottom, length: mm(350), area: mm2(900), material: steel });

// Electric half: a 230 V, 50 Hz supply switched on at its voltage peak (phase 90 degrees).
const line = net.node('line');
const out = net.node('out');
const supply = net.voltageSource('supply', line, net.ground, sine({ amplitude: 230 * Math.SQRT2, frequency: 50, phase: Math.PI / 2 }));

// Two windings on the wound leg. 820 turns give about 1.4 T at 230 V (EMF equation
// V_rms = 4.44 f N A B_peak); 88 turns give about 24 V.
const primary = net.winding('primary', { tube: leg, turns: 820, resistance: 2.5, plus: line, minus: net.ground });
const secondary = net.winding('secondary', { tube: leg, turns: 88, resistance: 0.04, plus: out, minus: net.ground });
const load = net.resistor('load', out, net.ground, 10);

const result = simulate(net, { stopTime: 0.1 }); // five cycles
console.log(`status: ${result.status} (${result.message}), ${result.stats.acceptedSteps} steps, ${result.length} samples`);

const b = result.fluxDensity(leg); // T
const margin = fluxDensityMargin(result.time, b, { saturation: steel.saturationFluxDensity ?? 1.97 });
console.log(`peak |B| ${margin.peak.toFixed(3)} T at ${(margin.peakTime * 1e3).toFixed(1)} ms, margin to saturation ${margin.margin.toFixed(3)} T`);

const lastCycle = { from: 0.08 };
const iPrimary = seriesRms(result.time, result.current(primary), lastCycle);
const iSecondary = seriesRms(result.time, result.current(secondary), lastCycle);
const vLoad = seriesRms(result.time, result.voltage(load), lastCycle);
console.log(`last cycle: primary ${iPrimary.toFixed(3)} A rms, secondary ${iSecondary.toFixed(3)} A rms, load ${vLoad.toFixed(2)} V rms`);

const audit = result.energy();
console.log(
  `energy: sources ${audit.sourceEnergy.toFixed(4)} J = load ${audit.dissipated.resistors.toFixed(4)} J` +
    ` + copper ${audit.dissipated.windings.toFixed(4)} J + stored ${(audit.storedEnd - audit.storedStart).toExponential(2)} J` +
    ` (relative error ${audit.relativeError.toExponential(1)})`,
);

mkdirSync('out/getting-started', { recursive: true });
writeFileSync('out/getting-started/run.csv', result.toCSV()); // time, then B of every tube, i and v of every element
const file = writeReport('out/getting-started/report.html', resultReport(result, { title: 'First transformer' }));
console.log(`report: ${file}`);
