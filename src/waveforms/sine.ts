import type { Waveform } from './waveform.js';
import { waveformError, type WaveformOwner, requireSpecKind } from './waveform-error.js';

/**
 * Plain-data description of a sine wave switched on at `start`:
 * v(t) = offset + amplitude * sin(2 pi frequency (t - start) + phase) for
 * t >= start, and 0 before (the source is not yet connected).
 *
 * @example
 * ```ts
 * const mains: SineSpec = { kind: 'sine', amplitude: 325, frequency: 50, phase: Math.PI / 2 };
 * ```
 */
export interface SineSpec {
  readonly kind: 'sine';
  /** Peak value, V or A. */
  readonly amplitude: number;
  /** Frequency in Hz (> 0). */
  readonly frequency: number;
  /** Phase at the switching instant, rad. 0 = switched at a rising voltage zero. Default 0. */
  readonly phase?: number;
  /** Constant added to the sine, V or A. Default 0. */
  readonly offset?: number;
  /** Switching instant, s. Default 0. */
  readonly start?: number;
}

/**
 * A sine wave spec.
 *
 * @example
 * ```ts
 * // 230 V rms mains switched on at the voltage peak (phase pi/2)
 * sine({ amplitude: 230 * Math.SQRT2, frequency: 50, phase: Math.PI / 2 });
 * ```
 */
export function sine(params: Omit<SineSpec, 'kind'>): SineSpec {
  return { kind: 'sine', ...params };
}

/**
 * Compile a {@link SineSpec}; `owner` names the element in errors.
 *
 * @example
 * ```ts
 * sineWaveform(sine({ amplitude: 10, frequency: 50 }), 'mains').value(0.005); // 10
 * ```
 */
export function sineWaveform(spec: SineSpec, owner: WaveformOwner = 'waveform'): Waveform {
  requireSpecKind(spec, 'sine', 'sineWaveform', owner);
  const { amplitude, frequency } = spec;
  const phase = spec.phase ?? 0;
  const offset = spec.offset ?? 0;
  const start = spec.start ?? 0;
  for (const [label, v] of [['amplitude', amplitude], ['phase', phase], ['offset', offset], ['start', start]] as const) {
    if (!Number.isFinite(v)) {
      throw waveformError(owner, `sine ${label} ${v} is not finite; give a finite number`);
    }
  }
  if (!Number.isFinite(frequency) || frequency <= 0) {
    throw waveformError(owner, `sine frequency ${frequency} Hz must be positive and finite`);
  }
  const omega = 2 * Math.PI * frequency;
  return {
    value: (t) => (t < start ? 0 : offset + amplitude * Math.sin(omega * (t - start) + phase)),
    breakpoints: (t0, t1) => (start >= t0 && start <= t1 ? [start] : []),
    nextBreakpoint: (after) => (start > after ? start : Infinity),
  };
}
