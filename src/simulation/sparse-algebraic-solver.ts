import type { InputView } from '../elements/element-kind.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { columnsTimes, columnsTransposeTimes, massSpaces, type MassSpaces } from '../solver/consistent-initialization.js';
import { createSparseAlgebraicJacobian, type SparseAlgebraicJacobian } from '../solver/sparse-consistency.js';
import { PatternValuesTarget } from '../solver/sparse-iteration-system.js';
import { sparsePattern } from '../solver/sparse-pattern.js';
import { leastChangeSettle, unknownTolerance } from './least-change-settle.js';

/**
 * The algebraic solve of device-settle.ts's `algebraicSolver` for large
 * networks: the same Newton iteration on W0^T f(t, y + V0 z) = 0 with a
 * fresh Jacobian per iteration, but J stamped as values on the compiled
 * pattern and W0^T J V0 formed and factored sparsely
 * ({@link createSparseAlgebraicJacobian}); the bases are used as sparse
 * columns. No n x n or n x k array unless the least-change fallback (dense,
 * for an algebraic Jacobian too ill-conditioned for the pivot test) runs.
 *
 * @example
 * ```ts
 * const solve = sparseAlgebraicSolver(compiled, 1e-6, 1e-6, { maxIterations: 25, tolerance: 1e-8, stagnation: 1 });
 * solve(t, y, inputs);
 * ```
 */
export function sparseAlgebraicSolver(
  compiled: CompiledNetwork,
  atol: number | Float64Array,
  rtol: number,
  limits: { readonly maxIterations: number; readonly tolerance: number; readonly stagnation: number },
): (t: number, y: Float64Array, inputs: InputView) => boolean {
  const n = compiled.layout.size;
  const jp = compiled.jacobianPattern!;
  const pattern = sparsePattern(n, jp.rows, jp.cols);
  const values = new Float64Array(pattern.col.length);
  const target = new PatternValuesTarget(pattern).bind(values);
  const f = new Float64Array(n);
  const dy = new Float64Array(n);
  let spaces: MassSpaces | undefined;
  let algebraic: SparseAlgebraicJacobian | undefined;
  let z = new Float64Array(0);
  const tolerance = (i: number, yi: number): number => unknownTolerance(atol, rtol, i, yi);
  const leastChange = leastChangeSettle(compiled, atol, rtol);
  return (t, y, inputs) => {
    if (!spaces) {
      spaces = massSpaces(compiled.sparseMass, n);
      z = new Float64Array(spaces.k);
      if (spaces.k > 0) algebraic = createSparseAlgebraicJacobian(spaces, pattern);
    }
    const k = spaces.k;
    if (k === 0) return true;
    const { v0, w0 } = spaces.columns;
    let previous = Infinity;
    for (let iter = 0; iter < limits.maxIterations; iter++) {
      compiled.evaluate(t, y, inputs, f);
      values.fill(0);
      compiled.stampJacobian(t, y, inputs, target);
      if (algebraic!.factor(values) >= 0) return leastChange(t, y, inputs, spaces);
      columnsTransposeTimes(w0, f, z);
      for (let j = 0; j < k; j++) z[j] = -z[j]!;
      algebraic!.lu.solve(z);
      columnsTimes(v0, z, dy);
      let norm = 0;
      for (let i = 0; i < n; i++) {
        y[i] = y[i]! + dy[i]!;
        norm = Math.max(norm, Math.abs(dy[i]!) / tolerance(i, y[i]!));
      }
      if (!Number.isFinite(norm)) return false;
      if (norm <= limits.tolerance) return true;
      // Stagnation within tolerance: the round-off floor of an ill-conditioned solve (off-conductances).
      if (iter > 0 && norm <= limits.stagnation && norm >= 0.5 * previous) return true;
      previous = norm;
    }
    return false;
  };
}
