import type { AlgebraicSolver, ConsistencyContext, MassSpaces } from './consistent-initialization.js';
import { columnsTransposeTimes } from './consistent-initialization.js';
import type { RealLinearSolver } from './linear-solver.js';
import { createSparseLu } from './sparse-lu.js';
import { createSparseMatrix, sparsePattern, type SparsePattern } from './sparse-pattern.js';
import { rowsOfColumns, sparseProduct, type RowStructure } from './sparse-product.js';
import { maximumTransversal } from './sparse-transversal.js';

/**
 * A square system of fixed structure factored from its values by the sparse
 * LU, its rows first permuted to a maximum transversal (the systems of
 * consistent initialisation number their rows unrelated to their columns;
 * see {@link maximumTransversal}); ordering and band analysed once. The
 * sparse counterpart, for a fixed structure, of the pattern-adaptive LU.
 *
 * @internal
 * @example
 * ```ts
 * const lu = createTransversalLu(structure);
 * if (lu.factorValues(values) < 0) lu.solve(b);
 * ```
 */
export interface TransversalLu extends RealLinearSolver {
  /** Factor the matrix with `values` on the structure; -1 or the column of a bad pivot. */
  factorValues(values: Float64Array): number;
  /** Numbers held (band, multipliers, values, vectors), for storage checks. */
  readonly held: number;
}

/** See {@link TransversalLu}. @internal */
export function createTransversalLu(s: RowStructure): TransversalLu {
  const n = s.rows;
  const rowOf = maximumTransversal({ n, rowStart: s.rowStart, col: s.col });
  const rows: number[] = [];
  const cols: number[] = [];
  for (let j = 0; j < n; j++) for (let e = s.rowStart[rowOf[j]!]!; e < s.rowStart[rowOf[j]! + 1]!; e++) rows.push(j), cols.push(s.col[e]!);
  const pattern: SparsePattern = sparsePattern(n, rows, cols);
  const lookup = createSparseMatrix(pattern);
  const slotOf = new Int32Array(s.col.length);
  for (let j = 0; j < n; j++) for (let e = s.rowStart[rowOf[j]!]!; e < s.rowStart[rowOf[j]! + 1]!; e++) slotOf[e] = lookup.slot(j, s.col[e]!);
  const lu = createSparseLu(pattern);
  const values = new Float64Array(pattern.col.length);
  const x = new Float64Array(n);
  const { width, lower } = lu.structure;
  return {
    size: n,
    held: n * width + n * lower + 3 * pattern.col.length + 8 * n,
    factorValues(v) {
      values.fill(0);
      for (let e = 0; e < slotOf.length; e++) values[slotOf[e]!] = v[e]!;
      return lu.factorValues(values);
    },
    factor() {
      throw new Error('createTransversalLu: factor values on the structure (factorValues)');
    },
    solve(b) {
      for (let j = 0; j < n; j++) x[j] = b[rowOf[j]!]!;
      lu.solve(x);
      b.set(x);
    },
  };
}

/**
 * The algebraic Jacobian W0^T J V0 (k x k) for J given as values on a
 * pattern, formed as W0^T (J V0) (the association of the dense
 * algebraicJacobian) by fixed-structure products and factored by a
 * {@link TransversalLu}: no n x n or n x k array.
 *
 * @internal
 * @example
 * ```ts
 * const alg = createSparseAlgebraicJacobian(spaces, pattern);
 * if (alg.factor(jacValues) < 0) alg.lu.solve(z);
 * ```
 */
export interface SparseAlgebraicJacobian {
  /** Form and factor W0^T J V0 for J (values on the pattern): -1 or the column of a bad pivot. */
  factor(jac: Float64Array): number;
  readonly lu: TransversalLu;
  /** Numbers held, for storage checks. */
  readonly held: number;
}

/** See {@link SparseAlgebraicJacobian}. @internal */
export function createSparseAlgebraicJacobian(spaces: MassSpaces, pattern: SparsePattern): SparseAlgebraicJacobian {
  const { n, k } = spaces;
  const { v0, w0 } = spaces.columns;
  const jStructure: RowStructure = { rows: n, cols: n, rowStart: pattern.rowStart, col: pattern.col };
  const w0T: RowStructure = { rows: k, cols: n, rowStart: w0.start, col: w0.index };
  const v0Rows = rowsOfColumns(n, k, v0.start, v0.index);
  const v0Values = Float64Array.from(v0Rows.valueOf, (e) => v0.value[e]!);
  const jv = sparseProduct(jStructure, v0Rows.structure);
  const jvValues = new Float64Array(jv.structure.col.length);
  const jr = sparseProduct(w0T, jv.structure);
  const jrValues = new Float64Array(jr.structure.col.length);
  const lu = createTransversalLu(jr.structure);
  return {
    lu,
    held: jvValues.length + jrValues.length + lu.held,
    factor(jac) {
      jv.evaluate(jac, v0Values, jvValues);
      jr.evaluate(w0.value, jvValues, jrValues);
      return lu.factorValues(jrValues);
    },
  };
}

/**
 * The consistent initialisation's matrices on the sparse path, for J held
 * as values on the iteration pattern (sparse-iteration-system.ts): the
 * algebraic Jacobian W0^T J V0 (k x k) and the consistent-derivative system
 * [U1^T M; W0^T J] (n x n), each a product of fixed structure
 * ({@link sparseProduct}) factored by a {@link TransversalLu}. The same
 * matrices as the dense functions of consistent-initialization.ts
 * (algebraicJacobian, consistentDerivativeWith), with no n x n or n x k array.
 *
 * @internal
 * @example
 * ```ts
 * const sc = createSparseConsistency(spaces, pattern, massValues);
 * if (sc.factorAlgebraic(jac)) resolveAlgebraic(ctx, t, y, sc.solver);
 * ```
 */
export interface SparseConsistency {
  /** Factor W0^T J V0 for J (values on the pattern) into `solver.lu`; false when it is singular. */
  factorAlgebraic(jac: Float64Array): boolean;
  /** Buffers and the factorisation above, for resolveAlgebraic and makeConsistent. */
  readonly solver: AlgebraicSolver;
  /** The consistent derivative y' at a consistent y (as consistentDerivativeWith), or undefined when its system is singular. */
  derivative(ctx: ConsistencyContext, t: number, dt: number, y: Float64Array, f: Float64Array, jac: Float64Array): Float64Array | undefined;
  /** Numbers held, for storage checks. */
  readonly held: number;
}

/** See {@link SparseConsistency}. `massValues`: M on `pattern`. @internal */
export function createSparseConsistency(spaces: MassSpaces, pattern: SparsePattern, massValues: Float64Array): SparseConsistency {
  const { n, k, rank } = spaces;
  const { w0, u1 } = spaces.columns;
  const jStructure: RowStructure = { rows: n, cols: n, rowStart: pattern.rowStart, col: pattern.col };
  const w0T: RowStructure = { rows: k, cols: n, rowStart: w0.start, col: w0.index };
  const u1T: RowStructure = { rows: rank, cols: n, rowStart: u1.start, col: u1.index };
  const algebraic = createSparseAlgebraicJacobian(spaces, pattern);
  // [U1^T M; W0^T J]: the first block is constant.
  const massRows = sparseProduct(u1T, jStructure);
  const jacRows = sparseProduct(w0T, jStructure);
  const top = massRows.structure.col.length;
  const rowStart = new Int32Array(n + 1);
  for (let r = 0; r <= rank; r++) rowStart[r] = massRows.structure.rowStart[r]!;
  for (let c = 1; c <= k; c++) rowStart[rank + c] = top + jacRows.structure.rowStart[c]!;
  const stacked: RowStructure = { rows: n, cols: n, rowStart, col: Int32Array.from([...massRows.structure.col, ...jacRows.structure.col]) };
  const aValues = new Float64Array(stacked.col.length);
  massRows.evaluate(u1.value, massValues, aValues);
  const bottom = aValues.subarray(top);
  const derivativeLu = createTransversalLu(stacked);
  const ft = new Float64Array(n);
  const b = new Float64Array(n);
  const solver: AlgebraicSolver = {
    lu: algebraic.lu,
    jr: new Float64Array(0),
    jv: new Float64Array(0),
    f: new Float64Array(n),
    r: new Float64Array(k),
    dz: new Float64Array(k),
    dy: new Float64Array(n),
  };
  return {
    solver,
    held: aValues.length + algebraic.held + derivativeLu.held + 8 * n,
    factorAlgebraic: (jac) => algebraic.factor(jac) < 0,
    derivative(ctx, t, dt, y, f, jac) {
      ctx.rhs(t + dt, y, ft);
      columnsTransposeTimes(u1, f, b);
      for (let c = 0; c < k; c++) {
        let s = 0;
        for (let e = w0.start[c]!; e < w0.start[c + 1]!; e++) {
          const i = w0.index[e]!;
          s += w0.value[e]! * (ft[i]! - f[i]!) / dt;
        }
        b[rank + c] = -s;
      }
      jacRows.evaluate(w0.value, jac, bottom);
      if (derivativeLu.factorValues(aValues) >= 0) return undefined;
      derivativeLu.solve(b);
      return b;
    },
  };
}
