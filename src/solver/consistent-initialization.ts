import { Matrix, SVD, pseudoInverse } from 'ml-matrix';
import { columnsOfDense, denseOfColumns, structuralMassBases, type SparseColumns } from './sparse-mass-spaces.js';
import { createPatternAdaptiveLu } from './sparse-adaptive-lu.js';
import { denseOfSparseMass, sparseMassOfDense, type SparseMass } from './sparse-mass.js';
import type { RealLinearSolver } from './linear-solver.js';
import { largestScaled, nonFiniteIndices, roundingFlooredNorm } from './weighted-norm.js';
import { copyEntries, zeroEntries } from './small-array-copy.js';

/**
 * Null spaces of a constant mass matrix: the right null space V0 (directions
 * in which y can move without changing M y: the algebraic unknowns, for a
 * non-diagonal M too), the left null space W0 (combinations of rows that are
 * algebraic equations, W0^T M = 0) and the range U1 of M; orthonormal bases.
 * The solver's own loops use the sparse columns (`columns`); the dense
 * row-major arrays are made on first use.
 *
 * @internal
 */
export interface MassSpaces {
  readonly n: number;
  /** rank of M */
  readonly rank: number;
  /** n - rank */
  readonly k: number;
  /** Right null space, n x k row-major (column j is a null vector). */
  readonly v0: Float64Array;
  /** Left null space, n x k row-major. */
  readonly w0: Float64Array;
  /** Range of M, n x rank row-major. */
  readonly u1: Float64Array;
  /** The same bases as sparse columns. */
  readonly columns: { readonly v0: SparseColumns; readonly w0: SparseColumns; readonly u1: SparseColumns };
}

/**
 * Size from which {@link massSpaces} finds the null spaces from the
 * structure of M (connected blocks, {@link structuralMassBases}) rather than
 * by an SVD of the whole matrix; below it the dense SVD is cheap and kept.
 *
 * @internal
 */
export const STRUCTURAL_SPACES_MIN_SIZE = 32;

/**
 * Null spaces of M: from its structure from {@link STRUCTURAL_SPACES_MIN_SIZE}
 * unknowns on (or with `method: 'structural'`), else by a dense SVD
 * ({@link denseMassSpaces}). Both use the same rank test and span the same
 * spaces. M is row-major dense (n x n) or compressed rows
 * ({@link SparseMass}); from the compressed rows the structural method
 * reads only the non-zeros.
 *
 * @internal
 */
export function massSpaces(mass: Float64Array | SparseMass, n: number, method: 'auto' | 'dense' | 'structural' = 'auto'): MassSpaces {
  const structural = method === 'structural' || (method === 'auto' && n >= STRUCTURAL_SPACES_MIN_SIZE);
  if (!structural) return denseMassSpaces(mass instanceof Float64Array ? mass : denseOfSparseMass(mass), n);
  const b = structuralMassBases(mass instanceof Float64Array ? sparseMassOfDense(mass, n) : mass);
  return spacesOf(n, b.rank, b.v0, b.w0, b.u1);
}

/** MassSpaces over sparse columns, with the dense arrays made on first use. */
function spacesOf(n: number, rank: number, v0: SparseColumns, w0: SparseColumns, u1: SparseColumns, dense?: { v0: Float64Array; w0: Float64Array; u1: Float64Array }): MassSpaces {
  let d = dense;
  const get = (): { v0: Float64Array; w0: Float64Array; u1: Float64Array } => (d ??= { v0: denseOfColumns(v0), w0: denseOfColumns(w0), u1: denseOfColumns(u1) });
  return {
    n,
    rank,
    k: n - rank,
    get v0() {
      return get().v0;
    },
    get w0() {
      return get().w0;
    },
    get u1() {
      return get().u1;
    },
    columns: { v0, w0, u1 },
  };
}

/**
 * Singular value decomposition of the whole M with ml-matrix; singular values below
 * n * eps * 16 * sigma_max count as zero (common practice for numerical rank,
 * Golub and Van Loan, sect. 5.4.1). O(n^3): for small n and as the reference
 * of the structural method.
 *
 * @internal
 */
export function denseMassSpaces(mass: Float64Array, n: number): MassSpaces {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, mass[i * n + j]!);
  const svd = new SVD(m, { computeLeftSingularVectors: true, computeRightSingularVectors: true, autoTranspose: false });
  const sigma = svd.diagonal;
  const smax = Math.max(0, ...sigma);
  const tol = smax * n * Number.EPSILON * 16;
  const zero: number[] = [];
  const nonzero: number[] = [];
  sigma.forEach((s, i) => (s > tol && smax > 0 ? nonzero : zero).push(i));
  const U = svd.leftSingularVectors;
  const V = svd.rightSingularVectors;
  const k = zero.length;
  const rank = nonzero.length;
  const v0 = new Float64Array(n * k);
  const w0 = new Float64Array(n * k);
  const u1 = new Float64Array(n * rank);
  for (let i = 0; i < n; i++) {
    zero.forEach((c, j) => {
      v0[i * k + j] = V.get(i, c);
      w0[i * k + j] = U.get(i, c);
    });
    nonzero.forEach((c, j) => {
      u1[i * rank + j] = U.get(i, c);
    });
  }
  return spacesOf(n, rank, columnsOfDense(v0, n, k), columnsOfDense(w0, n, k), columnsOfDense(u1, n, rank), { v0, w0, u1 });
}

/** out_j = (W^T x)_j for sparse columns W (@internal). */
export function columnsTransposeTimes(w: SparseColumns, x: Float64Array, out: Float64Array): void {
  const { k, start, index, value } = w;
  for (let j = 0; j < k; j++) {
    let s = 0;
    for (let e = start[j]!; e < start[j + 1]!; e++) s += value[e]! * x[index[e]!]!;
    out[j] = s;
  }
}

/** out = V z for sparse columns V (@internal). */
export function columnsTimes(v: SparseColumns, z: Float64Array, out: Float64Array): void {
  zeroEntries(out);
  const { k, start, index, value } = v;
  for (let j = 0; j < k; j++) {
    const zj = z[j]!;
    if (zj === 0) continue;
    for (let e = start[j]!; e < start[j + 1]!; e++) out[index[e]!] = out[index[e]!]! + value[e]! * zj;
  }
}

/**
 * Row `row` of W^T A (A dense row-major n x n, column c of W) into out[row * n ..): the
 * combination of A's rows that column c of W makes.
 */
function combineRows(w: SparseColumns, c: number, a: Float64Array, n: number, out: Float64Array, row: number): void {
  const base = row * n;
  zeroEntries(out, base, base + n);
  for (let e = w.start[c]!; e < w.start[c + 1]!; e++) {
    const coefficient = w.value[e]!;
    const src = w.index[e]! * n;
    for (let j = 0; j < n; j++) out[base + j] = out[base + j]! + coefficient * a[src + j]!;
  }
}

/**
 * V0 by rows (row l: pairs column, value at entries[2e], entries[2e + 1]) and the rows W0 touches, made once per spaces.
 * A class, not a literal: V8 widens the field types of a literal evaluated a second time (the next run's
 * spaces), which threw away algebraicJacobian's optimised code.
 */
class RowIndex {
  constructor(
    readonly byRow: Int32Array,
    readonly entries: Float64Array,
    readonly rows: Int32Array,
    /** The positions in J (row-major n x n) that W0^T J V0 reads: the rows W0 touches times the rows of V0 that hold a non-zero. */
    readonly support: Int32Array,
  ) {}
}
const rowIndexCache = new WeakMap<MassSpaces, RowIndex>();
function rowIndexOf(spaces: MassSpaces): RowIndex {
  let c = rowIndexCache.get(spaces);
  if (c) return c;
  const { v0, w0 } = spaces.columns;
  const n = spaces.n;
  const byRow = new Int32Array(n + 1);
  for (let e = 0; e < v0.index.length; e++) byRow[v0.index[e]! + 1]!++;
  for (let l = 0; l < n; l++) byRow[l + 1]! += byRow[l]!;
  const entries = new Float64Array(2 * v0.index.length);
  const next = byRow.slice(0, n);
  // Columns ascending within a row, so each sum runs over l in the order of the dense loop.
  for (let b = 0; b < v0.k; b++) {
    for (let e = v0.start[b]!; e < v0.start[b + 1]!; e++) {
      const slot = next[v0.index[e]!]!++;
      entries[2 * slot] = b;
      entries[2 * slot + 1] = v0.value[e]!;
    }
  }
  const touched = new Uint8Array(n);
  for (let e = 0; e < w0.index.length; e++) touched[w0.index[e]!] = 1;
  const rows = Int32Array.from({ length: n }, (_, i) => i).filter((i) => touched[i] === 1);
  const support: number[] = [];
  for (let r = 0; r < rows.length; r++) {
    for (let l = 0; l < n; l++) if (byRow[l]! < byRow[l + 1]!) support.push(rows[r]! * n + l);
  }
  c = new RowIndex(byRow, entries, rows, Int32Array.from(support));
  rowIndexCache.set(spaces, c);
  return c;
}

/**
 * The Jacobian of the algebraic equations with respect to the algebraic
 * directions, W0^T J V0 (k x k, row-major, into `out`): nonsingular exactly
 * when the DAE is index 1 at that state (Hairer and Wanner II, sect. VII.1).
 * `work` (n x k) may be passed to avoid an allocation. Only the non-zeros of
 * the bases' columns are visited.
 *
 * @internal
 */
export function algebraicJacobian(spaces: MassSpaces, jac: Float64Array, out: Float64Array, work: Float64Array = new Float64Array(spaces.n * spaces.k)): Float64Array {
  const { n, k } = spaces;
  const { v0, w0 } = spaces.columns;
  // work = J V0 (n x k), only in the rows W0 combines; J read row by row (contiguous), V0 by its rows.
  const { byRow, entries, rows } = rowIndexOf(spaces);
  for (let r = 0; r < rows.length; r++) {
    const i = rows[r]!;
    const base = i * k;
    zeroEntries(work, base, base + k);
    const rowJ = i * n;
    for (let l = 0; l < n; l++) {
      const a = jac[rowJ + l]!;
      if (a === 0) continue;
      for (let e = byRow[l]!; e < byRow[l + 1]!; e++) {
        const b = entries[2 * e]!;
        work[base + b] = work[base + b]! + a * entries[2 * e + 1]!;
      }
    }
  }
  zeroEntries(out, 0, k * k);
  for (let a = 0; a < k; a++) {
    for (let e = w0.start[a]!; e < w0.start[a + 1]!; e++) {
      const w = w0.value[e]!;
      const src = w0.index[e]! * k;
      for (let b = 0; b < k; b++) out[a * k + b] = out[a * k + b]! + w * work[src + b]!;
    }
  }
  return out;
}

/** What {@link makeConsistent} needs from its caller (evaluations are counted there). */
export interface ConsistencyContext {
  readonly n: number;
  readonly spaces: MassSpaces;
  /** f(t, y) -> out. May throw (the caller maps it to a status). */
  readonly rhs: (t: number, y: Float64Array, out: Float64Array) => void;
  /** df/dy at (t, y) with f = f(t, y) -> out (n*n). */
  readonly jacobian: (t: number, y: Float64Array, f: Float64Array, out: Float64Array) => void;
  /** Error scale atol + rtol |y| for the convergence test. */
  readonly scale: Float64Array;
  /**
   * On the sparse path: W0^T J V0 at (t, y) (f = f(t, y)) evaluated and
   * factored without dense arrays (returns -1 or the column of a bad pivot),
   * solved then by `lu`. Without it {@link makeConsistent} forms it from
   * the dense `jacobian`.
   */
  readonly algebraic?: { factorAt(t: number, y: Float64Array, f: Float64Array): number; readonly lu: RealLinearSolver };
}

/** Outcome of {@link makeConsistent}. */
export type ConsistencyOutcome =
  | {
      readonly ok: true;
      readonly iterations: number;
      /**
       * Differential unknowns that had to move (by more than their tolerance)
       * to satisfy a hidden constraint of an index-2 structure.
       */
      readonly adjusted?: readonly number[];
    }
  | { readonly ok: false; readonly reason: 'non-finite' | 'singular' | 'no-convergence'; readonly components: number[]; readonly message: string };

/** The factorisation of W0^T J V0 kept per spaces (factored anew on every use; the pattern analysis is kept). */
const consistencySolvers = new WeakMap<MassSpaces, RealLinearSolver>();

/** Newton iterations allowed for consistent initialisation. */
const MAX_ITERATIONS = 40;
/** Converged when the Newton update is this small in the weighted norm (a millionth of the tolerance). */
const UPDATE_TOLERANCE = 1e-6;

/**
 * Make the algebraic part of y consistent at time t, in place: Newton's
 * method on W0^T f(t, y + V0 z) = 0 for z (k unknowns), with the
 * monotonicity test of Deuflhard's damped Newton (P. Deuflhard, Newton
 * Methods for Nonlinear Problems, Springer 2004, sect. 3.3) on the simplified
 * correction. Only directions in the null space of M move, so M y (the
 * differential content of y) is kept exactly. Valid for non-diagonal M
 * (Brenan, Campbell and Petzold, Numerical Solution of Initial-Value Problems
 * in DAEs, SIAM 1996, sect. 5.3 on consistent initial conditions, in the
 * projected form used here).
 *
 * When W0^T J V0 is singular the algebraic part does not determine the
 * unknowns by itself (an index-2 structure, or an unknown no equation
 * constrains): see {@link leastChangeConsistent}.
 *
 * @internal
 */
export function makeConsistent(ctx: ConsistencyContext, t: number, y: Float64Array, moveDifferential = true): ConsistencyOutcome {
  const { n, spaces, scale } = ctx;
  const { k } = spaces;
  const { v0, w0 } = spaces.columns;
  if (k === 0) return { ok: true, iterations: 0 };
  const f = new Float64Array(n);
  const sparse = ctx.algebraic;
  const jac = sparse ? undefined : new Float64Array(n * n);
  const jv = sparse ? undefined : new Float64Array(n * k);
  const jr = sparse ? undefined : new Float64Array(k * k);
  const r = new Float64Array(k);
  const dz = new Float64Array(k);
  const dy = new Float64Array(n);
  const ytrial = new Float64Array(n);
  // One solver per spaces: its symbolic analysis (transversal, ordering, band) serves every later call.
  let lu = sparse?.lu ?? consistencySolvers.get(spaces);
  if (!lu) consistencySolvers.set(spaces, (lu = createPatternAdaptiveLu(k)));
  let lastNorm = Infinity;

  const residual = (at: Float64Array, out: Float64Array): number[] => {
    ctx.rhs(t, at, f);
    const bad = nonFiniteIndices(f);
    if (bad.length) return bad;
    columnsTransposeTimes(w0, f, out);
    return [];
  };
  const toY = (z: Float64Array, out: Float64Array): void => columnsTimes(v0, z, out);

  for (let iter = 1; iter <= MAX_ITERATIONS; iter++) {
    const badF = residual(y, r);
    if (badF.length) {
      return { ok: false, reason: 'non-finite', components: badF, message: `f is not finite at the initial state (components ${badF.join(', ')})` };
    }
    let badPivot: number;
    if (sparse) {
      badPivot = sparse.factorAt(t, y, f);
    } else {
      ctx.jacobian(t, y, f, jac!);
      algebraicJacobian(spaces, jac!, jr!, jv!);
      badPivot = lu.factor(jr!);
    }
    if (badPivot >= 0) return leastChangeConsistent(ctx, t, y, moveDifferential);
    for (let j = 0; j < k; j++) dz[j] = -r[j]!;
    lu.solve(dz);
    toY(dz, dy);
    const norm = roundingFlooredNorm(dy, y, scale);
    if (!Number.isFinite(norm)) {
      return { ok: false, reason: 'no-convergence', components: nonFiniteIndices(dy), message: 'the Newton update for the algebraic unknowns is not finite' };
    }
    if (norm <= UPDATE_TOLERANCE) {
      for (let i = 0; i < n; i++) y[i] = y[i]! + dy[i]!;
      return { ok: true, iterations: iter };
    }
    // Stagnation at round-off level: the update no longer shrinks.
    if (norm < 1e-2 && norm >= lastNorm) return { ok: true, iterations: iter };
    // An update below 1 % of the tolerances is round-off dominated: take it. The damped step's
    // monotonicity test below compares two such updates and fails on noise (seen at a switch-off that
    // leaves a node at kilovolts with a tight voltage tolerance).
    if (norm < 1e-2) {
      for (let i = 0; i < n; i++) y[i] = y[i]! + dy[i]!;
      return { ok: true, iterations: iter };
    }
    lastNorm = norm;
    // Damped step with the natural monotonicity test.
    let lambda = 1;
    const zbar = new Float64Array(k);
    const dybar = new Float64Array(n);
    for (;;) {
      for (let i = 0; i < n; i++) ytrial[i] = y[i]! + lambda * dy[i]!;
      const badT = residual(ytrial, zbar);
      if (!badT.length) {
        for (let j = 0; j < k; j++) zbar[j] = -zbar[j]!;
        lu.solve(zbar);
        toY(zbar, dybar);
        const nbar = roundingFlooredNorm(dybar, ytrial, scale);
        if (nbar <= (1 - lambda / 4) * norm) break;
      }
      lambda /= 2;
      if (lambda < 1 / 1024) {
        return {
          ok: false,
          reason: 'no-convergence',
          components: largestScaled(dy, scale),
          message: `Newton's method on the algebraic equations does not converge (last update ${norm.toExponential(2)} tolerances)`,
        };
      }
    }
    y.set(ytrial);
  }
  return {
    ok: false,
    reason: 'no-convergence',
    components: largestScaled(dy, scale),
    message: `Newton's method on the algebraic equations did not converge in ${MAX_ITERATIONS} iterations`,
  };
}

/**
 * Consistent initialisation when W0^T J V0 is singular, by least change:
 *
 * 1. Gauss-Newton on the algebraic residual W0^T f(t, y + V0 z) with
 *    minimum-norm steps (pseudo-inverse of W0^T J V0): the algebraic
 *    unknowns the equations determine are set, those they do not determine
 *    (index-2 unknowns such as the voltage of a current-driven winding) keep
 *    their value, and M y is kept.
 * 2. If a residual remains, the algebraic equations constrain the
 *    differential unknowns too (a hidden constraint of index 2: the flux of
 *    a winding whose current a current source forces). Gauss-Newton then
 *    moves all unknowns, with the step of least weighted norm
 *    ||diag(scale)^-1 dy|| (the least change in tolerance units); the
 *    differential unknowns that moved are reported as `adjusted`.
 *
 * Both phases are the classical minimum-norm Gauss-Newton method for
 * underdetermined systems (e.g. Deuflhard, Newton Methods for Nonlinear
 * Problems, Springer 2004, sect. 4.4 on underdetermined problems; from
 * memory). Converged when each algebraic residual is below what a move of
 * one tolerance could change (sum_i |(W0^T J)_ji| scale_i). With
 * `moveDifferential` false only phase 1 runs (projection of an interpolated
 * state, which must keep its differential content).
 *
 * @internal
 */
function leastChangeConsistent(ctx: ConsistencyContext, t: number, y: Float64Array, moveDifferential: boolean): ConsistencyOutcome {
  const { n, spaces, scale } = ctx;
  const { k, v0, w0 } = spaces;
  const f = new Float64Array(n);
  const jac = new Float64Array(n * n);
  const start = Float64Array.from(y);
  const residual = (at: Float64Array): { r: Float64Array; bad: number[] } => {
    ctx.rhs(t, at, f);
    const bad = nonFiniteIndices(f);
    const r = new Float64Array(k);
    for (let j = 0; j < k; j++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += w0[i * k + j]! * f[i]!;
      r[j] = s;
    }
    return { r, bad };
  };
  /** G = W0^T J (k x n) at y, and whether each residual is within one tolerance move. */
  const linearise = (at: Float64Array, r: Float64Array): { g: Matrix; small: boolean; worst: number[] } => {
    ctx.rhs(t, at, f);
    ctx.jacobian(t, at, f, jac);
    const g = new Matrix(k, n);
    const worst: number[] = [];
    for (let j = 0; j < k; j++) {
      let sens = 0;
      for (let l = 0; l < n; l++) {
        let wj = 0;
        for (let i = 0; i < n; i++) wj += w0[i * k + j]! * jac[i * n + l]!;
        g.set(j, l, wj);
        sens += Math.abs(wj) * scale[l]!;
      }
      if (!(Math.abs(r[j]!) <= sens)) for (let i = 0; i < n; i++) if (Math.abs(w0[i * k + j]!) > 1e-8) worst.push(i);
    }
    return { g, small: worst.length === 0, worst };
  };
  const v0m = new Matrix(n, k);
  for (let i = 0; i < n; i++) for (let j = 0; j < k; j++) v0m.set(i, j, v0[i * k + j]!);

  let iterations = 0;
  for (const phase of moveDifferential ? ([1, 2] as const) : ([1] as const)) {
    for (let iter = 1; iter <= MAX_ITERATIONS; iter++) {
      iterations++;
      const { r, bad } = residual(y);
      if (bad.length) {
        return { ok: false, reason: 'non-finite', components: bad, message: `f is not finite at the initial state (components ${bad.join(', ')})` };
      }
      const { g, small, worst } = linearise(y, r);
      if (small) {
        const adjusted: number[] = [];
        for (let i = 0; i < n; i++) {
          let inNull = 0;
          for (let j = 0; j < k; j++) inNull += v0[i * k + j]! ** 2;
          if (inNull < 0.999 && Math.abs(y[i]! - start[i]!) > scale[i]!) adjusted.push(i);
        }
        return adjusted.length ? { ok: true, iterations, adjusted } : { ok: true, iterations };
      }
      const rm = Matrix.columnVector(Array.from(r));
      let dy: Matrix;
      if (phase === 1) {
        dy = v0m.mmul(pseudoInverse(g.mmul(v0m)).mmul(rm)).neg();
      } else {
        const sg = g.clone();
        for (let l = 0; l < n; l++) for (let j = 0; j < k; j++) sg.set(j, l, g.get(j, l) * scale[l]!);
        dy = pseudoInverse(sg).mmul(rm).neg();
        for (let l = 0; l < n; l++) dy.set(l, 0, dy.get(l, 0) * scale[l]!);
      }
      const step = Float64Array.from(dy.to1DArray());
      const norm = roundingFlooredNorm(step, y, scale);
      if (!Number.isFinite(norm)) {
        return { ok: false, reason: 'no-convergence', components: nonFiniteIndices(step), message: 'the least-change update of the initial state is not finite' };
      }
      const before = Float64Array.from(y);
      for (let i = 0; i < n; i++) y[i] = y[i]! + step[i]!;
      if (norm <= UPDATE_TOLERANCE) {
        // The step no longer moves y: this phase cannot reduce the residual further.
        const after = residual(y);
        if (!after.bad.length && linearise(y, after.r).small) continue;
        y.set(before);
        if (phase === 2) {
          return {
            ok: false, reason: 'singular', components: [...new Set(worst)].sort((a, b) => a - b),
            message: 'the algebraic equations cannot be satisfied near y0, even moving the differential unknowns; check the model and y0',
          };
        }
        break;
      }
    }
  }
  const { r } = residual(y);
  const { worst } = linearise(y, r);
  return {
    ok: false, reason: 'no-convergence', components: [...new Set(worst)].sort((a, b) => a - b),
    message: `the least-change initialisation did not converge in ${MAX_ITERATIONS} iterations per phase`,
  };
}

/**
 * The consistent derivative y'(t) of an index-1 DAE at a consistent y:
 * U1^T M y' = U1^T f (the differential rows) and W0^T (J y' + df/dt) = 0 (the
 * algebraic rows differentiated once). df/dt by a forward difference.
 * Returns undefined when that system is singular (index > 1).
 *
 * @internal
 */
export function consistentDerivative(
  ctx: ConsistencyContext,
  mass: Float64Array,
  t: number,
  dt: number,
  y: Float64Array,
): Float64Array | undefined {
  const { n } = ctx;
  const f = new Float64Array(n);
  const jac = new Float64Array(n * n);
  ctx.rhs(t, y, f);
  ctx.jacobian(t, y, f, jac);
  return consistentDerivativeWith(ctx, t, dt, y, f, jac, createDerivativeWork(ctx.spaces, mass));
}

/**
 * Buffers of {@link consistentDerivativeWith}, allocated once, with the
 * rows U1^T M of its system formed once (M is constant).
 *
 * @internal
 */
export interface DerivativeWork {
  readonly ft: Float64Array;
  /** The system (n x n): rows U1^T M (written once, with the work) over rows W0^T J (written per J). */
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly lu: RealLinearSolver;
  /** The version of J the system in `lu` was formed from (NaN: none), and whether it was singular. */
  factoredVersion: number;
  singular: boolean;
}

/**
 * The buffers for the mass spaces `spaces` of the n x n mass matrix `mass`
 * (row-major), U1^T M formed here rather than on first use: a branch taken
 * only by a run's first restart has no type feedback when V8 optimises the
 * restart path, so the next run would throw that code away (docs/solver.md).
 *
 * @internal
 */
export function createDerivativeWork(spaces: MassSpaces, mass: Float64Array): DerivativeWork {
  return new DerivativeBuffers(spaces, mass);
}

/** A class, not a literal (see {@link createAlgebraicSolver}). */
class DerivativeBuffers implements DerivativeWork {
  readonly ft: Float64Array;
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly lu: RealLinearSolver;
  factoredVersion = NaN;
  singular = false;

  constructor(spaces: MassSpaces, mass: Float64Array) {
    const { n, rank } = spaces;
    this.ft = new Float64Array(n);
    this.a = new Float64Array(n * n);
    // The top rows stay as written here: the LU factors a without changing it (RealLinearSolver.factor).
    for (let r = 0; r < rank; r++) combineRows(spaces.columns.u1, r, mass, n, this.a, r);
    this.b = new Float64Array(n);
    this.lu = createPatternAdaptiveLu(n);
  }
}

/**
 * {@link consistentDerivative} with f = f(t, y) and a Jacobian given (for a
 * restart: the kept one, good enough for a step-size estimate) and buffers
 * from `work` (made for ctx's mass matrix); allocates nothing. The result
 * lives in `work.b`.
 * `jacVersion`, when given, names the contents of `jac` (the same number
 * for the same entries): the system is formed and factored only when it
 * differs from the one factored last (M is constant, so the same J gives
 * the same system and the same factors).
 *
 * @internal
 */
export function consistentDerivativeWith(
  ctx: ConsistencyContext,
  t: number,
  dt: number,
  y: Float64Array,
  f: Float64Array,
  jac: Float64Array,
  work: DerivativeWork,
  jacVersion = NaN,
): Float64Array | undefined {
  const { n, spaces } = ctx;
  const { k, rank } = spaces;
  const { w0, u1 } = spaces.columns;
  const { ft, b } = work;
  ctx.rhs(t + dt, y, ft);
  if (!(work.factoredVersion === jacVersion)) {
    work.singular = work.lu.factor(derivativeSystem(work, jac, spaces)) >= 0;
    work.factoredVersion = jacVersion;
  }
  columnsTransposeTimes(u1, f, b);
  for (let c = 0; c < k; c++) {
    let s = 0;
    for (let e = w0.start[c]!; e < w0.start[c + 1]!; e++) {
      const i = w0.index[e]!;
      s += w0.value[e]! * (ft[i]! - f[i]!) / dt;
    }
    b[rank + c] = -s;
  }
  if (work.singular) return undefined;
  work.lu.solve(b);
  return b;
}

/** The system of {@link consistentDerivativeWith} in `work.a`: its rows W0^T J below the rows U1^T M made with the work. */
function derivativeSystem(work: DerivativeWork, jac: Float64Array, spaces: MassSpaces): Float64Array {
  const { n, k, rank } = spaces;
  const { w0 } = spaces.columns;
  const a = work.a;
  for (let c = 0; c < k; c++) combineRows(w0, c, jac, n, a, rank + c);
  return a;
}

/**
 * Buffers and the factored algebraic Jacobian W0^T J V0 for
 * {@link resolveAlgebraic}, allocated once per integrator. `f` holds
 * f(t, y) for the re-solve (see there).
 *
 * @internal
 */
export interface AlgebraicSolver {
  readonly lu: RealLinearSolver;
  readonly jr: Float64Array;
  readonly jv: Float64Array;
  readonly f: Float64Array;
  readonly r: Float64Array;
  readonly dz: Float64Array;
  readonly dy: Float64Array;
}

/**
 * The dense path's {@link AlgebraicSolver}, which remembers the block it
 * factored last (see {@link factorAlgebraic}).
 *
 * @internal
 */
export interface DenseAlgebraicSolver extends AlgebraicSolver {
  /** W0^T J V0 as last factored (meaningful while `factored`). */
  readonly factoredBlock: Float64Array;
  /** The entries of J that block was formed from, at the positions of its support (meaningful while `factored`). */
  readonly factoredSupport: Float64Array;
  factored: boolean;
}

/** @internal */
export function createAlgebraicSolver(n: number, k: number): DenseAlgebraicSolver {
  return new DenseAlgebraicBuffers(n, k);
}

/** A class, not a literal: a literal made once per integrator has its field types widened at its second evaluation (docs/solver.md). */
class DenseAlgebraicBuffers implements DenseAlgebraicSolver {
  readonly lu: RealLinearSolver;
  readonly jr: Float64Array;
  readonly jv: Float64Array;
  readonly f: Float64Array;
  readonly r: Float64Array;
  readonly dz: Float64Array;
  readonly dy: Float64Array;
  readonly factoredBlock: Float64Array;
  readonly factoredSupport: Float64Array;
  factored = false;

  constructor(n: number, k: number) {
    this.lu = createPatternAdaptiveLu(k);
    this.jr = new Float64Array(k * k);
    this.jv = new Float64Array(n * k);
    this.f = new Float64Array(n);
    this.r = new Float64Array(k);
    this.dz = new Float64Array(k);
    this.dy = new Float64Array(n);
    this.factoredBlock = new Float64Array(k * k);
    this.factoredSupport = new Float64Array(n * n);
  }
}

/**
 * Factor W0^T J V0 for the kept Jacobian J; false when it is singular (an
 * index-2 structure: the full initialisation must handle it). When the
 * block equals, entry for entry, the one factored last, the factors are
 * kept (the same matrix factored again gives the same factors): a Jacobian
 * that changed only in its differential columns, such as a saturating
 * core's dH/dB as the flux moves, leaves the algebraic block as it was.
 * That case is found before the block is formed: when the entries of J the
 * block reads (its support) equal those it was last formed from.
 *
 * @internal
 */
export function factorAlgebraic(spaces: MassSpaces, jac: Float64Array, solver: DenseAlgebraicSolver): boolean {
  const { support } = rowIndexOf(spaces);
  const heldSupport = solver.factoredSupport;
  // The block is a fixed sum of products of these entries: equal entries give the same block, so J
  // that moved only elsewhere (a saturating core's dH/dB in a differential column) is not multiplied out.
  if (solver.factored && sameAt(jac, support, heldSupport)) return true;
  const block = algebraicJacobian(spaces, jac, solver.jr, solver.jv);
  for (let s = 0; s < support.length; s++) heldSupport[s] = jac[support[s]!]!;
  const held = solver.factoredBlock;
  if (solver.factored) {
    let same = true;
    for (let e = 0; e < block.length; e++) {
      if (block[e] !== held[e]) {
        same = false;
        break;
      }
    }
    if (same) return true;
  }
  copyEntries(block, held); // copied before the LU reads it (an LU may scale its input)
  solver.factored = solver.lu.factor(block) < 0;
  return solver.factored;
}

/** Whether jac[positions[s]] equals held[s] for every s (=== : 0 and -0 alike, which the block's products treat alike). */
function sameAt(jac: Float64Array, positions: Int32Array, held: Float64Array): boolean {
  for (let s = 0; s < positions.length; s++) if (jac[positions[s]!] !== held[s]) return false;
  return true;
}

/**
 * How {@link resolveAlgebraic} ended: `'current'` (y was consistent within
 * the tolerance and is unchanged: `solver.f` still holds f(t, y)), `'moved'`
 * (the update was applied: f is stale) or `'failed'` (a non-finite update).
 *
 * @internal
 */
export type AlgebraicResolve = 'current' | 'moved' | 'failed';

/**
 * Re-solve the algebraic equations W0^T f(t, y + V0 z) = 0 after an input
 * jump by one simplified Newton update with a kept factorisation of
 * W0^T J V0 (no new Jacobian, no allocation). `solver.f` holds f(t, y) on
 * entry (the caller evaluates it with the new inputs). An update within the
 * tolerance of {@link makeConsistent} (rounding units excepted) is not
 * applied: y and f stay as they are.
 *
 * One update, unverified: for the linear dependence of a source's value it
 * is exact to rounding; a nonlinear one (a smooth junction swinging through
 * its knee) is left to the first step's Newton iteration, whose collocation
 * equations hold the algebraic equations at every stage. Iterating here to
 * convergence was tried: such a junction then fails to converge, and so
 * does the full re-initialisation, where the first step's Newton iteration
 * with its short step succeeds (test/devices/exponential-switch-off.test.ts).
 *
 * @internal
 */
export function resolveAlgebraic(ctx: ConsistencyContext, t: number, y: Float64Array, solver: AlgebraicSolver): AlgebraicResolve {
  const { n, spaces, scale } = ctx;
  const { k } = spaces;
  const { v0, w0 } = spaces.columns;
  const { f, r, dz, dy } = solver;
  columnsTransposeTimes(w0, f, r);
  for (let j = 0; j < k; j++) dz[j] = -r[j]!;
  solver.lu.solve(dz);
  columnsTimes(v0, dz, dy);
  const norm = roundingFlooredNorm(dy, y, scale);
  if (!Number.isFinite(norm)) return 'failed';
  if (norm <= UPDATE_TOLERANCE) return 'current';
  for (let i = 0; i < n; i++) y[i] = y[i]! + dy[i]!;
  return 'moved';
}
