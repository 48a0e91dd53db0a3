import { describe, expect, it } from 'vitest';
import { bipolarSquare, bipolarSquareOnTimes, compileWaveform, voltSecondsPerHalfCycle } from '../../../src/index.js';
import { jitteredGrid, sample } from './grids.js';

describe('voltSecondsPerHalfCycle', () => {
  it('gives A t_pos and -A t_neg per half-cycle of a bipolar square with dead time and mismatch (derived)', () => {
    const spec = bipolarSquare({ amplitude: 48, period: 10e-6, deadTime: 0.4e-6, mismatch: 0.15e-6, delay: 2e-6 });
    const w = compileWaveform(spec, 'Vbridge');
    const { positive: tPos, negative: tNeg } = bipolarSquareOnTimes(spec);
    // sample as the solver does: land on every switching instant; record both sides of each jump
    const edges = w.breakpoints(0, 2e-6 + 6 * 10e-6);
    const t: number[] = [0];
    const v: number[] = [0];
    for (const e of edges) {
      t.push(e, e);
      v.push(w.value(e - 1e-12), w.value(e));
    }
    const vs = voltSecondsPerHalfCycle(t, v, { period: 10e-6, start: 2e-6 });
    expect(vs.starts.length).toBe(6);
    for (let k = 0; k < 6; k++) {
      expect(vs.positive[k]).toBeCloseTo(48 * tPos, 15);
      expect(vs.negative[k]).toBeCloseTo(-48 * tNeg, 15);
      expect(vs.net[k]).toBeCloseTo(48 * 0.15e-6, 15);
    }
    // the same with the waveform as dense evaluator on a grid through the edges
    const grid = [0, ...edges];
    const viaAt = voltSecondsPerHalfCycle(grid, grid.map((s) => w.value(s)), { period: 10e-6, start: 2e-6, at: (s) => w.value(s) });
    expect(viaAt.positive[3]).toBeCloseTo(48 * tPos, 15);
    expect(viaAt.negative[3]).toBeCloseTo(-48 * tNeg, 15);
  });

  it('gives +-2A/w per half-cycle of a sine (derived) on a non-uniform grid', () => {
    const f = 400;
    const w = 2 * Math.PI * f;
    const t = jitteredGrid(0, 3 / f, 3000);
    const vs = voltSecondsPerHalfCycle(t, sample(t, (s) => 115 * Math.sin(w * s)), { period: 1 / f });
    for (let k = 0; k < 3; k++) {
      expect((vs.positive[k] ?? Number.NaN) / ((2 * 115) / w)).toBeCloseTo(1, 5);
      expect((vs.negative[k] ?? Number.NaN) / ((-2 * 115) / w)).toBeCloseTo(1, 5);
      expect(Math.abs(vs.net[k] ?? Number.NaN)).toBeLessThan(1e-5 * ((2 * 115) / w));
    }
  });
});
