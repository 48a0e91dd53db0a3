/**
 * Harmonics of a transformer's magnetising current at no load, without and
 * with a DC bias current in a second winding (as a DC-bias or geomagnetic
 * study would ask): a saturating core draws odd harmonics; a DC bias adds
 * even ones.
 *
 *     npx tsx examples/harmonics.ts
 *
 * An invented 230 V transformer on the demo steel; it describes no real
 * product. Caution: estimates from a model and its inputs; measure before
 * relying on them.
 */
import { constant, createNetwork, demoMaterials, harmonics, mm, mm2, periodicSteadyState, sine } from '../src/index.js';

const FREQUENCY = 50;
const PERIOD = 1 / FREQUENCY;

function noLoad(dcBias: number) {
  const net = createNetwork(`no-load test, ${dcBias} A DC`);
  const bottom = net.magneticNode('bottom');
  const top = net.magneticNode('top');
  const steel = demoMaterials.grainOrientedSteel;
  const leg = net.fluxTube('wound leg', { from: bottom, to: top, length: mm(150), area: mm2(900), material: steel });
  net.fluxTube('rest of core', { from: top, to: bottom, length: mm(350), area: mm2(900), material: steel });
  const line = net.node('line');
  // Switched on at the voltage peak: no DC flux offset from switching.
  net.voltageSource('mains', line, net.ground, sine({ amplitude: 250 * Math.SQRT2, frequency: FREQUENCY, phase: Math.PI / 2 }));
  const primary = net.winding('primary', { tube: leg, turns: 820, resistance: 2.5, plus: line, minus: net.ground });
  // A 20-turn bias winding fed by an ideal DC current source (its flux is free: the source sets the current).
  const biasNode = net.node('bias');
  net.currentSource('dc bias', biasNode, net.ground, constant(dcBias));
  net.winding('bias winding', { tube: leg, turns: 20, plus: biasNode, minus: net.ground });
  return { net, primary };
}

// The DC part of the primary current dies out with L/R of seconds: the periodic steady state (shooting) gives
// the settled cycle directly.
console.log('Magnetising current of the primary in periodic steady state (rms per harmonic order)');
console.log('  DC bias      total     h1       h2       h3       h4       h5       h7     THD');
for (const bias of [0, 0.25, 1]) {
  const { net, primary } = noLoad(bias);
  const steady = periodicSteadyState(net, { period: PERIOD, samplesPerPeriod: 2000 });
  if (steady.status !== 'converged') throw new Error(steady.message);
  const { result } = steady;
  const h = harmonics(result.time, result.current(primary), { fundamental: FREQUENCY, cycles: 1, count: 9, name: 'primary current' });
  const mA = (x: number) => `${(x * 1e3).toFixed(2)}`.padStart(7);
  console.log(
    `${`${bias} A`.padStart(8)}  ${mA(h.totalRms)}  ${[1, 2, 3, 4, 5, 7].map((k) => mA(h.rms[k]!)).join('  ')}  ${(100 * h.thd).toFixed(0).padStart(4)} %   (mA; DC ${mA(Math.abs(h.dc) < 5e-6 ? 0 : h.dc)} mA)`,
  );
}
console.log('\nCaution: model estimates from invented data; standards and measurements govern real DC-bias limits.');
