import type { Waveform } from './waveform.js';
import { waveformError, type WaveformOwner, notASpecMessage } from './waveform-error.js';
import { constantWaveform, type ConstantSpec } from './constant.js';
import { sineWaveform, type SineSpec } from './sine.js';
import { pulseWaveform, type PulseSpec } from './pulse.js';
import { bipolarSquareWaveform, type BipolarSquareSpec } from './bipolar-square.js';
import { piecewiseLinearWaveform, type PiecewiseLinearSpec } from './piecewise-linear.js';
import { userFunctionWaveform, type UserFunctionSpec } from './user-function.js';

/**
 * Plain-data description of a source waveform. Every kind is
 * JSON-serialisable except a {@link UserFunctionSpec} that carries its `fn`
 * (use its `module` + `export` form to cross a process boundary).
 *
 * @example
 * ```ts
 * const specs: WaveformSpec[] = [constant(5), sine({ amplitude: 1, frequency: 50 }), pulse({ high: 1, period: 1e-3, duty: 0.5 })];
 * const json = JSON.stringify(specs[2]); // plain data: save it, send it to a worker
 * ```
 */
export type WaveformSpec = ConstantSpec | SineSpec | PulseSpec | BipolarSquareSpec | PiecewiseLinearSpec | UserFunctionSpec;

/**
 * Turn a waveform spec into an executable {@link Waveform}, validating it.
 * `owner` (the source's name) is used in error messages. A by-reference
 * function spec must be resolved first ({@link resolveFunctionWaveform}).
 *
 * @example
 * ```ts
 * const w = compileWaveform({ kind: 'constant', value: 5 }, 'bias supply');
 * ```
 */
export function compileWaveform(spec: WaveformSpec, owner: WaveformOwner = 'waveform'): Waveform {
  if (spec === null || typeof spec !== 'object') {
    throw waveformError(owner, `${String(spec)} is not a waveform spec; build one with constant(), sine(), pulse()...`);
  }
  switch (spec.kind) {
    case 'constant':
      return constantWaveform(spec, owner);
    case 'sine':
      return sineWaveform(spec, owner);
    case 'pulse':
      return pulseWaveform(spec, owner);
    case 'bipolar-square':
      return bipolarSquareWaveform(spec, owner);
    case 'piecewise-linear':
      return piecewiseLinearWaveform(spec, owner);
    case 'function':
      return userFunctionWaveform(spec, owner);
    default:
      throw waveformError(owner, notASpecMessage(spec));
  }
}
