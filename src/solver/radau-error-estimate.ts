import type { CollocationStep, CollocationSystem } from './collocation-newton.js';
import { stepErrorNorm, type DependentError } from './dependent-error.js';
import type { RealLinearSolver } from './linear-solver.js';
import { packedDoubles } from './packed-doubles.js';
import { E1, E2, E3 } from './radau-tableau.js';
import { weightedRmsNorm } from './weighted-norm.js';

/**
 * Work arrays of {@link radauErrorEstimate} (each of length n), allocated once.
 *
 * @internal
 * @example
 * ```ts
 * const work: ErrorEstimateWork = { err: new Float64Array(n), mz: packedDoubles(n), ez: packedDoubles(n), ys: new Float64Array(n), fy: new Float64Array(n) };
 * ```
 */
export interface ErrorEstimateWork {
  /** The error vector (out): the components behind a rejection are read from it. */
  readonly err: Float64Array;
  /** M (e . Z)/h (not written when M is the identity: (e . Z)/h is read instead). */
  readonly mz: number[];
  /** (e . Z)/h. */
  readonly ez: number[];
  /** y + err, for the refined estimate. */
  readonly ys: Float64Array;
  /** f(t, y + err). */
  readonly fy: Float64Array;
}

/** The work arrays of {@link radauErrorEstimate} from `take`, as a class (one map: see the collocation work arrays). */
export class ErrorEstimateArrays implements ErrorEstimateWork {
  readonly err: Float64Array;
  readonly mz: number[];
  readonly ez: number[];
  readonly ys: Float64Array;
  readonly fy: Float64Array;

  constructor(n: number, take: (length: number) => Float64Array) {
    this.err = take(n);
    this.mz = packedDoubles(n);
    this.ez = packedDoubles(n);
    this.ys = take(n);
    this.fy = take(n);
  }
}

/**
 * The embedded error estimate of Radau IIA with a mass matrix (Hairer and
 * Wanner II, sect. IV.8, eq. 8.19-8.20; radau5's ESTRAD):
 * err = ((gamma/h) M - J)^-1 (f(t, y) + M (e1 Z1 + e2 Z2 + e3 Z3)/h), with the
 * real iteration matrix already factored in `luReal`. When `refine` is true
 * (first step, or after a rejection) and ||err|| >= 1, the estimate is
 * recomputed once with f(t, y + err), which filters the stiff components
 * (radau5). Writes ||err|| in the weighted RMS norm, at least 1e-10 and 1e10
 * for a non-finite value, into `at.err`; the error vector is left in `work.err`.
 * With `sys.dependentError` the norm also takes the unknowns that follow
 * from the state (see {@link DependentError}).
 *
 * Shapes: y, f0 = f(t, y), scale (n); z (3n), stage k at [k n, k n + n).
 * The step's t and h are read from `at`, and the norm written there, not
 * returned: numbers passed to, or returned from, a call that is not inlined
 * are boxed on the heap.
 *
 * @internal
 * @example
 * ```ts
 * radauErrorEstimate(sys, luReal, work, at, y, f0, z, scale, first || rejected);
 * if (at.err >= 1) reject();
 * ```
 */
export function radauErrorEstimate(
  sys: Pick<CollocationSystem, 'rhs' | 'multiplyMass' | 'identityMass'> & { readonly dependentError?: DependentError | undefined },
  luReal: RealLinearSolver,
  work: ErrorEstimateWork,
  at: Pick<CollocationStep, 't' | 'h'> & { err: number },
  y: Float64Array,
  f0: Float64Array,
  z: number[],
  scale: Float64Array,
  refine: boolean,
): void {
  const n = y.length;
  const t = at.t;
  const h = at.h;
  const { err: errv, mz, ez } = work;
  const hee1 = E1 / h;
  const hee2 = E2 / h;
  const hee3 = E3 / h;
  for (let i = 0; i < n; i++) ez[i] = hee1 * z[i]! + hee2 * z[n + i]! + hee3 * z[2 * n + i]!;
  // M (e . Z)/h: (e . Z)/h itself when M is the identity (read in place, not copied).
  let me = ez;
  if (sys.identityMass !== true) {
    sys.multiplyMass(ez, 0, mz);
    me = mz;
  }
  for (let i = 0; i < n; i++) errv[i] = f0[i]! + me[i]!;
  luReal.solve(errv);
  const dependent = sys.dependentError;
  let err = Math.max(dependent === undefined ? weightedRmsNorm(errv, scale) : stepErrorNorm(at, y, errv, scale, dependent), 1e-10);
  if (err >= 1 && refine) {
    const { ys, fy } = work;
    for (let i = 0; i < n; i++) ys[i] = y[i]! + errv[i]!;
    sys.rhs(t, ys, fy);
    for (let i = 0; i < n; i++) errv[i] = fy[i]! + me[i]!;
    luReal.solve(errv);
    err = Math.max(dependent === undefined ? weightedRmsNorm(errv, scale) : stepErrorNorm(at, y, errv, scale, dependent), 1e-10);
  }
  at.err = Number.isFinite(err) ? err : 1e10;
}
