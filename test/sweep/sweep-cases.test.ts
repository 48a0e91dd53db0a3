import { describe, expect, it } from 'vitest';
import { sweepCase, sweepCaseCount, type SweepJob } from '../../src/sweep/index.js';
import { rlDescription } from './rl-network.js';

const axes = [
  { name: 'angle', target: { element: 'mains', field: 'waveform.phase' } },
  { name: 'resistance', target: [{ element: 'coil', field: 'resistance' }] },
] as const;

function job(parameters: SweepJob['parameters']): SweepJob {
  return { network: rlDescription(), simulate: { stopTime: 0.01 }, parameters, outputs: [] };
}

describe('sweepCase / sweepCaseCount', () => {
  it('orders a grid like nested loops, first axis slowest', () => {
    const j = job({ axes, grid: { angle: [0, 1], resistance: [1, 2, 3] } });
    expect(sweepCaseCount(j)).toBe(6);
    const cases = Array.from({ length: 6 }, (_, i) => sweepCase(j, i).parameters);
    expect(cases).toEqual([
      { angle: 0, resistance: 1 }, { angle: 0, resistance: 2 }, { angle: 0, resistance: 3 },
      { angle: 1, resistance: 1 }, { angle: 1, resistance: 2 }, { angle: 1, resistance: 3 },
    ]);
    expect(sweepCase(j, 4).edits).toEqual([
      { target: { element: 'mains', field: 'waveform.phase' }, value: 1 },
      { target: { element: 'coil', field: 'resistance' }, value: 2 },
    ]);
  });

  it('takes an explicit list in its order; no axes and an empty grid is the base network, one case', () => {
    const j = job({ axes, cases: [{ angle: 2, resistance: 5 }, { resistance: 1, angle: 0 }] });
    expect(sweepCaseCount(j)).toBe(2);
    expect(sweepCase(j, 1).parameters).toEqual({ angle: 0, resistance: 1 });
    const one = job({ axes: [], grid: {} });
    expect(sweepCaseCount(one)).toBe(1);
    expect(sweepCase(one, 0)).toEqual({ index: 0, parameters: {}, edits: [] });
    expect(() => sweepCase(one, 1)).toThrow(expect.objectContaining({ code: 'sweep-bad-option' }));
  });
});
