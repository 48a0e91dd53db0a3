import { InputError } from '../errors.js';
import { evaluateCollocation } from './collocation-polynomial.js';
import { createDaeIntegratorFromNormalized, type DaeStepInterpolant } from './dae-integrator.js';
import { normalizeDae } from './normalize-problem.js';
import { firstIndexAbove } from './sorted-search.js';
import { StateRows } from './state-rows.js';
import type { DaeEventRecord, DaeProblem, DaeSolution, SolveDaeOptions } from './types.js';

/**
 * Solve M y' = f(t, y), y(t0) = y0 on [t0, tEnd] with the Radau IIA method of
 * order 5 (Hairer and Wanner, Solving ODEs II, sect. IV.8): a thin loop over
 * {@link createDaeIntegrator} that collects the accepted points, the dense
 * output of every step, located events and the requested output times.
 *
 * A bad call (wrong lengths, non-finite y0, tEnd <= t0, negative tolerance,
 * badly shaped mass matrix, breakpoints outside the span...) throws an
 * {@link InputError}. Numerical outcomes never throw: the solution carries a
 * `status`, a one-line `message`, `failure` details, and all data up to the
 * last accepted step. See docs/solver.md.
 *
 * @example
 * ```ts
 * // Robertson's chemical kinetics as a DAE: M = diag(1, 1, 0), third row y1 + y2 + y3 = 1
 * const sol = solveDae(
 *   {
 *     size: 3,
 *     y0: [1, 0, 0],
 *     t0: 0,
 *     tEnd: 40,
 *     mass: [[1, 0, 0], [0, 1, 0], [0, 0, 0]],
 *     rhs: (t, y, out) => {
 *       out[0] = -0.04 * y[0]! + 1e4 * y[1]! * y[2]!;
 *       out[1] = 0.04 * y[0]! - 1e4 * y[1]! * y[2]! - 3e7 * y[1]! ** 2;
 *       out[2] = y[0]! + y[1]! + y[2]! - 1;
 *     },
 *   },
 *   { rtol: 1e-8, atol: 1e-12 },
 * );
 * if (sol.status !== 'success') console.error(sol.message);
 * console.log(sol.at(40), sol.stats);
 * ```
 */
export function solveDae(problem: DaeProblem, options: SolveDaeOptions = {}): DaeSolution {
  const p = normalizeDae(problem, options);
  const integ = createDaeIntegratorFromNormalized(p);
  // The times and states row after row (no typed array per step); sol.y makes the per-point views on first use.
  const ys = new StateRows(p.n);
  // The integrator writes each point (time, state) into the rows in place.
  ys.pushFrom(integ);
  const pieces: DaeStepInterpolant[] = [];
  const events: DaeEventRecord[] = [];
  const outT = p.outputTimes;
  const outY: Float64Array[] = [];
  let outK = 0;
  while (outK < outT.length && outT[outK]! <= integ.t) {
    outY.push(integ.y);
    outK++;
  }
  let lastProgress = p.onProgress ? performance.now() : 0;

  while (integ.status === 'running') {
    const r = integ.step();
    if (r.status !== 'accepted' && r.status !== 'terminal-event') break;
    // The step's polynomial only when something reads it (its arrays are copied for us per request).
    const step = p.denseOutput || (outK < outT.length && outT[outK]! <= integ.t) ? integ.interpolant! : undefined;
    // Share the previous point's array as the piece's yOld (same values): saves n numbers per step.
    const it: DaeStepInterpolant | undefined = step && { tOld: step.tOld, t: step.t, h: step.h, yOld: ys.row(ys.length - 1), q: step.q };
    if (r.jumpFrom) {
      // Re-initialised at a breakpoint: keep the left limit, then the right limit, at the same time.
      const left = new Float64Array(p.n + 1);
      left[0] = integ.t;
      left.set(r.jumpFrom, 1);
      ys.push(left);
      if (p.denseOutput) pieces.push(it!, { tOld: integ.t, t: integ.t, h: 1, yOld: integ.y, q: new Float64Array(3 * p.n) });
    } else if (p.denseOutput) {
      pieces.push(it!);
    }
    ys.pushFrom(integ);
    for (let k = 0; k < r.events.length; k++) events.push(r.events[k]!);
    while (outK < outT.length && outT[outK]! <= integ.t) {
      outY.push(evaluateCollocation(it!, outT[outK]!, new Float64Array(p.n)));
      outK++;
    }
    if (p.onProgress) {
      const now = performance.now();
      if (now - lastProgress >= p.progressIntervalMs) {
        lastProgress = now;
        p.onProgress({
          t: integ.t,
          t0: p.t0,
          tEnd: p.tEnd,
          fraction: (integ.t - p.t0) / (p.tEnd - p.t0),
          acceptedSteps: integ.stats.acceptedSteps,
        });
      }
    }
  }

  const status = integ.status === 'running' ? 'success' : integ.status;
  const tArr = ys.times();
  const tReached = tArr[tArr.length - 1]!;
  const n = p.n;
  const stats = integ.stats;
  const message = status === 'success' ? `reached tEnd = ${p.tEnd} in ${stats.acceptedSteps} steps` : integ.message;
  const failure = status === 'success' || status === 'terminal-event' ? undefined : integ.failure;

  let yRows: Float64Array[] | undefined;
  // at and component as methods, not arrows: under tsx every arrow made per solve is named by a property
  // definition (about half a microsecond each). Neither reads `this`.
  const solution: { -readonly [K in keyof DaeSolution]: DaeSolution[K] } = {
    status,
    message,
    t: tArr,
    get y(): Float64Array[] {
      if (!yRows) {
        yRows = new Array<Float64Array>(ys.length);
        for (let k = 0; k < ys.length; k++) yRows[k] = ys.row(k);
      }
      return yRows;
    },
    tReached,
    at(t: number): Float64Array {
      if (!(t >= p.t0 && t <= tReached)) {
        throw new InputError('outside-solution', `at(${t}): the solution covers [${p.t0}, ${tReached}]`, ['t']);
      }
      // Last index k with tArr[k] <= t (t >= t0 = tArr[0], so k >= 0).
      const lo = firstIndexAbove(tArr, t) - 1;
      if (tArr[lo] === t) return Float64Array.from(ys.row(lo));
      if (!p.denseOutput) {
        throw new InputError('no-dense-output', `at(${t}): run with denseOutput: true to evaluate between steps`, ['denseOutput']);
      }
      return evaluateCollocation(pieces[lo]!, t, new Float64Array(n));
    },
    component(index: number): Float64Array {
      if (!Number.isInteger(index) || index < 0 || index >= n) {
        throw new InputError('bad-component', `component(${index}): index must be an integer in 0..${n - 1}`, ['index']);
      }
      const out = new Float64Array(ys.length);
      for (let k = 0; k < ys.length; k++) out[k] = ys.get(k, index);
      return out;
    },
    events,
    output: { t: outT.slice(0, outY.length), y: outY },
    stats,
  };
  // Added last, as the spreads of optional fields placed them (no object made for a field left out).
  if (failure) solution.failure = failure;
  if (integ.adjustedAtStart.length) solution.adjustedAtStart = integ.adjustedAtStart;
  return solution;
}
