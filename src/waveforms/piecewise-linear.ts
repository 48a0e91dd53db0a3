import type { Waveform } from './waveform.js';
import { requireFinite, waveformError, type WaveformOwner, requireSpecKind } from './waveform-error.js';
import { vertexWaveform } from './vertex-waveform.js';

/**
 * Plain-data description of a piecewise-linear table: straight lines between
 * the vertices `(times[i], values[i])`.
 *
 * ```text
 *  values[1]      +
 *                / \
 *  values[0] ---+   \        +-------   (holds the last value)
 *               ^    \      /
 *           times[0]  +----+
 *                   times[2..3]
 * ```
 *
 * - before `times[0]` the value is `values[0]`; after the last vertex it holds
 *   the last value;
 * - with `period`, the table repeats: the value at `t + k*period` equals the
 *   value at `t` for `t` in `[times[0], times[0] + period)`. The period must
 *   be at least the table's span `times[last] - times[0]`; if longer, the last
 *   value is held until the period ends, then the table restarts with a jump
 *   to `values[0]` (add a closing vertex yourself for a ramp back).
 *   Before `times[0]` the value is still `values[0]`.
 * - times must be strictly increasing (a step needs two close vertices).
 *
 * @example
 * ```ts
 * const ramp: PiecewiseLinearSpec = { kind: 'piecewise-linear', times: [0, 1e-3], values: [0, 10] };
 * ```
 */
export interface PiecewiseLinearSpec {
  readonly kind: 'piecewise-linear';
  /** Vertex times, s, strictly increasing (at least one). */
  readonly times: readonly number[];
  /** Vertex values, V or A, one per time. */
  readonly values: readonly number[];
  /** Repeat the table with this period, s (>= the table's span). Default: no repetition. */
  readonly period?: number;
}

/**
 * A piecewise-linear table spec. The arrays are copied: later changes to the
 * caller's arrays do not affect the spec.
 *
 * @example
 * ```ts
 * // a 1 ms ramp to 10 V, held: a soft-start
 * const soft = piecewiseLinear({ times: [0, 1e-3], values: [0, 10] });
 * // a 20 kHz sawtooth, 0 to 5 A
 * const saw = piecewiseLinear({ times: [0, 50e-6], values: [0, 5], period: 50e-6 });
 * ```
 */
export function piecewiseLinear(params: Omit<PiecewiseLinearSpec, 'kind'>): PiecewiseLinearSpec {
  return {
    kind: 'piecewise-linear',
    times: [...params.times],
    values: [...params.values],
    ...(params.period !== undefined ? { period: params.period } : {}),
  };
}

/**
 * Compile a {@link PiecewiseLinearSpec}; `owner` names the element in
 * errors. Breakpoints: every vertex inside the queried window (for a
 * repeating table, every vertex of every period, computed from the period
 * index; plus the period boundary).
 *
 * @example
 * ```ts
 * const w = piecewiseLinearWaveform(piecewiseLinear({ times: [0, 1, 3], values: [0, 2, 0] }), 'ramp current');
 * w.value(2); // 1
 * w.breakpoints(0, 10); // [0, 1, 3]
 * ```
 */
export function piecewiseLinearWaveform(spec: PiecewiseLinearSpec, owner: WaveformOwner = 'waveform'): Waveform {
  requireSpecKind(spec, 'piecewise-linear', 'piecewiseLinearWaveform', owner);
  const { times, values, period } = spec;
  const n = times.length;
  if (n === 0) throw waveformError(owner, 'piecewise-linear table is empty; give at least one (time, value) vertex');
  if (values.length !== n) {
    throw waveformError(owner, `piecewise-linear table has ${n} times but ${values.length} values; give one value per time`);
  }
  for (let i = 0; i < n; i++) {
    requireFinite(owner, `piecewise-linear time [${i}]`, times[i] ?? Number.NaN);
    requireFinite(owner, `piecewise-linear value [${i}]`, values[i] ?? Number.NaN);
    if (i > 0 && !((times[i] ?? 0) > (times[i - 1] ?? 0))) {
      throw waveformError(
        owner,
        `piecewise-linear times must be strictly increasing, but times[${i}] = ${times[i]} s follows ${times[i - 1]} s; sort the table (for a step use two close times)`,
      );
    }
  }
  const t0 = times[0] ?? 0;
  const tn = times[n - 1] ?? 0;
  const v0 = values[0] ?? 0;
  const vn = values[n - 1] ?? 0;
  if (period === undefined) {
    return vertexWaveform({ times: Float64Array.from(times), values: Float64Array.from(values), before: v0 });
  }
  requireFinite(owner, 'piecewise-linear period', period);
  if (period <= 0) throw waveformError(owner, `piecewise-linear period ${period} s must be > 0`);
  const span = tn - t0;
  const close = t0 + period;
  // A period equal to the span (within rounding) closes on the last vertex; else hold the last value.
  const tol = 8 * Number.EPSILON * Math.max(Math.abs(t0), Math.abs(tn), period);
  if (period < span - tol) {
    throw waveformError(
      owner,
      `piecewise-linear period ${period} s is shorter than the table's span ${span} s; give period >= times[last] - times[0]`,
    );
  }
  const ts = [...times];
  const vs = [...values];
  if (n > 1 && Math.abs(close - tn) <= tol) {
    ts[n - 1] = Math.max(tn, close);
  } else {
    ts.push(close);
    vs.push(vn);
  }
  return vertexWaveform({ times: Float64Array.from(ts), values: Float64Array.from(vs), period, before: v0 });
}
