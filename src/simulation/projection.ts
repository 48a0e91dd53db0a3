import type { InputView } from '../elements/element-kind.js';
import { DenseStampTarget } from '../elements/stamp-target.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { algebraicJacobian, columnsTimes, columnsTransposeTimes, makeConsistent, massSpaces, type ConsistencyContext, type MassSpaces } from '../solver/consistent-initialization.js';
import { createSparseAlgebraicJacobian, type SparseAlgebraicJacobian } from '../solver/sparse-consistency.js';
import { PatternValuesTarget } from '../solver/sparse-iteration-system.js';
import { sparsePattern } from '../solver/sparse-pattern.js';
import { SPARSE_MIN_SIZE } from '../solver/types.js';
import { createDenseLu } from '../solver/dense-lu.js';

/** Converged when the last correction is this small in tolerance units (as the initialisation). */
const UPDATE_TOLERANCE = 1e-6;
/** Simplified Newton iterations before falling back to a full Newton solve. */
const MAX_SIMPLIFIED = 6;

/**
 * Projects an interpolated state onto the algebraic equations: keeps its
 * differential content M y and solves W0^T f(t, y + V0 z) = 0 for z.
 *
 * Why: between steps the state comes from the collocation polynomial, which
 * is accurate for the differential unknowns, but an algebraic unknown that is
 * a nonlinear function of them (the magnetising current of a saturating core
 * whose flux ramps linearly) is not a cubic in time, and the solver's error
 * control does not see it between stages. Solving the algebraic equations at
 * the interpolated differential state restores it to solver accuracy (the
 * projected dense output of index-1 DAEs; e.g. Brenan, Campbell and Petzold,
 * Numerical Solution of Initial-Value Problems in DAEs, SIAM 1996, sect. 5.3;
 * from memory). Index-2 unknowns are left as interpolated.
 *
 * Cost: simplified Newton with the factorised W0^T J V0 kept from call to
 * call (refreshed when it stops contracting), so a projection usually costs
 * one or two evaluations of f; where that matrix is singular (index 2) the
 * solver's full least-change initialisation is used instead.
 *
 * @example
 * ```ts
 * const project = createProjector(compiled, atol, rtol);
 * project(t, y, inputs); // in place, with the inputs in force at t
 * ```
 */
export function createProjector(
  compiled: CompiledNetwork,
  atol: number | Float64Array,
  rtol: number,
): (t: number, y: Float64Array, inputs?: InputView) => void {
  const n = compiled.layout.size;
  /** The inputs of the present call (default: the network's, as a reader has put them). */
  let inputs: InputView = compiled.inputs;
  const target = new DenseStampTarget(n);
  const rhs = (t: number, y: Float64Array, out: Float64Array): void => compiled.evaluate(t, y, inputs, out);
  const jacobianInto = (t: number, y: Float64Array, out: Float64Array): void => compiled.stampJacobian(t, y, inputs, target.bind(out));
  let spaces: MassSpaces | undefined;
  let k = 0;
  const scale = new Float64Array(n);
  const f = new Float64Array(n);
  const dy = new Float64Array(n);
  /** The interpolated state, put back when the projection fails (a scratch, not a copy per call). */
  const start = new Float64Array(n);
  const atolOf = typeof atol === 'number' ? undefined : atol;
  const atolAll = typeof atol === 'number' ? atol : 0;
  /** J, made on first use: a run that never projects holds no n x n array here. */
  let jac: Float64Array | undefined;
  let lu: ReturnType<typeof createDenseLu> | undefined;
  let luValid = false;
  let singular = false;
  let z = new Float64Array(0);

  const ctx = (): ConsistencyContext => ({
    n,
    spaces: spaces!,
    rhs,
    jacobian: (t, y, _f, out) => {
      out.fill(0);
      jacobianInto(t, y, out);
    },
    scale,
  });

  // Large networks: J as values on the stamps' pattern and W0^T J V0 formed and factored sparsely.
  const pattern = compiled.jacobianPattern && n >= SPARSE_MIN_SIZE ? sparsePattern(n, compiled.jacobianPattern.rows, compiled.jacobianPattern.cols) : undefined;
  const values = pattern ? new Float64Array(pattern.col.length) : undefined;
  const valuesTarget = pattern ? new PatternValuesTarget(pattern).bind(values!) : undefined;
  let algebraic: SparseAlgebraicJacobian | undefined;

  /** Factorise W0^T J V0 at (t, y); false when it is singular. */
  const refresh = (t: number, y: Float64Array): boolean => {
    if (pattern) {
      algebraic ??= createSparseAlgebraicJacobian(spaces!, pattern);
      values!.fill(0);
      compiled.stampJacobian(t, y, inputs, valuesTarget!);
      luValid = algebraic.factor(values!) < 0;
      return luValid;
    }
    jac ??= new Float64Array(n * n);
    jac.fill(0);
    jacobianInto(t, y, jac);
    const jr = algebraicJacobian(spaces!, jac, new Float64Array(k * k));
    lu ??= createDenseLu(k);
    luValid = lu.factor(jr) < 0;
    return luValid;
  };

  const full = (t: number, y: Float64Array): void => {
    const before = Float64Array.from(y);
    if (!makeConsistent(ctx(), t, y, false).ok) y.set(before); // keep the interpolated state
  };

  return (t, y, given) => {
    inputs = given ?? compiled.inputs;
    if (!spaces) {
      spaces = massSpaces(compiled.sparseMass, n);
      k = spaces.k;
      z = new Float64Array(k);
    }
    if (k === 0) return;
    for (let i = 0; i < n; i++) scale[i] = (atolOf === undefined ? atolAll : atolOf[i]!) + rtol * Math.abs(y[i]!);
    if (singular) return full(t, y);
    const s = spaces;
    for (let i = 0; i < n; i++) start[i] = y[i]!;
    let previous = Infinity;
    for (let iter = 0; iter < MAX_SIMPLIFIED; iter++) {
      if (!luValid && !refresh(t, y)) {
        singular = true;
        y.set(start);
        return full(t, y);
      }
      rhs(t, y, f);
      columnsTransposeTimes(s.columns.w0, f, z);
      for (let j = 0; j < k; j++) z[j] = -z[j]!;
      if (algebraic) algebraic.lu.solve(z);
      else lu!.solve(z);
      columnsTimes(s.columns.v0, z, dy);
      let norm = 0;
      for (let i = 0; i < n; i++) {
        y[i] = y[i]! + dy[i]!;
        norm += (dy[i]! / scale[i]!) ** 2;
      }
      norm = Math.sqrt(norm / n);
      if (!Number.isFinite(norm)) break;
      if (norm <= UPDATE_TOLERANCE) return;
      // Not contracting fast enough: refresh the matrix at the present iterate.
      if (norm > 0.5 * previous) luValid = false;
      previous = norm;
    }
    y.set(start);
    luValid = false;
    full(t, y);
  };
}
