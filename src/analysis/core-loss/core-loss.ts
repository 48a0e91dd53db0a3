import { InputError } from '../../errors.js';
import { igseLossDensity, periodWindow } from './igse-loss-density.js';
import { steinmetzLossDensity } from './steinmetz.js';
import type { SteinmetzCoefficients } from './steinmetz-coefficients.js';

/**
 * One flux tube for {@link coreLoss}.
 *
 * @example
 * ```ts
 * const leg: CoreLossTube = { name: 'leg', b: bLeg, volume: 12e-6 };
 * ```
 */
export interface CoreLossTube {
  /** Name of the flux tube. */
  readonly name: string;
  /** Flux density samples, T, on the shared time grid. */
  readonly b: ArrayLike<number>;
  /** Volume of the tube, m^3 (> 0). */
  readonly volume: number;
  /** Coefficients of this tube's material; default: the options' coefficients. */
  readonly coefficients?: SteinmetzCoefficients;
}

/**
 * Options of {@link coreLoss}.
 *
 * @example
 * ```ts
 * coreLoss(t, tubes, { period: 10e-6, start: 0.99e-3, coefficients: { k: 1.5, alpha: 1.4, beta: 2.6 } });
 * ```
 */
export interface CoreLossOptions {
  /** Period T of the steady state, s. */
  readonly period: number;
  /** Start of the period to evaluate, s. Default: the first sample time. */
  readonly start?: number;
  /** Coefficients for tubes that give none. */
  readonly coefficients?: SteinmetzCoefficients;
  /**
   * `'igse'` (default): any periodic waveform. `'steinmetz'`: the
   * sinusoidal formula with f = 1/T and B_peak = dB_pp / 2 (correct only for
   * sinusoidal flux; kept for comparison).
   */
  readonly method?: 'igse' | 'steinmetz';
}

/**
 * Core loss of one flux tube.
 *
 * @example
 * ```ts
 * for (const tube of coreLoss(t, tubes, options).tubes) console.log(tube.name, tube.loss, 'W');
 * ```
 */
export interface TubeCoreLoss {
  readonly name: string;
  /** Loss per unit volume, W/m^3. */
  readonly lossDensity: number;
  /** Loss, W (lossDensity * volume). */
  readonly loss: number;
  /** Peak-to-peak flux density over the period, T. */
  readonly peakToPeak: number;
}

/**
 * Core loss per tube and in total.
 *
 * @example
 * ```ts
 * const { tubes: perTube, total } = coreLoss(t, tubes, options);
 * ```
 */
export interface CoreLoss {
  readonly tubes: readonly TubeCoreLoss[];
  /** Sum over the tubes, W. */
  readonly total: number;
}

/**
 * Core loss of every flux tube over one period of steady state, from each
 * tube's flux density series and volume, by the iGSE (default) or the
 * sinusoidal Steinmetz equation, and the total. Post-processing only: the
 * loss does not act back on the simulated waveforms. See
 * {@link igseLossDensity} for the assumptions (a single major loop per
 * period, coefficients used within their fitted range).
 *
 * @example
 * ```ts
 * const loss = coreLoss(result.t, [
 *   { name: 'leg', b: bLeg, volume: 12e-6 },
 *   { name: 'yoke', b: bYoke, volume: 8e-6 },
 * ], { period: 1e-5, start: 0.99e-3, coefficients: { k: 1.5, alpha: 1.4, beta: 2.6 } });
 * loss.total; // W
 * ```
 */
export function coreLoss(t: ArrayLike<number>, tubes: readonly CoreLossTube[], options: CoreLossOptions): CoreLoss {
  const method = options.method ?? 'igse';
  if (method !== 'igse' && method !== 'steinmetz') {
    throw new InputError('bad-option', `coreLoss: method "${String(method)}" is not 'igse' or 'steinmetz'`, []);
  }
  const out: TubeCoreLoss[] = [];
  let total = 0;
  for (const tube of tubes) {
    const { name, volume } = tube;
    const c = tube.coefficients ?? options.coefficients;
    if (c === undefined) {
      throw new InputError('bad-loss-coefficients', `${name}: no Steinmetz coefficients; give them on the tube or in the options`, [name]);
    }
    if (!Number.isFinite(volume) || volume <= 0) {
      throw new InputError('bad-option', `${name}: volume ${volume} m^3 must be positive and finite`, [name]);
    }
    const window = { period: options.period, ...(options.start !== undefined ? { start: options.start } : {}), name };
    const { peakToPeak } = periodWindow(t, tube.b, window, name);
    const lossDensity =
      method === 'igse' ? igseLossDensity(c, t, tube.b, window) : steinmetzLossDensity(c, 1 / options.period, peakToPeak / 2, name);
    const loss = lossDensity * volume;
    out.push({ name, lossDensity, loss, peakToPeak });
    total += loss;
  }
  return { tubes: out, total };
}
