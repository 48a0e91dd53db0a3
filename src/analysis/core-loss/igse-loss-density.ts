import { InputError } from '../../errors.js';
import { checkSeries } from '../metrics/series-options.js';
import { interpolateAt, intervalIndex } from '../metrics/window-integral.js';
import { igseCoefficient } from './igse-coefficient.js';
import type { SteinmetzCoefficients } from './steinmetz-coefficients.js';

/**
 * Options of {@link igseLossDensity}.
 *
 * @example
 * ```ts
 * igseLossDensity(coefficients, t, b, { period: 10e-6, start: 0.99e-3, name: 'leg' });
 * ```
 */
export interface IgseOptions {
  /** Period T, s. Default: the whole series is one period. */
  readonly period?: number;
  /** Start of the period to use, s. Default: the first sample time. */
  readonly start?: number;
  /** Name (flux tube) for messages. Default `'core'`. */
  readonly name?: string;
}

/**
 * Peak-to-peak flux density and period of the window {@link igseLossDensity} used.
 *
 * @internal
 */
export interface IgseWindow {
  readonly from: number;
  readonly to: number;
  readonly peakToPeak: number;
}

/**
 * The period window [from, to] of a B(t) series and its peak-to-peak B,
 * checked.
 *
 * @internal
 */
export function periodWindow(t: ArrayLike<number>, b: ArrayLike<number>, options: IgseOptions, name: string): IgseWindow {
  checkSeries(t, b, name);
  const first = t[0] ?? 0;
  const last = t[t.length - 1] ?? 0;
  const from = options.start ?? first;
  const period = options.period ?? last - from;
  if (!Number.isFinite(period) || period <= 0) {
    throw new InputError('bad-option', `${name}: period ${period} s must be positive and finite`, [name]);
  }
  const slack = 1e-9 * period;
  if (!Number.isFinite(from) || from < first - slack || from + period > last + slack) {
    throw new InputError(
      'bad-window',
      `${name}: the period [${from}, ${from + period}] s is not inside the data [${first}, ${last}] s; give one full period of B`,
      [name],
    );
  }
  const a = Math.max(from, first);
  const to = Math.min(from + period, last);
  let max = -Infinity;
  let min = Infinity;
  const see = (v: number): void => {
    if (v > max) max = v;
    if (v < min) min = v;
  };
  see(interpolateAt(t, b, intervalIndex(t, a), a));
  see(interpolateAt(t, b, intervalIndex(t, to), to));
  for (let i = intervalIndex(t, a); i < t.length && (t[i] ?? 0) <= to; i++) if ((t[i] ?? 0) >= a) see(b[i] ?? 0);
  return { from: a, to, peakToPeak: max - min };
}

/**
 * Core loss per unit volume (W/m^3) for an arbitrary periodic flux density
 * B(t) by the improved generalised Steinmetz equation (iGSE; Venkatachalam,
 * Sullivan, Abdallah, Tacca, IEEE COMPEL Workshop 2002, pp. 36-41):
 *
 * `P_v = (1/T) integral over one period of k_i |dB/dt|^alpha (dB_pp)^(beta - alpha) dt`,
 * with k_i from {@link igseCoefficient} and dB_pp the peak-to-peak flux
 * density over the period.
 *
 * B is taken as linear between samples, so dB/dt is constant on each
 * interval and the integral is a sum. It is exact for piecewise-linear flux
 * (the triangle and trapezoid shapes of square-wave drives, sampled at their
 * corners) and second-order accurate in the spacing for smooth flux.
 * dB_pp is taken from the samples (and the window ends), so a crest that
 * falls between samples is clipped, also an O(h^2) error: sample densely,
 * or at the flux extremes.
 *
 * Assumptions: one period of steady state (pass `period` and `start`, or a
 * series that is exactly one period); a single major loop per period, i.e.
 * B rises monotonically from its minimum to its maximum and falls back
 * (minor loops would need the waveform split into loops, which is not
 * done); no DC-bias correction; the coefficients' fitted range.
 *
 * @example
 * ```ts
 * const f = 100e3;
 * const t = Float64Array.from({ length: 1001 }, (_, i) => i / (1000 * f));
 * const b = t.map((s) => 0.1 * Math.sin(2 * Math.PI * f * s));
 * igseLossDensity({ k: 1.5, alpha: 1.4, beta: 2.6 }, t, b); // = steinmetzLossDensity(..., 100e3, 0.1) for a sine
 * ```
 */
export function igseLossDensity(c: SteinmetzCoefficients, t: ArrayLike<number>, b: ArrayLike<number>, options: IgseOptions = {}): number {
  const name = options.name ?? 'core';
  const ki = igseCoefficient(c, name);
  const { from, to, peakToPeak } = periodWindow(t, b, options, name);
  const period = to - from;
  if (peakToPeak === 0) return 0;
  const { alpha, beta } = c;
  let sum = 0; // integral of |dB/dt|^alpha dt = sum |dB|^alpha dt^(1 - alpha)
  for (let i = intervalIndex(t, from); i < t.length - 1; i++) {
    const t0 = t[i] ?? 0;
    const t1 = t[i + 1] ?? 0;
    if (t0 >= to) break;
    const lo = Math.max(from, t0);
    const hi = Math.min(to, t1);
    if (!(hi > lo)) continue;
    const dt = hi - lo;
    const db = interpolateAt(t, b, i, hi) - interpolateAt(t, b, i, lo);
    if (db !== 0) sum += Math.pow(Math.abs(db) / dt, alpha) * dt;
  }
  return (ki * Math.pow(peakToPeak, beta - alpha) * sum) / period;
}
