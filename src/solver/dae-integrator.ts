import { InputError } from '../errors.js';
import { createCollocationWork, createNewtonOutcome, NEWTON_FAILURE_SHRINK, solveCollocation, type CollocationStep, type CollocationSystem, type CollocationWork, type NewtonOutcome } from './collocation-newton.js';
import { evaluateCollocation } from './collocation-polynomial.js';
import { ComponentList } from './component-list.js';
import {
  consistentDerivative,
  consistentDerivativeWith,
  createAlgebraicSolver,
  createDerivativeWork,
  factorAlgebraic,
  makeConsistent,
  massSpaces,
  resolveAlgebraic,
  type AlgebraicSolver,
  type ConsistencyContext,
  type DenseAlgebraicSolver,
  type DerivativeWork,
  type MassSpaces,
} from './consistent-initialization.js';
import { copyEntries } from './small-array-copy.js';
import { createDenseIterationSystem } from './dense-iteration-system.js';
import { locateSignChange } from './event-locator.js';
import { nextDown } from './float-neighbours.js';
import { Float64Chunks, type TakeFloat64 } from './float64-chunks.js';
import { OutsidePatternError, type IterationSystem } from './iteration-system.js';
import type { ComplexLinearSolver, RealLinearSolver } from './linear-solver.js';
import { normalizeDae, type NormalizedDae } from './normalize-problem.js';
import { packedDoublesFrom, packedIndices } from './packed-doubles.js';
import { C1, C2, JACOBIAN_RATE_THRESHOLD, MAX_SINGULAR_RETRIES, MU_COMPLEX_IM, MU_COMPLEX_RE, MU_REAL, P } from './radau-tableau.js';
import { mapRadauTolerances } from './radau-tolerances.js';
import type { DependentError } from './dependent-error.js';
import { ErrorEstimateArrays, radauErrorEstimate, type ErrorEstimateWork } from './radau-error-estimate.js';
import { firstIndexAbove } from './sorted-search.js';
import type { PointSource } from './state-rows.js';
import { createSparseConsistency, type SparseConsistency } from './sparse-consistency.js';
import { createSparseIterationSystem } from './sparse-iteration-system.js';
import { errorQuotient, nextStepSize, type AcceptedStep } from './step-size-controller.js';
import type { DaeEventRecord, DaeFailure, DaeProblem, DaeStatus, SolveDaeOptions, SolverStats } from './types.js';
import { allFinite, errorScale, largestScaled, largestScaledInto, nonFiniteIndices, weightedRmsNorm } from './weighted-norm.js';

/** The events of a step without events (shared, frozen: steps without events allocate no array). */
const NO_EVENTS: readonly DaeEventRecord[] = Object.freeze([]);
/** The outcome of a plain accepted step (shared, frozen: such a step allocates no result). */
const ACCEPTED: DaeStepResult = Object.freeze({ status: 'accepted', events: NO_EVENTS });

/** Unit round-off (radau5's UROUND). */
const UROUND = Number.EPSILON / 2;
/** Consecutive Newton failures with a fresh Jacobian before status 'newton-failure' (our choice; radau5 only halves h). */
const MAX_NEWTON_FAILURES = 10;
/** Shrink factor after a rejected first step (radau5: 0.1). */
const FIRST_STEP_REJECT_SHRINK = 0.1;
/** Stretch the step by up to this factor to land on a stop time instead of leaving a sliver (common practice). */
const LANDING_STRETCH = 1.1;
/**
 * Short steps to the crossing after a retaken step that ended on a
 * {@link DaeEvent.stepToEvent} event where its function still had the old
 * sign, before the event is reported there anyway (our choice: one is the
 * rule).
 */
const MAX_LANDING_TRIES = 3;
/** A short step to a crossing goes this far past the secant's estimate of it, to land on the new side (our choice). */
const LANDING_OVERSHOOT = 1.25;
/** A retaken step, or a short step to a crossing, is at least this many round-off limits of h long. */
const MIN_LANDING_STEPS = 100;

/**
 * Outcome of one call to {@link DaeIntegrator.step}: `'accepted'` (one step
 * taken), `'terminal-event'` (a step taken and cut at a terminal event),
 * `'success'` (already at tEnd, nothing to do) or a failure status.
 *
 * @example
 * ```ts
 * const r = integ.step();
 * if (r.status !== 'accepted' && r.status !== 'terminal-event') console.error(integ.message);
 * ```
 */
export type DaeStepStatus = 'accepted' | DaeStatus;

/**
 * What one {@link DaeIntegrator.step} (or {@link DaeIntegrator.advanceTo}) did.
 *
 * @example
 * ```ts
 * const { status, events } = integ.advanceTo(0.02);
 * for (const e of events) console.log(e.name, e.t);
 * ```
 */
export interface DaeStepResult {
  readonly status: DaeStepStatus;
  /** Events located in the step(s), in time order. */
  readonly events: readonly DaeEventRecord[];
  /**
   * Present when the step landed on a breakpoint where the algebraic
   * unknowns were re-initialised (a source or switch changed them): the
   * state just before (left limit, the end of the step's interpolant).
   * The integrator's `y` is the state after. (Added field.)
   */
  readonly jumpFrom?: Float64Array;
}

/**
 * The collocation polynomial of the last accepted step (Hairer and Wanner II,
 * sect. IV.8, dense output): u(tOld + s h) = yOld + sum_k q[k*n .. k*n+n) s^(k+1),
 * valid for t in [tOld, t].
 *
 * @example
 * ```ts
 * integ.step();
 * const p = integ.interpolant!; // coefficients of the last step
 * const yMid = integ.interpolate(0.5 * (p.tOld + p.t));
 * ```
 */
export interface DaeStepInterpolant {
  readonly tOld: number;
  /** Right end of validity (the step's end, or an event time that cut it). */
  readonly t: number;
  /** Step size the polynomial was built with (may exceed t - tOld after an event cut). */
  readonly h: number;
  readonly yOld: Float64Array;
  /** 3n coefficients. */
  readonly q: Float64Array;
}

/**
 * A copy of the integrator's whole state, plain data (structuredClone-able),
 * for what-if runs and sweeps: {@link DaeIntegrator.restore} continues
 * exactly from here. The LU factors are not stored; they are rebuilt.
 *
 * @example
 * ```ts
 * const snap = integ.snapshot();       // before a switching decision
 * integ.advanceTo(0.01);               // try one way
 * integ.restore(snap);                 // and start again from the same state
 * ```
 */
export interface DaeIntegratorSnapshot {
  readonly t: number;
  readonly y: Float64Array;
  readonly f: Float64Array;
  readonly h: number;
  readonly hAcc: number;
  readonly errAcc: number;
  readonly faccon: number;
  readonly first: boolean;
  readonly extrapolate: boolean;
  readonly jacobian: Float64Array | undefined;
  readonly jacobianCurrent: boolean;
  readonly interpolant: DaeStepInterpolant | undefined;
  readonly eventValues: Float64Array;
  readonly stats: SolverStats;
  /**
   * A located {@link DaeEvent.stepToEvent} event that the next steps end on,
   * when one is pending: its time, its index, the step size to take after it
   * and the short steps to its crossing tried so far. (Added field.)
   */
  readonly landing?: { readonly t: number; readonly index: number; readonly hAfter: number; readonly tries: number };
}

/** A located {@link DaeEvent.stepToEvent} event that the next steps end on (see {@link DaeIntegratorSnapshot.landing}). */
type EventLanding = NonNullable<DaeIntegratorSnapshot['landing']>;

/**
 * An incremental Radau IIA integrator for M y' = f(t, y): owns the state,
 * step history, cached Jacobian and LU factors, and statistics. Drive it step
 * by step (embedding, stop times, changing inputs between advances) or let
 * {@link solveDae} run it to the end.
 *
 * @example
 * ```ts
 * let u = 1; // an input that f reads
 * const integ = createDaeIntegrator({ size: 1, y0: [0], t0: 0, tEnd: 1, rhs: (t, y, out) => { out[0] = u - y[0]!; } });
 * integ.advanceTo(0.5);   // lands exactly on 0.5
 * u = -1;                 // change the input...
 * integ.restart();        // ...and tell the integrator
 * integ.advanceTo(1);
 * console.log(integ.t, integ.y, integ.stats);
 * ```
 */
export interface DaeIntegrator {
  /** Present time (last accepted point). */
  readonly t: number;
  /** Present state (a copy). */
  readonly y: Float64Array;
  /** Step size the next step will try. */
  readonly h: number;
  /** Start and end of the problem's span. */
  readonly t0: number;
  readonly tEnd: number;
  /** Counts so far (a copy). */
  readonly stats: SolverStats;
  /** `'running'` while more steps can be taken, else the final status. */
  readonly status: 'running' | DaeStatus;
  /** One line on the status (empty while running). */
  readonly message: string;
  /** Where and why a failure happened. */
  readonly failure: DaeFailure | undefined;
  /**
   * Differential unknowns the last (re)initialisation had to move to meet a
   * hidden constraint of an index-2 structure (for example the flux of a
   * winding whose current a current source forces); empty otherwise.
   */
  readonly adjustedAtStart: readonly number[];
  /** The last step's interpolant, or undefined before the first step (and after restart). */
  readonly interpolant: DaeStepInterpolant | undefined;
  /**
   * Take one accepted step (retrying internally after rejections), never
   * passing `tStop` (landing on it exactly), the next breakpoint or tEnd.
   */
  step(tStop?: number): DaeStepResult;
  /**
   * Step until t reaches `tStop` exactly (a stop time, for instance a
   * switching instant), a terminal event, or a failure. `onStep` is called
   * after each accepted step.
   */
  advanceTo(tStop: number, onStep?: (integrator: DaeIntegrator, result: DaeStepResult) => void): DaeStepResult;
  /**
   * Forget the Jacobian, LU factors and step history and re-initialise
   * consistently at the present time: call this after changing anything f
   * depends on (switch states, set-points). `y`, when given, replaces the
   * state first. Clears a failure. Returns the new status.
   */
  restart(y?: ArrayLike<number>, options?: RestartOptions): 'running' | DaeStatus;
  /** Copy of the whole state, see {@link DaeIntegratorSnapshot}. */
  snapshot(): DaeIntegratorSnapshot;
  /** Continue from a snapshot of this integrator (or of one built from the same problem). */
  restore(snapshot: DaeIntegratorSnapshot): void;
  /** State at time t within the last step [tOld, t] from the collocation polynomial. */
  interpolate(t: number, out?: Float64Array): Float64Array;
  /**
   * The last step's interpolant with its two arrays drawn from `take`
   * (called for n, then 3n numbers), or undefined before the first step:
   * for callers that keep many steps in storage of their own.
   */
  copyInterpolant(take: (length: number) => Float64Array): DaeStepInterpolant | undefined;
  /**
   * The same copy into two arrays of the caller's (n, then 3n numbers), or
   * undefined before the first step: no callback, so the integrator's code
   * sees no function of the caller's that changes from run to run.
   */
  copyInterpolantInto(yOld: Float64Array, q: Float64Array): DaeStepInterpolant | undefined;
  /** Copy the present state into `out` (length n) without allocating; returns `out`. */
  readState(out: Float64Array): Float64Array;
  /**
   * Copy f(t, y) at the present state into `out` (length n) when the last
   * `step` evaluated it there and nothing has moved the state since (no
   * restart, restore, breakpoint re-initialisation or event in the step);
   * returns whether it did. It is the problem's own f, as given: where
   * dependent rows of M are recombined, the step kept a copy from before
   * the recombination. A caller that needs f at the state a step ended on (a check of
   * what it records) then evaluates it once, not twice.
   */
  readRhsAtState(out: Float64Array): boolean;
}

/**
 * Options of {@link DaeIntegrator.restart}.
 *
 * @example
 * ```ts
 * integ.restart(undefined, { capStepByEstimate: true }); // after a source jumped
 * ```
 */
export interface RestartOptions {
  /**
   * Cap the kept step size by a fresh starting-step estimate from the
   * consistent y'(t) (Hairer, Norsett and Wanner I, sect. II.4): after a jump
   * of an input the step that suited the old inputs may be far too long.
   */
  readonly capStepByEstimate?: boolean;
}

/** Thrown when the Jacobian has NaN or Infinity entries; maps to status 'non-finite'. */
class NonFiniteJacobian extends Error {
  constructor(
    readonly rows: number[],
    readonly tAt: number,
  ) {
    super('non-finite Jacobian');
  }
}

/** Thrown around user code so that its errors map to status 'rhs-error'. */
class UserCodeError extends Error {
  constructor(
    override readonly cause: unknown,
    readonly what: string,
    readonly tAt: number,
  ) {
    super(what);
  }
}

/**
 * A {@link DependentError} whose measure, which evaluates the caller's f at
 * a shifted state, maps a throw to {@link UserCodeError} as every other
 * evaluation of f does, so it ends the run as 'rhs-error'.
 */
class GuardedDependentError implements DependentError {
  readonly count: number;
  squares = 0;

  constructor(private readonly inner: DependentError) {
    this.count = inner.count;
  }

  measure(at: { readonly t: number }, y: Float64Array, err: Float64Array): void {
    try {
      this.inner.measure(at, y, err);
    } catch (e) {
      throw new UserCodeError(e, 'f (the error estimate of the eliminated unknowns)', at.t);
    }
    this.squares = this.inner.squares;
  }

  measureIncrement(at: { readonly t: number }, y: Float64Array, dw: Float64Array): void {
    try {
      this.inner.measureIncrement(at, y, dw);
    } catch (e) {
      throw new UserCodeError(e, 'f (the error estimate of the eliminated unknowns)', at.t);
    }
    this.squares = this.inner.squares;
  }
}

function emptyStats(): SolverStats {
  return {
    acceptedSteps: 0,
    rejectedSteps: 0,
    rhsEvaluations: 0,
    jacobianEvaluations: 0,
    luFactorizations: 0,
    newtonIterations: 0,
    newtonFailures: 0,
    retakenSteps: 0,
  };
}

/**
 * Create an incremental Radau IIA (order 5) integrator for the problem
 * M y' = f(t, y) (Hairer and Wanner, Solving ODEs II, sect. IV.8 and VI.6).
 * Validates the problem (throws {@link InputError} for a bad call) and makes
 * the initial state consistent unless `options.consistentInit` is false; if
 * that fails, `status` is `'inconsistent-init'` and `step()` returns it.
 *
 * Options used: rtol, atol, initialStep, maxStep, maxSteps (counted over the
 * integrator's life), maxWallTimeMs (from creation), signal, eventTolerance,
 * consistentInit, linearAlgebra.
 *
 * @example
 * ```ts
 * // y' = -1000 (y - cos t): stiff, follows cos t closely
 * const integ = createDaeIntegrator(
 *   { size: 1, y0: [0], t0: 0, tEnd: 1, rhs: (t, y, out) => { out[0] = -1000 * (y[0]! - Math.cos(t)); } },
 *   { rtol: 1e-8, atol: 1e-10 },
 * );
 * integ.advanceTo(0.5);          // lands exactly on t = 0.5
 * console.log(integ.t, integ.y[0]);
 * while (integ.status === 'running') integ.step();
 * ```
 */
export function createDaeIntegrator(problem: DaeProblem, options: SolveDaeOptions = {}): DaeIntegrator {
  const P_ = normalizeDae(problem, options);
  return new RadauIntegrator(P_);
}

/**
 * {@link createDaeIntegrator} whose error estimate also takes unknowns that
 * follow from the state (the reduced formulation's algebraic unknowns; see
 * {@link DependentError}).
 *
 * @internal
 * @example
 * ```ts
 * const inner = createDaeIntegratorWithDependents(reducedProblem, { rtol: 1e-6 }, elimination);
 * ```
 */
export function createDaeIntegratorWithDependents(problem: DaeProblem, options: SolveDaeOptions, dependent: DependentError): DaeIntegrator {
  return new RadauIntegrator(normalizeDae(problem, options), dependent);
}

/**
 * The numbers (Float64 and Int32 entries) an integrator's linear algebra
 * holds, by part: the Jacobian and its scratch copies, the iteration
 * matrices, the LU factors and work, the consistent initialisation's
 * matrices on the sparse path. For tests that a large network is held
 * without n x n arrays.
 *
 * @internal
 * @example
 * ```ts
 * const held = linearAlgebraStorage(integ); // { jacobian, iterationMatrices, factors, consistency, denseJacobian, mass, denseMass }
 * ```
 */
export function linearAlgebraStorage(integ: DaeIntegrator): { jacobian: number; iterationMatrices: number; factors: number; consistency: number; denseJacobian: number; mass: number; denseMass: number } {
  if (!(integ instanceof RadauIntegrator)) throw new TypeError('linearAlgebraStorage: not an integrator made by createDaeIntegrator');
  return integ.linearAlgebraStorage();
}

/** @internal The integrator, which also writes solveDae's stored rows in place ({@link PointSource}). */
export function createDaeIntegratorFromNormalized(p: NormalizedDae): DaeIntegrator & PointSource {
  return new RadauIntegrator(p);
}

/** No unknown adjusted at a (re)start: one frozen list, not a new empty array per cheap restart. */
const NONE_ADJUSTED: readonly number[] = Object.freeze([]);

/**
 * The integrator's f (counted and guarded) and M v as methods of one class, for the
 * collocation kernel and the error estimate. Their call sites (`sys.rhs`, `sys.multiplyMass`)
 * then see one function whatever the integrator: a closure per integrator is a new call target
 * for each, and the next integrator in a process deoptimised the code specialised on the last.
 */
class IntegratorCalls implements CollocationSystem {
  constructor(
    private readonly integ: RadauIntegrator,
    readonly n: number,
    readonly identityMass: boolean,
    readonly luReal: RealLinearSolver,
    readonly luComplex: ComplexLinearSolver,
    readonly fnewt: number,
    readonly stats: SolverStats,
    readonly dependentError: DependentError | undefined,
  ) {}

  rhs(t: number, y: Float64Array, out: Float64Array): void {
    this.integ.callRhs(t, y, out);
  }

  multiplyMass(v: number[], vOff: number, out: number[]): void {
    this.integ.mulMass(v, vOff, out);
  }
}

/** Work arrays of the first-step estimate; a class, not a literal (see createNewtonOutcome). */
class StepEstimateWork {
  constructor(
    readonly scale: Float64Array,
    readonly y1: Float64Array,
    readonly f1: Float64Array,
  ) {}
}

/** The integrator's {@link ConsistencyContext}: f and the dense J as methods, for the reason given at {@link IntegratorCalls}. */
class IntegratorConsistency implements ConsistencyContext {
  readonly scale: Float64Array;

  constructor(
    private readonly integ: RadauIntegrator,
    readonly n: number,
    readonly spaces: MassSpaces,
    readonly algebraic: ConsistencyContext['algebraic'],
  ) {
    this.scale = new Float64Array(n);
  }

  rhs(t: number, y: Float64Array, out: Float64Array): void {
    this.integ.callRhs(t, y, out);
  }

  jacobian(t: number, y: Float64Array, f: Float64Array, out: Float64Array): void {
    this.integ.callJacobianDense(t, y, f, out);
  }
}

class RadauIntegrator implements DaeIntegrator {
  private readonly p: NormalizedDae;
  private readonly n: number;
  /** M in compressed rows (CSR), or undefined for the identity; plain arrays, read for M W in every Newton iteration (see packedDoubles). */
  private readonly mRowPtr: number[] | undefined;
  private readonly mCol: number[] | undefined;
  private readonly mVal: number[] | undefined;
  private readonly spaces: MassSpaces | undefined;
  /** radau5's transformed tolerances. */
  private readonly rtolT: Float64Array;
  private readonly atolT: Float64Array;
  /** Newton stopping tolerance FNEWT. */
  private readonly fnewt: number;
  /** Where J is held and how the iteration matrices are formed and factored (dense or sparse). */
  private readonly system: IterationSystem;
  private readonly luReal: RealLinearSolver;
  private readonly luComplex: ComplexLinearSolver;
  private readonly startTime: number;

  private tCur: number;
  private yCur: Float64Array;
  private fCur: Float64Array;
  /** Whether the problem's own f at (tCur, yCur) was evaluated by the last step (see readRhsAtState). */
  private rhsAtState = false;
  /** The problem's own f at a step's end where dependent rows of M are recombined (fCur holds them recombined); empty otherwise. */
  private readonly rhsOwn: Float64Array;
  private hCur = 0;
  private hAcc = NaN;
  private errAcc = NaN;
  private faccon = 1;
  private theta = JACOBIAN_RATE_THRESHOLD;
  private first = true;
  private extrapolate = false;
  /** J in the system's storage (dense n*n, or values on the sparse pattern). */
  private jac: Float64Array;
  /** J as a dense array for the consistent initialisation, when the system's storage is sparse (made on first use). */
  private jacDense: Float64Array | undefined;
  /**
   * A fresh Jacobian at a cheap restart, compared with the held one before it replaces it. Made with
   * J, not at the first restart: a branch taken only there has no type feedback when V8 optimises the
   * restart path, and the next run's first restart would throw that code away (docs/solver.md).
   */
  private jacScratch: Float64Array;
  private jacValid = false;
  private jacCurrent = false;
  private luH = NaN;
  /** Bumped whenever this.jac changes: the factored algebraic Jacobian belongs to one version. */
  private jacVersion = 0;
  private algebraicVersion = -1;
  /** For cheap restarts (singular M only): W0^T J V0 factored for the kept J, and y' work. */
  private readonly algebraic: AlgebraicSolver | undefined;
  /** The same solver on the dense path, which keeps its factors while the block is unchanged. */
  private readonly denseAlgebraic: DenseAlgebraicSolver | undefined;
  private readonly derivativeWork: DerivativeWork | undefined;
  /** On the sparse path: the consistent initialisation's matrices from J on the pattern (no dense arrays), and J for it. */
  private readonly sparseConsistency: SparseConsistency | undefined;
  private readonly consistencyJac: Float64Array | undefined;
  /** The consistency context, built once; its scale is refreshed per use. */
  private readonly consistency: ConsistencyContext | undefined;
  /** State saved before a cheap restart, to fall back to the full one. */
  private readonly ySaved: Float64Array;
  /** y' at the last cheap restart: the first step's Newton starts from the tangent instead of zero. */
  private readonly restartSlope: Float64Array;
  private slopeStart = false;
  /**
   * A cheap restart whose first step has not been accepted yet: should that
   * step's Newton iteration fail for good, the full re-initialisation is
   * tried once before reporting a failure (a jump that changes the algebraic
   * structure, such as a hysteretic tube's db/dt reversing at a switch-off,
   * can defeat the kept factorisation and the tangent start).
   */
  private cheapRestartUnproven = false;
  private cheapRestartCap = false;
  /** The step size before the last cheap restart (its cap by the estimate is undone when another restart replaces it). */
  private hBeforeCheapRestart = NaN;
  private readonly stepWork: StepEstimateWork;
  /** The last step's polynomial in buffers reused from step to step (meaningful while hasPiece). */
  private readonly piece: { tOld: number; t: number; h: number; readonly yOld: Float64Array; readonly q: Float64Array };
  private hasPiece = false;
  /** The public copy of the piece ({@link DaeIntegrator.interpolant}), made on the first request after a step. */
  private pieceCopy: DaeStepInterpolant | undefined;
  private eventValues: Float64Array;
  /** Whether any event is terminal with stepToEvent (only then is the start of each step kept for a retake). */
  private readonly landingEvents: boolean;
  /** The start of the step in hand, for a retake: f there and the controller's and Jacobian's memory before it. */
  private readonly stepStart: {
    readonly f: Float64Array;
    hAcc: number;
    errAcc: number;
    first: boolean;
    cheapRestartUnproven: boolean;
    jacValid: boolean;
    jacCurrent: boolean;
  };
  /** The located stepToEvent event the next steps end on, if any. */
  private landing: EventLanding | undefined;
  private readonly statsCur: SolverStats = emptyStats();
  private statusCur: 'running' | DaeStatus = 'running';
  private adjustedCur: readonly number[] = NONE_ADJUSTED;
  private messageCur = '';
  private failureCur: DaeFailure | undefined;
  private pendingError: UserCodeError | undefined;
  private pendingFailure: { status: DaeStatus; message: string; components: number[] } | undefined;

  // Work buffers (allocated once).
  private readonly work: CollocationWork;
  private readonly errorWork: ErrorEstimateWork;
  private readonly newtonOutcome: NewtonOutcome;
  /** The largest components of the last rejected step's error (see {@link ComponentList}). */
  private readonly errorComponents: ComponentList;
  /**
   * The attempt's numbers for the Newton kernel, the error estimate, the start values and the
   * acceptance (rewritten per attempt: numbers passed as arguments are boxed per call).
   */
  private readonly attempt: CollocationStep & { tNew: number; err: number } = { t: 0.5, h: 0.5, tLastStage: 0.5, faccon: 0.5, tNew: 0.5, err: 0.5 };
  /** The accepted step as the step-size controller reads it (rewritten per step, see {@link AcceptedStep}). */
  private readonly acceptedStep: AcceptedStep = { h: 0.5, err: 0.5, hAcc: 0.5, errAcc: 0.5, maxStep: 0.5, newtonIterations: 0, rejected: false, recomputeJacobian: false, hNext: 0.5 };
  /** f counted and guarded, and M v, for the kernels (see {@link IntegratorCalls}). */
  private readonly collocation: IntegratorCalls;
  private readonly scale: Float64Array;

  constructor(p: NormalizedDae, dependent?: DependentError) {
    this.p = p;
    const n = p.n;
    this.n = n;
    // The work arrays as views into one chunk (a typed array of its own costs an ArrayBuffer each, and
    // a short solve's set-up was mostly those): on the dense path J and its restart scratch, and the
    // three iteration matrices for ml-matrix (the flat LUs keep theirs in plain arrays), and about 43
    // of length n.
    const denseMatrices = p.iterationPattern ? 0 : p.linearAlgebra === 'ml-matrix' ? 5 : 2;
    const chunks = new Float64Chunks(Math.min(denseMatrices * n * n + 44 * n, 1 << 16));
    // Bound, not an arrow: under tsx every arrow made per solve is named by a property definition (about half a microsecond).
    const take: TakeFloat64 = chunks.take.bind(chunks);
    if (p.mass) {
      // M in compressed rows as normalizeDae made it: no n x n array on the sparse path.
      this.mRowPtr = packedIndices(p.mass.rowStart);
      this.mCol = packedIndices(p.mass.col);
      this.mVal = packedDoublesFrom(p.mass.value);
      this.spaces = massSpaces(p.mass, n);
    }
    // radau5's tolerance map on entry (mapRadauTolerances).
    this.rtolT = take(n);
    this.atolT = take(n);
    const rmin = mapRadauTolerances(p.rtol, p.atol, p.atolFollowsRtol, this.rtolT, this.atolT);
    // radau5: FNEWT = max(10 uround / rtol', min(0.03, rtol'^0.5)).
    this.fnewt = Math.max((10 * UROUND) / rmin, Math.min(0.03, Math.sqrt(rmin)));
    this.system = p.iterationPattern ? createSparseIterationSystem(p) : createDenseIterationSystem(p, take);
    this.luReal = this.system.luReal;
    this.luComplex = this.system.luComplex;
    this.work = createCollocationWork(n, take);
    this.errorWork = new ErrorEstimateArrays(n, take);
    this.newtonOutcome = createNewtonOutcome(n);
    this.errorComponents = new ComponentList(n);
    this.collocation = new IntegratorCalls(this, n, !p.mass, this.luReal, this.luComplex, this.fnewt, this.statsCur, dependent ? new GuardedDependentError(dependent) : undefined);
    this.scale = take(n);
    this.ySaved = take(n);
    this.restartSlope = take(n);
    this.stepWork = new StepEstimateWork(take(n), take(n), take(n));
    const sparse = this.system.sparse;
    if (this.spaces && sparse && this.spaces.k > 0) {
      // The sparse path: W0^T J V0 and the y' system formed on the pattern, factored from values.
      const sc = createSparseConsistency(this.spaces, sparse.pattern, sparse.massValues);
      const jac = new Float64Array(this.system.jacobianSize);
      this.sparseConsistency = sc;
      this.consistencyJac = jac;
      this.algebraic = sc.solver;
      this.consistency = new IntegratorConsistency(this, n, this.spaces, {
        factorAt: (t: number, y: Float64Array, f: Float64Array): number => {
          this.callJacobian(t, y, f, jac);
          this.algebraicVersion = -1; // the shared factorisation no longer belongs to the held J
          return sc.factorAlgebraic(jac) ? -1 : 0;
        },
        lu: sc.solver.lu,
      });
    } else if (this.spaces) {
      this.consistency = new IntegratorConsistency(this, n, this.spaces, undefined);
      this.denseAlgebraic = createAlgebraicSolver(n, this.spaces.k);
      this.algebraic = this.denseAlgebraic;
      // Read by the cheap restart's step estimate only (M made dense here, not at a run's first restart).
      if (this.spaces.k > 0 && p.consistentInit) this.derivativeWork = createDerivativeWork(this.spaces, p.denseMass()!);
    }
    this.piece = { tOld: NaN, t: NaN, h: NaN, yOld: take(n), q: take(3 * n) };
    this.jac = take(this.system.jacobianSize);
    this.jacScratch = take(this.system.jacobianSize);
    this.eventValues = take(p.events.length);
    this.landingEvents = p.events.length > 0 && p.events.some((e) => e.terminal === true && e.stepToEvent === true);
    this.stepStart = {
      f: take(this.landingEvents ? n : 0),
      hAcc: NaN, errAcc: NaN, first: true, cheapRestartUnproven: false, jacValid: false, jacCurrent: false,
    };
    // Read only against a wall-time budget.
    this.startTime = p.maxWallTimeMs !== Infinity ? performance.now() : 0;

    this.tCur = p.t0;
    this.yCur = take(n);
    this.yCur.set(p.y0);
    this.fCur = take(n);
    this.rhsOwn = take(p.massCompression ? n : 0);
    this.initialise(true);
  }

  // ---- public surface -------------------------------------------------------

  /** See {@link linearAlgebraStorage}. */
  linearAlgebraStorage(): { jacobian: number; iterationMatrices: number; factors: number; consistency: number; denseJacobian: number; mass: number; denseMass: number } {
    const s = this.system.storage();
    const p = this.p;
    return {
      jacobian: s.jacobian + this.jac.length + this.jacScratch.length + (this.consistencyJac?.length ?? 0),
      iterationMatrices: s.iterationMatrices,
      factors: s.factors,
      consistency: this.sparseConsistency?.held ?? (this.derivativeWork ? this.derivativeWork.a.length : 0),
      denseJacobian: this.jacDense?.length ?? 0,
      // M's non-zeros as held (compressed rows), and the n x n copy if the dense path made one.
      mass: p.mass ? p.mass.col.length : 0,
      denseMass: p.denseMassMade() ? p.n * p.n : 0,
    };
  }

  get t(): number {
    return this.tCur;
  }
  get y(): Float64Array {
    return this.readState(new Float64Array(this.n));
  }
  get h(): number {
    return this.hCur;
  }
  get t0(): number {
    return this.p.t0;
  }
  get tEnd(): number {
    return this.p.tEnd;
  }
  get stats(): SolverStats {
    return { ...this.statsCur };
  }
  get status(): 'running' | DaeStatus {
    return this.statusCur;
  }
  get message(): string {
    return this.messageCur;
  }
  get failure(): DaeFailure | undefined {
    return this.failureCur;
  }
  get adjustedAtStart(): readonly number[] {
    return this.adjustedCur;
  }
  get interpolant(): DaeStepInterpolant | undefined {
    if (!this.hasPiece) return undefined;
    return (this.pieceCopy ??= copyPiece(this.piece));
  }

  step(tStop?: number): DaeStepResult {
    if (tStop !== undefined && (!Number.isFinite(tStop) || tStop > this.p.tEnd)) {
      throw new InputError('bad-stop-time', `stop time ${tStop} must be a finite time <= tEnd = ${this.p.tEnd}`, ['tStop']);
    }
    if (this.statusCur === 'terminal-event') this.statusCur = this.tCur >= this.p.tEnd ? 'success' : 'running';
    if (this.statusCur !== 'running') return { status: this.statusCur, events: [] } as DaeStepResult;
    if (tStop !== undefined && tStop <= this.tCur) return { status: 'success', events: [] };
    this.rhsAtState = false;
    try {
      return this.attemptStep(tStop ?? this.p.tEnd);
    } catch (e) {
      return this.failFromError(e);
    }
  }

  advanceTo(tStop: number, onStep?: (integrator: DaeIntegrator, result: DaeStepResult) => void): DaeStepResult {
    if (!Number.isFinite(tStop) || tStop > this.p.tEnd || tStop < this.tCur) {
      throw new InputError(
        'bad-stop-time',
        `advanceTo(${tStop}): the time must lie in [t, tEnd] = [${this.tCur}, ${this.p.tEnd}]`,
        ['tStop'],
      );
    }
    const events: DaeEventRecord[] = [];
    while (this.tCur < tStop) {
      const r = this.step(tStop);
      events.push(...r.events);
      if (r.status !== 'accepted' && r.status !== 'terminal-event') return { status: r.status, events };
      onStep?.(this, r);
      if (r.status === 'terminal-event') return { status: 'terminal-event', events };
    }
    return { status: 'success', events };
  }

  restart(y?: ArrayLike<number>, options: RestartOptions = {}): 'running' | DaeStatus {
    this.rhsAtState = false;
    if (y !== undefined) {
      if (y.length !== this.n) throw new InputError('bad-initial-state', `restart: y has ${y.length} entries, expected ${this.n}`, ['y']);
      for (let i = 0; i < this.n; i++) {
        if (!Number.isFinite(y[i]!)) throw new InputError('bad-initial-state', `restart: y[${i}] = ${y[i]} is not finite`, ['y']);
      }
      this.yCur.set(Array.from(y));
    }
    const healthy = (this.statusCur === 'running' || this.statusCur === 'success' || this.statusCur === 'terminal-event') && !this.pendingError && !this.pendingFailure;
    this.statusCur = 'running';
    this.messageCur = '';
    this.failureCur = undefined;
    this.pendingError = undefined;
    this.pendingFailure = undefined;
    this.forgetPiece();
    this.landing = undefined; // the event was located with the old f: the restarted run finds its own
    const capByEstimate = options.capStepByEstimate ?? false;
    // A cheap restart that no step has proven, replaced by this one, leaves no trace: its estimate came
    // from the point it was leaving (measured: 1.6e-21 s at a flyback's turn-off where a smooth junction's
    // node was off by 24 V, then kept by the minimum with this restart's own estimate, a step-size underflow).
    if (this.cheapRestartUnproven) this.hCur = this.hBeforeCheapRestart;
    this.cheapRestartUnproven = false;
    this.hBeforeCheapRestart = this.hCur;
    if (y === undefined && healthy && this.restartCheaply(capByEstimate)) {
      this.cheapRestartUnproven = true;
      this.cheapRestartCap = capByEstimate;
    } else {
      this.initialise(false, capByEstimate);
    }
    return this.statusCur;
  }

  /**
   * Restart after an input jump keeping what is still valid (issue: cheap
   * restarts): the step size (capped by a fresh estimate when asked). f and
   * the Jacobian are evaluated once with the new inputs, f first (the
   * Jacobian's finite differences are taken from it: the f kept from the
   * last step belongs to the old inputs), and the algebraic unknowns are
   * re-solved by a simplified Newton iteration on W0^T J V0 factored from it
   * (no SVD, no least-change search, no allocation), starting from that f.
   * The step history (controller memory, extrapolated start values) is
   * dropped, as at any restart. Returns false, with the state as it was,
   * when this is not enough (no convergence, a singular algebraic Jacobian,
   * a non-finite f, user code throwing): the caller then does the full
   * re-initialisation.
   *
   * Evaluations for a jump that moves the algebraic unknowns (a source's
   * value): f twice (with the new inputs before the re-solve, and at the
   * re-solved state; once when the re-solve moves nothing), J once, and
   * with `capByEstimate` f once more for df/dt of the consistent y' (on the
   * dense path the step estimate takes its second derivative from
   * J y' + df/dt instead of a trial f; the sparse path keeps the trial f).
   */
  private restartCheaply(capByEstimate: boolean): boolean {
    const p = this.p;
    const y = this.yCur;
    const t = this.tCur;
    copyEntries(y, this.ySaved);
    try {
      this.callRhs(t, y, this.fCur);
      if (!allFinite(this.fCur)) return this.undoCheapRestart();
      // The Jacobian is evaluated afresh with the new inputs: a jump can change it (a switch's
      // conductance by nine orders of magnitude), and a stale one both slows the algebraic re-solve and,
      // worse, filters the first steps' error estimates through the wrong matrix, so that they accept
      // wrong steps (an energy audit off by 5 % across a switch-off was measured with the kept one).
      this.refreshJacobianKeepingEqual();
      let yp: Float64Array | undefined;
      let secondDerivative: Float64Array | undefined;
      let moved = false;
      if (this.spaces && this.spaces.k > 0 && p.consistentInit) {
        const solver = this.algebraic!;
        if (this.algebraicVersion !== this.jacVersion) {
          const factored = this.sparseConsistency ? this.sparseConsistency.factorAlgebraic(this.jac) : factorAlgebraic(this.spaces, this.denseJacobian(), this.denseAlgebraic!);
          if (!factored) return this.undoCheapRestart();
          this.algebraicVersion = this.jacVersion;
        }
        const ctx = this.consistencyContext();
        copyEntries(this.fCur, solver.f);
        const outcome = resolveAlgebraic(ctx, t, y, solver);
        if (outcome === 'failed') return this.undoCheapRestart();
        if (outcome === 'current') copyEntries(solver.f, this.fCur);
        else this.callRhs(t, y, this.fCur);
        if (!allFinite(this.fCur)) return this.undoCheapRestart();
        for (let i = 0; i < this.n && !moved; i++) moved = y[i] !== this.ySaved[i];
        if (capByEstimate) {
          const dt = Math.sqrt(UROUND) * Math.max(Math.abs(t), p.tEnd - p.t0);
          if (this.sparseConsistency) {
            yp = this.sparseConsistency.derivative(ctx, t, dt, y, this.fCur, this.jac);
          } else {
            const work = this.derivativeWork!;
            yp = consistentDerivativeWith(ctx, t, dt, y, this.fCur, this.denseJacobian(), work, this.jacVersion);
            if (yp) secondDerivative = linearisedSecondDerivative(this.denseJacobian(), yp, work.ft, this.fCur, dt, this.stepWork.f1);
          }
        }
      } else if (!p.mass) {
        yp = this.fCur;
      }
      this.adjustedCur = NONE_ADJUSTED;
      this.first = true;
      this.extrapolate = false;
      this.hAcc = NaN;
      this.errAcc = NaN;
      this.faccon = 1;
      // J was evaluated at (t, y) with the new inputs: current unless the re-solve moved y since.
      this.jacCurrent = !moved;
      if (capByEstimate) this.hCur = Math.min(this.hCur, this.restartStepSize(yp ?? (p.mass ? undefined : this.fCur), secondDerivative));
      this.slopeStart = yp !== undefined;
      if (yp) copyEntries(yp, this.restartSlope);
      this.evaluateEventsAt(t, y, this.eventValues);
      if (t >= p.tEnd) this.statusCur = 'success';
      return true;
    } catch (e) {
      if (e instanceof UserCodeError || e instanceof NonFiniteJacobian) {
        // Let the full re-initialisation meet (and report) the same failure; the evaluations stay counted.
        return this.undoCheapRestart();
      }
      throw e;
    }
  }

  private undoCheapRestart(): false {
    copyEntries(this.ySaved, this.yCur);
    return false;
  }

  private forgetPiece(): void {
    this.hasPiece = false;
    this.pieceCopy = undefined;
  }

  snapshot(): DaeIntegratorSnapshot {
    return {
      t: this.tCur,
      y: this.yCur.slice(),
      f: this.fCur.slice(),
      h: this.hCur,
      hAcc: this.hAcc,
      errAcc: this.errAcc,
      faccon: this.faccon,
      first: this.first,
      extrapolate: this.extrapolate,
      jacobian: this.jacValid ? Float64Array.from(this.jac) : undefined,
      jacobianCurrent: this.jacCurrent,
      interpolant: this.hasPiece ? copyPiece(this.piece) : undefined,
      eventValues: Float64Array.from(this.eventValues),
      stats: { ...this.statsCur },
      ...(this.landing ? { landing: { ...this.landing } } : {}),
    };
  }

  restore(s: DaeIntegratorSnapshot): void {
    this.rhsAtState = false;
    if (s.y.length !== this.n || s.f.length !== this.n) {
      throw new InputError('bad-snapshot', `snapshot has ${s.y.length} unknowns; this integrator has ${this.n}`, ['snapshot']);
    }
    this.tCur = s.t;
    this.yCur.set(s.y);
    this.fCur.set(s.f);
    this.hCur = s.h;
    this.hAcc = s.hAcc;
    this.errAcc = s.errAcc;
    this.faccon = s.faccon;
    this.first = s.first;
    this.extrapolate = s.extrapolate;
    this.slopeStart = false;
    if (s.jacobian) {
      this.jac.set(s.jacobian);
      this.jacVersion++;
      this.jacValid = true;
      this.jacCurrent = s.jacobianCurrent;
    } else {
      this.jacValid = false;
      this.jacCurrent = false;
    }
    this.luH = NaN;
    const it = s.interpolant;
    this.forgetPiece();
    if (it) {
      const piece = this.piece;
      piece.tOld = it.tOld;
      piece.t = it.t;
      piece.h = it.h;
      piece.yOld.set(it.yOld);
      piece.q.set(it.q);
      this.hasPiece = true;
    }
    this.eventValues = Float64Array.from(s.eventValues);
    Object.assign(this.statsCur, s.stats); // the same object: the Newton kernel counts into it
    this.statsCur.retakenSteps = s.stats.retakenSteps ?? 0; // a snapshot of an older version
    this.landing = s.landing && this.landingEvents ? { ...s.landing } : undefined;
    this.pendingError = undefined;
    this.pendingFailure = undefined;
    this.failureCur = undefined;
    this.messageCur = '';
    this.statusCur = this.tCur >= this.p.tEnd ? 'success' : 'running';
  }

  copyInterpolant(take: (length: number) => Float64Array): DaeStepInterpolant | undefined {
    if (!this.hasPiece) return undefined;
    const yOld = take(this.n);
    return this.copyInterpolantInto(yOld, take(3 * this.n));
  }

  copyInterpolantInto(yOld: Float64Array, q: Float64Array): DaeStepInterpolant | undefined {
    if (!this.hasPiece) return undefined;
    const p = this.piece;
    copyEntries(p.yOld, yOld);
    copyEntries(p.q, q);
    return { tOld: p.tOld, t: p.t, h: p.h, yOld, q };
  }

  readState(out: Float64Array): Float64Array {
    copyEntries(this.yCur, out);
    return out;
  }

  /** The present time at out[offset] and state after it, by a loop (see {@link PointSource}; not part of the public interface). */
  readPoint(out: Float64Array, offset: number): void {
    out[offset] = this.tCur;
    const y = this.yCur;
    for (let i = 0; i < this.n; i++) out[offset + 1 + i] = y[i]!;
  }

  readRhsAtState(out: Float64Array): boolean {
    if (!this.rhsAtState) return false;
    copyEntries(this.p.massCompression ? this.rhsOwn : this.fCur, out);
    return true;
  }

  interpolate(t: number, out?: Float64Array): Float64Array {
    const res = out ?? new Float64Array(this.n);
    const it = this.hasPiece ? this.piece : undefined;
    if (!it) {
      if (t === this.tCur) {
        res.set(this.yCur);
        return res;
      }
      throw new InputError('outside-last-step', `interpolate(${t}): no step taken yet; only t = ${this.tCur} is known`, ['t']);
    }
    if (!(t >= it.tOld && t <= it.t)) {
      throw new InputError('outside-last-step', `interpolate(${t}): the last step covers [${it.tOld}, ${it.t}]`, ['t']);
    }
    return evaluateCollocation(it, t, res);
  }

  // ---- internals -------------------------------------------------------------

  private fail(status: DaeStatus, message: string, components: number[], cause?: unknown): DaeStepResult {
    this.statusCur = status;
    this.messageCur = message;
    const failure: { t: number; h: number; components: readonly number[]; cause?: unknown } = {
      t: this.tCur,
      h: this.hCur,
      components,
    };
    if (cause !== undefined) failure.cause = cause;
    this.failureCur = failure;
    return { status, events: [] };
  }

  callRhs(t: number, y: Float64Array, out: Float64Array): void {
    this.statsCur.rhsEvaluations++;
    try {
      this.p.calls.rhs(t, y, out);
    } catch (e) {
      throw new UserCodeError(e, 'f', t);
    }
  }

  /** {@link callRhs} into fCur at a step's end, keeping the problem's own f in rhsOwn where rows are recombined. */
  private callRhsAtStepEnd(t: number, y: Float64Array): void {
    this.statsCur.rhsEvaluations++;
    try {
      this.p.calls.rhsKeepingOwn(t, y, this.fCur, this.rhsOwn);
    } catch (e) {
      throw new UserCodeError(e, 'f', t);
    }
  }

  /** Evaluate J at (t, y) with f = f(t, y), analytic or finite-difference, into `out` (the system's storage). */
  callJacobian(t: number, y: Float64Array, f: Float64Array, out: Float64Array): void {
    this.statsCur.jacobianEvaluations++;
    try {
      this.statsCur.rhsEvaluations += this.system.evaluate(t, y, f, out);
    } catch (e) {
      // The sparse storage refuses an entry outside the declared pattern rather than drop it.
      if (e instanceof OutsidePatternError) throw new UserCodeError(e, 'the Jacobian (an entry outside jacobianPattern)', t);
      throw new UserCodeError(e, this.system.analytic ? 'the Jacobian' : 'f (finite-difference Jacobian)', t);
    }
    const rows = this.system.nonFiniteRows(out);
    if (rows.length > 0) throw new NonFiniteJacobian([...rows], t);
  }

  /** {@link callJacobian} into a dense row-major n x n `out` (for the consistent initialisation). */
  callJacobianDense(t: number, y: Float64Array, f: Float64Array, out: Float64Array): void {
    if (this.system.jacobianSize === out.length) {
      this.callJacobian(t, y, f, out);
      return;
    }
    const values = this.jacScratch;
    this.callJacobian(t, y, f, values);
    this.system.toDense(values, out);
  }

  /** The held J as a dense row-major array (itself when the storage is dense). */
  private denseJacobian(): Float64Array {
    if (this.system.jacobianSize === this.n * this.n) return this.jac;
    return this.system.toDense(this.jac, (this.jacDense ??= new Float64Array(this.n * this.n)));
  }

  /** Map errors from user code to a status; rethrow anything else (a bug). */
  private failFromError(e: unknown): DaeStepResult {
    if (e instanceof UserCodeError) {
      const msg = e.cause instanceof Error ? e.cause.message : String(e.cause);
      return this.fail('rhs-error', `${e.what} threw at t = ${e.tAt}: ${msg}`, [], e.cause);
    }
    if (e instanceof NonFiniteJacobian) {
      return this.fail('non-finite', `the Jacobian has NaN or Infinity entries at t = ${e.tAt} in rows ${e.rows.join(', ')}`, e.rows);
    }
    throw e;
  }

  /** out = M v (v when M is the identity). */
  mulMass(v: number[], vOff: number, out: number[]): void {
    const rp = this.mRowPtr;
    if (!rp) {
      for (let i = 0; i < this.n; i++) out[i] = v[vOff + i]!;
      return;
    }
    const col = this.mCol!;
    const val = this.mVal!;
    for (let i = 0; i < this.n; i++) {
      let s = 0;
      for (let k = rp[i]!; k < rp[i + 1]!; k++) s += val[k]! * v[vOff + col[k]!]!;
      out[i] = s;
    }
  }

  /** Consistent initialisation, f, first h, event values at the present time. */
  private initialise(fresh: boolean, capByEstimate = false): void {
    const p = this.p;
    const n = this.n;
    this.landing = undefined;
    this.first = true;
    this.extrapolate = false;
    this.slopeStart = false;
    this.hAcc = NaN;
    this.errAcc = NaN;
    this.faccon = 1;
    this.theta = JACOBIAN_RATE_THRESHOLD;
    this.jacValid = false;
    this.jacCurrent = false;
    this.luH = NaN;
    try {
      let yp: Float64Array | undefined;
      if (this.spaces && this.spaces.k > 0 && p.consistentInit) {
        const ctx = this.consistencyContext();
        const yBefore = Float64Array.from(this.yCur);
        const res = makeConsistent(ctx, this.tCur, this.yCur);
        if (!res.ok) {
          this.yCur.set(yBefore); // report the state as given, not a failed Newton iterate
          if (res.reason === 'non-finite') {
            this.fail('non-finite', `f returned NaN or Infinity at t = ${this.tCur} in components ${res.components.join(', ')} (initial state)`, res.components);
          } else {
            this.fail('inconsistent-init', `no consistent initial state at t = ${this.tCur}: ${res.message}`, res.components);
          }
          return;
        }
        this.adjustedCur = res.adjusted ?? [];
        if (fresh || capByEstimate) {
          const dt = Math.sqrt(UROUND) * Math.max(Math.abs(this.tCur), p.tEnd - p.t0);
          yp = this.sparseConsistency ? this.sparseDerivativeAt(ctx, dt) : consistentDerivative(ctx, p.denseMass()!, this.tCur, dt, this.yCur);
        }
      }
      this.callRhs(this.tCur, this.yCur, this.fCur);
      if (!allFinite(this.fCur)) {
        const bad = nonFiniteIndices(this.fCur);
        this.fail('non-finite', `f returned NaN or Infinity at t = ${this.tCur} in components ${bad.join(', ')}`, bad);
        return;
      }
      if (fresh) this.hCur = this.startingStepSize(yp ?? (p.mass ? undefined : this.fCur), false);
      else if (capByEstimate) this.hCur = Math.min(this.hCur, this.startingStepSize(yp ?? (p.mass ? undefined : this.fCur), true));
      this.evaluateEventsAt(this.tCur, this.yCur, this.eventValues);
      if (this.tCur >= p.tEnd) this.statusCur = 'success';
    } catch (e) {
      this.failFromError(e);
    }
  }

  /** consistentDerivative on the sparse path: f and J evaluated afresh at the present state (a fresh f array: y' may be kept). */
  private sparseDerivativeAt(ctx: ConsistencyContext, dt: number): Float64Array | undefined {
    const f = new Float64Array(this.n);
    this.callRhs(this.tCur, this.yCur, f);
    this.callJacobian(this.tCur, this.yCur, f, this.consistencyJac!);
    const yp = this.sparseConsistency!.derivative(ctx, this.tCur, dt, this.yCur, f, this.consistencyJac!);
    return yp && Float64Array.from(yp);
  }

  /** The consistency context with its scale atol + rtol |y| at the present state. */
  private consistencyContext(): ConsistencyContext {
    const ctx = this.consistency!;
    errorScale(this.yCur, this.p.rtol, this.p.atol, ctx.scale);
    return ctx;
  }

  /**
   * Initial step (Hairer, Norsett and Wanner, Solving ODEs I, sect. II.4,
   * "starting step size"; the form used by SciPy's select_initial_step) from
   * y' at t0: f for an ODE, the consistent derivative for a DAE, with the
   * second derivative's size from a trial f at t0 + h0, y0 + h0 y'. The
   * user's initial step instead, unless `ignoreGiven`. For a run's start and
   * a full re-initialisation; a cheap restart has {@link restartStepSize}.
   */
  private startingStepSize(yp: Float64Array | undefined, ignoreGiven: boolean): number {
    const p = this.p;
    const span = p.tEnd - p.t0;
    const cap = Math.min(p.maxStep, span);
    if (p.initialStep !== undefined && !ignoreGiven) {
      // A step below the round-off floor of attemptStep can never be taken: start at the floor instead
      // (a caller that carries the last step of a sliver between two close breakpoints into the next interval).
      const floor = 10 * UROUND * Math.max(Math.abs(this.tCur), 1e-10 * span);
      return Math.min(Math.max(p.initialStep, floor), cap);
    }
    if (!yp) return Math.min(1e-6 * span, cap);
    const scale = errorScale(this.yCur, p.rtol, p.atol, this.stepWork.scale);
    const d1 = weightedRmsNorm(yp, scale);
    const h0 = firstStepGuess(weightedRmsNorm(this.yCur, scale), d1, span, cap);
    return stepFromDerivatives(h0, d1, this.trialSecondDerivative(h0, yp, scale), span, cap);
  }

  /**
   * {@link startingStepSize} at a cheap restart (the user's initial step
   * ignored), the second derivative's size from `secondDerivative` when
   * given (J y' + df/dt, the trial's difference quotient to first order in
   * h0). Apart from the run's start: a branch taken only at the start would
   * have no type feedback when V8 optimises the restarts, and each later
   * run's start would throw that code away (docs/solver.md).
   */
  private restartStepSize(yp: Float64Array | undefined, secondDerivative: Float64Array | undefined): number {
    const p = this.p;
    const span = p.tEnd - p.t0;
    const cap = Math.min(p.maxStep, span);
    if (!yp) return Math.min(1e-6 * span, cap);
    const scale = errorScale(this.yCur, p.rtol, p.atol, this.stepWork.scale);
    const d1 = weightedRmsNorm(yp, scale);
    const h0 = firstStepGuess(weightedRmsNorm(this.yCur, scale), d1, span, cap);
    const d2 = secondDerivative ? weightedRmsNorm(secondDerivative, scale) : this.trialSecondDerivative(h0, yp, scale);
    return stepFromDerivatives(h0, d1, d2, span, cap);
  }

  /** The second derivative's weighted size from a trial f at t + h0, y + h0 y'. */
  private trialSecondDerivative(h0: number, yp: Float64Array, scale: Float64Array): number {
    const n = this.n;
    const { y1, f1 } = this.stepWork;
    for (let i = 0; i < n; i++) y1[i] = this.yCur[i]! + h0 * yp[i]!;
    this.callRhs(this.tCur + h0, y1, f1);
    for (let i = 0; i < n; i++) f1[i] = f1[i]! - this.fCur[i]!;
    return weightedRmsNorm(f1, scale) / h0;
  }

  private evaluateEventsAt(t: number, y: Float64Array, out: Float64Array): void {
    const evs = this.p.events;
    for (let e = 0; e < evs.length; e++) {
      try {
        out[e] = evs[e]!.fn(t, y);
      } catch (err) {
        throw new UserCodeError(err, `event "${this.p.eventNames[e]}"`, t);
      }
    }
  }

  /**
   * Build and factor (gamma/h) M - J and ((alpha - i beta)/h) M - J for the step size h of
   * `attempt` (read from there: a number passed to a call that is not inlined is boxed on the heap).
   * Returns the bad pivot (real system first) or -1.
   */
  private factorIterationMatrices(): number {
    const h = this.attempt.h;
    this.statsCur.luFactorizations++;
    return this.system.factor(this.jac, MU_REAL / h, MU_COMPLEX_RE / h, MU_COMPLEX_IM / h);
  }

  /**
   * Evaluate J afresh at the present state; when it equals the one held
   * entry for entry (a linear network whose inputs jumped), keep the held
   * one with its version, so the LU factors of the iteration matrices and of
   * the algebraic block stay valid (the same matrices, factored again, would
   * give the same factors).
   */
  private refreshJacobianKeepingEqual(): void {
    if (!this.jacValid) {
      this.ensureJacobian();
      return;
    }
    const fresh = this.jacScratch;
    this.jacValid = false;
    this.callJacobian(this.tCur, this.yCur, this.fCur, fresh);
    const J = this.jac;
    let same = true;
    for (let k = 0; k < fresh.length; k++) {
      if (fresh[k] !== J[k]) {
        same = false;
        break;
      }
    }
    this.jacValid = true;
    this.jacCurrent = true;
    if (same) return;
    // The fresh one becomes the held one by exchanging the two arrays (no copy; nothing else keeps either).
    this.jac = fresh;
    this.jacScratch = J;
    this.jacVersion++;
    this.luH = NaN;
  }

  private ensureJacobian(): void {
    if (!this.jacValid || !this.jacCurrent) {
      this.callJacobian(this.tCur, this.yCur, this.fCur, this.jac);
      this.jacVersion++;
      this.jacValid = true;
      this.jacCurrent = true;
      this.luH = NaN;
    }
  }

  /** The next breakpoint after t when it comes no later than tStop, else NaN. */
  private nextBreakpoint(tStop: number): number {
    const bps = this.p.breakpoints;
    const next = firstIndexAbove(bps, this.tCur);
    return next < bps.length && bps[next]! <= tStop ? bps[next]! : NaN;
  }

  /**
   * The attempt loop of radau5 (Hairer and Wanner II, sect. IV.8), returning
   * after one accepted step or a failure. Per attempt: choose h (landing on
   * the target), factor the iteration matrices when h changed, solve the
   * collocation system ({@link solveCollocation}), estimate the error
   * ({@link radauErrorEstimate}), then accept or reject with the step-size
   * controller (step-size-controller.ts).
   */
  private attemptStep(tStopIn: number): DaeStepResult {
    const p = this.p;
    const n = this.n;
    if (this.pendingError) throw this.pendingError;
    if (this.pendingFailure) {
      const pf = this.pendingFailure;
      this.pendingFailure = undefined;
      return this.fail(pf.status, pf.message, pf.components);
    }
    if (p.signal?.aborted) {
      return this.fail('aborted', `aborted by the caller's signal at t = ${this.tCur}`, []);
    }
    if (!allFinite(this.fCur)) {
      const badF = nonFiniteIndices(this.fCur);
      return this.fail('non-finite', `f returned NaN or Infinity at t = ${this.tCur} in components ${badF.join(', ')}; check the model near this time`, badF);
    }
    // A step may not pass the next breakpoint, tStop or tEnd.
    const breakpoint = this.nextBreakpoint(tStopIn);
    let isBreakpoint = breakpoint === breakpoint;
    let tTarget = isBreakpoint ? breakpoint : Math.min(tStopIn, p.tEnd);
    // ...nor a located event that the steps must end on (see DaeEvent.stepToEvent).
    if (this.landing && this.landing.t < tTarget) {
      tTarget = this.landing.t;
      isBreakpoint = false;
    }
    const z = this.work.z;
    const scale = this.scale;
    const y = this.yCur;
    const t = this.tCur;
    let rejected = false;
    let singularCount = 0;
    let newtonFailCount = 0;
    // What a failure of this step would name: whether the last Newton failure was a non-finite f, and
    // the components of the last Newton failure and of the last rejection (kept in place, copied on failure).
    let lastNonFinite = false;
    const newtonComponents = this.newtonOutcome.components;
    const errorComponents = this.errorComponents;
    newtonComponents.clear();
    errorComponents.clear();
    const hMin = 10 * UROUND * Math.max(Math.abs(t), 1e-10 * (p.tEnd - p.t0));

    for (;;) {
      const st = this.statsCur;
      if (st.acceptedSteps + st.rejectedSteps + st.retakenSteps >= p.maxSteps) {
        return this.fail('step-budget', `stopped after maxSteps = ${p.maxSteps} steps at t = ${t}; raise maxSteps or loosen the tolerances`, []);
      }
      if (p.maxWallTimeMs !== Infinity && performance.now() - this.startTime > p.maxWallTimeMs) {
        return this.fail('time-budget', `stopped after the wall-time budget of ${p.maxWallTimeMs} ms at t = ${t}`, []);
      }
      let h = Math.min(this.hCur, p.maxStep);
      if (!(h >= hMin)) return this.failTooSmall(h, t, lastNonFinite, errorComponents.length ? errorComponents : newtonComponents);
      // Land exactly on the target (stretching the step a little rather than leaving a sliver).
      // maxStep may be exceeded by round-off (1e-8 relative): steps of exactly maxStep that
      // should add up to a breakpoint would otherwise leave a sliver of a few ulp.
      let tNew = t + h;
      let landed = false;
      if (tNew >= tTarget || tTarget - t <= Math.min(LANDING_STRETCH * h, p.maxStep * (1 + 1e-8))) {
        tNew = tTarget;
        h = tTarget - t;
        landed = true;
      }
      if (h !== this.luH) {
        // The LU is rebuilt for a new h; the Jacobian is refreshed only when it is missing.
        if (!this.jacValid) this.ensureJacobian();
        this.attempt.h = h;
        const pivot = this.factorIterationMatrices();
        if (pivot >= 0) {
          singularCount++;
          if (singularCount >= MAX_SINGULAR_RETRIES) {
            this.hCur = h;
            return this.fail(
              'singular-matrix',
              `the iteration matrix (gamma/h M - J) is singular at t = ${t}, h = ${h.toExponential(3)}, pivot at component ${pivot}; look for an unknown that no equation constrains or a floating part of the model`,
              [pivot],
            );
          }
          this.luH = NaN;
          this.hCur = h * NEWTON_FAILURE_SHRINK;
          if (!this.jacCurrent) this.ensureJacobian();
          continue;
        }
        this.luH = h;
      }

      // Scale for Newton and error (radau5's SCAL; index-2 components divided by h).
      errorScale(y, this.rtolT, this.atolT, scale);
      if (p.hasIndex2) for (let i = 0; i < n; i++) if (p.index2[i] === 1) scale[i] = scale[i]! / h;
      const at = this.attempt;
      at.t = t;
      at.h = h;
      this.startValues();

      // The last stage sits at tNew; on a breakpoint it takes the left limit of f (one ulp before),
      // because f(breakpoint) is the value after the switch (the project's waveform convention).
      const tLastStage = landed && isBreakpoint && tNew === tTarget ? nextDown(tNew) : tNew;
      at.tLastStage = tLastStage;
      at.faccon = this.faccon;
      const newton = solveCollocation(this.collocation, this.work, y, scale, at, this.newtonOutcome);
      this.faccon = newton.faccon;
      if (!newton.converged) {
        this.statsCur.newtonFailures++;
        this.luH = NaN;
        lastNonFinite = newton.nonFiniteF;
        if (lastNonFinite) {
          this.hCur = h * NEWTON_FAILURE_SHRINK;
          continue;
        }
        if (!this.jacCurrent) {
          // Refresh the Jacobian first, keep h.
          this.ensureJacobian();
          this.hCur = h;
          continue;
        }
        newtonFailCount++;
        if (newtonFailCount >= MAX_NEWTON_FAILURES && this.cheapRestartUnproven) {
          this.cheapRestartUnproven = false;
          this.yCur.set(this.ySaved);
          this.initialise(false, this.cheapRestartCap);
          if (this.statusCur !== 'running') return { status: this.statusCur, events: [] };
          newtonFailCount = 0;
          continue;
        }
        if (newtonFailCount >= MAX_NEWTON_FAILURES) {
          this.hCur = h;
          const components = newtonComponents.toArray();
          return this.fail(
            'newton-failure',
            `the Newton iteration failed ${newtonFailCount} times in a row at t = ${t} with a fresh Jacobian, last h = ${h.toExponential(3)} (components ${components.join(', ')}); check the Jacobian against finiteDifferenceJacobian, the model's smoothness, or tolerances too tight for round-off`,
            components,
          );
        }
        // First step after a (re)start with a contracting Newton predicted too slow: an algebraic unknown
        // jumped (its first increment stays large however small h is), so shrink as for a rejected first step.
        this.hCur = h * (this.first && newton.theta < 0.5 ? Math.min(newton.shrink, FIRST_STEP_REJECT_SHRINK) : newton.shrink);
        continue;
      }
      lastNonFinite = false;

      radauErrorEstimate(this.collocation, this.luReal, this.errorWork, at, y, this.fCur, z, scale, this.first || rejected);
      const err = at.err;
      if (err >= 1) {
        // Rejected.
        this.statsCur.rejectedSteps++;
        largestScaledInto(this.errorWork.err, scale, 3, errorComponents);
        rejected = true;
        this.hCur = this.first ? h * FIRST_STEP_REJECT_SHRINK : h / errorQuotient(err, newton.iterations);
        this.luH = NaN;
        if (!this.jacCurrent) this.ensureJacobian();
        continue;
      }
      at.tNew = tNew;
      return this.accept(rejected, newton.iterations, landed && isBreakpoint && tNew === tTarget);
    }
  }

  /** Status for a step size below the round-off limit: non-finite f, or step-size underflow naming components. */
  private failTooSmall(h: number, t: number, lastNonFinite: boolean, components: ComponentList): DaeStepResult {
    if (lastNonFinite) {
      const bad = this.newtonOutcome.nonFinite.toArray();
      return this.fail('non-finite', `f returned NaN or Infinity near t = ${t} in components ${bad.join(', ')} for every step tried; check the model near this time`, bad);
    }
    // Without an error estimate, name the components that change fastest.
    const comps = components.length ? components.toArray() : largestScaled(this.fCur, errorScale(this.yCur, this.rtolT, this.atolT, this.scale));
    return this.fail(
      'step-size-underflow',
      `step size ${h.toExponential(3)} fell below the round-off limit at t = ${t} (components ${comps.join(', ')}); look for a singularity in f (a solution that blows up), an inconsistent or higher-index model, or tolerances too tight`,
      comps,
    );
  }

  /** Newton start values into work.z for the step (t, h) of `attempt`: the last step's collocation polynomial extrapolated, or zero (radau5 STARTN). */
  private startValues(): void {
    const { t, h } = this.attempt;
    const n = this.n;
    const z = this.work.z;
    const y = this.yCur;
    if (this.extrapolate && this.hasPiece) {
      // The three stages in one pass, each written as evaluateCollocation writes it (the same operations).
      const it = this.piece;
      const yOld = it.yOld;
      const q = it.q;
      const s1 = (t + C1 * h - it.tOld) / it.h;
      const s2 = (t + C2 * h - it.tOld) / it.h;
      const s3 = (t + h - it.tOld) / it.h;
      for (let i = 0; i < n; i++) {
        const yo = yOld[i]!;
        const q1 = q[i]!;
        const q2 = q[n + i]!;
        const q3 = q[2 * n + i]!;
        const yi = y[i]!;
        z[i] = yo + s1 * (q1 + s1 * (q2 + s1 * q3)) - yi;
        z[n + i] = yo + s2 * (q1 + s2 * (q2 + s2 * q3)) - yi;
        z[2 * n + i] = yo + s3 * (q1 + s3 * (q2 + s3 * q3)) - yi;
      }
    } else if (this.slopeStart) {
      // After a cheap restart: the tangent y + c h y' (y' consistent), closer than zero by O(h^2).
      const yp = this.restartSlope;
      for (let s = 0; s < 3; s++) {
        const ch = (s === 0 ? C1 : s === 1 ? C2 : 1) * h;
        for (let i = 0; i < n; i++) z[s * n + i] = ch * yp[i]!;
      }
    } else {
      for (let k = 0; k < 3 * n; k++) z[k] = 0;
    }
  }

  /**
   * Take the converged step [t, tNew] (t, tNew, h, err from `attempt`, the Newton rate from
   * `newtonOutcome`): controller memory and next h, the
   * dense output, f at the new point, re-initialisation on a breakpoint, events.
   */
  private accept(rejected: boolean, iterations: number, onBreakpoint: boolean): DaeStepResult {
    const { t, tNew, h, err } = this.attempt;
    const theta = this.newtonOutcome.theta;
    const p = this.p;
    const n = this.n;
    const z = this.work.z;
    const y = this.yCur;
    if (this.landingEvents) {
      // What a retake of this step would start from (see retake).
      const m = this.stepStart;
      m.f.set(this.fCur);
      m.hAcc = this.hAcc;
      m.errAcc = this.errAcc;
      m.first = this.first;
      m.cheapRestartUnproven = this.cheapRestartUnproven;
      m.jacValid = this.jacValid;
      m.jacCurrent = this.jacCurrent;
    }
    const recomputeJac = iterations > 2 && theta > JACOBIAN_RATE_THRESHOLD;
    const next = this.acceptedStep;
    next.h = h;
    next.err = err;
    next.hAcc = this.hAcc;
    next.errAcc = this.errAcc;
    next.maxStep = p.maxStep;
    next.newtonIterations = iterations;
    next.rejected = rejected;
    next.recomputeJacobian = recomputeJac;
    nextStepSize(next);
    this.hAcc = h;
    this.errAcc = Math.max(1e-2, err);
    this.statsCur.acceptedSteps++;

    // Dense output coefficients Q = Z^T P, before z is reused (into the reused piece buffers).
    const piece = this.piece;
    const q = piece.q;
    // P's entries as locals and the three powers in one pass: the imported array read inside the
    // loop was loaded and checked per entry.
    const p0 = P[0]!, p1 = P[1]!, p2 = P[2]!, p3 = P[3]!, p4 = P[4]!, p5 = P[5]!, p6 = P[6]!, p7 = P[7]!, p8 = P[8]!;
    for (let i = 0; i < n; i++) {
      const z1 = z[i]!;
      const z2 = z[n + i]!;
      const z3 = z[2 * n + i]!;
      q[i] = z1 * p0 + z2 * p3 + z3 * p6;
      q[n + i] = z1 * p1 + z2 * p4 + z3 * p7;
      q[2 * n + i] = z1 * p2 + z2 * p5 + z3 * p8;
    }
    const yOld = piece.yOld;
    for (let i = 0; i < n; i++) {
      const yi = y[i]!;
      yOld[i] = yi;
      y[i] = yi + z[2 * n + i]!;
    }
    piece.tOld = t;
    piece.t = tNew;
    piece.h = h;
    this.hasPiece = true;
    this.pieceCopy = undefined;
    this.tCur = tNew;
    this.first = false;
    this.extrapolate = true;
    this.slopeStart = false;
    this.cheapRestartUnproven = false;
    let rhsAtState = false;
    try {
      this.callRhsAtStepEnd(tNew, y);
      // A breakpoint's re-initialisation may move y. (Recombined rows are not the problem's f: rhsOwn keeps it.)
      rhsAtState = !onBreakpoint;
    } catch (e) {
      // The step itself is good: keep it; the next step() reports the error.
      if (e instanceof UserCodeError) this.pendingError = e;
      else throw e;
    }

    this.jacCurrent = false;
    if (recomputeJac) this.jacValid = false;
    this.hCur = next.hNext;
    const jumpFrom = onBreakpoint ? this.reinitialiseAtBreakpoint(tNew) : undefined;
    if (tNew >= p.tEnd) this.statusCur = 'success';

    // Events on the dense output.
    let events: readonly DaeEventRecord[] = NO_EVENTS;
    let terminal = false;
    if (p.events.length) {
      const r = this.findEvents(t, tNew, !onBreakpoint);
      if (r.retake) return this.retake(t, r.retake.t, r.retake.index, r.retake.hAfter);
      events = r.events;
      terminal = r.terminal;
    }
    if (terminal) {
      this.statusCur = 'terminal-event';
      this.messageCur = `terminal event "${events[events.length - 1]!.name}" at t = ${this.tCur}`;
      return jumpFrom ? { status: 'terminal-event', events, jumpFrom } : { status: 'terminal-event', events };
    }
    if (jumpFrom) return { status: 'accepted', events, jumpFrom };
    // Only a step that ends where f was evaluated, with no event located in it, hands f on.
    if (events.length === 0) this.rhsAtState = rhsAtState;
    return events === NO_EVENTS ? ACCEPTED : { status: 'accepted', events };
  }

  /**
   * After landing on a breakpoint: forget the step history and, since a
   * switch may move the algebraic unknowns, start the next step from a
   * consistent state (radau5's error estimate copes with an inconsistent
   * start only with an exact Jacobian). Returns the state before when it moved.
   */
  private reinitialiseAtBreakpoint(tNew: number): Float64Array | undefined {
    const p = this.p;
    const y = this.yCur;
    this.restartHistory();
    if (!(this.spaces && this.spaces.k > 0 && p.consistentInit && !this.pendingError)) return undefined;
    const before = y.slice();
    const res = makeConsistent(this.consistencyContext(), tNew, y);
    if (!res.ok) {
      y.set(before);
      this.pendingFailure = {
        status: res.reason === 'non-finite' ? 'non-finite' : 'inconsistent-init',
        message: `no consistent state after the breakpoint at t = ${tNew}: ${res.message}`,
        components: res.components,
      };
      return undefined;
    }
    if (y.some((v, i) => v !== before[i])) {
      this.callRhs(tNew, y, this.fCur);
      return before;
    }
    return undefined;
  }
  /** After landing on a breakpoint: forget the step history (radau5 restarted there). */
  private restartHistory(): void {
    this.first = true;
    this.extrapolate = false;
    this.slopeStart = false;
    this.hAcc = NaN;
    this.errAcc = NaN;
    this.faccon = 1;
    this.jacValid = false;
    this.jacCurrent = false;
    this.luH = NaN;
  }

  /**
   * Sign changes of the event functions over [tOld, tNew]; cuts the step at
   * the first terminal one, or asks for the step to be taken again to end on
   * it (`retake`, for a {@link DaeEvent.stepToEvent} event when `mayRetake`).
   * On a step that ends on a pending landing, that event is not located: it
   * happens at tNew if its function has its new sign there; if not, a short
   * step to the crossing is set up (see {@link DaeEvent.stepToEvent}).
   */
  private findEvents(tOld: number, tNew: number, mayRetake: boolean): { events: DaeEventRecord[]; terminal: boolean; retake?: { t: number; index: number; hAfter: number } } {
    const p = this.p;
    const evs = p.events;
    const gNew = new Float64Array(evs.length);
    this.evaluateEventsAt(tNew, this.yCur, gNew);
    const it = this.piece;
    const yb = new Float64Array(this.n);
    const pending = this.landing;
    const landed = pending !== undefined && pending.t === tNew ? pending : undefined;
    if (landed) this.landing = undefined;
    let landedOldSign = false;
    const found: { index: number; t: number }[] = [];
    for (let e = 0; e < evs.length; e++) {
      const ga = this.eventValues[e]!;
      const gb = gNew[e]!;
      const dir = evs[e]!.direction ?? 0;
      const rising = ga < 0 && gb >= 0;
      const falling = ga > 0 && gb <= 0;
      const crossed = (rising && dir >= 0) || (falling && dir <= 0);
      if (landed && e === landed.index) {
        // The step ends where the event was located: it happens here (a sign change inside this step is the
        // same crossing, seen on the error-controlled trajectory within the tolerance), unless g keeps its old sign.
        if (crossed || landed.tries >= MAX_LANDING_TRIES) found.push({ index: e, t: tNew });
        else landedOldSign = true;
        continue;
      }
      if (!crossed) continue;
      const fn = evs[e]!.fn;
      const name = p.eventNames[e]!;
      const g = (tt: number): number => {
        evaluateCollocation(it, tt, yb);
        try {
          return fn(tt, yb);
        } catch (err) {
          throw new UserCodeError(err, `event "${name}"`, tt);
        }
      };
      const tol = p.eventTolerance ?? 1e-12 * Math.max(1, Math.abs(tNew));
      found.push({ index: e, t: locateSignChange(g, tOld, tNew, ga, gb, tol) });
    }
    found.sort((a, b) => a.t - b.t);
    const records: DaeEventRecord[] = [];
    let terminal = false;
    for (const f of found) {
      const ev = evs[f.index]!;
      if (ev.terminal && ev.stepToEvent && mayRetake && f.t < tNew && f.t - tOld > this.shortestLanding(tOld)) {
        // The caller restarts from the state here: take the step again to end on the event (the events
        // before it are found again on the retaken steps).
        // After it, the step proposed by the step that first located an event here (a retaken step's own proposal is cut short).
        return { events: [], terminal: false, retake: { t: f.t, index: f.index, hAfter: pending?.hAfter ?? this.hCur } };
      }
      const yE = new Float64Array(this.n);
      if (f.t === tNew) yE.set(this.yCur);
      else evaluateCollocation(it, f.t, yE);
      records.push({ index: f.index, name: p.eventNames[f.index]!, t: f.t, y: yE });
      if (ev.terminal) {
        terminal = true;
        break;
      }
    }
    if (terminal) {
      this.landing = undefined; // the caller restarts (or stops) here
      const last = records[records.length - 1]!;
      if (last.t < tNew) {
        this.tCur = last.t;
        this.yCur.set(last.y);
        it.t = last.t;
        this.pieceCopy = undefined;
        this.callRhs(this.tCur, this.yCur, this.fCur);
        this.jacCurrent = false;
        if (this.statusCur === 'success') this.statusCur = 'running';
      } else if (landed && last.index === landed.index) {
        // After the event the step the located step proposed (the retake's own is cut short by the landing).
        this.hCur = landed.hAfter;
      }
      this.evaluateEventsAt(this.tCur, this.yCur, this.eventValues);
      // The located event's function already has its new sign at the cut (right end of the final bracket).
    } else {
      this.eventValues = gNew;
      if (landedOldSign) {
        // The error-controlled trajectory crosses a little later: a short step to the crossing.
        const tc = this.crossingAfter(landed!.index, tNew, gNew[landed!.index]!);
        if (tc !== undefined) this.landing = { t: tc, index: landed!.index, hAfter: landed!.hAfter, tries: landed!.tries + 1 };
      }
    }
    return { events: records, terminal };
  }

  /** The shortest step a landing takes (shorter ones keep the dense output): a hundred round-off limits. */
  private shortestLanding(t: number): number {
    return MIN_LANDING_STEPS * 10 * UROUND * Math.max(Math.abs(t), 1e-10 * (this.p.tEnd - this.p.t0));
  }

  /**
   * Where event `index`, with the value g at the end of the step just
   * taken (still on its old side), crosses: the secant through the step's
   * midpoint and its end, a quarter further so that the step lands on the
   * new side (the secant's own error is second order in that distance, the
   * overshoot a quarter of it: within the time the interpolant's location
   * was already off by). Undefined when
   * the secant does not point to a crossing within a step's length (the
   * event is then found as usual, by the next step's sign change).
   */
  private crossingAfter(index: number, tEnd: number, g: number): number | undefined {
    const it = this.piece;
    const tm = 0.5 * (it.tOld + tEnd);
    const ym = evaluateCollocation(it, tm, new Float64Array(this.n));
    let gm: number;
    try {
      gm = this.p.events[index]!.fn(tm, ym);
    } catch (err) {
      throw new UserCodeError(err, `event "${this.p.eventNames[index]}"`, tm);
    }
    const slope = (g - gm) / (tEnd - tm);
    const d = -g / slope;
    if (!(d > 0 && d < tEnd - it.tOld)) return undefined;
    const tc = tEnd + Math.max(LANDING_OVERSHOOT * d, this.shortestLanding(tEnd));
    return tc < this.p.tEnd ? tc : undefined;
  }

  /**
   * Take the step just accepted over [tOld, tNew] again with h = tEvent -
   * tOld, because an event after which the caller restarts was located at
   * tEvent inside it: the restart then starts from an error-controlled state
   * instead of the dense output (see {@link DaeEvent.stepToEvent}). State,
   * f, controller and Jacobian memory go back to tOld; the discarded step's
   * polynomial, which covers [tOld, tEvent], gives the Newton start values.
   * An ordinary attempt loop follows: if rejected, the controller subdivides
   * and the following steps end on tEvent.
   */
  private retake(tOld: number, tEvent: number, index: number, hAfter: number): DaeStepResult {
    const m = this.stepStart;
    this.statsCur.acceptedSteps--;
    this.statsCur.retakenSteps++;
    this.tCur = tOld;
    this.yCur.set(this.piece.yOld);
    this.fCur.set(m.f);
    this.hAcc = m.hAcc;
    this.errAcc = m.errAcc;
    this.first = m.first;
    this.cheapRestartUnproven = m.cheapRestartUnproven;
    this.jacValid = m.jacValid;
    this.jacCurrent = m.jacCurrent;
    this.extrapolate = true;
    this.slopeStart = false;
    this.pieceCopy = undefined;
    this.pendingError = undefined; // f at the discarded end
    if (this.statusCur === 'success') this.statusCur = 'running';
    this.landing = { t: tEvent, index, hAfter, tries: 0 };
    this.hCur = tEvent - tOld;
    const r = this.attemptStep(tEvent);
    if (r.status !== 'accepted' && r.status !== 'terminal-event') this.forgetPiece();
    return r;
  }
}

/** A step's polynomial with arrays of its own (the public, immutable form). */
function copyPiece(p: DaeStepInterpolant): DaeStepInterpolant {
  const yOld = new Float64Array(p.yOld.length);
  yOld.set(p.yOld);
  const q = new Float64Array(p.q.length);
  q.set(p.q);
  return { tOld: p.tOld, t: p.t, h: p.h, yOld, q };
}

/**
 * u(tOld + s h) = yOld + sum_k Q_k s^(k+1): the dense output of one step
 * (kept name; the evaluator is {@link evaluateCollocation}).
 *
 * @internal
 * @example
 * ```ts
 * evaluateInterpolant(integ.interpolant!, t, out);
 * ```
 */
export function evaluateInterpolant(it: DaeStepInterpolant, t: number, out: Float64Array): void {
  evaluateCollocation(it, t, out);
}

/**
 * J y' + df/dt into `out` (J dense row-major n x n, df/dt from f(t + dt, y)
 * in `fAhead` and f(t, y) in `f`): the derivative of f along the solution,
 * which the starting-step estimate otherwise takes from a trial evaluation
 * (f(t + h0, y + h0 y') - f(t, y)) / h0, equal to it to first order in h0.
 * At a restart both J and df/dt are at hand, so the trial f is saved.
 */
function linearisedSecondDerivative(jac: Float64Array, yp: Float64Array, fAhead: Float64Array, f: Float64Array, dt: number, out: Float64Array): Float64Array {
  const n = yp.length;
  for (let i = 0; i < n; i++) {
    let s = (fAhead[i]! - f[i]!) / dt;
    const row = i * n;
    for (let j = 0; j < n; j++) s += jac[row + j]! * yp[j]!;
    out[i] = s;
  }
  return out;
}

/** The starting step's first guess from the weighted sizes of y (d0) and y' (d1) (Solving ODEs I, sect. II.4, step a-b). */
function firstStepGuess(d0: number, d1: number, span: number, cap: number): number {
  const h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 * span : (0.01 * d0) / d1;
  return Math.min(h0, cap);
}

/** The starting step from the first guess h0 and the weighted sizes of y' (d1) and y'' (d2) (Solving ODEs I, sect. II.4, step c-f). */
function stepFromDerivatives(h0: number, d1: number, d2: number, span: number, cap: number): number {
  let h1: number;
  if (!Number.isFinite(d2)) h1 = h0 * 1e-3;
  else if (d1 <= 1e-15 && d2 <= 1e-15) h1 = Math.max(1e-6 * span, h0 * 1e-3);
  else h1 = (0.01 / Math.max(d1, d2)) ** (1 / 6);
  const h = Math.min(100 * h0, h1, cap);
  return h > 0 && Number.isFinite(h) ? h : Math.min(1e-6 * span, cap);
}
