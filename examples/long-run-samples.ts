// A long run on a coarse sampling grid: with keepSteps: false only the samples are kept, computed
// from the step that contains them as the run goes, so memory follows the grid, not the number of
// solver steps. A winding on a saturating core driven by a +/-12 V square wave at 20 kHz for 200 ms
// (4000 periods, every edge a restart), sampled every 0.1 ms. Invented values.
// Run: npx tsx examples/long-run-samples.ts

import { createNetwork, demoMaterials, pulse, simulate } from '../src/index.js';

const net = createNetwork('square drive, long run');
const m1 = net.magneticNode('m1');
const m2 = net.magneticNode('m2');
const ferrite = demoMaterials.ferrite; // invented demo material
const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.03, area: 1e-4, material: ferrite });
net.fluxTube('rest', { from: m2, to: m1, length: 0.05, area: 1e-4, material: ferrite });
const drive = net.node('drive');
net.voltageSource('drive', drive, net.ground, pulse({ low: -12, high: 12, period: 5e-5, duty: 0.5 }));
const coil = net.winding('coil', { tube: leg, turns: 40, resistance: 0.2, plus: drive, minus: net.ground });

const options = { stopTime: 0.2, sampling: { interval: 1e-4 } } as const;
const streamed = simulate(net, { ...options, keepSteps: false });
// Grid times that fall on a drive edge are kept twice (the values just before and just after).
console.log(`streamed: status ${streamed.status}, ${streamed.stats.acceptedSteps} solver steps, ${streamed.length} samples kept`);

const b = streamed.fluxDensity(leg);
let peak = 0;
for (const v of b) peak = Math.max(peak, Math.abs(v));
console.log(`peak |B| on the grid: ${peak.toFixed(4)} T`);

// The same run keeping every step (the default) gives the same samples, and can also be audited.
const kept = simulate(net, options);
const same = streamed.current(coil).every((v, k) => v === kept.current(coil)[k]);
console.log(`samples identical to keeping every step: ${same}; energy audit (needs every step) relative error ${kept.energy().relativeError.toExponential(1)}`);
