import { InputError } from '../../errors.js';
import { checkPoints, checkSeries, resolveWindow } from './series-options.js';
import { identity, windowIntegral } from './window-integral.js';

/**
 * Options of {@link lossTotals}.
 *
 * @example
 * ```ts
 * lossTotals(t, { load: pLoad }, { from: 0.08, to: 0.1 }); // the last cycle of a 50 Hz run
 * ```
 */
export interface LossTotalsOptions {
  /** Start of the window, s. Default: the first sample time. */
  readonly from?: number;
  /** End of the window, s. Default: the last sample time. */
  readonly to?: number;
  /** Dense-output evaluators of some of the loss powers, by the same names. */
  readonly at?: Readonly<Record<string, (t: number) => number>>;
  /** Gauss-Legendre points per sample interval where `at` is given, 1 to 5. Default 4. */
  readonly pointsPerInterval?: number;
}

/**
 * Energies lost per element over a window, their sum, and the average loss power.
 *
 * @example
 * ```ts
 * const { energies, total, averagePower } = lossTotals(t, { load: pLoad, 'primary copper': pCopper });
 * ```
 */
export interface LossTotals {
  /** Energy lost by each element over the window, J, in the input's order. */
  readonly energies: Readonly<Record<string, number>>;
  /** Sum of the energies, J. */
  readonly total: number;
  /** Window length, s. */
  readonly duration: number;
  /** total / duration, W. */
  readonly averagePower: number;
}

/**
 * Energy lost in each element (resistors, winding copper, core eddy terms,
 * post-processed core loss...) over `[from, to]`, given each element's loss
 * power series on a shared time grid, with their total and the average loss
 * power. Integrals as in {@link seriesIntegral}.
 *
 * @example
 * ```ts
 * const t = Float64Array.of(0, 1e-3, 2e-3);
 * const totals = lossTotals(t, { Rload: Float64Array.of(10, 10, 10), Rwinding: Float64Array.of(0, 1, 2) });
 * // totals.energies.Rload 0.02 J, Rwinding 0.002 J, total 0.022 J, averagePower 11 W
 * ```
 */
export function lossTotals(
  t: ArrayLike<number>,
  losses: Readonly<Record<string, ArrayLike<number>>>,
  options: LossTotalsOptions = {},
): LossTotals {
  const names = Object.keys(losses);
  if (names.length === 0) throw new InputError('bad-series', 'lossTotals: no loss series given; pass { name: power series }', []);
  const points = checkPoints(options.pointsPerInterval ?? 4, 'lossTotals');
  const energies: Record<string, number> = {};
  let total = 0;
  let window: [number, number] | undefined;
  for (const name of names) {
    const p = losses[name] ?? [];
    checkSeries(t, p, name);
    window ??= resolveWindow(t, options, name);
    const e = windowIntegral(t, p, window[0], window[1], identity, options.at?.[name], points);
    energies[name] = e;
    total += e;
  }
  const [a, b] = window ?? [0, 0];
  return { energies, total, duration: b - a, averagePower: total / (b - a) };
}
