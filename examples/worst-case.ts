/**
 * Worst-case inrush search: the switching angle and remanence that give the
 * largest first-cycle inrush peak of a small transformer, found by a bounded
 * search (coarse scan, then Brent's method on each parameter) instead of a
 * fine grid, and the smallest margin to saturation over the same ranges.
 *
 *     npx tsx examples/worst-case.ts
 *
 * Invented design on the demo steel; it describes no real product.
 *
 * CAUTION: inrush peaks and saturation margins are engineering estimates from
 * a model and its inputs (material curve, remanence, switching instant, source
 * impedance). They do not prove a protection setting or a design safe; local
 * codes, standards and licensed engineering practice govern.
 */
import { createNetwork, demoMaterials, fluxDensityMargin, mm, mm2, seriesPeak, simulate, sine, worstCase } from '../src/index.js';

const steel = demoMaterials.grainOrientedSteel;
const B_SAT = steel.saturationFluxDensity ?? 1.97;

/** One energisation: 230 V, 50 Hz, switched at `angle` degrees after a rising voltage zero, remanence `remanence` T. */
function energise(angle: number, remanence: number) {
  const net = createNetwork('230 V transformer');
  const bottom = net.magneticNode('bottom');
  const top = net.magneticNode('top');
  const leg = net.fluxTube('wound leg', { from: bottom, to: top, length: mm(150), area: mm2(900), material: steel, initialFluxDensity: remanence });
  net.fluxTube('rest of core', { from: top, to: bottom, length: mm(350), area: mm2(900), material: steel, initialFluxDensity: remanence });
  const line = net.node('line');
  const source = net.node('source');
  net.voltageSource('mains', source, net.ground, sine({ amplitude: 230 * Math.SQRT2, frequency: 50, phase: (angle * Math.PI) / 180 }));
  net.resistor('supply resistance', source, line, 0.4);
  const primary = net.winding('primary', { tube: leg, turns: 820, resistance: 2.5, plus: line, minus: net.ground });
  const result = simulate(net, { stopTime: 0.02 }); // the first cycle holds the largest peak
  if (result.status !== 'success') throw new Error(`angle ${angle}, remanence ${remanence}: ${result.message}`);
  return { result, primary, leg };
}

const parameters = [
  { name: 'angle', min: -180, max: 180, tolerance: 0.5, gridPoints: 13 }, // degrees
  { name: 'remanence', min: -0.8, max: 0.8, tolerance: 0.01, gridPoints: 5 }, // T
];

const inrush = worstCase({
  goal: 'maximum',
  parameters,
  evaluate: ({ angle, remanence }) => {
    const { result, primary } = energise(angle!, remanence!);
    return seriesPeak(result.time, result.current(primary)).peak;
  },
});
console.log(
  `largest inrush peak: ${inrush.objective.toFixed(1)} A at ${inrush.values.angle!.toFixed(1)} deg, remanence ${inrush.values.remanence!.toFixed(2)} T` +
    ` (${inrush.evaluations} runs, converged: ${inrush.converged})`,
);

const margin = worstCase({
  goal: 'minimum',
  parameters,
  evaluate: ({ angle, remanence }) => {
    const { result, leg } = energise(angle!, remanence!);
    return fluxDensityMargin(result.time, result.fluxDensity(leg), { saturation: B_SAT }).margin;
  },
});
console.log(
  `smallest margin to B_sat ${B_SAT} T: ${margin.objective.toFixed(3)} T at ${margin.values.angle!.toFixed(1)} deg, remanence ${margin.values.remanence!.toFixed(2)} T` +
    ` (${margin.evaluations} runs)`,
);
console.log(`A grid at the same resolution (0.5 deg x 0.01 T) would take ${721 * 161} runs.`);
console.log('\nCAUTION: engineering estimates from a model; local codes, standards and licensed practice govern.');
