// Scenario: a three-leg (E type, shell) core of grain-oriented steel with the excitation on the
// centre leg and a winding with its own resistive load on each outer leg (our own invented
// design). The centre flux divides between the outer legs according to the loads, not equally;
// the outer voltages add up to the centre's. Results are an engineering estimate.
import { addCoreLayout, createNetwork, demoMaterials, eCoreLayout, mm, seriesRms, sine, simulate } from '../../src/index.js';
import { resultReport } from '../../src/report/index.js';
import { formatTable, sig, type ScenarioOutcome, type ScenarioProgress } from './scenario.js';

const F = 50;
const PERIOD = 1 / F;

export function threeLegCore(loads: { left: number; right: number }) {
  const layout = eCoreLayout({
    centreLegWidth: mm(40), outerLegWidth: mm(20), yokeHeight: mm(20), depth: mm(40), stackingFactor: 0.96,
    windowWidth: mm(25), windowHeight: mm(70),
  });
  const net = createNetwork('three-leg core');
  const core = addCoreLayout(net, layout, { material: demoMaterials.grainOrientedSteel });
  const s = net.node('supply');
  const a = net.node('left out');
  const b = net.node('right out');
  const supply = net.voltageSource('supply', s, net.ground, sine({ amplitude: 80 * Math.SQRT2, frequency: F, phase: Math.PI / 2 }));
  // Equal turns on all legs; the outer windings are oriented so their MMF opposes the centre's around each window.
  const centre = net.winding('centre winding', { tube: core.windingTube('centre'), turns: 220, resistance: 0.6, plus: s, minus: net.ground });
  const left = net.winding('left winding', { tube: core.windingTube('left'), turns: 220, resistance: 0.6, plus: a, minus: net.ground, orientation: -1 });
  const right = net.winding('right winding', { tube: core.windingTube('right'), turns: 220, resistance: 0.6, plus: b, minus: net.ground, orientation: -1 });
  const loadL = net.resistor('left load', a, net.ground, loads.left);
  const loadR = net.resistor('right load', b, net.ground, loads.right);
  return { net, core, supply, centre, left, right, loadL, loadR };
}

export function runThreeLegLoads(progress: ScenarioProgress = () => {}): ScenarioOutcome {
  progress(0, 'three-leg core, loads 20 ohm and 60 ohm');
  const model = threeLegCore({ left: 20, right: 60 });
  const cycles = 6;
  const result = simulate(model.net, { stopTime: cycles * PERIOD, rtol: 1e-7, sampling: { interval: PERIOD / 200 } });
  progress(1, 'done');
  const from = (cycles - 1) * PERIOD;
  const rms = (x: Float64Array) => seriesRms(result.time, x, { from });
  const legs = ['centre', 'left', 'right'] as const;
  const windings = { centre: model.centre, left: model.left, right: model.right };
  const rows = legs.map((leg) => {
    const b = result.fluxDensity(model.core.windingTube(leg));
    const peakB = b.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
    return [leg, sig(peakB), sig(rms(result.voltage(windings[leg]))), sig(rms(result.current(windings[leg])))];
  });
  const vl = rms(result.voltage(model.left));
  const vr = rms(result.voltage(model.right));
  // Instantaneous check: the outer EMFs add up to the centre EMF (flux conservation at the yokes).
  const ec = result.emf(model.centre);
  const el = result.emf(model.left);
  const er = result.emf(model.right);
  let worst = 0;
  let scale = 0;
  for (let k = 0; k < ec.length; k++) {
    worst = Math.max(worst, Math.abs(ec[k]! - el[k]! - er[k]!));
    scale = Math.max(scale, Math.abs(ec[k]!));
  }
  const report = resultReport(result, {
    title: 'Three-leg core with unequal loads',
    subtitle: 'Centre-leg excitation 80 V rms, outer legs loaded with 20 ohm and 60 ohm (invented design)',
    description:
      'The centre flux divides between the outer legs in the ratio of the loads; the outer winding voltages add up to ' +
      'the centre voltage (less the drops in the windings).',
    plots: [
      { title: 'Flux density per leg', series: legs.map((leg) => ({ quantity: 'fluxDensity' as const, handle: model.core.windingTube(leg), label: `${leg} leg` })) },
      { title: 'Winding voltages', series: legs.map((leg) => ({ quantity: 'voltage' as const, handle: windings[leg], label: `${leg} winding` })) },
      { title: 'Winding currents', series: legs.map((leg) => ({ quantity: 'current' as const, handle: windings[leg], label: `${leg} winding` })) },
    ],
  });
  return {
    slug: 'three-leg-loads',
    title: 'Three-leg core, centre excitation, unequal outer loads (invented design)',
    table: { head: ['leg', 'peak|B| T', 'V rms (last cycle)', 'I rms A (last cycle)'], rows },
    notes: [
      `Outer winding voltages ${sig(vl)} V and ${sig(vr)} V rms (ratio ${sig(vr / vl)}; the loads are in the ratio 3: ` +
        'equal currents, as the MMF balance around each window demands).',
      `Largest |e_centre - e_left - e_right| ${sig(worst)} V against a peak EMF of ${sig(scale)} V (flux conservation: the outer EMFs ` +
        'add up to the centre EMF; all legs point upwards and the outer windings are wound against them).',
      'Engineering estimate: verify against measurements before relying on it.',
    ],
    report,
    csv: { 'three-leg-loads': result.toCSV() },
  };
}
