/**
 * Public types of the generic DAE solver. The solver knows nothing about
 * magnetics: it integrates M y' = f(t, y) with a constant, possibly singular
 * mass matrix M.
 *
 * Matrices are dense, row-major Float64Array of length n*n:
 * entry (i, j) is at index i*n + j.
 */

/**
 * Right-hand side f(t, y) of M y' = f(t, y), written into `out` (length n).
 * The function must not keep references to `y` or `out`; it may throw, in
 * which case the solver stops with status `'rhs-error'` and keeps all data.
 *
 * @example
 * ```ts
 * // Van der Pol oscillator, mu = 1000: y1' = y2, y2' = mu (1 - y1^2) y2 - y1
 * const rhs: RhsFunction = (_t, y, out) => {
 *   out[0] = y[1]!;
 *   out[1] = 1000 * (1 - y[0]! ** 2) * y[1]! - y[0]!;
 * };
 * ```
 */
export type RhsFunction = (t: number, y: Float64Array, out: Float64Array) => void;

/**
 * Analytic Jacobian df/dy at (t, y), written into `out` (row-major n*n).
 * `out` is zero-filled by the caller before each call, so a sparse stamp may
 * write only its non-zero entries.
 *
 * @example
 * ```ts
 * // Jacobian of the Van der Pol right-hand side above (n = 2, entry (i, j) at i*2 + j)
 * const jacobian: JacobianFunction = (_t, y, out) => {
 *   out[1] = 1;
 *   out[2] = -2000 * y[0]! * y[1]! - 1;
 *   out[3] = 1000 * (1 - y[0]! ** 2);
 * };
 * ```
 */
export type JacobianFunction = (t: number, y: Float64Array, out: Float64Array) => void;

/**
 * Where {@link DaeProblem.jacobianEntries} adds the entries of df/dy: entry
 * (row, col) += value. A negative row or column is ignored (a grounded
 * terminal); a position outside {@link DaeProblem.jacobianPattern} stops the
 * run with `'rhs-error'`.
 *
 * @example
 * ```ts
 * const entries: JacobianEntriesFunction = (_t, y, target) => {
 *   target.add(0, 1, 1);
 *   target.add(1, 0, -2000 * y[0]! * y[1]! - 1);
 *   target.add(1, 1, 1000 * (1 - y[0]! ** 2));
 * };
 * ```
 */
export interface JacobianEntryTarget {
  add(row: number, col: number, value: number): void;
}

/**
 * Analytic Jacobian df/dy at (t, y) given entry by entry into a
 * {@link JacobianEntryTarget} (entries at one position add up; the target
 * starts from zero at each call). With {@link DaeProblem.jacobianPattern} it
 * lets the sparse solver hold J on the pattern alone, with no n x n array.
 *
 * @example
 * ```ts
 * // Van der Pol (as the JacobianFunction example), entry by entry
 * const entries: JacobianEntriesFunction = (_t, y, target) => {
 *   target.add(0, 1, 1);
 *   target.add(1, 0, -2000 * y[0]! * y[1]! - 1);
 *   target.add(1, 1, 1000 * (1 - y[0]! ** 2));
 * };
 * ```
 */
export type JacobianEntriesFunction = (t: number, y: Float64Array, target: JacobianEntryTarget) => void;

/**
 * A mass matrix given either as row-major Float64Array (n*n) or as an array
 * of n rows of n numbers.
 *
 * @example
 * ```ts
 * // Two differential unknowns and one algebraic (a conservation law): both forms are the same matrix.
 * const rows: MassMatrixInput = [[1, 0, 0], [0, 1, 0], [0, 0, 0]];
 * const flat: MassMatrixInput = Float64Array.of(1, 0, 0, 0, 1, 0, 0, 0, 0);
 * ```
 */
export type MassMatrixInput = Float64Array | readonly (readonly number[])[];

/**
 * A mass matrix given by its non-zeros: entry k is M(rows[k], cols[k]) +=
 * values[k] (entries at one position add up, as in a
 * {@link JacobianEntryTarget}; positions not listed are zero). The three
 * arrays have one element per entry. For {@link DaeProblem.massEntries}.
 *
 * @example
 * ```ts
 * // The matrix of the MassMatrixInput example, [[1, 0, 0], [0, 1, 0], [0, 0, 0]], by its two non-zeros.
 * const entries: MassEntries = { rows: [0, 1], cols: [0, 1], values: [1, 1] };
 * ```
 */
export interface MassEntries {
  readonly rows: ArrayLike<number>;
  readonly cols: ArrayLike<number>;
  readonly values: ArrayLike<number>;
}

/**
 * An event function g(t, y) whose zero crossings the solver locates on its dense output.
 *
 * @example
 * ```ts
 * const overVoltage: DaeEvent = { name: 'v > 400', fn: (t, y) => y[3]! - 400, direction: 1, terminal: true };
 * ```
 */
export interface DaeEvent {
  /** Name used in the result and in messages. */
  readonly name?: string;
  /** The event function; a sign change between two accepted points is a crossing. */
  readonly fn: (t: number, y: Float64Array) => number;
  /** +1: only rising crossings (g goes from negative to positive); -1: only falling; 0 or absent: both. */
  readonly direction?: -1 | 0 | 1;
  /** Stop the integration at this event (status `'terminal-event'`). */
  readonly terminal?: boolean;
  /**
   * With `terminal`: the caller restarts from the state at this event (a
   * switch or diode changing state there), so that state must be
   * error-controlled. When the event is located inside a step [t0, t1], the
   * step is taken again from t0 with h = t* - t0 (an ordinary Radau step,
   * subdivided by the controller if rejected), and the event is reported at
   * the end of that step instead of at the step's dense output there (third
   * order, not error-controlled). Should the event function still have its
   * old sign at t* (the error-controlled trajectory crosses a little later),
   * a short step to the crossing follows. Costs about one step per event.
   * (Added field.)
   */
  readonly stepToEvent?: boolean;
}

/**
 * The initial value problem M y' = f(t, y), y(t0) = y0, on [t0, tEnd]. Pure data.
 *
 * The callbacks `rhs`, `jacobian` and `jacobianEntries` are called as
 * methods of this object (`problem.rhs(t, y, out)`): a class instance whose
 * methods read their state through `this` works as well as an object
 * literal of functions. A class keeps the solver's call sites on one
 * function from run to run (a closure made per run is a new call target
 * each time, which costs the next run in a process its optimised code).
 *
 * @example
 * ```ts
 * // RC low-pass: C v' = (u(t) - v)/R, u a 1 V step at t = 1 ms
 * const problem: DaeProblem = {
 *   size: 1, y0: [0], t0: 0, tEnd: 0.01, mass: [[1e-6]],
 *   rhs: (t, v, out) => { out[0] = ((t >= 1e-3 ? 1 : 0) - v[0]!) / 1e3; },
 *   jacobian: (t, v, J) => { J[0] = -1e-3; },
 *   breakpoints: [1e-3],
 * };
 * ```
 */
export interface DaeProblem {
  /** Number of unknowns n. */
  readonly size: number;
  /** Right-hand side f. */
  readonly rhs: RhsFunction;
  /** Analytic Jacobian df/dy. Without it the solver builds one by finite differences. */
  readonly jacobian?: JacobianFunction;
  /**
   * Constant mass matrix M (n*n); absent (and no {@link DaeProblem.massEntries})
   * means the identity (an ODE). May be singular.
   */
  readonly mass?: MassMatrixInput;
  /**
   * The same constant mass matrix given by its non-zeros instead of
   * {@link DaeProblem.mass} (give one of the two). The solver's set-up
   * (checks, recombination of dependent rows, null spaces) and the sparse
   * path then read only these entries, so no n x n array of M is made
   * there; the dense path builds M from them. Indices must lie in 0..n-1 and
   * values be finite. (Added field.)
   */
  readonly massEntries?: MassEntries;
  /** Initial state (length n). Algebraic components are made consistent at t0 unless disabled. */
  readonly y0: ArrayLike<number>;
  /** Start time. */
  readonly t0: number;
  /** End time (> t0). */
  readonly tEnd: number;
  /**
   * Times in (t0, tEnd) where f or one of its derivatives is discontinuous
   * (a source switching on, a switch opening). The solver lands exactly on
   * each and restarts there.
   */
  readonly breakpoints?: readonly number[];
  /** Event functions located on the dense output. */
  readonly events?: readonly DaeEvent[];
  /**
   * Indices of index-2 components (for example the voltage across a winding
   * whose current is forced by a current source). Their error estimate is
   * scaled by the step size, as in Hairer and Wanner, Solving ODEs II,
   * sect. VI.6 and the radau5 code.
   */
  readonly index2?: readonly number[];
  /**
   * Structural non-zeros of df/dy: entry k is (rows[k], cols[k]). With it
   * the iteration matrices are factored by the sparse LU (reordered band LU,
   * `sparse-lu.ts`) from {@link SPARSE_MIN_SIZE} unknowns on, or always with
   * `linearAlgebra: 'sparse'`. Every entry the Jacobian may ever make
   * non-zero must be listed; one outside it stops the run with
   * `'rhs-error'` naming the row. (Added field.)
   */
  readonly jacobianPattern?: { readonly rows: ArrayLike<number>; readonly cols: ArrayLike<number> };
  /**
   * The same Jacobian as {@link DaeProblem.jacobian}, entry by entry. Used
   * on the sparse path (with `jacobianPattern`): J is then held and formed
   * on the pattern alone, so memory and work per step grow with the number
   * of non-zeros, not n^2. Without it the sparse path evaluates the dense
   * Jacobian into an n x n scratch array and gathers it. (Added field.)
   */
  readonly jacobianEntries?: JacobianEntriesFunction;
}

/**
 * Size from which a problem with a {@link DaeProblem.jacobianPattern} is
 * solved with the sparse LU by default (chosen by `npm run bench`, section
 * "dense against sparse LU": below it the dense kernels are as fast).
 *
 * @example
 * ```ts
 * const sparse = problem.size >= SPARSE_MIN_SIZE;
 * ```
 */
export const SPARSE_MIN_SIZE = 32;

/**
 * Progress report passed to {@link SolveDaeOptions.onProgress}.
 *
 * @example
 * ```ts
 * solveDae(problem, { onProgress: (p: DaeProgress) => console.log(`${(100 * p.fraction).toFixed(0)} % at t = ${p.t}`) });
 * ```
 */
export interface DaeProgress {
  /** Time reached by the last accepted step. */
  readonly t: number;
  readonly t0: number;
  readonly tEnd: number;
  /** Fraction done, (t - t0)/(tEnd - t0). */
  readonly fraction: number;
  readonly acceptedSteps: number;
}

/**
 * Options of {@link solveDae} (and of {@link createDaeIntegrator}). All optional.
 *
 * @example
 * ```ts
 * const options: SolveDaeOptions = { rtol: 1e-8, atol: [1e-10, 1e-6], maxWallTimeMs: 5000, outputTimes: [0.001, 0.002] };
 * ```
 */
export interface SolveDaeOptions {
  /** Relative tolerance, scalar or per component. Default 1e-6. */
  readonly rtol?: number | ArrayLike<number>;
  /**
   * Absolute tolerance, scalar or per component. Default 1e-9 (in the error
   * test 1e-8 at every rtol: see {@link SolveDaeOptions.atolFollowsRtol}).
   */
  readonly atol?: number | ArrayLike<number>;
  /**
   * How the error test uses atol. The tolerances are mapped on entry as in
   * radau5: rtol' = 0.1 rtol^(2/3). With `true`, atol' = rtol' atol / rtol
   * (radau5: the ratio atol/rtol is kept, so atol' grows as rtol shrinks:
   * 46 atol at rtol 1e-8, 1000 atol at rtol 1e-12). With `false`, atol' =
   * 10 atol, the value the map gives at rtol = 1e-6, at every rtol: a tighter
   * rtol never loosens the absolute part. Default: `true` when `atol` is
   * given (the published radau5 behaviour), `false` for the default atol.
   * (Added field.)
   */
  readonly atolFollowsRtol?: boolean;
  /** First step size to try; default chosen from the problem. */
  readonly initialStep?: number;
  /** Largest step size allowed. Default tEnd - t0. */
  readonly maxStep?: number;
  /** Budget of accepted + rejected steps; status `'step-budget'` when exceeded. Default 1e6. */
  readonly maxSteps?: number;
  /** Wall-time budget in milliseconds; status `'time-budget'` when exceeded. */
  readonly maxWallTimeMs?: number;
  /** Cancellation; status `'aborted'` when signalled. */
  readonly signal?: AbortSignal;
  /** Called after accepted steps, at most every {@link progressIntervalMs}. */
  readonly onProgress?: (progress: DaeProgress) => void;
  /** Minimum wall time between two progress calls, ms. Default 200. */
  readonly progressIntervalMs?: number;
  /** Time tolerance for locating events. Default 1e-12 * max(1, |t|). */
  readonly eventTolerance?: number;
  /** Make algebraic components consistent at t0 by Newton's method. Default true. */
  readonly consistentInit?: boolean;
  /** Keep every step's interpolant so that `solution.at(t)` works anywhere in [t0, tReached]. Default true. */
  readonly denseOutput?: boolean;
  /** Extra output times, filled from the dense output (any order; returned sorted). */
  readonly outputTimes?: ArrayLike<number>;
  /**
   * Kernel behind the solver's linear-algebra interface: `'flat'` (default)
   * uses the allocation-free LU kernels on flat Float64Arrays (a real one and
   * a complex one); `'ml-matrix'` uses ml-matrix's LuDecomposition for the
   * real system and for the complex system embedded as a real 2n x 2n one.
   * Both give the same results to round-off; `npm run bench` compares them.
   * `'sparse'` uses the sparse LU on the problem's `jacobianPattern`
   * (required); by default a problem with a pattern and at least
   * {@link SPARSE_MIN_SIZE} unknowns uses it. (Added field.)
   */
  readonly linearAlgebra?: 'flat' | 'ml-matrix' | 'sparse';
}

/**
 * Outcome of a run.
 *
 * @example
 * ```ts
 * const status: DaeStatus = solveDae(problem).status;
 * if (status === 'step-budget') console.warn('raise maxSteps or loosen the tolerances');
 * ```
 *
 * - `'success'`: reached tEnd.
 * - `'terminal-event'`: a terminal event fired; `events` tells which.
 * - `'step-size-underflow'`: the step size fell below the round-off limit
 *   (common reasons: a singularity in f, an inconsistent or higher-index
 *   model, tolerances too tight for double precision).
 * - `'newton-failure'`: the collocation Newton iteration failed repeatedly
 *   even with a fresh Jacobian and smaller steps.
 * - `'singular-matrix'`: the iteration matrix (gamma/h M - J) is singular
 *   (common reasons: a floating part of the model, an unconstrained unknown).
 * - `'non-finite'`: f returned NaN or Infinity at the first evaluation of a step.
 * - `'rhs-error'`: f or the Jacobian threw.
 * - `'inconsistent-init'`: the algebraic equations could not be satisfied at t0.
 * - `'step-budget'`, `'time-budget'`, `'aborted'`: stopped by the caller's limits.
 */
export type DaeStatus =
  | 'success'
  | 'terminal-event'
  | 'step-size-underflow'
  | 'newton-failure'
  | 'singular-matrix'
  | 'non-finite'
  | 'rhs-error'
  | 'inconsistent-init'
  | 'step-budget'
  | 'time-budget'
  | 'aborted';

/**
 * Counts of the work done; every evaluation is counted.
 *
 * @example
 * ```ts
 * const { acceptedSteps, rejectedSteps, luFactorizations }: SolverStats = solveDae(problem).stats;
 * ```
 */
export interface SolverStats {
  acceptedSteps: number;
  rejectedSteps: number;
  /** Evaluations of f (including those for finite-difference Jacobians and consistent initialisation). */
  rhsEvaluations: number;
  /** Jacobian evaluations (analytic or finite-difference). */
  jacobianEvaluations: number;
  /** Factorisations of the iteration matrices (one real and one complex system count as one). */
  luFactorizations: number;
  /** Newton iterations on the collocation system. */
  newtonIterations: number;
  /** Newton iterations that failed to converge (each leads to a retry). */
  newtonFailures: number;
  /**
   * Steps that passed the error test but were taken again, shorter, to end
   * on an event marked {@link DaeEvent.stepToEvent} located inside them
   * (their work is counted in the other fields; they are not in
   * `acceptedSteps`). (Added field.)
   */
  retakenSteps: number;
}

/**
 * A located event.
 *
 * @example
 * ```ts
 * for (const e of solveDae(problem).events) console.log(`${e.name} at t = ${e.t}`);
 * ```
 */
export interface DaeEventRecord {
  /** Index in `problem.events`. */
  readonly index: number;
  readonly name: string;
  readonly t: number;
  readonly y: Float64Array;
}

/**
 * Where and why a run stopped early.
 *
 * @example
 * ```ts
 * const { failure } = solveDae(problem);
 * if (failure) console.warn(`stopped at t = ${failure.t}; components ${failure.components.join(', ')}`);
 * ```
 */
export interface DaeFailure {
  /** Time of the last accepted step (data up to here is valid). */
  readonly t: number;
  /** Step size being attempted when the run stopped. */
  readonly h: number;
  /** Components involved: largest in the error estimate, non-finite in f, or at a zero pivot. */
  readonly components: readonly number[];
  /** The error thrown by f, when status is `'rhs-error'`. */
  readonly cause?: unknown;
}

/**
 * Result of {@link solveDae}. Returned for every status: nothing computed is lost.
 *
 * @example
 * ```ts
 * const sol = solveDae(problem);
 * if (sol.status !== 'success') console.warn(sol.message, sol.failure);
 * const v = sol.component(0);        // at the accepted times sol.t
 * const mid = sol.at(0.005);         // dense output
 * ```
 */
export interface DaeSolution {
  readonly status: DaeStatus;
  /** One line a person can act on. */
  readonly message: string;
  /**
   * Accepted times, starting with t0 (after consistent initialisation). A
   * breakpoint where the algebraic unknowns jump (a source steps) appears
   * twice: the left limit, then the consistent right limit.
   */
  readonly t: Float64Array;
  /** States at `t`: y[k] is the state at t[k]. */
  readonly y: readonly Float64Array[];
  /** Last accepted time. */
  readonly tReached: number;
  /** Dense output: the state at any time in [t0, tReached]. Throws outside that range. */
  at(t: number): Float64Array;
  /** Time history of one component at the accepted times. */
  component(index: number): Float64Array;
  /** Located events in time order. */
  readonly events: readonly DaeEventRecord[];
  /** Requested `outputTimes` (sorted) and the states there, up to tReached. */
  readonly output: { readonly t: Float64Array; readonly y: readonly Float64Array[] };
  readonly stats: SolverStats;
  /** Present when status is neither `'success'` nor `'terminal-event'`. */
  readonly failure?: DaeFailure;
  /**
   * Differential components that consistent initialisation had to move
   * (beyond their tolerance) to meet a hidden constraint of an index-2
   * structure; absent when none moved.
   */
  readonly adjustedAtStart?: readonly number[];
}
