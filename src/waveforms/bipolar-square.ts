import type { Waveform } from './waveform.js';
import { requireFinite, waveformError, type WaveformOwner, requireSpecKind } from './waveform-error.js';
import { vertexWaveform } from './vertex-waveform.js';

/**
 * Plain-data description of a bipolar square wave with dead time, the
 * voltage a push-pull or bridge drive puts across a transformer winding.
 * One period, starting at `delay` (T = period):
 *
 * ```text
 *          |<- t_pos ->|           |<- t_neg ->|
 *   +A     +-----------+                                   +----
 *          |           |                                   |
 *    0 ----+           +-----------+           +-----------+
 *                                  |           |
 *   -A                             +-----------+
 *          ^ delay                 ^ delay + T/2           ^ delay + T
 *          |<-------- T/2 -------->|<-------- T/2 -------->|
 * ```
 *
 * - each half-period starts with its conduction interval and ends with its
 *   dead time: `+A` on `[delay + kT, delay + kT + t_pos)`, `0` until
 *   `delay + kT + T/2`, `-A` on `[delay + kT + T/2, delay + kT + T/2 + t_neg)`,
 *   `0` until the next period;
 * - `t_pos = T/2 - deadTime + mismatch/2`, `t_neg = T/2 - deadTime - mismatch/2`,
 *   so `mismatch = t_pos - t_neg` models a duty mismatch between the two
 *   switch pairs: it leaves a net volt-second `A * mismatch` per period
 *   (mean `A * mismatch / T`), the cause of flux walk;
 * - before `delay` the value is 0; at an edge instant the value is the value
 *   after the edge (right-continuous).
 *
 * Constraints: `period > 0`, `0 <= deadTime < T/2`, and both on-times within
 * `[0, T/2]`, i.e. `|mismatch| / 2 <= deadTime` and `|mismatch| / 2 <= T/2 - deadTime`.
 *
 * @example
 * ```ts
 * const drive: BipolarSquareSpec = { kind: 'bipolar-square', amplitude: 48, period: 10e-6, deadTime: 200e-9 };
 * ```
 */
export interface BipolarSquareSpec {
  readonly kind: 'bipolar-square';
  /** Level A during conduction, V (the wave takes +A and -A). */
  readonly amplitude: number;
  /** Period T, s (> 0). */
  readonly period: number;
  /** Dead time at the end of each half-period, s. Default 0. */
  readonly deadTime?: number;
  /** On-time difference t_pos - t_neg, s. Default 0 (balanced). */
  readonly mismatch?: number;
  /** Start of the first positive conduction interval, s. Default 0. */
  readonly delay?: number;
}

/**
 * A bipolar square wave spec (push-pull / bridge drive with dead time).
 *
 * @example
 * ```ts
 * // 48 V bridge at 100 kHz, 200 ns dead time, positive half 20 ns longer
 * const drive = bipolarSquare({ amplitude: 48, period: 10e-6, deadTime: 200e-9, mismatch: 20e-9 });
 * ```
 */
export function bipolarSquare(params: Omit<BipolarSquareSpec, 'kind'>): BipolarSquareSpec {
  return { kind: 'bipolar-square', ...params };
}

/**
 * The two conduction times of a {@link BipolarSquareSpec}, s (no validation).
 *
 * @example
 * ```ts
 * bipolarSquareOnTimes(bipolarSquare({ amplitude: 1, period: 2, deadTime: 0.1, mismatch: 0.02 }));
 * // { positive: 0.91, negative: 0.89 }
 * ```
 */
export function bipolarSquareOnTimes(spec: BipolarSquareSpec): { positive: number; negative: number } {
  const half = spec.period / 2;
  const dead = spec.deadTime ?? 0;
  const m = spec.mismatch ?? 0;
  // Written as half - (dead time of that half) so that |mismatch| / 2 = deadTime gives exactly T/2.
  return { positive: half - (dead - m / 2), negative: half - (dead + m / 2) };
}

/**
 * Compile a {@link BipolarSquareSpec}; `owner` names the element in errors.
 * Breakpoints: every switching instant in the queried window, computed from
 * the period index.
 *
 * @example
 * ```ts
 * const w = bipolarSquareWaveform(bipolarSquare({ amplitude: 10, period: 1, deadTime: 0.1 }), 'Vbridge');
 * w.value(0.2); // 10
 * w.value(0.45); // 0 (dead time)
 * w.value(0.7); // -10
 * ```
 */
export function bipolarSquareWaveform(spec: BipolarSquareSpec, owner: WaveformOwner = 'waveform'): Waveform {
  requireSpecKind(spec, 'bipolar-square', 'bipolarSquareWaveform', owner);
  const { amplitude, period } = spec;
  const deadTime = spec.deadTime ?? 0;
  const mismatch = spec.mismatch ?? 0;
  const delay = spec.delay ?? 0;
  requireFinite(owner, 'bipolar square amplitude', amplitude);
  requireFinite(owner, 'bipolar square period', period);
  requireFinite(owner, 'bipolar square dead time', deadTime);
  requireFinite(owner, 'bipolar square mismatch', mismatch);
  requireFinite(owner, 'bipolar square delay', delay);
  if (period <= 0) throw waveformError(owner, `bipolar square period ${period} s must be > 0`);
  const half = period / 2;
  if (deadTime < 0) throw waveformError(owner, `bipolar square dead time ${deadTime} s is negative; give deadTime >= 0`);
  if (deadTime >= half) {
    throw waveformError(
      owner,
      `bipolar square dead time ${deadTime} s is too long for the period ${period} s: it must be shorter than half the period (${half} s)`,
    );
  }
  const { positive, negative } = bipolarSquareOnTimes({ ...spec, deadTime, mismatch });
  if (deadTime - Math.abs(mismatch) / 2 < 0) {
    throw waveformError(
      owner,
      `bipolar square mismatch ${mismatch} s needs a dead time of at least |mismatch|/2 = ${Math.abs(mismatch) / 2} s (have ${deadTime} s); raise deadTime or reduce the mismatch`,
    );
  }
  if (positive < 0 || negative < 0) {
    throw waveformError(
      owner,
      `bipolar square mismatch ${mismatch} s leaves a negative on-time (positive ${positive} s, negative ${negative} s); reduce the mismatch or the dead time`,
    );
  }
  const d = delay;
  const a = amplitude;
  return vertexWaveform({
    times: Float64Array.of(d, d, d + positive, d + positive, d + half, d + half, d + half + negative, d + half + negative, d + period),
    values: Float64Array.of(0, a, a, 0, 0, -a, -a, 0, 0),
    period,
    before: 0,
  });
}
