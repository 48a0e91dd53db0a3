import { collocationComponent, evaluateCollocation } from '../solver/collocation-polynomial.js';
import { C1, C2, C3 } from '../solver/radau-tableau.js';

/**
 * One accepted step of a run: the collocation polynomial of Radau IIA
 * (Hairer and Wanner II, sect. IV.8, dense output),
 * u(tOld + s h) = yOld + sum_k q[k n + i] s^(k+1), valid on [tOld, t].
 */
export interface RecordedStep {
  readonly tOld: number;
  readonly t: number;
  readonly h: number;
  readonly yOld: Float64Array;
  readonly q: Float64Array;
  /** Index of the input interval the step belongs to. */
  readonly interval: number;
  /** The first step after a (re)start, whose yOld may hold inconsistent index-2 values. */
  readonly firstAfterStart: boolean;
}

const cubic = collocationComponent;

/** Quadratic through the stage values (c_k, Y_k) of component i, evaluated at s. */
function stageQuadratic(step: RecordedStep, s: number, i: number): number {
  const y1 = cubic(step, C1, i);
  const y2 = cubic(step, C2, i);
  const y3 = cubic(step, C3, i);
  const l1 = ((s - C2) * (s - C3)) / ((C1 - C2) * (C1 - C3));
  const l2 = ((s - C1) * (s - C3)) / ((C2 - C1) * (C2 - C3));
  const l3 = ((s - C1) * (s - C2)) / ((C3 - C1) * (C3 - C2));
  return l1 * y1 + l2 * y2 + l3 * y3;
}

/**
 * The state at time t in [tOld, t] of a step. In the first step after a
 * (re)start the index-2 unknowns are taken from the quadratic through the
 * stage values instead: the stages satisfy the algebraic equations, the
 * start value of an index-2 unknown generally does not (the index-1
 * initialisation cannot determine it), and the cubic through it would carry
 * that error into the step.
 */
export function evaluateRecordedStep(step: RecordedStep, t: number, index2: readonly number[], out?: Float64Array): Float64Array {
  const y = evaluateCollocation(step, t, out ?? new Float64Array(step.yOld.length));
  if (step.firstAfterStart) {
    const s = (t - step.tOld) / step.h;
    for (const i of index2) y[i] = stageQuadratic(step, s, i);
  }
  return y;
}

/** The step's start state with its index-2 unknowns extrapolated from the stages (s = 0). */
export function stageExtrapolation(step: RecordedStep, index2: readonly number[]): Float64Array {
  const y = step.yOld.slice();
  for (const i of index2) y[i] = stageQuadratic(step, 0, i);
  return y;
}
