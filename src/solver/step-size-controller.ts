import { KEEP_STEP_HIGH, KEEP_STEP_LOW, MAX_STEP_RATIO, MIN_STEP_RATIO, NEWTON_MAX_ITERATIONS, SAFETY } from './radau-tableau.js';

/**
 * Step-size control of radau5 (Hairer and Wanner II, sect. IV.8), as pure
 * functions of the error norm and the step history. Quotients are h / hNew,
 * bounded to [1/MAX_STEP_RATIO, 1/MIN_STEP_RATIO].
 */

/** Bounds of a quotient h / hNew. */
const QUOT_LOW = 1 / MAX_STEP_RATIO;
const QUOT_HIGH = 1 / MIN_STEP_RATIO;

function bounded(quot: number): number {
  return Math.max(QUOT_LOW, Math.min(QUOT_HIGH, quot));
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
  const fac = safetyFactor(newtonIterations);
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

/**
 * An accepted step as the controller reads it, in one record the integrator
 * rewrites per step (numbers passed to, or returned from, a call that is not
 * inlined are boxed on the heap: half a dozen per step), with the next step
 * size written back into `hNext` by {@link nextStepSize}.
 *
 * @internal
 * @example
 * ```ts
 * const s: AcceptedStep = { h: 0.1, err: 0.3, hAcc: NaN, errAcc: NaN, maxStep: 1, newtonIterations: 2, rejected: false, recomputeJacobian: false, hNext: 0 };
 * ```
 */
export interface AcceptedStep {
  h: number;
  /** Its error norm (below 1). */
  err: number;
  /** The previous accepted step and its error (NaN hAcc: no history). */
  hAcc: number;
  errAcc: number;
  maxStep: number;
  newtonIterations: number;
  /** Whether an attempt of this step was rejected before. */
  rejected: boolean;
  /** Whether the Jacobian is evaluated afresh for the next step. */
  recomputeJacobian: boolean;
  /** Out: the step size to try next. */
  hNext: number;
}

/**
 * radau5's next step size after an accepted step (into `s.hNext`): the
 * proposal h / max({@link errorQuotient}, {@link predictiveQuotient}) capped
 * by maxStep and, after a rejection, by h; then {@link stepAfterAccept}.
 * Both quotients are first taken with fourth roots by square roots (a few
 * ulp from the powers): when the screen of {@link surelyKeepsStep} says h
 * is kept, h without the powers; otherwise only the power of the quotient
 * that is surely the larger is taken (the maximum is that quotient, exactly),
 * both when the two lie too close to tell.
 *
 * @internal
 * @example
 * ```ts
 * nextStepSize(s);
 * this.hCur = s.hNext;
 * ```
 */
export function nextStepSize(s: AcceptedStep): void {
  const h = s.h;
  const err = s.err;
  const hAcc = s.hAcc;
  const errAcc = s.errAcc;
  const fac = safetyFactor(s.newtonIterations);
  const history = !Number.isNaN(hAcc);
  // The bounds of `bounded` written out here and below: a number passed to (or returned from) a call
  // that is not inlined is boxed on the heap, and not every call site here was inlined.
  const rootErr = Math.max(QUOT_LOW, Math.min(QUOT_HIGH, Math.sqrt(Math.sqrt(err)) / fac));
  const rootGus = history ? Math.max(QUOT_LOW, Math.min(QUOT_HIGH, ((hAcc / h) * Math.sqrt(Math.sqrt((err * err) / errAcc))) / SAFETY)) : 0;
  if (!s.recomputeJacobian && keepsStepAt(s, Math.max(rootErr, rootGus))) {
    s.hNext = h;
    return;
  }
  // The quotients of errorQuotient and predictiveQuotient, the same expressions; the power of one
  // that is surely the smaller is not taken.
  const errSurelyLarger = !history || rootErr > rootGus * (1 + KEEP_MARGIN);
  const gusSurelyLarger = history && rootGus > rootErr * (1 + KEEP_MARGIN);
  const qErr = gusSurelyLarger ? 0 : Math.max(QUOT_LOW, Math.min(QUOT_HIGH, err ** 0.25 / fac));
  const qGus = errSurelyLarger ? 0 : Math.max(QUOT_LOW, Math.min(QUOT_HIGH, ((hAcc / h) * (err * err / errAcc) ** 0.25) / SAFETY));
  const quot = errSurelyLarger ? qErr : gusSurelyLarger ? qGus : Math.max(qErr, qGus);
  let hNew = h / quot;
  hNew = Math.min(hNew, s.maxStep);
  if (s.rejected) hNew = Math.min(hNew, h);
  s.hNext = stepAfterAccept(h, hNew, s.recomputeJacobian);
}

/** radau5's safety factor FAC, lowered when Newton needed many iterations (see {@link errorQuotient}). */
function safetyFactor(newtonIterations: number): number {
  const cfac = SAFETY * (1 + 2 * NEWTON_MAX_ITERATIONS);
  return Math.min(SAFETY, cfac / (newtonIterations + 2 * NEWTON_MAX_ITERATIONS));
}

/** Relative margin around the keep band: far above the few ulp between a fourth root by square roots and by the power. */
const KEEP_MARGIN = 1e-12;

/**
 * Whether the proposal after the accepted step `s` surely lies in the keep
 * band of {@link stepAfterAccept} (1 <= hNew/h <= 1.2), decided with fourth
 * roots by two square roots instead of the powers of {@link errorQuotient}
 * and {@link predictiveQuotient}: the two differ by a few ulp, and every
 * step of the proposal (the bounds, the larger quotient, h / quot, the caps
 * by maxStep and, after a rejection, by h) is monotone, so when the proposal
 * with the quotient moved by a margin far above that either way still lies
 * inside the band, the exact one does too. False when it cannot decide (the
 * caller then takes the powers): about a third of the steps keep h, and the
 * powers were a tenth of a small problem's time per step.
 *
 * @internal
 * @example
 * ```ts
 * if (!s.recomputeJacobian && surelyKeepsStep(s)) hNext = s.h;
 * ```
 */
export function surelyKeepsStep(s: Omit<AcceptedStep, 'recomputeJacobian' | 'hNext'>): boolean {
  const { h, err, hAcc, errAcc } = s;
  const fac = safetyFactor(s.newtonIterations);
  let quot = bounded(Math.sqrt(Math.sqrt(err)) / fac);
  if (!Number.isNaN(hAcc)) quot = Math.max(quot, bounded(((hAcc / h) * Math.sqrt(Math.sqrt((err * err) / errAcc))) / SAFETY));
  return keepsStepAt(s, quot);
}

/** The band test of {@link surelyKeepsStep} for its quotient by square roots. */
function keepsStepAt(s: Omit<AcceptedStep, 'recomputeJacobian' | 'hNext'>, quot: number): boolean {
  const { h, maxStep, rejected } = s;
  const lowest = capped(h, h / (quot * (1 + KEEP_MARGIN)), maxStep, rejected);
  const highest = capped(h, h / (quot * (1 - KEEP_MARGIN)), maxStep, rejected);
  if (lowest === highest) {
    // A cap decided (maxStep, or h after a rejection): the exact proposal is capped to the same number.
    const qt = lowest / h;
    return qt >= KEEP_STEP_LOW && qt <= KEEP_STEP_HIGH;
  }
  const qLow = lowest / h;
  const qHigh = highest / h;
  return qLow >= KEEP_STEP_LOW * (1 + KEEP_MARGIN) && qHigh <= KEEP_STEP_HIGH * (1 - KEEP_MARGIN);
}

/** The proposal hNew capped as on acceptance: by maxStep, and by h after a rejection. */
function capped(h: number, hNew: number, maxStep: number, rejected: boolean): number {
  const c = Math.min(hNew, maxStep);
  return rejected ? Math.min(c, h) : c;
}
