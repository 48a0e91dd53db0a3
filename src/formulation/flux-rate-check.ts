import type { CompiledTube, TubeLoops } from '../elements/tube-kind.js';
import { algebraicJacobian, massSpaces } from '../solver/consistent-initialization.js';
import { Matrix, SVD } from 'ml-matrix';

/** Eddy resistance (ohm) put on a tube only to test whether it would make the DAE index 1. */
const TEST_EDDY = 1;

/** Above this many tubes without an eddy resistance, all are named together instead of testing each alone. */
const MAX_TUBES_TESTED_ALONE = 16;

/**
 * Refuses a network in which a tube whose states follow dphi/dt (a
 * hysteretic tube) has no eddy resistance and the other rows do not fix its
 * flux derivative: then db/dt has no equation of its own and the DAE is of
 * index 2 (an unwound hysteretic branch in parallel with another path, or a
 * winding fed from a current source).
 *
 * The test is the index-1 condition at the initial state: W0^T J V0
 * nonsingular, W0 and V0 the left and right null spaces of M (Hairer and
 * Wanner II, sect. VII.1), with M as compiled. When it fails, the same test
 * with a trial eddy resistance on every such tube tells whether those tubes
 * are the cause (the rank deficiency drops); a tube is named alone when the trial on all the others does
 * not suffice, else all of them are named together (a wound centre leg with
 * two unwound outer legs: an eddy resistance on any two of the three
 * suffices). A deficiency the trial does not reduce comes from another
 * index-2 structure (a current source in an inductive cut-set), which the
 * solver's index-2 treatment handles; it is not these tubes' doing.
 *
 * @example
 * ```ts
 * checkFluxRatesDetermined(tubes, tubeLoops, () => mass, n, (y, J) => jacobian(0, y, J), y0); // throws or returns
 * ```
 */
export function checkFluxRatesDetermined(
  tubes: readonly (CompiledTube & { readonly name: string })[],
  tubeLoops: readonly TubeLoops[],
  massOf: () => Float64Array,
  n: number,
  jacobian: (y: Float64Array, J: Float64Array) => void,
  y0: Float64Array,
): void {
  const bare = tubes.flatMap((t, b) => (t.missingFluxRateError ? [b] : []));
  if (bare.length === 0) return;
  // The dense M only for a network that has such tubes (made on demand: none on a large network without them).
  const mass = massOf();
  const J = new Float64Array(n * n);
  try {
    jacobian(y0, J);
  } catch {
    // An element's stamp that throws at the initial state is reported by the run itself, with its own code.
    return;
  }
  const deficiency = (trial: readonly number[]): number => {
    const m = Float64Array.from(mass);
    for (const b of trial) {
      const { index, sign } = tubeLoops[b]!;
      for (let k1 = 0; k1 < index.length; k1++) {
        for (let k2 = 0; k2 < index.length; k2++) m[index[k1]! * n + index[k2]!]! += sign[k1]! * sign[k2]! * TEST_EDDY;
      }
    }
    const spaces = massSpaces(m, n);
    if (spaces.k === 0) return 0;
    return rankDeficiency(algebraicJacobian(spaces, J, new Float64Array(spaces.k * spaces.k)), spaces.k);
  };
  const alone = deficiency([]);
  if (alone === 0) return;
  const withAll = deficiency(bare);
  // The same deficiency with a trial eddy resistance on every such tube: another structure (a current
  // source in an inductive cut-set, handled by the solver's index-2 treatment) is the cause, not these tubes.
  if (withAll >= alone) return;
  const names = (list: readonly number[]): string[] => list.map((b) => tubes[b]!.name);
  const culprits =
    bare.length > MAX_TUBES_TESTED_ALONE ? [] : bare.filter((b) => deficiency(bare.filter((other) => other !== b)) > withAll);
  if (culprits.length > 0) {
    throw tubes[culprits[0]!]!.missingFluxRateError!(
      'the model follows db/dt, and no winding or eddy resistance fixes the flux rate of this tube, only the MMF ' +
        'balance does (an unwound branch in parallel with another path), so db/dt has no equation of its own ' +
        '(index 2); the eddy term R_e dphi/dt gives it one',
      names(culprits),
    );
  }
  throw tubes[bare[0]!]!.missingFluxRateError!(
    'the model follows db/dt, and only the MMF balance fixes the flux rates of the loops these tubes share (unwound ' +
      'branches in parallel, or a winding fed from a current source), so db/dt has no equation of its own (index 2); ' +
      'an eddy term R_e dphi/dt on some of them fixes those rates (on all of them always does)',
    names(bare),
  );
}

/**
 * Rank deficiency of a k x k row-major matrix: the number of singular values
 * below k * eps * 16 times the largest (the rank test of the mass matrix,
 * Golub and Van Loan, sect. 5.4.1). Not the LU's pivot test, which is built
 * to solve and passed a structurally singular 5 x 5 matrix whose singular
 * values spanned 2.8e-19 (a hysteretic return path in parallel with a
 * leakage reluctance); and no equilibration, which blew a column of
 * round-off (2e-18) up to order one and hid the same singularity.
 */
function rankDeficiency(a: Float64Array, k: number): number {
  const sigma = new SVD(Matrix.from1DArray(k, k, Array.from(a)), {
    computeLeftSingularVectors: false,
    computeRightSingularVectors: false,
  }).diagonal;
  const floor = k * Number.EPSILON * 16 * Math.max(...sigma);
  return sigma.filter((x) => !(x > floor)).length;
}
