import { DenseLu } from './dense-lu.js';
import type { DependentError } from './dependent-error.js';
import { samePoint } from './same-point.js';
import { compressedMass, massRowCompression, recombineJacobianRows, recombineRhsRows, type MassRowCompression } from './mass-row-compression.js';
import type { DaeEvent, DaeProblem } from './types.js';

/**
 * The split of M y' = f(t, y) that the reduced formulation works on: after
 * dependent rows of M are recombined (see massRowCompression), the
 * differential unknowns D are the columns of M with a non-zero, the
 * differential rows the rows with one; the rest are the algebraic unknowns
 * A and the algebraic rows. M on (differential rows x D) is square and
 * nonsingular, so the reduced problem M_DD y_D' = f_red(t, y_D) is an ODE in
 * implicit form.
 *
 * @internal
 * @example
 * ```ts
 * const split = affinePartition(compiled.mass, n);
 * if ('reason' in split) throw new Error(split.reason);
 * ```
 */
export interface AffinePartition {
  readonly n: number;
  readonly differential: Int32Array;
  readonly algebraic: Int32Array;
  readonly differentialRows: Int32Array;
  readonly algebraicRows: Int32Array;
  readonly compression: MassRowCompression | undefined;
  /** M on (differential rows x D), row-major. */
  readonly reducedMass: Float64Array;
}

/**
 * Split a problem by its mass matrix (row-major n x n); `{ reason, unknowns }`
 * when M's differential block is not square (`unknowns`: its columns) or is
 * singular (the column of a zero pivot).
 *
 * @internal
 * @example
 * ```ts
 * affinePartition(Float64Array.of(1, 0, 0, 0), 2); // D = [0], A = [1]
 * ```
 */
export function affinePartition(mass: Float64Array, n: number): AffinePartition | { readonly reason: string; readonly unknowns: Int32Array } {
  const compression = massRowCompression(mass, n);
  const m = compression ? compressedMass(mass, n, compression) : mass;
  const rowUsed = new Uint8Array(n);
  const colUsed = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (m[i * n + j] !== 0) {
        rowUsed[i] = 1;
        colUsed[j] = 1;
      }
    }
  }
  const pick = (used: Uint8Array, value: number): Int32Array => Int32Array.from([...used.keys()].filter((i) => used[i] === value));
  const differential = pick(colUsed, 1);
  const differentialRows = pick(rowUsed, 1);
  if (differential.length !== differentialRows.length) {
    return {
      reason: `the derivative terms act on combinations of unknowns, not on unknowns of their own (${differentialRows.length} independent rows of M on ${differential.length} unknowns)`,
      unknowns: differential,
    };
  }
  const nd = differential.length;
  const reducedMass = new Float64Array(nd * nd);
  for (let r = 0; r < nd; r++) for (let c = 0; c < nd; c++) reducedMass[r * nd + c] = m[differentialRows[r]! * n + differential[c]!]!;
  if (nd > 0) {
    const pivot = new DenseLu(nd).factor(reducedMass);
    if (pivot >= 0) return { reason: 'the mass matrix is singular on its differential unknowns', unknowns: Int32Array.of(differential[pivot]!) };
  }
  return { n, differential, algebraic: pick(colUsed, 0), differentialRows, algebraicRows: pick(rowUsed, 0), compression, reducedMass };
}

/**
 * Thrown when the block of df/dy on the algebraic rows and unknowns is
 * singular: the algebraic unknowns are not determined by the differential
 * ones (`unknown`: the column of the zero pivot).
 *
 * @internal
 */
export class SingularAlgebraicBlock extends Error {
  constructor(readonly unknown: number) {
    super(`the algebraic equations do not determine unknown ${unknown} (singular block of df/dy)`);
  }
}

/**
 * The full state from y_D and f = f(t, y_D, 0) into `out` (returned): y_D
 * in place, y_A = Q f with Q from {@link AffineElimination.expansionMap}.
 * One function for the integrator's expansions and those made later from a
 * kept step, so that both give the same bits.
 *
 * @internal
 * @example
 * ```ts
 * expandFromRhs(split, elimination.expansionMap, yD, f, new Float64Array(split.n));
 * ```
 */
export function expandFromRhs(split: AffinePartition, q: Float64Array, yD: ArrayLike<number>, f: Float64Array, out: Float64Array): Float64Array {
  const { n, differential: d, algebraic: a } = split;
  for (let j = 0; j < d.length; j++) out[d[j]!] = yD[j]!;
  for (let r = 0; r < a.length; r++) out[a[r]!] = rowTimes(q, r, n, f);
  return out;
}

/** Row r of the row-major map m (rows of length n) times v: the one product P f, Q f are made of. */
function rowTimes(m: Float64Array, r: number, n: number, v: ArrayLike<number>): number {
  let s = 0;
  for (let j = 0; j < n; j++) s += m[r * n + j]! * v[j]!;
  return s;
}

/** out (rows x d.length) = m J[:, d], m row-major with rows of length n, J n x n: the reduced Jacobian P J[:, D] and dy_A/dy_D = Q J[:, D]. */
function timesColumns(m: Float64Array, rows: number, n: number, jac: Float64Array, d: Int32Array, out: Float64Array): void {
  const nd = d.length;
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < nd; c++) {
      let s = 0;
      for (let j = 0; j < n; j++) s += m[r * n + j]! * jac[j * n + d[c]!]!;
      out[r * nd + c] = s;
    }
  }
}

/** Evaluations kept: a step reads its end again after its start and its two inner nodes (measured: with three, one miss per input interval). */
const KEPT_EXPANSIONS = 5;

/**
 * The reduced problem M_DD y_D' = f_red(t, y_D), handed over as the ODE
 * y_D' = M_DD^-1 f_red(t, y_D) (M_DD is constant and nonsingular): the
 * algebraic unknowns, which f enters affinely with coefficients fixed
 * between restarts (the caller's guarantee), are eliminated inside f. With
 * T the recombination of dependent rows and G = (T df/dy) on the algebraic
 * rows and unknowns (factored once per restart), f evaluated at (y_D, 0)
 * gives y_A = -G^-1 (T f)_A exactly (f is affine in y_A), and the
 * differential rows (T f)_D + (T df/dy)_DA y_A. Both are fixed linear maps
 * of f(y_D, 0), formed once per restart: y_A = Q f and
 * y_D' = P f, P = M_DD^-1 [T_D - (T J)_DA G^-1 T_A], so one evaluation of
 * f costs one product with P. The Jacobian is P J[:, D], M_DD^-1 times the
 * Schur complement J_DD - J_DA G^-1 J_AD (Hairer and Wanner II, sect. VI.1,
 * index-1 elimination; common practice); J's columns on D do not depend on
 * y_A (f = a(t, y_S) + B y with S within D), so it is taken at (y_D, 0) too.
 * Evaluating at y_A = 0 makes the expansion a function of (t, y_D) and the
 * inputs alone: the same bits whatever the history (a run restored from a
 * snapshot continues bit for bit).
 *
 * @internal
 * @example
 * ```ts
 * const reduced = new AffineElimination(fullProblem, split);
 * const y = reduced.expand(t, yD, new Float64Array(split.n));
 * ```
 */
export class AffineElimination implements DaeProblem, DependentError {
  readonly size: number;
  readonly y0: Float64Array;
  readonly t0: number;
  readonly tEnd: number;
  readonly events?: readonly DaeEvent[];
  /** The algebraic unknowns, whose error the integrator's estimate takes through {@link AffineElimination.measure}. */
  readonly count: number;
  squares = 0;
  /** Evaluations of the full f so far (the reduced f's and the expansions'). */
  evaluations = 0;
  /** Evaluations of the full df/dy (to form P and Q at a restart, and for reduced Jacobians elsewhere). */
  jacobianEvaluations = 0;
  private readonly n: number;
  private readonly nd: number;
  private readonly na: number;
  private stale = true;
  /** Whether P and Q hold the maps of the algebraic columns in jacA (false until formed, and while a factorisation failed). */
  private formed = false;
  private readonly lu: DenseLu;
  private readonly massLu: DenseLu;
  private readonly jac: Float64Array;
  /** df/dy where P and Q were last formed, with its point (t, y_D). */
  private readonly formedJac: Float64Array;
  private formedT = NaN;
  private readonly formedD: Float64Array;
  /** df/dy on the algebraic unknowns, original rows (n x nA): f at the expanded state is f(y_D, 0) + this y_A. */
  private readonly jacA: Float64Array;
  /** y_D' = P f(y_D, 0) (nD x n). */
  private readonly p: Float64Array;
  /** y_A = Q f(y_D, 0) (nA x n): a new array at each formation, never changed after (kept steps name it, see expansionMap). */
  private q: Float64Array;
  private readonly g: Float64Array;
  private readonly y: Float64Array;
  private readonly colA: Float64Array;
  private readonly colD: Float64Array;
  private readonly eventY: Float64Array;
  private readonly unit: Float64Array;
  /** y_A at a step's start, and the start shifted by the error estimate (scratch of {@link AffineElimination.measure}). */
  private readonly startA: Float64Array;
  private readonly shifted: Float64Array;
  /** dy_A/dy_D = Q J[:, D] (nA x nD), formed with each reduced Jacobian. */
  private readonly sensitivity: Float64Array;
  private sensitivityFormed = false;
  /** The scales of the algebraic unknowns at a step's start, atol' + rtol' |y_A|, and the start they belong to. */
  private readonly startScale: Float64Array;
  private startScaleT = NaN;
  private readonly startScaleD: Float64Array;
  /** The last expansion's point (t, y_D) and its y_A (read by {@link AffineElimination.measure}; t NaN after a restart). */
  private expandedT = NaN;
  private readonly expandedD: Float64Array;
  private readonly expandedA: Float64Array;
  /** radau5's mapped tolerances of the algebraic unknowns (rtol', atol'); atol' = Infinity, so no share, until set. */
  private readonly rtolA: Float64Array;
  private readonly atolA: Float64Array;
  private readonly keptT = new Float64Array(KEPT_EXPANSIONS).fill(NaN);
  private readonly keptD: Float64Array[];
  private readonly keptF: Float64Array[];
  private nextKept = 0;
  /** The slot of the last evaluation. */
  private lastKept = 0;

  constructor(
    private readonly full: DaeProblem & { readonly jacobian: NonNullable<DaeProblem['jacobian']> },
    readonly split: AffinePartition,
  ) {
    const n = split.n;
    const nd = split.differential.length;
    const na = split.algebraic.length;
    this.n = n;
    this.nd = nd;
    this.na = na;
    this.size = nd;
    this.count = na;
    this.startA = new Float64Array(na);
    this.expandedD = new Float64Array(nd);
    this.sensitivity = new Float64Array(na * nd);
    this.startScale = new Float64Array(na);
    this.startScaleD = new Float64Array(nd);
    this.expandedA = new Float64Array(na);
    this.shifted = new Float64Array(nd);
    this.rtolA = new Float64Array(na);
    this.atolA = new Float64Array(na).fill(Infinity);
    this.massLu = new DenseLu(Math.max(nd, 1));
    if (nd > 0) this.massLu.factor(split.reducedMass);
    this.y0 = Float64Array.from(split.differential, (i) => full.y0[i]!);
    this.t0 = full.t0;
    this.tEnd = full.tEnd;
    this.lu = new DenseLu(Math.max(na, 1));
    this.jac = new Float64Array(n * n);
    this.formedJac = new Float64Array(n * n);
    this.formedD = new Float64Array(nd);
    this.jacA = new Float64Array(n * na);
    this.p = new Float64Array(nd * n);
    this.q = new Float64Array(na * n);
    this.g = new Float64Array(na * na);
    this.y = new Float64Array(n);
    this.colA = new Float64Array(na);
    this.colD = new Float64Array(nd);
    this.eventY = new Float64Array(n);
    this.unit = new Float64Array(n);
    this.keptD = Array.from({ length: KEPT_EXPANSIONS }, () => new Float64Array(nd));
    this.keptF = Array.from({ length: KEPT_EXPANSIONS }, () => new Float64Array(n));
    if (full.events) {
      // The caller's events read the full state.
      this.events = full.events.map((ev) => ({ ...ev, fn: (t: number, yD: Float64Array) => ev.fn(t, this.expand(t, yD, this.eventY)) }));
    }
  }

  /**
   * Forget P, Q and the kept evaluations: f's coefficients may have changed
   * (new inputs), so they are formed again at the next call.
   */
  restart(): void {
    this.keptT.fill(NaN);
    this.expandedT = NaN;
    this.startScaleT = NaN;
    this.formedT = NaN;
    this.stale = true;
  }

  /** Form P and Q from df/dy at (y_D, 0); throws {@link SingularAlgebraicBlock}. */
  factorAt(t: number, yD: ArrayLike<number>): void {
    const { n, na, nd, split, jac, p, colA, colD } = this;
    this.jacobianEvaluations++;
    this.fillState(yD);
    jac.fill(0);
    this.full.jacobian(t, this.y, jac);
    // Kept as evaluated: the reduced Jacobian at the same point (a restart asks for it next) reads it.
    this.formedJac.set(jac);
    this.formedT = t;
    for (let j = 0; j < nd; j++) this.formedD[j] = yD[j]!;
    const a = split.algebraic;
    // P and Q depend on df/dy only through its algebraic columns (T and M_DD are fixed): where a
    // restart changed only source values, those columns are the same bits and P, Q stand as formed.
    let unchanged = this.formed;
    for (let i = 0; i < n && unchanged; i++) for (let k = 0; k < na && unchanged; k++) unchanged = this.jacA[i * na + k] === jac[i * n + a[k]!];
    if (unchanged) {
      this.stale = false;
      return;
    }
    this.formed = false;
    const q = new Float64Array(na * n);
    this.q = q;
    for (let i = 0; i < n; i++) for (let k = 0; k < na; k++) this.jacA[i * na + k] = jac[i * n + a[k]!]!;
    if (split.compression) recombineJacobianRows(jac, n, split.compression);
    for (let r = 0; r < na; r++) for (let k = 0; k < na; k++) this.g[r * na + k] = jac[split.algebraicRows[r]! * n + a[k]!]!;
    if (na > 0) {
      const pivot = this.lu.factor(this.g);
      if (pivot >= 0) throw new SingularAlgebraicBlock(a[pivot]!);
    }
    // Column j of T, the recombination (the identity but for dependent rows), applied to e_j.
    const e = this.unit;
    for (let j = 0; j < n; j++) {
      e.fill(0);
      e[j] = 1;
      if (split.compression) recombineRhsRows(e, split.compression);
      for (let k = 0; k < na; k++) colA[k] = -e[split.algebraicRows[k]!]!;
      if (na > 0) this.lu.solve(colA);
      for (let k = 0; k < na; k++) q[k * n + j] = colA[k]!;
      for (let r = 0; r < nd; r++) {
        const row = split.differentialRows[r]! * n;
        let s = e[split.differentialRows[r]!]!;
        for (let k = 0; k < na; k++) s += jac[row + a[k]!]! * colA[k]!;
        colD[r] = s;
      }
      if (nd > 0) this.massLu.solve(colD);
      for (let r = 0; r < nd; r++) p[r * n + j] = colD[r]!;
    }
    this.formed = true;
    this.stale = false;
  }

  rhs(t: number, yD: Float64Array, out: Float64Array): void {
    if (this.stale) this.factorAt(t, yD);
    const { n, nd, p } = this;
    const f = this.evaluate(t, yD);
    for (let r = 0; r < nd; r++) out[r] = rowTimes(p, r, n, f);
  }

  jacobian(t: number, yD: Float64Array, out: Float64Array): void {
    if (this.stale) this.factorAt(t, yD);
    const { n, nd, p } = this;
    let jac = this.jac;
    if (samePoint(t, yD, this.formedT, this.formedD, nd)) {
      jac = this.formedJac;
    } else {
      this.jacobianEvaluations++;
      this.fillState(yD);
      jac.fill(0);
      this.full.jacobian(t, this.y, jac);
    }
    timesColumns(p, nd, n, jac, this.split.differential, out);
    // y_A = Q f(y_D, 0), so dy_A/dy_D = Q J[:, D]: frozen with the reduced Jacobian, as the Newton
    // iteration freezes it (read by measureIncrement).
    timesColumns(this.q, this.na, n, jac, this.split.differential, this.sensitivity);
    this.sensitivityFormed = true;
  }

  /**
   * Watch the algebraic unknowns in the error estimate with these mapped
   * tolerances (rtol', atol' per algebraic unknown, in the order of
   * `split.algebraic`).
   */
  watchAlgebraic(rtolMapped: ArrayLike<number>, atolMapped: ArrayLike<number>): void {
    this.rtolA.set(rtolMapped);
    this.atolA.set(atolMapped);
  }

  /**
   * The algebraic unknowns' share of the error norm for the differential
   * estimate err of the step from (t, y_D): e_A = y_A(y_D + err) - y_A(y_D),
   * the change err makes in the solved unknowns (to first order the full
   * problem's e_A = -J_AA^-1 J_AD e_D, but at the step, where a Jacobian
   * kept from the interval's start can be far off in a saturating core),
   * each scaled by atol' + rtol' |y_A(y_D)| as the state is at the step's
   * start (radau5's SCAL). One evaluation of f; y_A at the start is the
   * last expansion's (the previous step's end) or a kept evaluation's, and
   * costs a second one only when neither is at hand. See {@link DependentError}.
   */
  measure(at: { readonly t: number }, yD: Float64Array, err: Float64Array): void {
    const { n, na, nd, q, startA, startScale, shifted } = this;
    const t = at.t;
    this.scaleAtStart(t, yD);
    for (let j = 0; j < nd; j++) shifted[j] = yD[j]! + err[j]!;
    const f1 = this.evaluate(t, shifted);
    let sum = 0;
    for (let r = 0; r < na; r++) {
      const x = (rowTimes(q, r, n, f1) - startA[r]!) / startScale[r]!;
      sum += x * x;
    }
    this.squares = sum;
  }

  /**
   * The algebraic unknowns' share of the Newton increment's norm: each of
   * the three transformed stage increments taken through dy_A/dy_D (frozen
   * with the reduced Jacobian) and scaled as at the step's start. See
   * {@link DependentError.measureIncrement}.
   */
  measureIncrement(at: { readonly t: number }, yD: Float64Array, dw: Float64Array): void {
    const { na, nd, sensitivity, startScale } = this;
    if (!this.sensitivityFormed || na === 0) {
      this.squares = 0;
      return;
    }
    this.scaleAtStart(at.t, yD);
    let sum = 0;
    for (let k = 0; k < 3; k++) {
      const o = k * nd;
      for (let r = 0; r < na; r++) {
        let e = 0;
        for (let c = 0; c < nd; c++) e += sensitivity[r * nd + c]! * dw[o + c]!;
        const x = e / startScale[r]!;
        sum += x * x;
      }
    }
    this.squares = sum;
  }

  /**
   * y_A at a step's start (t, y_D) into startA, and the scales atol' +
   * rtol' |y_A| into startScale, once per start: from the last expansion
   * (the previous step's end), a kept evaluation, or an evaluation of f.
   */
  private scaleAtStart(t: number, yD: Float64Array): void {
    const { n, na, nd, q, rtolA, atolA, startA, startScale } = this;
    if (samePoint(t, yD, this.startScaleT, this.startScaleD, nd)) return;
    if (samePoint(t, yD, this.expandedT, this.expandedD, nd)) {
      for (let r = 0; r < na; r++) startA[r] = this.expandedA[r]!;
    } else {
      const k = this.kept(t, yD);
      const f0 = k < 0 ? this.evaluate(t, yD) : this.keptF[k]!;
      for (let r = 0; r < na; r++) startA[r] = rowTimes(q, r, n, f0);
    }
    for (let r = 0; r < na; r++) startScale[r] = atolA[r]! + rtolA[r]! * Math.abs(startA[r]!);
    this.startScaleT = t;
    for (let j = 0; j < nd; j++) this.startScaleD[j] = yD[j]!;
  }

  /**
   * The full state at (t, y_D) into `out` (returned), and f there into
   * `rhs` when given: from a kept evaluation when (t, y_D) is one bit for bit.
   */
  expand(t: number, yD: ArrayLike<number>, out: Float64Array, rhs?: Float64Array): Float64Array {
    if (this.stale) this.factorAt(t, yD);
    let k = this.kept(t, yD);
    if (k < 0) {
      this.evaluate(t, yD);
      k = this.lastKept;
    }
    expandFromRhs(this.split, this.q, yD, this.keptF[k]!, out);
    if (rhs) this.rhsAtExpanded(k, out, rhs);
    // Kept for the next step's error measure: a step's end, expanded when the step is copied, is the next one's start.
    const { nd, na, expandedD, expandedA } = this;
    const a = this.split.algebraic;
    this.expandedT = t;
    for (let j = 0; j < nd; j++) expandedD[j] = yD[j]!;
    for (let r = 0; r < na; r++) expandedA[r] = out[a[r]!]!;
    return out;
  }

  /**
   * f at a state expanded from kept evaluation k (see {@link AffineElimination.kept}) into `rhs`:
   * exact for f affine in y_A, f(y_D, 0) + (df/dy_A) y_A; the algebraic rows vanish to round-off.
   */
  rhsAtExpanded(k: number, state: Float64Array, rhs: Float64Array): void {
    const { n, na } = this;
    const a = this.split.algebraic;
    const f = this.keptF[k]!;
    for (let i = 0; i < n; i++) {
      let s = f[i]!;
      for (let r = 0; r < na; r++) s += this.jacA[i * na + r]! * state[a[r]!]!;
      rhs[i] = s;
    }
  }

  /**
   * Q, the map from f(y_D, 0) to y_A in force: an array of its own per
   * formation, never changed after, so a step kept with it can be expanded
   * later (see {@link expandFromRhs}).
   */
  get expansionMap(): Float64Array {
    return this.q;
  }

  /** The index of a kept evaluation at exactly (t, y_D), else -1. */
  kept(t: number, yD: ArrayLike<number>): number {
    for (let k = 0; k < KEPT_EXPANSIONS; k++) if (samePoint(t, yD, this.keptT[k]!, this.keptD[k]!, this.nd)) return k;
    return -1;
  }

  /** f at (y_D, 0), kept (with t and y_D) for the expansions that follow. */
  private evaluate(t: number, yD: ArrayLike<number>): Float64Array {
    this.fillState(yD);
    this.evaluations++;
    const slot = this.nextKept;
    this.lastKept = slot;
    this.nextKept = (slot + 1) % KEPT_EXPANSIONS;
    const f = this.keptF[slot]!;
    this.full.rhs(t, this.y, f);
    this.keptT[slot] = t;
    // A loop, not set(): for a few unknowns the builtin's call costs more than the stores.
    const kept = this.keptD[slot]!;
    for (let j = 0; j < this.nd; j++) kept[j] = yD[j]!;
    return f;
  }

  private fillState(yD: ArrayLike<number>): void {
    const { split, y } = this;
    for (let j = 0; j < this.nd; j++) y[split.differential[j]!] = yD[j]!;
    for (let k = 0; k < this.na; k++) y[split.algebraic[k]!] = 0;
  }
}
