import type { Waveform } from './waveform.js';
import { requireFinite, waveformError, type WaveformOwner, requireSpecKind } from './waveform-error.js';
import { vertexWaveform } from './vertex-waveform.js';

/**
 * Plain-data description of a periodic pulse train (gate drive, PWM
 * voltage). Timing of one period, starting at `delay`:
 *
 * ```text
 *            rise                fall
 *           |<-->|              |<-->|
 *  high          +--------------+                         +----
 *               /                \                       /
 *  low  -------+                  +---------------------+
 *              ^ delay            ^ delay + duty*period ^ delay + period
 *              |<-- duty*period ->|
 *              |<---------------- period -------------->|
 * ```
 *
 * - the rising edge starts at `delay + k*period` and lasts `rise`;
 * - the falling edge starts `duty*period` after the rising edge started and
 *   lasts `fall`; so `duty` is measured from the start of one edge to the
 *   start of the other, and equal `rise` and `fall` keep the mean at
 *   `low + duty*(high - low)`;
 * - before `delay` the value is `low`;
 * - the value at an edge instant is the value after the edge (right-continuous).
 *
 * Constraints: `period > 0`, `0 <= duty <= 1`, `rise, fall >= 0`,
 * `rise <= duty*period`, `duty*period + fall <= period`.
 *
 * @example
 * ```ts
 * const gate: PulseSpec = { kind: 'pulse', low: 0, high: 15, period: 50e-6, duty: 0.3 };
 * ```
 */
export interface PulseSpec {
  readonly kind: 'pulse';
  /** Level between pulses, V or A. Default 0. */
  readonly low?: number;
  /** Level during a pulse, V or A. */
  readonly high: number;
  /** Period, s (> 0). */
  readonly period: number;
  /** Fraction of the period from the start of the rising edge to the start of the falling edge, in [0, 1]. */
  readonly duty: number;
  /** Start of the first rising edge, s. Default 0. */
  readonly delay?: number;
  /** Duration of the rising edge, s. Default 0 (a jump). */
  readonly rise?: number;
  /** Duration of the falling edge, s. Default 0 (a jump). */
  readonly fall?: number;
}

/**
 * A pulse train spec.
 *
 * @example
 * ```ts
 * // 0/15 V gate drive, 20 kHz, 30 % duty, first pulse at 10 us
 * const gate = pulse({ low: 0, high: 15, period: 50e-6, duty: 0.3, delay: 10e-6 });
 * compileWaveform(gate, 'gate drive').value(20e-6); // 15
 * ```
 */
export function pulse(params: Omit<PulseSpec, 'kind'>): PulseSpec {
  return { kind: 'pulse', ...params };
}

/**
 * Compile a {@link PulseSpec}; `owner` names the element in errors.
 * Breakpoints: every edge start and end inside the queried window, computed
 * from the period index (no scan from t = 0).
 *
 * @example
 * ```ts
 * const w = pulseWaveform(pulse({ high: 1, period: 1e-3, duty: 0.5 }), 'gate drive');
 * w.breakpoints(0, 2e-3); // [0, 0.0005, 0.001, 0.0015, 0.002]
 * ```
 */
export function pulseWaveform(spec: PulseSpec, owner: WaveformOwner = 'waveform'): Waveform {
  requireSpecKind(spec, 'pulse', 'pulseWaveform', owner);
  const low = spec.low ?? 0;
  const { high, period, duty } = spec;
  const delay = spec.delay ?? 0;
  const rise = spec.rise ?? 0;
  const fall = spec.fall ?? 0;
  requireFinite(owner, 'pulse low level', low);
  requireFinite(owner, 'pulse high level', high);
  requireFinite(owner, 'pulse delay', delay);
  requireFinite(owner, 'pulse period', period);
  requireFinite(owner, 'pulse duty', duty);
  requireFinite(owner, 'pulse rise time', rise);
  requireFinite(owner, 'pulse fall time', fall);
  if (period <= 0) throw waveformError(owner, `pulse period ${period} s must be > 0`);
  if (duty < 0 || duty > 1) throw waveformError(owner, `pulse duty ${duty} is outside [0, 1]; give a fraction of the period`);
  if (rise < 0) throw waveformError(owner, `pulse rise time ${rise} s is negative; give rise >= 0`);
  if (fall < 0) throw waveformError(owner, `pulse fall time ${fall} s is negative; give fall >= 0`);
  const onTime = duty * period;
  if (rise > onTime) {
    throw waveformError(owner, `pulse rise time ${rise} s is longer than duty*period = ${onTime} s; shorten the rise or raise the duty`);
  }
  if (onTime + fall > period) {
    throw waveformError(
      owner,
      `pulse fall time ${fall} s does not fit after duty*period = ${onTime} s in the period ${period} s; shorten the fall or lower the duty`,
    );
  }
  const d = delay;
  return vertexWaveform({
    times: Float64Array.of(d, d + rise, d + onTime, d + onTime + fall, d + period),
    values: Float64Array.of(low, high, high, low, low),
    period,
    before: low,
  });
}
