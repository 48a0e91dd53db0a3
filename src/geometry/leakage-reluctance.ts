import { MU0 } from '../constants.js';
import { requireNonNegative, requirePositive } from './checks.js';

/**
 * Two concentric windings of equal height on one leg (radial dimensions in m).
 *
 * @example
 * ```ts
 * const w: ConcentricWindingsGeometry = {
 *   innerBuild: mm(3), outerBuild: mm(4), spacing: mm(1), height: mm(40), meanTurnLength: mm(120),
 * };
 * ```
 */
export interface ConcentricWindingsGeometry {
  /** Radial build a1 of the inner winding (next to the leg), m (> 0). */
  readonly innerBuild: number;
  /** Radial build a2 of the outer winding, m (> 0). */
  readonly outerBuild: number;
  /** Radial spacing d between the two windings (insulation, duct), m (>= 0). */
  readonly spacing: number;
  /** Winding height h_w along the leg, m (> 0). */
  readonly height: number;
  /** Mean length of turn MLT of the winding pair, m (> 0). */
  readonly meanTurnLength: number;
}

/**
 * Leakage reluctance between two concentric windings of equal height:
 *
 *     R_s = h_w / (mu0 MLT (d + (a1 + a2)/3))
 *
 * It is the classic leakage inductance referred to a winding of N turns,
 * L_s = mu0 N^2 MLT (a1/3 + a2/3 + d) / h_w, written per turn squared:
 * L_s = N^2 / R_s, so R_s does not depend on the turns. Derivation (the
 * ampere-turn diagram; textbook result, e.g. R. Lee, Electronic Transformers
 * and Circuits, 2nd ed., Wiley 1955, sect. 4-8 "Leakage inductance", there
 * credited to Fortescue; form FROM MEMORY, derivation below DERIVED): with
 * balanced ampere-turns N i, the axial field H = N i x/(a1 h_w) rises across
 * the inner winding, stays N i / h_w across the spacing and falls back to 0
 * across the outer winding; the energy (mu0/2) integral(H^2 dV) with
 * dV = MLT h_w dx is (mu0/2)(N i/h_w)^2 MLT h_w (a1/3 + d + a2/3) = L_s i^2/2.
 * In words: a flux tube of length h_w and area MLT (d + (a1 + a2)/3), the
 * spacing plus a third of each winding's build. Assumes windings much taller
 * than their radial build (axial leakage field, no end effects) and a core of
 * much lower reluctance than the leakage path.
 *
 * @example
 * ```ts
 * const r = concentricLeakageReluctance({
 *   innerBuild: mm(3), outerBuild: mm(4), spacing: mm(1), height: mm(40), meanTurnLength: mm(120),
 * });
 * const leakageInductance = 100 ** 2 / r; // H, for a 100-turn winding
 * ```
 */
export function concentricLeakageReluctance(w: ConcentricWindingsGeometry, owner = 'concentricLeakageReluctance'): number {
  const a1 = requirePositive(w.innerBuild, 'innerBuild', owner);
  const a2 = requirePositive(w.outerBuild, 'outerBuild', owner);
  const d = requireNonNegative(w.spacing, 'spacing', owner);
  const hw = requirePositive(w.height, 'height', owner);
  const mlt = requirePositive(w.meanTurnLength, 'meanTurnLength', owner);
  return hw / (MU0 * mlt * (d + (a1 + a2) / 3));
}
