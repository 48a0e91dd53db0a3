// Scenario: flux walk in a push-pull style converter transformer (our own invented design).
// The primary is driven by a bipolar square wave whose positive on-time is slightly longer
// than its negative one (a duty mismatch). The small DC voltage that results is integrated by
// the core: the flux walks away from zero until the magnetising current times the winding
// resistance balances it, here well into saturation. Results are an engineering estimate.
import {
  addCoreLayout, bipolarSquare, createNetwork, cycleMeans, demoMaterials, eCoreLayout, mm, simulate,
  type SimulationResult,
} from '../../src/index.js';
import { resultReport } from '../../src/report/index.js';
import { formatTable, sig, type ScenarioOutcome, type ScenarioProgress } from './scenario.js';

export const SWITCHING_FREQUENCY = 50e3; // Hz
const PERIOD = 1 / SWITCHING_FREQUENCY;
const AMPLITUDE = 24; // V
const DEAD_TIME = 0.3e-6; // s

/** The converter transformer on a ferrite E core; `mismatch` = positive minus negative on-time, s. */
export function pushPullTransformer(mismatch: number) {
  const layout = eCoreLayout({
    centreLegWidth: mm(12), outerLegWidth: mm(6), yokeHeight: mm(6), depth: mm(12),
    windowWidth: mm(9), windowHeight: mm(22),
    windings: { centre: { innerBuild: mm(3), outerBuild: mm(3), spacing: mm(0.5), clearance: mm(1) } },
  });
  const net = createNetwork('push-pull transformer');
  const core = addCoreLayout(net, layout, { material: demoMaterials.ferrite });
  const drive = net.node('drive');
  const out = net.node('out');
  const source = net.voltageSource('bridge', drive, net.ground, bipolarSquare({ amplitude: AMPLITUDE, period: PERIOD, deadTime: DEAD_TIME, mismatch }));
  // 6 turns: volt-seconds per half cycle 24 V * 9.7 us = 233 uVs, swing 2 * 0.2 T over 144 mm^2.
  const primary = net.winding('primary', { tube: core.windingTube('centre'), turns: 6, resistance: 0.015, plus: drive, minus: net.ground });
  const secondary = net.winding('secondary', { tube: core.outerWindingTube('centre'), turns: 3, resistance: 0.008, plus: out, minus: net.ground });
  net.resistor('load', out, net.ground, 1.5);
  return { net, core, source, primary, secondary };
}

export function runPushPullWalk(progress: ScenarioProgress = () => {}): ScenarioOutcome {
  const cycles = 400;
  const mismatches = [0, 20e-9, 50e-9];
  const bSat = demoMaterials.ferrite.saturationFluxDensity!;
  const rows: string[][] = [];
  let shown: { result: SimulationResult; model: ReturnType<typeof pushPullTransformer> } | undefined;
  mismatches.forEach((m, k) => {
    progress(k / mismatches.length, `duty mismatch ${m * 1e9} ns`);
    const model = pushPullTransformer(m);
    const result = simulate(model.net, {
      stopTime: cycles * PERIOD, rtol: 1e-5,
      onProgress: (p) => progress((k + p.fraction) / mismatches.length, `duty mismatch ${m * 1e9} ns`),
    });
    const b = result.fluxDensity(model.core.windingTube('centre'));
    const means = cycleMeans(result.time, b, { period: PERIOD }).means;
    const peakB = b.reduce((x, v) => Math.max(x, Math.abs(v)), 0);
    const i = result.current(model.primary);
    const peakI = i.reduce((x, v) => Math.max(x, Math.abs(v)), 0);
    rows.push([
      sig(m * 1e9), sig(means[9] ?? NaN), sig(means[99] ?? NaN), sig(means[means.length - 1] ?? NaN), sig(peakB), sig(bSat - peakB),
      sig(peakI), `${result.stats.acceptedSteps}`, result.status,
    ]);
    if (m === mismatches[mismatches.length - 1]) shown = { result, model };
  });
  progress(1, 'done');
  const { result, model } = shown!;
  const report = resultReport(result, {
    title: 'Flux walk in a push-pull converter transformer',
    subtitle: `Bipolar drive ${AMPLITUDE} V, ${SWITCHING_FREQUENCY / 1e3} kHz, positive on-time ${mismatches[mismatches.length - 1]! * 1e9} ns longer (invented design)`,
    description:
      'A small DC component of the drive (from the on-time mismatch) is integrated by the core: the mean flux density ' +
      'walks away from zero until the magnetising current times the primary resistance balances the DC voltage.',
    metrics: [{
      title: 'Study (all mismatches)',
      rows: rows.map((r) => ({ name: `mismatch ${r[0]} ns`, value: Number(r[3]), unit: 'T', note: `mean B of the last cycle; peak |B| ${r[4]} T` })),
    }],
    plots: [
      { title: 'Flux density, centre leg', series: [{ quantity: 'fluxDensity', handle: model.core.windingTube('centre'), label: 'centre leg' }] },
      { title: 'Primary current', series: [{ quantity: 'current', handle: model.primary, label: 'primary' }] },
    ],
  });
  return {
    slug: 'push-pull-walk',
    title: `Flux walk in a push-pull transformer (${cycles} cycles at ${SWITCHING_FREQUENCY / 1e3} kHz, invented design)`,
    table: {
      head: ['mismatch ns', 'mean B cyc10 T', 'mean B cyc100 T', 'mean B last T', 'peak|B| T', 'margin T', 'peak i A', 'steps', 'status'],
      rows,
    },
    notes: [
      `Demo ferrite B_sat ${bSat} T. A negative margin means the core saturates in that case.`,
      'Engineering estimate: verify against measurements before relying on it.',
    ],
    report,
    csv: { 'push-pull-walk': result.toCSV() },
  };
}
