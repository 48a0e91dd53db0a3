import { InputError } from '../../errors.js';
import { seriesPeak } from './series-peak.js';
import type { WindowOptions } from './series-options.js';

/**
 * Options of {@link fluxDensityMargin}.
 *
 * @example
 * ```ts
 * fluxDensityMargin(t, b, { saturation: 1.9, name: 'yoke', from: 0.1 });
 * ```
 */
export interface FluxDensityMarginOptions extends WindowOptions {
  /** Saturation flux density to compare with, T (> 0). */
  readonly saturation: number;
}

/**
 * Peak |B| of one flux tube and its distance from saturation.
 *
 * @example
 * ```ts
 * const { peak, peakTime, margin, ratio } = fluxDensityMargin(t, b, { saturation: 1.9 });
 * ```
 */
export interface FluxDensityMargin {
  /** Name of the series (flux tube). */
  readonly name: string;
  /** Largest |B| over the window, T. */
  readonly peak: number;
  /** Time of the peak, s. */
  readonly peakTime: number;
  /** Time of the peak, s. @deprecated Use `peakTime`; this alias goes in the next minor version. */
  readonly time: number;
  /** Saturation flux density used, T. */
  readonly saturation: number;
  /** saturation - peak, T (negative: the peak exceeds saturation). */
  readonly margin: number;
  /** peak / saturation (1 or more: at or beyond saturation; 1 - ratio is the relative margin). */
  readonly ratio: number;
}

/**
 * Peak |B| of a flux-density series with its time, and the margin to a
 * saturation flux density, absolute (T) and as a ratio.
 *
 * Caution: this is an engineering estimate from a model (material data,
 * geometry, sampling; see {@link seriesPeak} for the sampling error, pass
 * `at` to refine). A positive margin does not prove a design safe; local
 * codes, standards and licensed engineering practice govern.
 *
 * @example
 * ```ts
 * const t = Float64Array.from({ length: 2001 }, (_, i) => i * 1e-5);
 * const b = t.map((s) => 1.45 * Math.sin(2 * Math.PI * 50 * s));
 * const m = fluxDensityMargin(t, b, { saturation: 1.9, name: 'centre leg' });
 * // m.peak 1.45 T, m.margin 0.45 T, m.ratio 0.763
 * ```
 */
export function fluxDensityMargin(t: ArrayLike<number>, b: ArrayLike<number>, options: FluxDensityMarginOptions): FluxDensityMargin {
  const name = options.name ?? 'flux density';
  const sat = options.saturation;
  if (!Number.isFinite(sat) || sat <= 0) {
    throw new InputError('bad-option', `${name}: saturation flux density ${sat} T must be positive and finite`, [name]);
  }
  const p = seriesPeak(t, b, { ...options, name });
  return { name, peak: p.peak, peakTime: p.peakTime, time: p.peakTime, saturation: sat, margin: sat - p.peak, ratio: p.peak / sat };
}

/**
 * One flux tube for {@link fluxDensityMargins}.
 *
 * @example
 * ```ts
 * const leg: FluxDensitySeries = { name: 'leg A', b: bA, saturation: 1.9 };
 * ```
 */
export interface FluxDensitySeries {
  /** Name of the flux tube. */
  readonly name: string;
  /** Flux density samples, T, on the shared time grid. */
  readonly b: ArrayLike<number>;
  /** Saturation flux density of its material, T. */
  readonly saturation: number;
  /** Dense output of B for refining the peak. */
  readonly at?: (t: number) => number;
}

/**
 * {@link fluxDensityMargin} for many flux tubes on one time grid, sorted
 * worst first (highest peak/saturation ratio).
 *
 * Caution: engineering estimates from a model; local codes, standards and
 * licensed engineering practice govern.
 *
 * @example
 * ```ts
 * const margins = fluxDensityMargins(t, [
 *   { name: 'leg A', b: bA, saturation: 1.9 },
 *   { name: 'yoke', b: bY, saturation: 1.9 },
 * ]);
 * margins[0]; // the tube closest to (or furthest beyond) saturation
 * ```
 */
export function fluxDensityMargins(
  t: ArrayLike<number>,
  series: readonly FluxDensitySeries[],
  options: Omit<WindowOptions, 'at' | 'name'> = {},
): FluxDensityMargin[] {
  return series
    .map((s) =>
      fluxDensityMargin(t, s.b, { ...options, name: s.name, saturation: s.saturation, ...(s.at !== undefined ? { at: s.at } : {}) }),
    )
    .sort((p, q) => q.ratio - p.ratio);
}
