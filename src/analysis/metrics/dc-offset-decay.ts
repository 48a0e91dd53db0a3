import { InputError } from '../../errors.js';
import { cycleMeans, type CycleMeans } from './cycle-means.js';
import { fitExponentialDecay, type ExponentialFit } from './fit-exponential-decay.js';
import type { CycleOptions } from './series-options.js';

/**
 * Options of {@link dcOffsetDecay}.
 *
 * @example
 * ```ts
 * dcOffsetDecay(t, phi, { period: 0.02, skipCycles: 2, name: 'centre leg flux' });
 * ```
 */
export interface DcOffsetDecayOptions extends CycleOptions {
  /** Value the per-cycle mean settles to. Default 0. */
  readonly asymptote?: number;
  /**
   * Leading cycles left out of the fit (not yet exponential: during inrush
   * the first cycles decay faster than the later ones). Default `'auto'`:
   * the fewest leading cycles whose omission gives a fit with R^2 >= 0.99
   * on at least 3 cycles (or the best R^2 if none does); a number fixes it.
   */
  readonly skipCycles?: number | 'auto';
  /** R^2 below which the result carries a warning. Default 0.95. */
  readonly warnBelowRSquared?: number;
}

/**
 * Per-cycle DC offset and its exponential decay.
 *
 * @example
 * ```ts
 * const { cycles, fit } = dcOffsetDecay(t, i, { period: 0.02 });
 * console.log(`DC offset decays with tau = ${fit.tau} s (R^2 ${fit.rSquared})`);
 * ```
 */
export interface DcOffsetDecay {
  /** The per-cycle means, every full cycle. */
  readonly cycles: CycleMeans;
  /** Fit of `mean_k = asymptote + amplitude * exp(-(mid_k - mid_first) / tau)` over the fitted cycles. */
  readonly fit: ExponentialFit;
  /** Leading cycles left out of the fit. */
  readonly skippedCycles: number;
  /** Plain-language warnings when the fit's assumptions do not hold (poor exponential fit). Empty when none. */
  readonly warnings: readonly string[];
}

/**
 * DC offset per cycle of a series (see {@link cycleMeans}) and the time
 * constant of its decay (see {@link fitExponentialDecay}), e.g. the decay
 * of the DC flux or current offset after energising a transformer. Each
 * cycle's mean is placed at the cycle's mid time. The first cycles of an
 * inrush decay faster than the rest (the core saturates): by default they
 * are left out until the rest is exponential (`skipCycles: 'auto'`), and a
 * poor fit still comes with a warning in `warnings`.
 *
 * For an offset `c exp(-t/tau)` on top of a periodic signal the cycle means
 * are exactly `c' exp(-mid_k/tau)`, so the fit recovers tau whatever the
 * periodic part (derived: the mean of exp(-t/tau) over [s, s+T] is
 * proportional to exp(-s/tau)).
 *
 * @example
 * ```ts
 * const tau = 0.05;
 * const t = Float64Array.from({ length: 20001 }, (_, i) => i * 1e-5); // 10 cycles of 50 Hz
 * const i = t.map((s) => Math.sin(2 * Math.PI * 50 * s) + 3 * Math.exp(-s / tau));
 * dcOffsetDecay(t, i, { period: 0.02 }).fit.tau; // 0.05
 * ```
 */
export function dcOffsetDecay(t: ArrayLike<number>, x: ArrayLike<number>, options: DcOffsetDecayOptions): DcOffsetDecay {
  const name = options.name ?? 'series';
  const cycles = cycleMeans(t, x, options);
  const asymptote = options.asymptote !== undefined ? { asymptote: options.asymptote } : {};
  const fitFrom = (skip: number): ExponentialFit =>
    fitExponentialDecay(cycles.midTimes.subarray(skip), cycles.means.subarray(skip), { name, ...asymptote });
  const requested = options.skipCycles ?? 'auto';
  let skip: number;
  let fit: ExponentialFit;
  if (requested === 'auto') {
    if (cycles.means.length < 2) {
      throw new InputError('bad-window', `${name}: ${cycles.means.length} full cycles of ${options.period} s in the data; the decay fit needs at least 2 (simulate longer)`, [name]);
    }
    // Candidates leave at least 3 cycles (2 points always fit exactly); with 2 cycles only, use both.
    const last = Math.max(0, cycles.means.length - 3);
    let best: { skip: number; fit: ExponentialFit } | undefined;
    let chosen: { skip: number; fit: ExponentialFit } | undefined;
    for (let k = 0; k <= last && chosen === undefined; k++) {
      let candidate: ExponentialFit;
      try {
        candidate = fitFrom(k);
      } catch {
        continue; // e.g. the means cross the asymptote in the first cycles: try skipping them
      }
      if (candidate.rSquared >= 0.99) chosen = { skip: k, fit: candidate };
      if (best === undefined || candidate.rSquared > best.fit.rSquared) best = { skip: k, fit: candidate };
    }
    const pick = chosen ?? best ?? { skip: 0, fit: fitFrom(0) };
    skip = pick.skip;
    fit = pick.fit;
  } else {
    skip = requested;
    if (!Number.isInteger(skip) || skip < 0) {
      throw new InputError('bad-option', `${name}: skipCycles ${skip} must be a non-negative integer or 'auto'`, [name]);
    }
    const used = cycles.means.length - skip;
    if (used < 2) {
      throw new InputError(
        'bad-window',
        `${name}: ${cycles.means.length} full cycles of ${options.period} s in the data, ${used} left after skipping ${skip}; the decay fit needs at least 2 (simulate longer)`,
        [name],
      );
    }
    fit = fitFrom(skip);
  }
  const threshold = options.warnBelowRSquared ?? 0.95;
  const warnings: string[] = [];
  if (fit.points >= 3 && !(fit.rSquared >= threshold)) {
    warnings.push(
      `${name}: the per-cycle DC offset is not a single exponential decay (R^2 ${fit.rSquared.toFixed(3)} over ${fit.points} cycles after skipping ${skip}); ` +
        `tau = ${fit.tau} s is a rough figure only: simulate more cycles, or fit a later window (skipCycles)`,
    );
  }
  return { cycles, fit, skippedCycles: skip, warnings };
}
