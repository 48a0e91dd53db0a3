import { KEEP_STEP_HIGH, KEEP_STEP_LOW, MAX_STEP_RATIO, MIN_STEP_RATIO, NEWTON_MAX_ITERATIONS, SAFETY } from './radau-tableau.js';

/**
 * Step-size control of radau5 (Hairer and Wanner II, sect. IV.8), as pure
 * functions of the error norm and the step history. Quotients are h / hNew,
 * bounded to [1/MAX_STEP_RATIO, 1/MIN_STEP_RATIO].
 */

function bounded(quot: number): number {
  return Math.max(1 / MAX_STEP_RATIO, Math.min(1 / MIN_STEP_RATIO, quot));
}

/**
 * radau5's proposal from the error norm: quot = err^(1/4)/fac with the
 * safety factor fac = min(SAFETY, SAFETY (1 + 2 nit)/(newt + 2 nit)) lowered
 * when Newton needed many iterations.
 *
 * @internal
 * @example
 * ```ts
 * const hNew = h / errorQuotient(err, newtonIterations);
 * ```
 */
export function errorQuotient(err: number, newtonIterations: number): number {
  const cfac = SAFETY * (1 + 2 * NEWTON_MAX_ITERATIONS);
  const fac = Math.min(SAFETY, cfac / (newtonIterations + 2 * NEWTON_MAX_ITERATIONS));
  return bounded(err ** 0.25 / fac);
}

/**
 * Gustafsson's predictive controller on an accepted step (book eq. IV.8.25):
 * the larger (more cautious) of `quot` and
 * (hAcc/h) (err^2/errAcc)^(1/4)/SAFETY, where hAcc and errAcc are the
 * previous accepted step and its error (NaN hAcc: no history, `quot` kept).
 *
 * @internal
 * @example
 * ```ts
 * quot = predictiveQuotient(quot, h, err, hAcc, errAcc);
 * ```
 */
export function predictiveQuotient(quot: number, h: number, err: number, hAcc: number, errAcc: number): number {
  if (Number.isNaN(hAcc)) return quot;
  const facgus = bounded(((hAcc / h) * (err * err / errAcc) ** 0.25) / SAFETY);
  return Math.max(quot, facgus);
}

/**
 * The step to try next after an accepted step of size h with proposal hNew:
 * h itself when the change is small (1 <= hNew/h <= 1.2) and the Jacobian is
 * kept, so that the LU factors survive (radau5's QUOT1/QUOT2); hNew otherwise.
 *
 * @internal
 * @example
 * ```ts
 * this.hCur = stepAfterAccept(h, Math.min(hNew, maxStep), recomputeJacobian);
 * ```
 */
export function stepAfterAccept(h: number, hNew: number, recomputeJacobian: boolean): number {
  const qt = hNew / h;
  return !recomputeJacobian && qt >= KEEP_STEP_LOW && qt <= KEEP_STEP_HIGH ? h : hNew;
}
