import type { Waveform } from './waveform.js';
import { waveformError, type WaveformOwner, requireSpecKind } from './waveform-error.js';

/**
 * Plain-data description of a constant (DC) waveform.
 *
 * @example
 * ```ts
 * const dc: ConstantSpec = { kind: 'constant', value: 12 };
 * ```
 */
export interface ConstantSpec {
  readonly kind: 'constant';
  /** The value, V or A. */
  readonly value: number;
}

/**
 * A constant (DC) waveform spec.
 *
 * @example
 * ```ts
 * net.voltageSource('battery', plus, net.ground, constant(12));
 * ```
 */
export function constant(value: number): ConstantSpec {
  return { kind: 'constant', value };
}

/**
 * Compile a {@link ConstantSpec}; `owner` names the element in errors.
 *
 * @example
 * ```ts
 * constantWaveform(constant(12), 'battery').value(3); // 12
 * ```
 */
export function constantWaveform(spec: ConstantSpec, owner: WaveformOwner = 'waveform'): Waveform {
  requireSpecKind(spec, 'constant', 'constantWaveform', owner);
  if (!Number.isFinite(spec.value)) {
    throw waveformError(owner, `constant value ${spec.value} is not finite; give a finite number`);
  }
  const v = spec.value;
  return { value: () => v, breakpoints: () => [], nextBreakpoint: () => Infinity, piecewiseLinear: true };
}
