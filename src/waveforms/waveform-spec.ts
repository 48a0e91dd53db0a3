import type { Waveform } from './waveform.js';
import { constantWaveform, type ConstantSpec } from './constant.js';
import { sineWaveform, type SineSpec } from './sine.js';

/** Plain-data (JSON-serialisable) description of a source waveform. */
export type WaveformSpec = ConstantSpec | SineSpec;

/**
 * Turn a waveform spec into an executable {@link Waveform}, validating it.
 * `owner` (the source's name) is used in error messages.
 *
 * @example
 * ```ts
 * const w = compileWaveform({ kind: 'constant', value: 5 }, 'V1');
 * ```
 */
export function compileWaveform(spec: WaveformSpec, owner = 'waveform'): Waveform {
  switch (spec.kind) {
    case 'constant':
      return constantWaveform(spec, owner);
    case 'sine':
      return sineWaveform(spec, owner);
  }
}
