import { AffineElimination, type AffinePartition } from './affine-elimination.js';
import type { DependentError } from './dependent-error.js';
import { evaluateCollocation } from './collocation-polynomial.js';
import { createDaeIntegratorWithDependents, type DaeIntegrator, type DaeIntegratorSnapshot, type DaeStepInterpolant, type DaeStepResult, type RestartOptions } from './dae-integrator.js';
import { atolFollowsRtol, DEFAULT_ATOL, DEFAULT_RTOL, toleranceArray } from './normalize-problem.js';
import { C1, C2 } from './radau-tableau.js';
import { mapRadauTolerances } from './radau-tolerances.js';
import { samePoint } from './same-point.js';
import { copyEntries } from './small-array-copy.js';
import type { DaeFailure, DaeProblem, DaeStatus, SolveDaeOptions, SolverStats } from './types.js';

/** The collocation nodes of Radau IIA (order 5): c1, c2, c3 = 1. */
const NODES = [C1, C2, 1] as const;

/**
 * The inverse of the matrix [s, s^2, s^3] at the collocation nodes s = c1,
 * c2, 1 (row-major): the coefficients of the cubic through a step's start
 * and its three nodes, the form of the full path's dense output.
 */
const NODE_INVERSE = (() => {
  const m = NODES.map((x) => [x, x * x, x * x * x]);
  const det = m[0]![0]! * (m[1]![1]! * m[2]![2]! - m[1]![2]! * m[2]![1]!)
    - m[0]![1]! * (m[1]![0]! * m[2]![2]! - m[1]![2]! * m[2]![0]!)
    + m[0]![2]! * (m[1]![0]! * m[2]![1]! - m[1]![1]! * m[2]![0]!);
  const inv = new Float64Array(9);
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      // Cofactor of m[j][i] (the adjugate is the transposed cofactor matrix).
      const r = [0, 1, 2].filter((x) => x !== j);
      const c = [0, 1, 2].filter((x) => x !== i);
      const minor = m[r[0]!]![c[0]!]! * m[r[1]!]![c[1]!]! - m[r[0]!]![c[1]!]! * m[r[1]!]![c[0]!]!;
      inv[i * 3 + j] = ((i + j) % 2 === 0 ? 1 : -1) * minor / det;
    }
  }
  return inv;
})();

/**
 * A Radau IIA integrator on the reduced problem M_DD y_D' = f_red(t, y_D)
 * (see {@link AffineElimination}), seen from outside as one on the full
 * problem: every state it hands over (y, readState, events, snapshots, dense
 * output) is expanded to all n unknowns. Newton iterates on y_D only; its
 * stopping test and the error estimate take the algebraic unknowns too,
 * through dy_A/dy_D (see {@link DependentError}), so that their tolerances
 * hold as in the full problem. The dense output of an algebraic unknown is the cubic through
 * its values at the step's start and at the three collocation nodes, each
 * solved from the differential unknowns there: the form the full path's
 * collocation polynomial has.
 *
 * The caller guarantees that f is affine in y_A with coefficients fixed
 * between restarts, and restarts after changing anything f depends on.
 *
 * @internal
 * @example
 * ```ts
 * const integ = createReducedIntegrator(problem, affinePartition(mass, n) as AffinePartition, { rtol: 1e-6 });
 * integ.advanceTo(1e-3);
 * ```
 */
export function createReducedIntegrator(
  problem: DaeProblem & { readonly jacobian: NonNullable<DaeProblem['jacobian']> },
  split: AffinePartition,
  options: SolveDaeOptions,
): ReducedDaeIntegrator {
  return new ReducedIntegrator(problem, split, options);
}

/**
 * The reduced integrator as its run sees it: the split, the expansion map
 * in force, and interpolants whose algebraic part is filled in on demand.
 *
 * @internal
 */
export interface ReducedDaeIntegrator extends DaeIntegrator {
  readonly split: AffinePartition;
  /** Q in force (see {@link AffineElimination.expansionMap}): what a step kept in the deferred form is completed with. */
  readonly expansionMap: Float64Array;
  /** With `deferInside`, the algebraic coefficients in the deferred form (see {@link InnerNodes}). */
  copyInterpolantInto(yOld: Float64Array, q: Float64Array, deferInside?: boolean): DaeStepInterpolant | undefined;
  /** Complete a step copied in the deferred form with the integrator's own expansion (inputs and Q unchanged since the copy). */
  completeInside(step: DaeStepInterpolant): void;
}

/**
 * The algebraic unknowns' coefficients of a step in the deferred form
 * filled in: the cubic through the start and the three collocation nodes,
 * each node's algebraic values solved from the differential polynomial
 * there. In the deferred form, coefficient row 0 of an algebraic unknown
 * holds its value at the end node (the integrator has it without a new
 * evaluation) and rows 1 and 2 are NaN, so a reader that skips completion
 * reads NaN. The two inner nodes cost an evaluation of f each: `expand`
 * (the integrator's own, or one with the step's inputs and Q, see
 * expandFromRhs) gives the same bits either way.
 *
 * @internal
 * @example
 * ```ts
 * const nodes = new InnerNodes(split);
 * nodes.complete(step, (t, yD, out) => { elimination.expand(t, yD, out); });
 * ```
 */
export class InnerNodes {
  private readonly nodeD: Float64Array;
  private readonly node0: Float64Array;
  private readonly node1: Float64Array;

  constructor(private readonly split: AffinePartition) {
    this.nodeD = new Float64Array(split.differential.length);
    this.node0 = new Float64Array(split.n);
    this.node1 = new Float64Array(split.n);
  }

  complete(step: { readonly tOld: number; readonly h: number; readonly yOld: Float64Array; readonly q: Float64Array }, expand: (t: number, yD: Float64Array, out: Float64Array) => void): void {
    const { n, algebraic: a } = this.split;
    if (a.length === 0) return;
    // The order the integrator's eager copy evaluated them in (node c2, then c1).
    this.expandNode(step, 1, this.node1, expand);
    this.expandNode(step, 0, this.node0, expand);
    const { yOld, q } = step;
    for (const i of a) {
      const y0 = yOld[i]!;
      const d1 = this.node0[i]! - y0;
      const d2 = this.node1[i]! - y0;
      const d3 = q[i]! - y0;
      for (let k = 0; k < 3; k++) q[k * n + i] = NODE_INVERSE[k * 3]! * d1 + NODE_INVERSE[k * 3 + 1]! * d2 + NODE_INVERSE[k * 3 + 2]! * d3;
    }
  }

  /** The full state at collocation node m of the step, from its polynomial in y_D. */
  private expandNode(
    step: { readonly tOld: number; readonly h: number; readonly yOld: Float64Array; readonly q: Float64Array },
    m: number,
    out: Float64Array,
    expand: (t: number, yD: Float64Array, out: Float64Array) => void,
  ): void {
    const { n, differential: d } = this.split;
    const { yOld, q } = step;
    const nodeD = this.nodeD;
    const s = NODES[m]!;
    for (let j = 0; j < d.length; j++) {
      const i = d[j]!;
      nodeD[j] = yOld[i]! + s * (q[i]! + s * (q[n + i]! + s * q[2 * n + i]!));
    }
    expand(step.tOld + s * step.h, nodeD, out);
  }
}

/** Components at the given indices. */
function pick(v: ArrayLike<number>, at: Int32Array): Float64Array {
  return Float64Array.from(at, (i) => v[i]!);
}

class ReducedIntegrator implements ReducedDaeIntegrator {
  private readonly elim: AffineElimination;
  private readonly inner: DaeIntegrator;
  private readonly n: number;
  private readonly nd: number;
  private readonly yD: Float64Array;
  private readonly pieceY: Float64Array;
  private readonly pieceQ: Float64Array;
  private readonly nodeD: Float64Array;
  private readonly start: Float64Array;
  /** The full state at the last step's end node. */
  private readonly end: Float64Array;
  private readonly scratchYOld: Float64Array;
  private readonly scratchQ: Float64Array;
  /** The expanded state readRhsAtState computes on the way. */
  private readonly stateAtEnd: Float64Array;
  /** The full state at the end of the last step whose polynomial was handed over (the next step's start). */
  private endValid = false;
  private readonly innerNodes: InnerNodes;
  /** The integrator's own expansion (counted, from kept evaluations where it can), for innerNodes. */
  private readonly expandHere: (t: number, yD: Float64Array, out: Float64Array) => void;
  private endT = NaN;
  private readonly endD: Float64Array;
  private readonly endY: Float64Array;

  constructor(problem: DaeProblem & { readonly jacobian: NonNullable<DaeProblem['jacobian']> }, readonly split: AffinePartition, options: SolveDaeOptions) {
    this.n = split.n;
    this.nd = split.differential.length;
    this.elim = new AffineElimination(problem, split);
    // G is factored here so that a singular algebraic block is reported to the caller, not as a failed run.
    this.elim.factorAt(problem.t0, this.elim.y0);
    const d = split.differential;
    const perUnknown = (v: number | ArrayLike<number> | undefined): number | Float64Array | undefined => (v === undefined || typeof v === 'number' ? v : pick(v, d));
    const rtol = perUnknown(options.rtol);
    const atol = perUnknown(options.atol);
    this.inner = createDaeIntegratorWithDependents(this.elim, {
      ...options,
      ...(rtol !== undefined ? { rtol } : {}),
      ...(atol !== undefined ? { atol } : {}),
    }, this.elim);
    // The algebraic unknowns' tolerances, mapped as the integrator maps the differential ones.
    const a = split.algebraic;
    const rtolA = pick(toleranceArray(options.rtol, DEFAULT_RTOL, this.n, 'rtol'), a);
    const atolA = pick(toleranceArray(options.atol, DEFAULT_ATOL, this.n, 'atol'), a);
    const rtolMapped = new Float64Array(a.length);
    const atolMapped = new Float64Array(a.length);
    mapRadauTolerances(rtolA, atolA, atolFollowsRtol(options), rtolMapped, atolMapped);
    this.elim.watchAlgebraic(rtolMapped, atolMapped);
    this.yD = new Float64Array(this.nd);
    this.pieceY = new Float64Array(this.nd);
    this.pieceQ = new Float64Array(3 * this.nd);
    this.nodeD = new Float64Array(this.nd);
    this.start = new Float64Array(this.n);
    this.end = new Float64Array(this.n);
    this.scratchYOld = new Float64Array(this.n);
    this.scratchQ = new Float64Array(3 * this.n);
    this.stateAtEnd = new Float64Array(this.n);
    this.innerNodes = new InnerNodes(split);
    this.expandHere = (t, yD, out) => {
      this.elim.expand(t, yD, out);
    };
    this.endD = new Float64Array(this.nd);
    this.endY = new Float64Array(this.n);
  }

  get t(): number {
    return this.inner.t;
  }

  get expansionMap(): Float64Array {
    return this.elim.expansionMap;
  }

  get y(): Float64Array {
    return this.readState(new Float64Array(this.n));
  }

  get h(): number {
    return this.inner.h;
  }

  get t0(): number {
    return this.inner.t0;
  }

  get tEnd(): number {
    return this.inner.tEnd;
  }

  /**
   * The inner integrator's counts, with the evaluations of the full f (the
   * expansions' too) and of the full df/dy as rhsEvaluations and
   * jacobianEvaluations.
   */
  get stats(): SolverStats {
    return { ...this.inner.stats, rhsEvaluations: this.elim.evaluations, jacobianEvaluations: this.elim.jacobianEvaluations };
  }

  get status(): 'running' | DaeStatus {
    return this.inner.status;
  }

  get message(): string {
    return this.inner.message;
  }

  get failure(): DaeFailure | undefined {
    const f = this.inner.failure;
    return f ? { ...f, components: f.components.map((k) => this.split.differential[k]!) } : undefined;
  }

  get adjustedAtStart(): readonly number[] {
    return this.inner.adjustedAtStart.map((k) => this.split.differential[k]!);
  }

  get interpolant(): DaeStepInterpolant | undefined {
    return this.copyInterpolant((length) => new Float64Array(length));
  }

  step(tStop?: number): DaeStepResult {
    const r = this.inner.step(tStop);
    if (r.events.length === 0) return r;
    const events = r.events.map((e) => ({ ...e, y: this.elim.expand(e.t, e.y, new Float64Array(this.n)) }));
    return { ...r, events };
  }

  advanceTo(tStop: number, onStep?: (integrator: DaeIntegrator, result: DaeStepResult) => void): DaeStepResult {
    const events: DaeStepResult['events'][number][] = [];
    let r: DaeStepResult = { status: this.inner.status === 'running' ? 'accepted' : this.inner.status, events };
    while (this.inner.status === 'running' && this.inner.t < tStop) {
      r = this.step(tStop);
      events.push(...r.events);
      if (r.status !== 'accepted') break;
      onStep?.(this, r);
    }
    return { ...r, events };
  }

  restart(y?: ArrayLike<number>, options?: RestartOptions): 'running' | DaeStatus {
    this.elim.restart();
    this.endValid = false;
    const status = this.inner.restart(y ? pick(y, this.split.differential) : undefined, options);
    if (status === 'running') this.keepStart();
    return status;
  }

  /**
   * Keep the expanded state at a restart as the next step's start: the
   * restart evaluated f there under the new inputs, so this costs no
   * evaluation, where the step would find it evicted by its Newton iterations.
   */
  private keepStart(): void {
    this.elim.expand(this.inner.t, this.inner.readState(this.endD), this.endY);
    this.endT = this.inner.t;
    this.endValid = true;
  }

  /** The inner integrator's snapshot with the full state as `y`. */
  snapshot(): DaeIntegratorSnapshot {
    return { ...this.inner.snapshot(), y: this.y };
  }

  restore(snapshot: DaeIntegratorSnapshot): void {
    this.inner.restore({ ...snapshot, y: pick(snapshot.y, this.split.differential) });
    this.elim.restart();
    this.endValid = false;
  }

  interpolate(t: number, out?: Float64Array): Float64Array {
    const it = this.copyInterpolantInto(this.scratchYOld, this.scratchQ);
    if (!it) throw new Error('interpolate: no step taken yet');
    return evaluateCollocation(it, t, out ?? new Float64Array(this.n));
  }

  copyInterpolant(take: (length: number) => Float64Array): DaeStepInterpolant | undefined {
    const yOld = take(this.n);
    const q = take(3 * this.n);
    return this.copyInterpolantInto(yOld, q);
  }

  /**
   * The last step's interpolant; with `deferInside`, the algebraic unknowns'
   * coefficients are left in the deferred form (see {@link InnerNodes}):
   * their two inner nodes, an evaluation of f each, are computed only when
   * asked for, by {@link ReducedDaeIntegrator.completeInside} or from a kept step.
   */
  copyInterpolantInto(yOld: Float64Array, q: Float64Array, deferInside = false): DaeStepInterpolant | undefined {
    const it = this.inner.copyInterpolantInto(this.pieceY, this.pieceQ);
    if (!it) return undefined;
    const { n, nd, pieceY, pieceQ } = this;
    const { differential: d, algebraic: a } = this.split;
    for (let j = 0; j < nd; j++) {
      yOld[d[j]!] = pieceY[j]!;
      for (let k = 0; k < 3; k++) q[k * n + d[j]!] = pieceQ[k * nd + j]!;
    }
    if (a.length > 0) {
      // The start: the previous step's end under the same inputs, kept from that step (read before
      // the end below replaces it; an evaluation here leaves the integrator's last, at the end, kept).
      const same = this.endValid && samePoint(it.tOld, pieceY, this.endT, this.endD, nd);
      // Element copies, not set(): for a few unknowns the builtin's call costs more than the copy (once per step).
      if (same) copyEntries(this.endY, this.start);
      else this.elim.expand(it.tOld, pieceY, this.start);
      // Then the end: the integrator evaluated f there last, so its expansion is usually kept.
      const end = this.end;
      const tEnd = it.tOld + it.h;
      if (this.inner.t === it.t && Math.abs(tEnd - it.t) <= 1e-12 * Math.abs(it.t)) {
        // The step's end: the integrator's own state, kept as the next step's start.
        this.elim.expand(this.inner.t, this.inner.readState(this.endD), end);
        copyEntries(end, this.endY);
        this.endT = it.t;
        this.endValid = true;
      } else {
        // The polynomial at s = 1 (the node's own time and value, as for the inner nodes).
        const { nodeD } = this;
        const s = NODES[2];
        for (let j = 0; j < nd; j++) nodeD[j] = pieceY[j]! + s * (pieceQ[j]! + s * (pieceQ[nd + j]! + s * pieceQ[2 * nd + j]!));
        this.elim.expand(tEnd, nodeD, end);
        this.endValid = false;
      }
      for (let j = 0; j < a.length; j++) {
        const i = a[j]!;
        yOld[i] = this.start[i]!;
        q[i] = end[i]!;
        q[n + i] = NaN;
        q[2 * n + i] = NaN;
      }
      const step = { tOld: it.tOld, t: it.t, h: it.h, yOld, q };
      if (!deferInside) this.innerNodes.complete(step, this.expandHere);
      return step;
    }
    return { tOld: it.tOld, t: it.t, h: it.h, yOld, q };
  }

  completeInside(step: DaeStepInterpolant): void {
    this.innerNodes.complete(step, this.expandHere);
  }

  readState(out: Float64Array): Float64Array {
    const yD = this.inner.readState(this.yD);
    if (!this.isKeptEnd(yD)) return this.elim.expand(this.inner.t, yD, out);
    copyEntries(this.endY, out);
    return out;
  }

  /** Whether the present state (y_D given) is the step end expanded when its polynomial was copied (endY: the same numbers). */
  private isKeptEnd(yD: Float64Array): boolean {
    return this.endValid && samePoint(this.inner.t, yD, this.endT, this.endD, this.nd);
  }

  /** f at the present state when the integrator's last evaluation was there (the expansion kept it). */
  readRhsAtState(out: Float64Array): boolean {
    const yD = this.inner.readState(this.yD);
    const k = this.elim.kept(this.inner.t, yD);
    if (k < 0) return false;
    const state = this.isKeptEnd(yD) ? this.endY : this.elim.expand(this.inner.t, yD, this.stateAtEnd);
    this.elim.rhsAtExpanded(k, state, out);
    return true;
  }
}
