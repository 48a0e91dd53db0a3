import { AffineElimination, type AffinePartition } from './affine-elimination.js';
import type { DependentError } from './dependent-error.js';
import { evaluateCollocation } from './collocation-polynomial.js';
import { createDaeIntegratorWithDependents, type DaeIntegrator, type DaeIntegratorSnapshot, type DaeStepInterpolant, type DaeStepResult, type RestartOptions } from './dae-integrator.js';
import { DEFAULT_ATOL, DEFAULT_RTOL, toleranceArray } from './normalize-problem.js';
import { C1, C2 } from './radau-tableau.js';
import { mapRadauTolerances } from './radau-tolerances.js';
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
 * output) is expanded to all n unknowns. Newton acts on y_D only; the error
 * estimate takes the algebraic unknowns too, through dy_A/dy_D (see
 * {@link DependentError}), so that their tolerances hold as in the full
 * problem. The dense output of an algebraic unknown is the cubic through
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
): DaeIntegrator {
  return new ReducedIntegrator(problem, split, options);
}

/** Components at the given indices. */
function pick(v: ArrayLike<number>, at: Int32Array): Float64Array {
  return Float64Array.from(at, (i) => v[i]!);
}

class ReducedIntegrator implements DaeIntegrator {
  private readonly elim: AffineElimination;
  private readonly inner: DaeIntegrator;
  private readonly n: number;
  private readonly nd: number;
  private readonly yD: Float64Array;
  private readonly pieceY: Float64Array;
  private readonly pieceQ: Float64Array;
  private readonly nodeD: Float64Array;
  private readonly start: Float64Array;
  private readonly node: Float64Array[];
  private readonly scratchYOld: Float64Array;
  private readonly scratchQ: Float64Array;
  /** The full state at the end of the last step whose polynomial was handed over (the next step's start). */
  private endValid = false;
  private endT = NaN;
  private readonly endD: Float64Array;
  private readonly endY: Float64Array;

  constructor(problem: DaeProblem & { readonly jacobian: NonNullable<DaeProblem['jacobian']> }, private readonly split: AffinePartition, options: SolveDaeOptions) {
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
    mapRadauTolerances(rtolA, atolA, options.atolFollowsRtol ?? options.atol !== undefined, rtolMapped, atolMapped);
    this.elim.watchAlgebraic(rtolMapped, atolMapped);
    this.yD = new Float64Array(this.nd);
    this.pieceY = new Float64Array(this.nd);
    this.pieceQ = new Float64Array(3 * this.nd);
    this.nodeD = new Float64Array(this.nd);
    this.start = new Float64Array(this.n);
    this.node = [0, 1, 2].map(() => new Float64Array(this.n));
    this.scratchYOld = new Float64Array(this.n);
    this.scratchQ = new Float64Array(3 * this.n);
    this.endD = new Float64Array(this.nd);
    this.endY = new Float64Array(this.n);
  }

  get t(): number {
    return this.inner.t;
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

  copyInterpolantInto(yOld: Float64Array, q: Float64Array): DaeStepInterpolant | undefined {
    const it = this.inner.copyInterpolantInto(this.pieceY, this.pieceQ);
    if (!it) return undefined;
    const { n, nd, pieceY, pieceQ, nodeD } = this;
    const { differential: d, algebraic: a } = this.split;
    for (let j = 0; j < nd; j++) {
      yOld[d[j]!] = pieceY[j]!;
      for (let k = 0; k < 3; k++) q[k * n + d[j]!] = pieceQ[k * nd + j]!;
    }
    if (a.length > 0) {
      // The start: the previous step's end under the same inputs, kept from that step (read before
      // the end below replaces it; an evaluation here leaves the integrator's last, at the end, kept).
      let same = this.endValid && this.endT === it.tOld;
      for (let j = 0; j < nd && same; j++) same = this.endD[j] === pieceY[j];
      if (same) this.start.set(this.endY);
      else this.elim.expand(it.tOld, pieceY, this.start);
      // Then the end: the integrator evaluated f there last, so its expansion is usually kept.
      let nextStartKept = false;
      for (let m = 2; m >= 0; m--) {
        const s = NODES[m]!;
        const tm = it.tOld + s * it.h;
        if (m === 2 && this.inner.t === it.t && Math.abs(tm - it.t) <= 1e-12 * Math.abs(it.t)) {
          // The step's end: the integrator's own state, kept as the next step's start.
          this.elim.expand(this.inner.t, this.inner.readState(this.endD), this.node[m]!);
          this.endY.set(this.node[m]!);
          this.endT = it.t;
          nextStartKept = true;
        } else {
          for (let j = 0; j < nd; j++) nodeD[j] = pieceY[j]! + s * (pieceQ[j]! + s * (pieceQ[nd + j]! + s * pieceQ[2 * nd + j]!));
          this.elim.expand(tm, nodeD, this.node[m]!);
        }
      }
      this.endValid = nextStartKept;
      for (const i of a) {
        const y0 = this.start[i]!;
        yOld[i] = y0;
        const d1 = this.node[0]![i]! - y0;
        const d2 = this.node[1]![i]! - y0;
        const d3 = this.node[2]![i]! - y0;
        for (let k = 0; k < 3; k++) q[k * n + i] = NODE_INVERSE[k * 3]! * d1 + NODE_INVERSE[k * 3 + 1]! * d2 + NODE_INVERSE[k * 3 + 2]! * d3;
      }
    }
    return { tOld: it.tOld, t: it.t, h: it.h, yOld, q };
  }

  readState(out: Float64Array): Float64Array {
    return this.elim.expand(this.inner.t, this.inner.readState(this.yD), out);
  }

  /** f at the present state when the integrator's last evaluation was there (the expansion kept it). */
  readRhsAtState(out: Float64Array): boolean {
    const yD = this.inner.readState(this.yD);
    if (this.elim.kept(this.inner.t, yD) < 0) return false;
    this.elim.expand(this.inner.t, yD, this.start, out);
    return true;
  }
}
