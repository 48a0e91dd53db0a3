import type { InputView } from '../elements/element-kind.js';
import { DenseStampTarget } from '../elements/stamp-target.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { makeConsistent, type MassSpaces } from '../solver/consistent-initialization.js';

/** The tolerance of unknown i at value yi in the settling solves: atol_i + rtol |yi|. */
export function unknownTolerance(atol: number | Float64Array, rtol: number, i: number, yi: number): number {
  return (typeof atol === 'number' ? atol : atol[i]!) + rtol * Math.abs(yi);
}

/**
 * The fallback of the algebraic solves at device settling (dense and
 * sparse alike): when W0^T J V0 is too ill-conditioned for the LU's pivot
 * test, the solver's least-change initialisation (SVD based, dense) makes
 * y consistent. Returns whether it did.
 *
 * @example
 * ```ts
 * const leastChange = leastChangeSettle(compiled, 1e-6, 1e-6);
 * leastChange(t, y, inputs, spaces);
 * ```
 */
export function leastChangeSettle(
  compiled: CompiledNetwork,
  atol: number | Float64Array,
  rtol: number,
): (t: number, y: Float64Array, inputs: InputView, spaces: MassSpaces) => boolean {
  const n = compiled.layout.size;
  const scale = new Float64Array(n);
  return (t, y, inputs, spaces) => {
    for (let i = 0; i < n; i++) scale[i] = unknownTolerance(atol, rtol, i, y[i]!);
    const ctx = {
      n,
      spaces,
      rhs: (tt: number, yy: Float64Array, out: Float64Array) => compiled.evaluate(tt, yy, inputs, out),
      jacobian: (tt: number, yy: Float64Array, _f: Float64Array, out: Float64Array) => {
        out.fill(0);
        compiled.stampJacobian(tt, yy, inputs, new DenseStampTarget(n).bind(out));
      },
      scale,
    };
    return makeConsistent(ctx, t, y, false).ok;
  };
}
