import { MU0 } from '../constants.js';
import { requirePositive } from './checks.js';
import { evaluateFringing, type FringingModel } from './fringing-factor.js';

/**
 * Input of {@link gapReluctance}.
 *
 * @example
 * ```ts
 * const input: GapReluctanceInput = { length: mm(0.5), area: mm2(100), fringing: { kind: 'none' } };
 * ```
 */
export interface GapReluctanceInput {
  /** Gap length l_g along the flux, m (> 0). */
  readonly length: number;
  /** Geometric area of the gap face A_g, m^2 (> 0). */
  readonly area: number;
  /** Fringing correction; default `{ kind: 'none' }`. */
  readonly fringing?: FringingModel;
}

/**
 * Result of {@link gapReluctance}.
 *
 * @example
 * ```ts
 * const { reluctance, fringingFactor } = gapReluctance({ length: mm(0.5), area: mm2(100) });
 * ```
 */
export interface GapReluctance {
  /** R_g = l_g / (mu0 A_g F), A/Wb (1/H). */
  readonly reluctance: number;
  /** Fringing factor F >= 1 (1 without fringing). */
  readonly fringingFactor: number;
  /** Effective gap area A_g F, m^2: the area to give a uniform-field gap of the same reluctance. */
  readonly effectiveArea: number;
}

/**
 * Reluctance of an air gap, R_g = l_g / (mu0 A_g F): the uniform-field gap
 * (F = 1) or with a fringing factor F from a published formula (see
 * {@link FringingModel}: McLyman's factor, Matsch's add-the-gap rule, or a
 * factor of your own). mu0 is {@link MU0} (CODATA 2018).
 *
 * Throws `invalid-dimension` for a length or area that is not positive, and
 * `gap-too-long-for-fringing` when the gap is outside the short-gap range
 * of the chosen formula (the message names the dimension it is compared with).
 *
 * @example
 * ```ts
 * // 0.5 mm gap under a 10 mm x 10 mm pole, window 20 mm high
 * const g = gapReluctance({
 *   length: mm(0.5),
 *   area: mm2(100),
 *   fringing: { kind: 'mclyman', windowHeight: mm(20) },
 * });
 * g.reluctance; // A/Wb: F = 1 + 0.05 ln 80 = 1.219, R = 3.26e6
 * ```
 */
export function gapReluctance(input: GapReluctanceInput, owner = 'gapReluctance'): GapReluctance {
  const length = requirePositive(input.length, 'gap length', owner);
  const area = requirePositive(input.area, 'gap area', owner, 'm^2');
  const fringingFactor = evaluateFringing(input.fringing ?? { kind: 'none' }, length, area, owner);
  const effectiveArea = area * fringingFactor;
  return Object.freeze({ reluctance: length / (MU0 * effectiveArea), fringingFactor, effectiveArea });
}
