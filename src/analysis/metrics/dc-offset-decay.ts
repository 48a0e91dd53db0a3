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
  /** Leading cycles left out of the fit (not yet exponential). Default 0. */
  readonly skipCycles?: number;
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
}

/**
 * DC offset per cycle of a series (see {@link cycleMeans}) and the time
 * constant of its decay (see {@link fitExponentialDecay}), e.g. the decay
 * of the DC flux or current offset after energising a transformer. Each
 * cycle's mean is placed at the cycle's mid time.
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
  const skip = options.skipCycles ?? 0;
  if (!Number.isInteger(skip) || skip < 0) {
    throw new InputError('bad-option', `${name}: skipCycles ${skip} must be a non-negative integer`, [name]);
  }
  const used = cycles.means.length - skip;
  if (used < 2) {
    throw new InputError(
      'bad-window',
      `${name}: ${cycles.means.length} full cycles of ${options.period} s in the data, ${used} left after skipping ${skip}; the decay fit needs at least 2 (simulate longer)`,
      [name],
    );
  }
  const fit = fitExponentialDecay(cycles.midTimes.subarray(skip), cycles.means.subarray(skip), {
    name,
    ...(options.asymptote !== undefined ? { asymptote: options.asymptote } : {}),
  });
  return { cycles, fit };
}
