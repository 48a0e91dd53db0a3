import { InputError } from '../../errors.js';
import { gaussLegendre } from './gauss-legendre.js';
import { checkPoints, checkSeries } from './series-options.js';
import { interpolateAt, intervalIndex, square, windowIntegral } from './window-integral.js';

/**
 * Options of {@link harmonics}.
 *
 * @example
 * ```ts
 * harmonics(t, i, { fundamental: 50, cycles: 2, count: 15, name: 'magnetising current' });
 * ```
 */
export interface HarmonicsOptions {
  /** Fundamental frequency, Hz (> 0). The window is a whole number of its periods. */
  readonly fundamental: number;
  /**
   * Start of the window, s. Default: the window ends at the last sample
   * (where a run is closest to steady state).
   */
  readonly from?: number;
  /** Number of fundamental periods in the window (a positive integer). Default: as many as fit. */
  readonly cycles?: number;
  /** Highest harmonic order reported. Default 25. */
  readonly count?: number;
  /** Dense output of the same quantity (Gauss-Legendre per sample interval instead of the linear interpolant). */
  readonly at?: (t: number) => number;
  /** Gauss-Legendre points per sample interval when `at` is given, 1 to 5. Default 4. */
  readonly pointsPerInterval?: number;
  /** Name of the series for messages. Default `'series'`. */
  readonly name?: string;
}

/**
 * Harmonic content of a series over a whole number of fundamental periods.
 * Arrays are indexed by harmonic order k = 0 ... count; index 0 is the DC
 * term (`amplitude[0] = |dc|`, `phase[0]` 0 or pi). The series is
 * `x(t) = dc + sum_k amplitude[k] * sin(2 pi k f t + phase[k])`, with t the
 * absolute time (the convention of {@link sine}).
 *
 * @example
 * ```ts
 * const h = harmonics(t, i, { fundamental: 50 });
 * console.log(`3rd harmonic ${h.rms[3]} A rms, ${(100 * h.amplitude[3]! / h.amplitude[1]!).toFixed(1)} % of the fundamental`);
 * ```
 */
export interface Harmonics {
  /** Fundamental frequency, Hz. */
  readonly fundamental: number;
  /** Window analysed, s. */
  readonly from: number;
  readonly to: number;
  /** Mean value over the window. */
  readonly dc: number;
  /** Peak amplitude per order (index 0: |dc|). */
  readonly amplitude: Float64Array;
  /** Rms value per order (amplitude / sqrt 2; index 0: |dc|). */
  readonly rms: Float64Array;
  /** Phase per order, rad, in (-pi, pi], sine convention at t = 0. */
  readonly phase: Float64Array;
  /** Rms of the whole series over the window. */
  readonly totalRms: number;
  /**
   * Rms of what orders 0 ... count do not hold:
   * `sqrt(max(0, totalRms^2 - sum rms[k]^2))` (Parseval); content above
   * `count`, or content that is not periodic in the window.
   */
  readonly residualRms: number;
  /** Total harmonic distortion, `sqrt(sum_{k>=2} rms[k]^2) / rms[1]` (orders up to count); NaN if rms[1] is 0. */
  readonly thd: number;
}

/** Integral over [a, b] of the square of the linear interpolant of (t, x), exact. */
function linearSquareIntegral(t: ArrayLike<number>, x: ArrayLike<number>, a: number, b: number): number {
  let sum = 0;
  for (let i = intervalIndex(t, a); i < t.length - 1; i++) {
    const t0 = t[i] ?? 0;
    const t1 = t[i + 1] ?? 0;
    if (t0 >= b) break;
    const lo = Math.max(a, t0);
    const hi = Math.min(b, t1);
    if (!(hi > lo)) continue;
    const x0 = lo === t0 ? (x[i] ?? 0) : interpolateAt(t, x, i, lo);
    const x1 = hi === t1 ? (x[i + 1] ?? 0) : interpolateAt(t, x, i, hi);
    sum += ((hi - lo) * (x0 * x0 + x0 * x1 + x1 * x1)) / 3;
  }
  return sum;
}

/** Complex e^{z} - 1 over z and the first moment, by series for small |z| (z = j w h purely imaginary). */
function moments(wh: number): { p1re: number; p1im: number; psre: number; psim: number } {
  // phi1(z) = (e^z - 1) / z, psi(z) = (e^z (z - 1) + 1) / z^2 with z = j wh:
  // int_0^h e^{jwu} du = h phi1, int_0^h u e^{jwu} du = h^2 psi.
  if (Math.abs(wh) < 0.5) {
    // phi1 = sum z^n / (n+1)!, psi = sum z^n / (n! (n+2)); z^n = (j wh)^n.
    let p1re = 0;
    let p1im = 0;
    let psre = 0;
    let psim = 0;
    let zre = 1; // z^n / n!
    let zim = 0;
    for (let n = 0; n <= 14; n++) {
      p1re += zre / (n + 1);
      p1im += zim / (n + 1);
      psre += zre / (n + 2);
      psim += zim / (n + 2);
      // next: z^{n+1}/(n+1)! = z^n/n! * (j wh) / (n+1)
      const nre = (-zim * wh) / (n + 1);
      const nim = (zre * wh) / (n + 1);
      zre = nre;
      zim = nim;
    }
    return { p1re, p1im, psre, psim };
  }
  const c = Math.cos(wh);
  const s = Math.sin(wh);
  // e^z - 1 = (c - 1) + j s; divided by z = j wh: ((c-1) + j s) / (j wh) = s / wh - j (c - 1) / wh
  const p1re = s / wh;
  const p1im = -(c - 1) / wh;
  // e^z (z - 1) + 1 = (c + j s)(-1 + j wh) + 1 = (1 - c - s wh) + j (c wh - s); over z^2 = -wh^2
  const psre = -(1 - c - s * wh) / (wh * wh);
  const psim = -(c * wh - s) / (wh * wh);
  return { p1re, p1im, psre, psim };
}

/**
 * Fourier analysis of a sampled series over a whole number of periods of
 * `fundamental`: DC term, amplitude and phase of every harmonic up to
 * `count`, total rms, the rms left outside those orders, and the total
 * harmonic distortion. For the magnetising current of a transformer, a
 * DC-bias study, or the ripple of a converter current.
 *
 * Accuracy: without `at` the series is taken as the straight line between
 * samples and each harmonic's integral over every sample interval is exact
 * for that line (no aliasing from the product with the cosine), so the
 * error is the interpolation error of the samples, second order in the
 * spacing. With `at` (the dense output), each sample interval is integrated
 * with a Gauss-Legendre rule on at(t) cos and at(t) sin; keep the sample
 * spacing well below the period of the highest order asked for.
 * The window must lie inside the data; leave `from` unset to analyse the
 * last whole cycles of a run (closest to steady state).
 *
 * @example
 * ```ts
 * const t = Float64Array.from({ length: 4001 }, (_, i) => i * 1e-5); // 2 cycles of 50 Hz
 * const i = t.map((s) => 0.2 + 3 * Math.sin(2 * Math.PI * 50 * s) + 0.6 * Math.sin(2 * Math.PI * 150 * s + 1));
 * const h = harmonics(t, i, { fundamental: 50, count: 5 });
 * // h.dc 0.2, h.amplitude[1] 3, h.amplitude[3] 0.6, h.phase[3] 1, h.thd 0.2
 * ```
 */
export function harmonics(t: ArrayLike<number>, x: ArrayLike<number>, options: HarmonicsOptions): Harmonics {
  const name = options.name ?? 'series';
  checkSeries(t, x, name);
  const f = options.fundamental;
  if (!Number.isFinite(f) || f <= 0) {
    throw new InputError('bad-option', `${name}: fundamental ${f} Hz must be positive and finite`, [name]);
  }
  const count = options.count ?? 25;
  if (!Number.isInteger(count) || count < 1) {
    throw new InputError('bad-option', `${name}: count ${count} must be a positive integer (the highest harmonic order)`, [name]);
  }
  const points = checkPoints(options.pointsPerInterval ?? 4, name);
  const period = 1 / f;
  const first = t[0] ?? 0;
  const last = t[t.length - 1] ?? 0;
  const slack = 1e-9 * period;
  const fit = (start: number) => Math.floor((last - start + slack) / period);
  let cycles = options.cycles;
  if (cycles !== undefined && (!Number.isInteger(cycles) || cycles < 1)) {
    throw new InputError('bad-option', `${name}: cycles ${cycles} must be a positive integer`, [name]);
  }
  let from: number;
  if (options.from === undefined) {
    cycles ??= fit(first);
    from = last - cycles * period;
  } else {
    from = options.from;
    if (!Number.isFinite(from)) throw new InputError('bad-window', `${name}: from ${from} s is not finite`, [name]);
    cycles ??= fit(from);
  }
  const to = from + cycles * period;
  if (cycles < 1 || from < first - slack || to > last + slack) {
    throw new InputError(
      'bad-window',
      `${name}: ${cycles} period(s) of ${period} s from ${from} s do not fit in the data [${first}, ${last}] s; simulate at least one whole period or move the window`,
      [name],
    );
  }
  const a = Math.max(from, first);
  const b = Math.min(to, last);
  const span = b - a;

  // c_k = integral over [a, b] of x(t) e^{j k w t} dt, for k = 0 ... count.
  const cre = new Float64Array(count + 1);
  const cim = new Float64Array(count + 1);
  const w1 = 2 * Math.PI * f;
  const n = t.length;
  const at = options.at;
  for (let i = intervalIndex(t, a); i < n - 1; i++) {
    const t0 = t[i] ?? 0;
    const t1 = t[i + 1] ?? 0;
    if (t0 >= b) break;
    const lo = Math.max(a, t0);
    const hi = Math.min(b, t1);
    if (!(hi > lo)) continue;
    const h = hi - lo;
    if (at !== undefined) {
      for (let k = 0; k <= count; k++) {
        const w = k * w1;
        cre[k]! += gaussLegendre((s) => at(s) * Math.cos(w * s), lo, hi, points);
        cim[k]! += gaussLegendre((s) => at(s) * Math.sin(w * s), lo, hi, points);
      }
      continue;
    }
    const xlo = lo === t0 ? (x[i] ?? 0) : interpolateAt(t, x, i, lo);
    const xhi = hi === t1 ? (x[i + 1] ?? 0) : interpolateAt(t, x, i, hi);
    const slope = (xhi - xlo) / h;
    for (let k = 0; k <= count; k++) {
      const w = k * w1;
      // int_lo^hi (xlo + slope u) e^{jw(lo+u)} du = e^{jw lo} (xlo h phi1 + slope h^2 psi)
      const m = moments(w * h);
      const ire = xlo * h * m.p1re + slope * h * h * m.psre;
      const iim = xlo * h * m.p1im + slope * h * h * m.psim;
      const ere = Math.cos(w * lo);
      const eim = Math.sin(w * lo);
      cre[k]! += ere * ire - eim * iim;
      cim[k]! += ere * iim + eim * ire;
    }
  }

  const dc = cre[0]! / span;
  const amplitude = new Float64Array(count + 1);
  const rms = new Float64Array(count + 1);
  const phase = new Float64Array(count + 1);
  amplitude[0] = Math.abs(dc);
  rms[0] = Math.abs(dc);
  phase[0] = dc < 0 ? Math.PI : 0;
  let sumSquares = dc * dc;
  let distortion = 0;
  for (let k = 1; k <= count; k++) {
    // x = A sin(kwt + p) = A cos p sin(kwt) + A sin p cos(kwt): A sin p = (2/T) int x cos, A cos p = (2/T) int x sin.
    const aCos = (2 * cre[k]!) / span;
    const aSin = (2 * cim[k]!) / span;
    amplitude[k] = Math.hypot(aCos, aSin);
    rms[k] = amplitude[k]! / Math.SQRT2;
    phase[k] = Math.atan2(aCos, aSin);
    sumSquares += rms[k]! * rms[k]!;
    if (k >= 2) distortion += rms[k]! * rms[k]!;
  }
  // Mean square of the same function the coefficients describe (the linear interpolant, exactly, or the
  // dense output), so that Parseval's identity holds to rounding as count grows.
  const meanSquare = (at !== undefined ? windowIntegral(t, x, a, b, square, at, points) : linearSquareIntegral(t, x, a, b)) / span;
  const totalRms = Math.sqrt(meanSquare);
  const residualRms = Math.sqrt(Math.max(0, meanSquare - sumSquares));
  const thd = rms[1]! > 0 ? Math.sqrt(distortion) / rms[1]! : Number.NaN;
  return { fundamental: f, from: a, to: b, dc, amplitude, rms, phase, totalRms, residualRms, thd };
}
