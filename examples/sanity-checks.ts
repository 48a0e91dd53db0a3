/**
 * Sanity checks of a model with a unit slip: a core described in metres
 * where millimetres were meant simulates to "success" with a flux density
 * of microtesla. sanityWarnings names the tubes and the likely slip before
 * the run; resultSanityWarnings adds flux densities no material carries
 * after it (here: a never-saturating linear core driven far too hard).
 *
 *     npx tsx examples/sanity-checks.ts
 *
 * Invented values; they describe no real product.
 */
import { createNetwork, demoMaterials, mm, mm2, resultSanityWarnings, sanityWarnings, seriesPeak, simulate, sine } from '../src/index.js';

function transformer(length: number, area: number, material: Parameters<ReturnType<typeof createNetwork>['fluxTube']>[1]['material'], turns = 820) {
  const net = createNetwork('230 V transformer');
  const bottom = net.magneticNode('bottom');
  const top = net.magneticNode('top');
  const leg = net.fluxTube('wound leg', { from: bottom, to: top, length, area, material });
  net.fluxTube('rest of core', { from: top, to: bottom, length: (7 / 3) * length, area, material });
  const line = net.node('line');
  net.voltageSource('mains', line, net.ground, sine({ amplitude: 325, frequency: 50, phase: Math.PI / 2 }));
  net.winding('primary', { tube: leg, turns, resistance: 2.5, plus: line, minus: net.ground });
  return { net, leg };
}

// Metres where millimetres were meant: 150 m and 900 m^2.
const slip = transformer(150, 900, demoMaterials.grainOrientedSteel);
const run = simulate(slip.net, { stopTime: 0.04 });
console.log(`unit slip: status ${run.status}, peak |B| ${seriesPeak(run.time, run.fluxDensity(slip.leg)).peak.toExponential(2)} T`);
for (const w of sanityWarnings(slip.net.describe())) console.log(`  warning: ${w.message}`);

// As meant: mm(150), mm2(900). No warning.
const meant = transformer(mm(150), mm2(900), demoMaterials.grainOrientedSteel);
console.log(`as meant: ${sanityWarnings(meant.net.describe()).length} warnings`);

// 20 turns on a linear (never saturating) core: the volt-seconds ask for tens of tesla.
const hard = transformer(mm(150), mm2(900), { kind: 'linear', relativePermeability: 3000 }, 20);
for (const w of resultSanityWarnings(simulate(hard.net, { stopTime: 0.02 }))) console.log(`after the run: ${w.message}`);
