import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { InputError } from '../errors.js';

/**
 * A nonlinear least-squares problem: minimise cost(p) = 1/2 sum r_i(p)^2.
 *
 * @example
 * ```ts
 * // fit y = a exp(b x) to three points
 * const xs = [0, 1, 2];
 * const ys = [1, 2.7, 7.4];
 * const problem: LeastSquaresProblem = {
 *   residuals: (p) => Float64Array.from(xs, (x, i) => p[0]! * Math.exp(p[1]! * x) - ys[i]!),
 *   initial: [1, 1],
 * };
 * ```
 */
export interface LeastSquaresProblem {
  /**
   * Residual vector r(p), length m >= number of parameters. A non-finite
   * entry marks p as outside the model's domain: the step is rejected.
   */
  readonly residuals: (p: Float64Array) => Float64Array;
  /** Starting parameters. */
  readonly initial: readonly number[];
}

/**
 * Options of {@link levenbergMarquardt}; every field has a default.
 *
 * @example
 * ```ts
 * const options: LevenbergMarquardtOptions = { maxIterations: 100, stepTolerance: 1e-10 };
 * ```
 */
export interface LevenbergMarquardtOptions {
  /** Iteration budget (accepted or rejected steps). Default 500. */
  readonly maxIterations?: number;
  /** Initial damping lambda (relative to diag(J^T J)). Default 1e-3. */
  readonly initialDamping?: number;
  /**
   * Stop when the largest cosine between r and a column of J is below this
   * (the residual is orthogonal to the model's tangent space). Default 1e-12.
   */
  readonly gradientTolerance?: number;
  /** Stop when |step| <= tol (|p| + tol) (Euclidean norms). Default 1e-12. */
  readonly stepTolerance?: number;
  /** Relative step of the central-difference Jacobian. Default 1e-6. */
  readonly differenceStep?: number;
}

/**
 * Why {@link levenbergMarquardt} stopped.
 *
 * @example
 * ```ts
 * const ok = (s: LevenbergMarquardtStatus): boolean => s === 'gradient' || s === 'step';
 * ```
 */
export type LevenbergMarquardtStatus = 'gradient' | 'step' | 'no-descent' | 'max-iterations';

/**
 * Outcome of {@link levenbergMarquardt}.
 *
 * @example
 * ```ts
 * const r: LevenbergMarquardtResult = levenbergMarquardt({ residuals: (p) => Float64Array.of(p[0]! - 3), initial: [0] });
 * r.parameters[0]; // 3
 * ```
 */
export interface LevenbergMarquardtResult {
  /** Best parameters found. */
  readonly parameters: Float64Array;
  /** Residuals at those parameters. */
  readonly residuals: Float64Array;
  /** 1/2 sum r_i^2 at those parameters. */
  readonly cost: number;
  /** Iterations taken (each solves one damped system). */
  readonly iterations: number;
  /** Residual evaluations, Jacobian columns included. */
  readonly evaluations: number;
  /**
   * 'gradient' or 'step': converged; 'no-descent': no step reduced the cost
   * even with very large damping (a minimum to rounding, or a model that
   * is undefined around p); 'max-iterations': budget used up.
   */
  readonly status: LevenbergMarquardtStatus;
  /** True for 'gradient' and 'step'. */
  readonly converged: boolean;
}

const MAX_DAMPING = 1e20;

/**
 * Levenberg-Marquardt least squares, small and dense.
 *
 * Method: K. Levenberg, "A method for the solution of certain non-linear
 * problems in least squares", Quarterly of Applied Mathematics 2 (1944)
 * 164-168; D. W. Marquardt, "An algorithm for least-squares estimation of
 * nonlinear parameters", J. SIAM 11(2) (1963) 431-441 (citations from
 * memory). Each iteration solves (J^T J + lambda D) delta = -J^T r with
 * D = diag(J^T J) (Marquardt's scaling, so the damping does not depend on
 * the parameters' units) by Cholesky (ml-matrix); a step that lowers the
 * cost is accepted and lambda divided by 10, otherwise lambda is multiplied
 * by 10 and the system re-solved (Marquardt's original strategy). The
 * Jacobian is formed by central differences. Stopping tests follow MINPACK's
 * lmdif in spirit (J. J. More et al., 1980): gradient orthogonality and
 * relative step size.
 *
 * @example
 * ```ts
 * // Rosenbrock as least squares: r = (10 (p1 - p0^2), 1 - p0), minimum (1, 1)
 * const fit = levenbergMarquardt({
 *   residuals: (p) => Float64Array.of(10 * (p[1]! - p[0]! ** 2), 1 - p[0]!),
 *   initial: [-1.2, 1],
 * });
 * fit.parameters; // ~ [1, 1]
 * ```
 */
export function levenbergMarquardt(
  problem: LeastSquaresProblem,
  options: LevenbergMarquardtOptions = {},
): LevenbergMarquardtResult {
  const maxIterations = options.maxIterations ?? 500;
  const gtol = options.gradientTolerance ?? 1e-12;
  const xtol = options.stepTolerance ?? 1e-12;
  const fdStep = options.differenceStep ?? 1e-6;
  let lambda = options.initialDamping ?? 1e-3;
  let p = Float64Array.from(problem.initial);
  let r = problem.residuals(p);
  let evaluations = 1;
  if (!allFinite(r) || !allFinite(p)) {
    throw new InputError(
      'fit-bad-start',
      'least squares: the residuals at the starting parameters are not finite; give a starting point inside the model\'s domain',
      ['initial'],
    );
  }
  let cost = halfSquaredNorm(r);
  const n = p.length;
  let iterations = 0;
  let status: LevenbergMarquardtStatus = 'max-iterations';
  outer: while (iterations < maxIterations) {
    if (cost === 0) {
      status = 'gradient';
      break;
    }
    const jac = centralJacobian(problem.residuals, p, r, fdStep);
    evaluations += 2 * n;
    const { a, g } = normalEquations(jac, r);
    if (gradientCosine(a, g, cost) <= gtol) {
      status = 'gradient';
      break;
    }
    for (;;) {
      iterations++;
      const delta = dampedStep(a, g, lambda);
      if (delta !== undefined) {
        const trial = p.map((v, j) => v + (delta[j] as number));
        const rt = problem.residuals(trial);
        evaluations++;
        const ct = allFinite(rt) ? halfSquaredNorm(rt) : Infinity;
        if (ct < cost) {
          const small = norm(delta) <= xtol * (norm(p) + xtol);
          p = trial;
          r = rt;
          cost = ct;
          lambda = Math.max(lambda / 10, 1e-15);
          if (small) {
            status = 'step';
            break outer;
          }
          break;
        }
        if (norm(delta) <= xtol * (norm(p) + xtol)) {
          status = 'step';
          break outer;
        }
      }
      lambda *= 10;
      if (lambda > MAX_DAMPING) {
        status = 'no-descent';
        break outer;
      }
      if (iterations >= maxIterations) break outer;
    }
  }
  return {
    parameters: p,
    residuals: r,
    cost,
    iterations,
    evaluations,
    status,
    converged: status === 'gradient' || status === 'step',
  };
}

function allFinite(v: ArrayLike<number>): boolean {
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i] as number)) return false;
  return true;
}

function halfSquaredNorm(v: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += (v[i] as number) ** 2;
  return 0.5 * s;
}

function norm(v: ArrayLike<number>): number {
  return Math.sqrt(2 * halfSquaredNorm(v));
}

/**
 * Central-difference Jacobian (m x n as rows of columns: jac[j][i] =
 * d r_i / d p_j), step fdStep * |p_j| (fdStep if p_j = 0); one-sided where
 * one neighbour is outside the model's domain.
 */
function centralJacobian(
  f: (p: Float64Array) => Float64Array,
  p: Float64Array,
  r: Float64Array,
  fdStep: number,
): Float64Array[] {
  const cols: Float64Array[] = [];
  for (let j = 0; j < p.length; j++) {
    const pj = p[j] as number;
    const h = fdStep * (pj !== 0 ? Math.abs(pj) : 1);
    const up = Float64Array.from(p);
    const down = Float64Array.from(p);
    up[j] = pj + h;
    down[j] = pj - h;
    const ru = f(up);
    const rd = f(down);
    const okU = allFinite(ru);
    const okD = allFinite(rd);
    const hi = okU ? ru : r;
    const lo = okD ? rd : r;
    const span = (okU ? (up[j] as number) : pj) - (okD ? (down[j] as number) : pj);
    const col = new Float64Array(r.length);
    if (span > 0) for (let i = 0; i < r.length; i++) col[i] = ((hi[i] as number) - (lo[i] as number)) / span;
    cols.push(col);
  }
  return cols;
}

/** A = J^T J (symmetric by construction) and g = J^T r. */
function normalEquations(cols: Float64Array[], r: Float64Array): { a: Float64Array[]; g: Float64Array } {
  const n = cols.length;
  const a = Array.from({ length: n }, () => new Float64Array(n));
  const g = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const cj = cols[j] as Float64Array;
    g[j] = dot(cj, r);
    for (let k = 0; k <= j; k++) {
      const v = dot(cj, cols[k] as Float64Array);
      (a[j] as Float64Array)[k] = v;
      (a[k] as Float64Array)[j] = v;
    }
  }
  return { a, g };
}

function dot(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += (x[i] as number) * (y[i] as number);
  return s;
}

/** max_j |g_j| / (|J_j| |r|): 0 when r is orthogonal to every column of J. */
function gradientCosine(a: Float64Array[], g: Float64Array, cost: number): number {
  const rnorm = Math.sqrt(2 * cost);
  let worst = 0;
  for (let j = 0; j < g.length; j++) {
    const cn = Math.sqrt((a[j] as Float64Array)[j] as number);
    if (cn > 0) worst = Math.max(worst, Math.abs(g[j] as number) / (cn * rnorm));
  }
  return worst;
}

/** Solve (A + lambda diag(A)) delta = -g; undefined if not positive definite. */
function dampedStep(a: Float64Array[], g: Float64Array, lambda: number): Float64Array | undefined {
  const n = g.length;
  const m = new Matrix(n, n);
  for (let j = 0; j < n; j++) {
    for (let k = 0; k < n; k++) m.set(j, k, (a[j] as Float64Array)[k] as number);
    const ajj = (a[j] as Float64Array)[j] as number;
    m.set(j, j, ajj + lambda * (ajj > 0 ? ajj : 1));
  }
  const chol = new CholeskyDecomposition(m);
  if (!chol.isPositiveDefinite()) return undefined;
  const rhs = Matrix.columnVector(Array.from(g, (v) => -v));
  const x = chol.solve(rhs);
  const delta = new Float64Array(n);
  for (let j = 0; j < n; j++) delta[j] = x.get(j, 0);
  return allFinite(delta) ? delta : undefined;
}
