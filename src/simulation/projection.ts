import type { CompiledNetwork } from '../formulation/compile-network.js';
import { makeConsistent, massSpaces, type ConsistencyContext, type MassSpaces } from '../solver/consistent-initialization.js';

/**
 * Projects an interpolated state onto the algebraic equations: keeps its
 * differential content M y and solves W0^T f(t, y) = 0 for the algebraic
 * part by Newton's method (the solver's consistent initialisation).
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
 * @example
 * ```ts
 * const project = createProjector(compiled, atol, rtol);
 * project(t, y); // in place; the inputs' interval must be set for t
 * ```
 */
export function createProjector(compiled: CompiledNetwork, atol: number | Float64Array, rtol: number): (t: number, y: Float64Array) => void {
  const n = compiled.layout.size;
  let spaces: MassSpaces | undefined;
  const scale = new Float64Array(n);
  const ctx = (): ConsistencyContext => {
    spaces ??= massSpaces(compiled.mass, n);
    return {
      n,
      spaces,
      rhs: compiled.rhs,
      jacobian: (t, y, _f, out) => {
        out.fill(0);
        compiled.jacobian(t, y, out);
      },
      scale,
    };
  };
  return (t, y) => {
    for (let i = 0; i < n; i++) scale[i] = (typeof atol === 'number' ? atol : atol[i]!) + rtol * Math.abs(y[i]!);
    const c = ctx();
    if (c.spaces.k === 0) return;
    const before = Float64Array.from(y);
    const res = makeConsistent(c, t, y, false);
    if (!res.ok) y.set(before); // keep the interpolated state rather than a failed iterate
  };
}
