import { describe, expect, it } from 'vitest';
import {
  bipolarSquare,
  compileWaveform,
  constant,
  piecewiseLinear,
  pulse,
  sine,
  userFunction,
  type WaveformSpec,
} from '../../src/index.js';

describe('compileWaveform', () => {
  it('compiles every kind of spec, and every plain-data kind survives a JSON round trip unchanged', () => {
    const specs: WaveformSpec[] = [
      constant(3),
      sine({ amplitude: 2, frequency: 50 }),
      pulse({ high: 1, period: 1e-3, duty: 0.5 }),
      bipolarSquare({ amplitude: 1, period: 1e-3, deadTime: 1e-5 }),
      piecewiseLinear({ times: [0, 1e-3], values: [0, 1] }),
    ];
    for (const spec of specs) {
      const w = compileWaveform(spec, 'src');
      const again = compileWaveform(JSON.parse(JSON.stringify(spec)) as WaveformSpec, 'src');
      for (const t of [0, 1.3e-4, 4.9e-4, 7.7e-4, 2.1e-3]) expect(again.value(t)).toBe(w.value(t));
      expect(again.breakpoints(0, 3e-3)).toEqual(w.breakpoints(0, 3e-3));
    }
    expect(compileWaveform(userFunction({ fn: (t) => t + 1 }), 'src').value(1)).toBe(2);
  });
});
