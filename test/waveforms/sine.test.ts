import { describe, expect, it } from 'vitest';
import { compileWaveform, sine, InputError } from '../../src/index.js';

describe('sine waveform', () => {
  it('is zero before its start and offset + A sin(w (t - start) + phase) after, with a breakpoint at start', () => {
    const w = compileWaveform(sine({ amplitude: 10, frequency: 50, phase: 0.3, offset: 1, start: 0.002 }), 'V1');
    expect(w.value(0.001)).toBe(0);
    const t = 0.0123;
    expect(w.value(t)).toBeCloseTo(1 + 10 * Math.sin(2 * Math.PI * 50 * (t - 0.002) + 0.3), 12);
    expect(w.breakpoints(0, 1)).toEqual([0.002]);
    expect(w.breakpoints(0.003, 1)).toEqual([]);
  });

  it('rejects a zero frequency, naming the source', () => {
    expect(() => compileWaveform(sine({ amplitude: 1, frequency: 0 }), 'mains')).toThrow(InputError);
    expect(() => compileWaveform(sine({ amplitude: 1, frequency: 0 }), 'mains')).toThrow(/mains/);
  });
});
