import { describe, expect, it } from 'vitest';
import { createNetwork, demoMaterials, mm, mm2, simulate, sine } from '../../src/index.js';
import { resultReport } from '../../src/report/index.js';

// What an engineer reads first in a result's report: the status in the API's words, time in a unit that fits the
// run, reference lines whose legend does not repeat the value, smooth curves between solver steps, and the
// sanity warnings of a model with a unit slip.

function transformer(length = mm(150), area = mm2(900)) {
  const net = createNetwork('first transformer');
  const bottom = net.magneticNode('bottom');
  const top = net.magneticNode('top');
  const steel = demoMaterials.grainOrientedSteel;
  const leg = net.fluxTube('wound leg', { from: bottom, to: top, length, area, material: steel });
  net.fluxTube('rest of core', { from: top, to: bottom, length: 2 * length, area, material: steel });
  const line = net.node('line');
  net.voltageSource('mains', line, net.ground, sine({ amplitude: 325, frequency: 50, phase: Math.PI / 2 }));
  const primary = net.winding('primary', { tube: leg, turns: 820, resistance: 2.5, plus: line, minus: net.ground });
  return { net, leg, primary };
}

const info = (data: ReturnType<typeof resultReport>, label: string) => data.info?.find((i) => i.label.startsWith(label))?.value;

describe('resultReport', () => {
  it("says 'success' as the API does, and gives time in ms for a mains run and in us for a fast one", () => {
    const { net } = transformer();
    const slow = resultReport(simulate(net, { stopTime: 0.04 }), { title: 'mains' });
    expect(info(slow, 'Status')).toBe('success');
    expect(info(slow, 'Simulated time')).toBe('0 ms to 40 ms');
    const plot = slow.sections[0]!.plots![0]!;
    expect(plot.xUnit).toBe('ms');
    expect(plot.series[0]!.t[plot.series[0]!.t.length - 1]).toBeCloseTo(40, 9);
    const fast = resultReport(simulate(net, { stopTime: 5e-4 }), { title: 'fast' });
    expect(fast.sections[0]!.plots![0]!.xUnit).toBe('\u00B5s');
    expect(info(fast, 'Simulated time')).toBe('0 \u00B5s to 500 \u00B5s');
  });

  it('labels the saturation lines without their value (the page adds "= 1.97 T")', () => {
    const { net } = transformer();
    const data = resultReport(simulate(net, { stopTime: 0.02 }), { title: 'x' });
    expect(data.sections[0]!.plots![0]!.references!.map((r) => r.label)).toEqual(['+B_sat', '-B_sat']);
  });

  it('draws the dense output between samples: the plotted crest is within 1e-4 of the true peak, samples alone are not', () => {
    const { net, leg } = transformer();
    const r = simulate(net, { stopTime: 0.02 });
    const data = resultReport(r, { title: 'x', plots: [{ title: 'B', series: [{ quantity: 'fluxDensity', handle: leg }] }] });
    const s = data.sections[0]!.plots![0]!.series[0]!;
    expect(s.t.length).toBe(r.length + 4 * (r.length - 1 - countRepeats(r.time)));
    // The true crest, from the dense output refined by golden-section search (seriesPeak with `at`).
    const b = r.fluxDensity(leg);
    const at = r.evaluator({ quantity: 'fluxDensity', handle: leg });
    let best = 0;
    for (let k = 0; k < 20000; k++) best = Math.max(best, Math.abs(at((0.02 * k) / 19999)));
    const drawn = Math.max(...Array.from(s.values, Math.abs));
    const sampled = Math.max(...Array.from(b, Math.abs));
    expect(best - drawn).toBeLessThan(1e-4 * best);
    expect(drawn).toBeGreaterThanOrEqual(sampled);
    const straight = resultReport(r, { title: 'x', pointsPerStep: 0, plots: [{ title: 'B', series: [{ quantity: 'fluxDensity', handle: leg }] }] });
    expect(straight.sections[0]!.plots![0]!.series[0]!.t.length).toBe(r.length);
  });

  it('lists waveform parameters in the network listing with 4 significant digits and their units', () => {
    const { net } = transformer();
    const data = resultReport(simulate(net, { stopTime: 0.02 }), { title: 'x' });
    const mains = data.sections[2]!.network!.rows.find((r) => r.element === 'mains')!;
    expect(mains.parameters[0]!.value).toBe('sine (amplitude 325 V, frequency 50 Hz, phase 1.571 rad)');
  });

  it('lists the sanity warnings of a core given in metres instead of millimetres', () => {
    const { net } = transformer(150, 900);
    const data = resultReport(simulate(net, { stopTime: 0.02 }), { title: 'slip' });
    expect(info(data, 'Warnings')).toMatch(/tube "wound leg": magnetic path length 150 m is longer than 10 m; was it given in millimetres\? write mm\(150\)/);
  });
});

function countRepeats(t: Float64Array): number {
  let n = 0;
  for (let i = 1; i < t.length; i++) if (!(t[i]! > t[i - 1]!)) n++;
  return n;
}
