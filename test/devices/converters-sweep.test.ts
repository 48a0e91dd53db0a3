/**
 * Sweeps of converters (issue 12): a job whose network has diodes and a
 * gate-driven switch, swept over the gate's duty, on worker threads and in
 * process. Checked against the forward converter's reset closed forms
 * (Mohan, Undeland and Robbins, Power Electronics, ch. 10.4; from memory):
 * the peak flux density Vin D T / (N1 A) reached at the end of the on-time
 * from a reset core, and the switch clamped at 2 Vin + Vf by the reset
 * winding of equal turns. Circuit values are test values of our own.
 */
import { describe, expect, it } from 'vitest';
import { demoMaterials } from '../../src/index.js';
import { parseSweepJob, runSweep, type SweepJob } from '../../src/sweep/index.js';
import { forward } from './converters-circuits.js';

const P = {
  vin: 24, period: 10e-6, n1: 20, n3: 20, n2: 10, diodeForward: 0.7,
  material: demoMaterials.ferrite, area: 5e-5, length: 0.05, load: 200, duty: 0.3,
} as const;

function job(): SweepJob {
  const vo = 0.5 * 0.3 * 24 - 0.7;
  const model = forward({ ...P, initialOutput: { voltage: vo, current: vo / P.load } });
  return parseSweepJob(JSON.parse(JSON.stringify({
    format: 'fluxstate-sweep/1',
    name: 'forward converter duty',
    network: model.net.describe(),
    simulate: { stopTime: 3 * P.period, rtol: 1e-8 },
    parameters: { axes: [{ name: 'duty', target: { element: 'Q1', field: 'gate.duty' } }], grid: { duty: [0.2, 0.3, 0.45] } },
    outputs: [
      { name: 'peak B', quantity: 'fluxDensity', of: { tube: 'core' }, metric: 'peak' },
      { name: 'peak switch voltage', quantity: 'voltage', of: { element: 'Q1' }, metric: 'peak' },
    ],
  })));
}

describe('sweeps of a converter with diodes and a gate-driven switch', () => {
  it('sweeps the gate duty on workers and in process alike, each case against the closed forms', async () => {
    const j = job();
    const workers = await runSweep(j, { concurrency: 2 });
    const serial = await runSweep(j, { inProcess: true });
    expect(workers.counts.success).toBe(3);
    expect(serial.counts.success).toBe(3);
    for (const c of workers.cases) {
      const duty = c.parameters.duty as number;
      // Each period starts from a reset core (D < 0.5), so the peak is one on-time's volt-seconds.
      const peakB = (P.vin * duty * P.period) / (P.n1 * P.area);
      // Resistive drops of 10 mohm at under 0.3 A: < 1e-3 of Vin.
      expect(Math.abs((c.outputs['peak B'] as number) / peakB - 1)).toBeLessThan(1e-3);
      expect(Math.abs((c.outputs['peak switch voltage'] as number) / (2 * P.vin + P.diodeForward) - 1)).toBeLessThan(1e-3);
      const same = serial.cases.find((s) => s.index === c.index)!;
      expect(same.outputs['peak B']).toBe(c.outputs['peak B']);
    }
  });
});
