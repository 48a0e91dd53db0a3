import { InputError } from '../../errors.js';

/**
 * Options of {@link fitExponentialDecay}.
 *
 * @example
 * ```ts
 * fitExponentialDecay(times, values, { asymptote: 0.1, name: 'dc flux' });
 * ```
 */
export interface ExponentialFitOptions {
  /** Value the data decays towards, y_inf. Default 0. */
  readonly asymptote?: number;
  /** Name of the data for messages. Default `'data'`. */
  readonly name?: string;
}

/**
 * Result of fitting `y = asymptote + amplitude * exp(-(t - t_0) / tau)`.
 *
 * @example
 * ```ts
 * const { tau, rSquared } = fitExponentialDecay(times, offsets);
 * ```
 */
export interface ExponentialFit {
  /** Time constant, s; negative if the data grow, Infinity if they are flat. */
  readonly tau: number;
  /** Value of y - asymptote at t_0 (the first time), same sign as the data. */
  readonly amplitude: number;
  /** The reference time t_0 (first time), s. */
  readonly referenceTime: number;
  /** Coefficient of determination of the straight-line fit of ln|y - y_inf| on t (1 = perfect). */
  readonly rSquared: number;
  /** Root-mean-square residual of ln|y - y_inf| (a relative error of the fit in y). */
  readonly rmsLogResidual: number;
  /** Number of points used. */
  readonly points: number;
}

/**
 * Fit an exponential decay to points `(t_i, y_i)` by linear least squares
 * on `ln |y_i - asymptote|` (common practice). Every `y_i - asymptote` must
 * be non-zero and of one sign, with at least two distinct times.
 *
 * Log-linear least squares weights every point by its relative error: good
 * for clean simulated data, but points near the asymptote (where noise or
 * the solver tolerance dominate) pull the fit; drop them (or the first,
 * not-yet-exponential cycles) before fitting. `rSquared` and
 * `rmsLogResidual` say how exponential the data really are.
 *
 * @example
 * ```ts
 * const t = [0, 1, 2, 3];
 * const fit = fitExponentialDecay(t, t.map((s) => 5 * Math.exp(-s / 2)));
 * // fit.tau 2, fit.amplitude 5, fit.rSquared 1
 * ```
 */
export function fitExponentialDecay(times: ArrayLike<number>, values: ArrayLike<number>, options: ExponentialFitOptions = {}): ExponentialFit {
  const name = options.name ?? 'data';
  const yInf = options.asymptote ?? 0;
  const n = times.length;
  if (values.length !== n) {
    throw new InputError('bad-series', `${name}: ${n} times but ${values.length} values; give one value per time`, [name]);
  }
  if (n < 2) throw new InputError('bad-series', `${name}: ${n} points; an exponential fit needs at least 2`, [name]);
  if (!Number.isFinite(yInf)) throw new InputError('bad-option', `${name}: asymptote ${yInf} is not finite`, [name]);
  const t0 = times[0] ?? 0;
  let sign = 0;
  const u = new Float64Array(n);
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ti = times[i] ?? Number.NaN;
    const d = (values[i] ?? Number.NaN) - yInf;
    if (!Number.isFinite(ti) || !Number.isFinite(d)) {
      throw new InputError('bad-series', `${name}: point ${i} (t = ${ti}, y = ${values[i]}) is not finite`, [name]);
    }
    const s = Math.sign(d);
    if (s === 0 || (sign !== 0 && s !== sign)) {
      throw new InputError(
        'bad-series',
        `${name}: y - asymptote at point ${i} (t = ${ti} s) is ${d}; an exponential fit needs all values on one side of the asymptote, none equal to it; drop those points or set the asymptote`,
        [name],
      );
    }
    sign = s;
    u[i] = ti - t0; // centred later; t0 keeps the numbers small
    z[i] = Math.log(Math.abs(d));
  }
  let mu = 0;
  let mz = 0;
  for (let i = 0; i < n; i++) {
    mu += u[i] ?? 0;
    mz += z[i] ?? 0;
  }
  mu /= n;
  mz /= n;
  let suu = 0;
  let suz = 0;
  let szz = 0;
  for (let i = 0; i < n; i++) {
    const du = (u[i] ?? 0) - mu;
    const dz = (z[i] ?? 0) - mz;
    suu += du * du;
    suz += du * dz;
    szz += dz * dz;
  }
  if (!(suu > 0)) throw new InputError('bad-series', `${name}: all points at one time; give at least two distinct times`, [name]);
  const slope = suz / suu;
  const intercept = mz - slope * mu; // ln|amplitude| at t0
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = (z[i] ?? 0) - (intercept + slope * (u[i] ?? 0));
    sse += r * r;
  }
  return {
    tau: slope === 0 ? Infinity : -1 / slope,
    amplitude: sign * Math.exp(intercept),
    referenceTime: t0,
    rSquared: szz > 0 ? 1 - sse / szz : 1,
    rmsLogResidual: Math.sqrt(sse / n),
    points: n,
  };
}
