import { consistentDerivative, makeConsistent, massSpaces } from './consistent-initialization.js';
import { finiteDifferenceJacobian } from './finite-difference-jacobian.js';
import { normalizeDae } from './normalize-problem.js';
import type { DaeProblem, SolveDaeOptions } from './types.js';
import { errorScale } from './weighted-norm.js';

/**
 * Result of {@link consistentInitialValues}.
 *
 * @example
 * ```ts
 * const init = consistentInitialValues(problem);
 * if (!init.ok) throw new Error(init.message);
 * console.log(init.y0, init.yp0);
 * ```
 */
export interface ConsistentInitialValues {
  /** True when y0 was made (or found) consistent. */
  readonly ok: boolean;
  /** Consistent y(t0): y0 moved only along the null space of M. */
  readonly y0: Float64Array;
  /**
   * Consistent y'(t0) for an index-1 problem (M y' = f and the differentiated
   * algebraic equations); undefined when that system is singular (index 2)
   * or when `ok` is false.
   */
  readonly yp0: Float64Array | undefined;
  /** Empty when ok; otherwise why not. */
  readonly message: string;
  /** Components involved when not ok. */
  readonly components: readonly number[];
}

/**
 * Consistent initial values of M y' = f(t, y) at t0, as {@link solveDae}
 * computes them before integrating: Newton's method on W^T f(t0, y0 + V z) = 0
 * with W, V spanning the left and right null spaces of M (valid for
 * non-diagonal singular M), then y'(t0) from M y' = f together with the
 * algebraic equations differentiated once (Brenan, Campbell and Petzold,
 * Numerical Solution of IVPs in DAEs, sect. 5.3); df/dt by a forward
 * difference with step sqrt(uround) max(|t0|, tEnd - t0). Uses the problem's
 * Jacobian, or finite differences. The tolerances (`rtol`, `atol`) set the
 * convergence test.
 *
 * @example
 * ```ts
 * // 0 = y2 - 2 y1 with y2 given wrongly: y2 is corrected to 2, y' = (-1, -2)
 * const init = consistentInitialValues({
 *   size: 2, y0: [1, 5], t0: 0, tEnd: 1, mass: [[1, 0], [0, 0]],
 *   rhs: (t, y, out) => { out[0] = -y[0]!; out[1] = y[1]! - 2 * y[0]!; },
 * });
 * console.log(init.y0, init.yp0);
 * ```
 */
export function consistentInitialValues(problem: DaeProblem, options: SolveDaeOptions = {}): ConsistentInitialValues {
  const p = normalizeDae(problem, options);
  const n = p.n;
  const y = Float64Array.from(p.y0);
  const rhs = (t: number, yy: Float64Array, out: Float64Array): void => p.rhs(t, yy, out);
  const jacobian = (t: number, yy: Float64Array, f: Float64Array, out: Float64Array): void => {
    if (p.jacobian) {
      out.fill(0);
      p.jacobian(t, yy, out);
    } else {
      finiteDifferenceJacobian(p.rhs, t, yy, f, out);
    }
  };
  if (!p.mass) {
    const f = new Float64Array(n);
    rhs(p.t0, y, f);
    return { ok: true, y0: y, yp0: f, message: '', components: [] };
  }
  const spaces = massSpaces(p.mass, n);
  const ctx = { n, spaces, rhs, jacobian, scale: errorScale(y, p.rtol, p.atol, new Float64Array(n)) };
  const res = makeConsistent(ctx, p.t0, y);
  if (!res.ok) return { ok: false, y0: y, yp0: undefined, message: res.message, components: res.components };
  const dt = Math.sqrt(Number.EPSILON / 2) * Math.max(Math.abs(p.t0), p.tEnd - p.t0);
  const yp0 = consistentDerivative(ctx, p.denseMass()!, p.t0, dt, y);
  return { ok: true, y0: y, yp0, message: '', components: [] };
}
