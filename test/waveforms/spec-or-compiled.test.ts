import { describe, expect, it } from 'vitest';
import { createNetwork, compileWaveform, pulse, pulseWaveform, sine, sineWaveform, type WaveformSpec } from '../../src/index.js';

// The pairs sine / sineWaveform (spec and compiled form) are easy to mix up; the errors say which call was meant.

describe('waveform spec helpers and their compilers cannot be confused silently', () => {
  it('a compiled waveform given to a source is refused, naming the spec helpers', () => {
    const net = createNetwork('mix-up');
    const line = net.node('line');
    const compiled = sineWaveform(sine({ amplitude: 325, frequency: 50 }), 'mains') as unknown as WaveformSpec;
    expect(() => net.voltageSource('mains', line, net.ground, compiled)).toThrow(/compiled waveform .* use sine\(\{ \.\.\. \}\), pulse\(\{ \.\.\. \}\)/);
    expect(() => compileWaveform(compiled, 'mains')).toThrow(expect.objectContaining({ code: 'bad-waveform' }));
  });

  it("parameters without the helper call are refused with the helper to write (was: waveform kind undefined)", () => {
    const bare = { amplitude: 325, frequency: 50 } as unknown as WaveformSpec;
    expect(() => compileWaveform(bare, 'mains')).toThrow(/^mains: the spec has no kind: were the parameters passed without the helper\? write sine\(\{ \.\.\. \}\) around them/);
    expect(() => sineWaveform(bare as never, 'mains')).toThrow(/sineWaveform\(\) compiles a spec made by sine\(\) .* call sineWaveform\(sine\(\{ \.\.\. \}\)\)/);
  });

  it('a spec of another kind in a ...Waveform compiler names the right compiler', () => {
    expect(() => sineWaveform(pulse({ low: 0, high: 1, period: 1e-3, duty: 0.5 }) as never, 'gate')).toThrow(
      /this spec is a 'pulse': compile it with compileWaveform\(spec\) or pulseWaveform\(spec\)/,
    );
    expect(pulseWaveform(pulse({ low: 0, high: 1, period: 1e-3, duty: 0.5 })).value(1e-4)).toBe(1);
  });
});
