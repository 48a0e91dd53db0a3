import { InputError } from '../errors.js';
import { compressedSparseMass, massRowCompression, type MassRowCompression } from './mass-row-compression.js';
import { ProblemCalls } from './problem-calls.js';
import { denseOfSparseMass, isIdentityMass, sparseMassOfDense, sparseMassOfEntries, type SparseMass } from './sparse-mass.js';
import { sparsePattern, type SparsePattern } from './sparse-pattern.js';
import { SPARSE_MIN_SIZE, type DaeEvent, type DaeProblem, type JacobianEntriesFunction, type JacobianFunction, type RhsFunction, type SolveDaeOptions, type DaeProgress } from './types.js';

/**
 * A validated copy of a {@link DaeProblem} and its options, in the shapes
 * the integrator works with. User inputs are never mutated.
 *
 * @internal
 */
export interface NormalizedDae {
  readonly n: number;
  /** f and J called as methods of the problem (the hot call sites: one call target whatever the run). */
  readonly calls: ProblemCalls;
  /** f as a function (recombined), for the paths that take one: it calls {@link NormalizedDae.calls}. */
  readonly rhs: RhsFunction;
  /** The dense J as a function (recombined), or undefined when the problem gives none. */
  readonly jacobian: JacobianFunction | undefined;
  /** The Jacobian entry by entry as the problem gave it (for the sparse path): rows not yet recombined by `massCompression`. */
  readonly jacobianEntries: JacobianEntriesFunction | undefined;
  /** Dependent rows of M recombined into explicit algebraic equations (rhs, jacobian and mass above are recombined already). */
  readonly massCompression: MassRowCompression | undefined;
  /** M in compressed rows (dependent rows recombined already), or undefined for the identity. */
  readonly mass: SparseMass | undefined;
  /** The same M row-major n*n (made on first call, for the dense path), or undefined for the identity. */
  denseMass(): Float64Array | undefined;
  /** Whether {@link NormalizedDae.denseMass} has made its n x n array. */
  denseMassMade(): boolean;
  readonly y0: Float64Array;
  readonly t0: number;
  readonly tEnd: number;
  /** Sorted, unique, strictly inside (t0, tEnd). */
  readonly breakpoints: Float64Array;
  readonly events: readonly DaeEvent[];
  readonly eventNames: readonly string[];
  /** 1 for index-2 components. */
  readonly index2: Uint8Array;
  readonly hasIndex2: boolean;
  readonly rtol: Float64Array;
  readonly atol: Float64Array;
  /** Whether atol is mapped with rtol (radau5) or fixed at its value for rtol = 1e-6. */
  readonly atolFollowsRtol: boolean;
  readonly initialStep: number | undefined;
  readonly maxStep: number;
  readonly maxSteps: number;
  readonly maxWallTimeMs: number;
  readonly signal: AbortSignal | undefined;
  readonly onProgress: ((p: DaeProgress) => void) | undefined;
  readonly progressIntervalMs: number;
  readonly eventTolerance: number | undefined;
  readonly consistentInit: boolean;
  readonly denseOutput: boolean;
  readonly outputTimes: Float64Array;
  readonly linearAlgebra: 'flat' | 'ml-matrix' | 'sparse';
  /** Pattern of (gamma/h) M - J (J's declared pattern, M, the diagonal), when the sparse LU is used. */
  readonly iterationPattern: SparsePattern | undefined;
}

function bad(code: string, message: string, elements: string[] = []): never {
  throw new InputError(code, message, elements);
}

function finite(x: unknown): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

/** The solver's default tolerances (SolveDaeOptions). */
export const DEFAULT_RTOL = 1e-6;
/** See {@link DEFAULT_RTOL}. */
export const DEFAULT_ATOL = 1e-9;

/**
 * Whether atol is mapped with rtol (radau5's map) or taken at its value for
 * rtol = 1e-6: as asked, else mapped exactly when atol is given.
 *
 * @internal
 */
export function atolFollowsRtol(options: SolveDaeOptions): boolean {
  return options.atolFollowsRtol ?? options.atol !== undefined;
}

/** An optional option that must be a finite number > 0. */
function positive(v: number | undefined, label: string): number | undefined {
  if (v === undefined) return undefined;
  if (!finite(v) || v <= 0) bad('bad-option', `${label} = ${v} must be a finite number > 0`, [label]);
  return v;
}

/**
 * A tolerance option as one value per unknown: `dflt` when absent, a scalar
 * spread, an array checked (length n, finite, >= 0); throws a
 * `bad-tolerance` InputError otherwise.
 *
 * @internal
 * @example
 * ```ts
 * toleranceArray(1e-6, 1e-6, 3, 'rtol'); // [1e-6, 1e-6, 1e-6]
 * ```
 */
export function toleranceArray(value: number | ArrayLike<number> | undefined, dflt: number, n: number, label: 'rtol' | 'atol'): Float64Array {
  const out = new Float64Array(n);
  if (value === undefined) return out.fill(dflt);
  if (typeof value === 'number') {
    if (!finite(value) || value < 0) bad('bad-tolerance', `${label} = ${value} must be a finite number >= 0`, [label]);
    return out.fill(value);
  }
  if (value.length !== n) bad('bad-tolerance', `${label} has ${value.length} entries but the problem has ${n} unknowns; give one per unknown or a scalar`, [label]);
  for (let i = 0; i < n; i++) {
    const v = value[i]!;
    if (!finite(v) || v < 0) bad('bad-tolerance', `${label}[${i}] = ${v} must be a finite number >= 0`, [label]);
    out[i] = v;
  }
  return out;
}

/**
 * M in compressed rows from `problem.mass` (dense) or `problem.massEntries`,
 * checked: shape, indices, and every value finite (a non-finite entry is
 * named by its position). Undefined when neither is given.
 */
function massOf(problem: DaeProblem, n: number): SparseMass | undefined {
  const m = problem.mass;
  const me = problem.massEntries;
  if (m !== undefined && me !== undefined) bad('bad-mass-matrix', 'give the mass matrix either as mass or as massEntries, not both', ['mass', 'massEntries']);
  if (m !== undefined) {
    if (m instanceof Float64Array) {
      if (m.length !== n * n) bad('bad-mass-matrix', `mass has ${m.length} entries; a row-major ${n}x${n} matrix needs ${n * n}`, ['mass']);
      for (let k = 0; k < n * n; k++) {
        if (!finite(m[k])) bad('bad-mass-matrix', `mass entry (${Math.floor(k / n)}, ${k % n}) = ${m[k]} is not finite`, ['mass']);
      }
      return sparseMassOfDense(m, n);
    }
    if (Array.isArray(m)) {
      if (m.length !== n) bad('bad-mass-matrix', `mass has ${m.length} rows; it must be ${n}x${n}`, ['mass']);
      for (let i = 0; i < n; i++) {
        const row = m[i];
        if (!row || row.length !== n) bad('bad-mass-matrix', `mass row ${i} has ${row?.length} entries; it must have ${n}`, ['mass']);
      }
      const rows: number[] = [];
      const cols: number[] = [];
      const values: number[] = [];
      for (let i = 0; i < n; i++) {
        const row = m[i]!;
        for (let j = 0; j < n; j++) {
          const v = row[j];
          if (!finite(v)) bad('bad-mass-matrix', `mass entry (${i}, ${j}) = ${v} is not finite`, ['mass']);
          if (v !== 0) rows.push(i), cols.push(j), values.push(v);
        }
      }
      return sparseMassOfEntries(n, rows, cols, values);
    }
    bad('bad-mass-matrix', 'mass must be a row-major Float64Array (n*n) or an array of n rows of n numbers', ['mass']);
  }
  if (me === undefined) return undefined;
  if (me === null || typeof me !== 'object' || !me.rows || !me.cols || !me.values) {
    bad('bad-mass-matrix', 'massEntries must be an object { rows, cols, values } of three arrays with one element per entry', ['massEntries']);
  }
  const count = me.rows.length;
  if (me.cols.length !== count || me.values.length !== count) {
    bad('bad-mass-matrix', `massEntries has ${count} rows, ${me.cols.length} columns and ${me.values.length} values; give one of each per entry`, ['massEntries']);
  }
  for (let k = 0; k < count; k++) {
    const i = me.rows[k]!;
    const j = me.cols[k]!;
    if (!(Number.isInteger(i) && Number.isInteger(j) && i >= 0 && j >= 0 && i < n && j < n)) {
      bad('bad-mass-matrix', `massEntries entry ${k} = (${i}, ${j}) is not a position in the ${n} x ${n} mass matrix`, ['massEntries']);
    }
    const v = me.values[k];
    if (!finite(v)) bad('bad-mass-matrix', `massEntries entry ${k}, mass (${i}, ${j}) = ${v}, is not finite`, ['massEntries']);
  }
  return sparseMassOfEntries(n, me.rows, me.cols, me.values);
}

/**
 * Validate a problem and its options; throws {@link InputError} with a stable
 * code for every bad call.
 *
 * @internal
 */
export function normalizeDae(problem: DaeProblem, options: SolveDaeOptions = {}): NormalizedDae {
  if (problem === null || typeof problem !== 'object') bad('bad-problem', 'the problem must be an object { size, rhs, y0, t0, tEnd, ... }');
  const n = problem.size;
  if (!Number.isInteger(n) || n < 1) bad('bad-problem-size', `problem.size = ${n} must be a positive integer`, ['size']);
  if (typeof problem.rhs !== 'function') bad('bad-rhs', 'problem.rhs must be a function (t, y, out) => void', ['rhs']);
  if (problem.jacobianEntries !== undefined && typeof problem.jacobianEntries !== 'function') {
    bad('bad-jacobian', 'problem.jacobianEntries must be a function (t, y, target) => void or absent', ['jacobianEntries']);
  }
  if (problem.jacobian !== undefined && typeof problem.jacobian !== 'function') {
    bad('bad-jacobian', 'problem.jacobian must be a function (t, y, out) => void or absent', ['jacobian']);
  }
  const { t0, tEnd } = problem;
  if (!finite(t0) || !finite(tEnd)) bad('bad-time-span', `t0 = ${t0} and tEnd = ${tEnd} must be finite numbers`, ['t0', 'tEnd']);
  if (!(tEnd > t0)) bad('bad-time-span', `tEnd = ${tEnd} must be greater than t0 = ${t0}`, ['t0', 'tEnd']);
  const y0In = problem.y0;
  if (!y0In || y0In.length !== n) bad('bad-initial-state', `y0 has ${y0In?.length} entries but problem.size is ${n}`, ['y0']);
  const y0 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = y0In[i]!;
    if (!finite(v)) bad('bad-initial-state', `y0[${i}] = ${v} is not finite; give a finite initial value`, ['y0']);
    y0[i] = v;
  }

  let mass = massOf(problem, n);
  // An exact identity is an ODE: drop the matrix so the hot loop skips M products.
  if (mass && isIdentityMass(mass)) mass = undefined;
  // Rows of M that depend on other rows are algebraic equations in disguise: make them explicit.
  const compression = mass ? massRowCompression(mass, n) : undefined;

  const bps: number[] = [];
  for (const b of problem.breakpoints ?? []) {
    if (!finite(b)) bad('bad-breakpoint', `breakpoint ${b} is not finite`, ['breakpoints']);
    if (b < t0 || b > tEnd) bad('bad-breakpoint', `breakpoint ${b} lies outside [t0, tEnd] = [${t0}, ${tEnd}]; drop it or widen the span`, ['breakpoints']);
    if (b > t0 && b < tEnd) bps.push(b);
  }
  bps.sort((a, b) => a - b);
  const breakpoints = Float64Array.from(bps.filter((b, i) => i === 0 || b !== bps[i - 1]));

  const events = problem.events ?? [];
  const eventNames: string[] = [];
  events.forEach((e, i) => {
    const name = e?.name ?? `event ${i}`;
    if (!e || typeof e.fn !== 'function') bad('bad-event', `${name}: fn must be a function (t, y) => number`, [name]);
    if (e.direction !== undefined && e.direction !== -1 && e.direction !== 0 && e.direction !== 1) {
      bad('bad-event', `${name}: direction ${String(e.direction)} must be -1, 0 or 1`, [name]);
    }
    eventNames.push(name);
  });

  const index2 = new Uint8Array(n);
  let hasIndex2 = false;
  for (const k of problem.index2 ?? []) {
    if (!Number.isInteger(k) || k < 0 || k >= n) bad('bad-index2', `index2 entry ${k} is not a component index in 0..${n - 1}`, ['index2']);
    index2[k] = 1;
    hasIndex2 = true;
  }

  const rtol = toleranceArray(options.rtol, DEFAULT_RTOL, n, 'rtol');
  const atol = toleranceArray(options.atol, DEFAULT_ATOL, n, 'atol');
  for (let i = 0; i < n; i++) {
    // radau5 requires rtol > 10 uround; its tolerance map rtol -> 0.1 rtol^(2/3) needs rtol > 0.
    if (rtol[i]! < 1e-15) bad('bad-tolerance', `rtol[${i}] = ${rtol[i]} is below 1e-15, the limit of double precision; raise it`, ['rtol']);
  }

  const initialStep = positive(options.initialStep, 'initialStep');
  const maxStep = positive(options.maxStep, 'maxStep') ?? tEnd - t0;
  const maxSteps = options.maxSteps ?? 1e6;
  if (!Number.isInteger(maxSteps) || maxSteps < 1) bad('bad-option', `maxSteps = ${maxSteps} must be a positive integer`, ['maxSteps']);
  const maxWallTimeMs = positive(options.maxWallTimeMs, 'maxWallTimeMs') ?? Infinity;
  const progressIntervalMs = options.progressIntervalMs ?? 200;
  if (!(progressIntervalMs >= 0) || !finite(progressIntervalMs)) bad('bad-option', `progressIntervalMs = ${progressIntervalMs} must be a finite number >= 0`, ['progressIntervalMs']);
  const eventTolerance = positive(options.eventTolerance, 'eventTolerance');
  if (options.onProgress !== undefined && typeof options.onProgress !== 'function') bad('bad-option', 'onProgress must be a function', ['onProgress']);
  const jp = problem.jacobianPattern;
  const la = options.linearAlgebra ?? (jp && n >= SPARSE_MIN_SIZE ? 'sparse' : 'flat');
  if (la !== 'flat' && la !== 'ml-matrix' && la !== 'sparse') bad('bad-option', `linearAlgebra = ${String(la)} must be 'flat', 'ml-matrix' or 'sparse'`, ['linearAlgebra']);
  if (la === 'sparse' && !jp) bad('bad-option', `linearAlgebra = 'sparse' needs problem.jacobianPattern (the structural non-zeros of df/dy)`, ['linearAlgebra']);
  let iterationPattern: SparsePattern | undefined;
  if (jp) {
    if (jp.rows.length !== jp.cols.length) bad('bad-problem', `jacobianPattern has ${jp.rows.length} rows but ${jp.cols.length} columns; give one (row, col) pair per entry`, ['jacobianPattern']);
    const rows: number[] = [];
    const cols: number[] = [];
    const perRow: number[][] = Array.from({ length: n }, () => []);
    for (let k = 0; k < jp.rows.length; k++) {
      const i = jp.rows[k]!;
      const j = jp.cols[k]!;
      if (!(Number.isInteger(i) && Number.isInteger(j) && i >= 0 && j >= 0 && i < n && j < n)) {
        bad('bad-problem', `jacobianPattern entry ${k} = (${i}, ${j}) is not a position in the ${n} x ${n} Jacobian`, ['jacobianPattern']);
      }
      perRow[i]!.push(j);
    }
    for (let i = 0; i < n; i++) for (const j of perRow[i]!) rows.push(i), cols.push(j);
    // Recombined rows of a hidden algebraic equation take the pattern of the rows they combine.
    // (Their whole rows of the iteration pattern: the mass entries and the diagonal too, so that the
    // sparse path recombines J's values on the pattern entry for entry.)
    for (const d of compression?.dependent ?? []) {
      for (const r of d.rows) {
        for (const j of perRow[r]!) rows.push(d.row), cols.push(j);
        rows.push(d.row), cols.push(r);
        if (mass) for (let e = mass.rowStart[r]!; e < mass.rowStart[r + 1]!; e++) rows.push(d.row), cols.push(mass.col[e]!);
      }
    }
    if (mass) for (let i = 0; i < n; i++) for (let e = mass.rowStart[i]!; e < mass.rowStart[i + 1]!; e++) rows.push(i), cols.push(mass.col[e]!);
    iterationPattern = sparsePattern(n, rows, cols);
  }

  // A problem giving its Jacobian entry by entry only has the dense form too (the dense path, recombined rows).
  const calls = new ProblemCalls(problem, n, compression);

  const ot: number[] = [];
  for (const v of Array.from(options.outputTimes ?? [])) {
    if (!finite(v) || v < t0 || v > tEnd) bad('bad-output-time', `output time ${v} must be a finite number in [t0, tEnd] = [${t0}, ${tEnd}]`, ['outputTimes']);
    ot.push(v);
  }
  ot.sort((a, b) => a - b);

  return new NormalizedProblem({
    n,
    calls,
    massCompression: compression,
    mass: compression && mass ? compressedSparseMass(mass, compression) : mass,
    y0,
    t0,
    tEnd,
    breakpoints,
    events,
    eventNames,
    index2,
    hasIndex2,
    rtol,
    atol,
    atolFollowsRtol: atolFollowsRtol(options),
    initialStep,
    maxStep,
    maxSteps,
    maxWallTimeMs,
    signal: options.signal,
    onProgress: options.onProgress,
    progressIntervalMs,
    eventTolerance,
    consistentInit: options.consistentInit ?? true,
    denseOutput: options.denseOutput ?? true,
    outputTimes: Float64Array.from(ot),
    linearAlgebra: la,
    iterationPattern: la === 'sparse' ? iterationPattern : undefined,
  });
}

/** The fields of a {@link NormalizedDae} that are values (its functions are made by the class, on first use). */
type NormalizedFields = Omit<NormalizedDae, 'rhs' | 'jacobian' | 'jacobianEntries' | 'denseMass' | 'denseMassMade'>;

/**
 * The normalised problem as an instance of a class, not an object literal:
 * V8 makes a literal evaluated a second time from a boilerplate and widens
 * the recorded types of its fields that hold objects, which threw away the
 * integrator's optimised code at the start of a process's second run
 * (docs/solver.md). A class's fields keep their types. The fields are
 * copied one by one (Object.assign onto an empty instance grew its property
 * store field by field, a few microseconds a solve); `declare`d, so that
 * none is first defined as undefined, which would widen its recorded type
 * at the first store. f, J and the dense M as functions are made only when
 * a path asks for them (the dense path with an analytic J never does).
 */
class NormalizedProblem implements NormalizedDae {
  declare readonly n: number;
  declare readonly calls: ProblemCalls;
  declare readonly massCompression: MassRowCompression | undefined;
  declare readonly mass: SparseMass | undefined;
  declare readonly y0: Float64Array;
  declare readonly t0: number;
  declare readonly tEnd: number;
  declare readonly breakpoints: Float64Array;
  declare readonly events: readonly DaeEvent[];
  declare readonly eventNames: readonly string[];
  declare readonly index2: Uint8Array;
  declare readonly hasIndex2: boolean;
  declare readonly rtol: Float64Array;
  declare readonly atol: Float64Array;
  declare readonly atolFollowsRtol: boolean;
  declare readonly initialStep: number | undefined;
  declare readonly maxStep: number;
  declare readonly maxSteps: number;
  declare readonly maxWallTimeMs: number;
  declare readonly signal: AbortSignal | undefined;
  declare readonly onProgress: ((p: DaeProgress) => void) | undefined;
  declare readonly progressIntervalMs: number;
  declare readonly eventTolerance: number | undefined;
  declare readonly consistentInit: boolean;
  declare readonly denseOutput: boolean;
  declare readonly outputTimes: Float64Array;
  declare readonly linearAlgebra: 'flat' | 'ml-matrix' | 'sparse';
  declare readonly iterationPattern: SparsePattern | undefined;
  declare private rhsFunction: RhsFunction | undefined;
  declare private jacobianFunction: JacobianFunction | undefined;
  declare private jacobianEntriesFunction: JacobianEntriesFunction | undefined;
  declare private dense: Float64Array | undefined;

  constructor(f: NormalizedFields) {
    this.n = f.n;
    this.calls = f.calls;
    this.massCompression = f.massCompression;
    this.mass = f.mass;
    this.y0 = f.y0;
    this.t0 = f.t0;
    this.tEnd = f.tEnd;
    this.breakpoints = f.breakpoints;
    this.events = f.events;
    this.eventNames = f.eventNames;
    this.index2 = f.index2;
    this.hasIndex2 = f.hasIndex2;
    this.rtol = f.rtol;
    this.atol = f.atol;
    this.atolFollowsRtol = f.atolFollowsRtol;
    this.initialStep = f.initialStep;
    this.maxStep = f.maxStep;
    this.maxSteps = f.maxSteps;
    this.maxWallTimeMs = f.maxWallTimeMs;
    this.signal = f.signal;
    this.onProgress = f.onProgress;
    this.progressIntervalMs = f.progressIntervalMs;
    this.eventTolerance = f.eventTolerance;
    this.consistentInit = f.consistentInit;
    this.denseOutput = f.denseOutput;
    this.outputTimes = f.outputTimes;
    this.linearAlgebra = f.linearAlgebra;
    this.iterationPattern = f.iterationPattern;
    this.rhsFunction = undefined;
    this.jacobianFunction = undefined;
    this.jacobianEntriesFunction = undefined;
    this.dense = undefined;
  }

  get rhs(): RhsFunction {
    const calls = this.calls;
    return (this.rhsFunction ??= (t, y, out) => calls.rhs(t, y, out));
  }

  get jacobian(): JacobianFunction | undefined {
    const calls = this.calls;
    if (!calls.hasJacobian) return undefined;
    return (this.jacobianFunction ??= (t, y, out) => calls.jacobian(t, y, out));
  }

  get jacobianEntries(): JacobianEntriesFunction | undefined {
    const calls = this.calls;
    if (!calls.hasJacobianEntries) return undefined;
    return (this.jacobianEntriesFunction ??= (t, y, target) => calls.jacobianEntries(t, y, target));
  }

  denseMass(): Float64Array | undefined {
    return this.mass ? (this.dense ??= denseOfSparseMass(this.mass)) : undefined;
  }

  denseMassMade(): boolean {
    return this.dense !== undefined;
  }
}
