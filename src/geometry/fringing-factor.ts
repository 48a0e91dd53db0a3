import { InputError } from '../errors.js';
import { requirePositive } from './checks.js';

/**
 * Largest gap, as a fraction of the dimension a fringing formula treats as
 * large (window height, side of the pole face), that we accept. Both formulas
 * are first-order corrections for short gaps; their sources give no numeric
 * bound, so this limit is OUR choice, not the sources'. Beyond it, turn
 * fringing off (`'none'`), give a factor from a field solution (`'factor'`),
 * or model the fringing paths explicitly.
 *
 * @example
 * ```ts
 * const longestGap = SHORT_GAP_LIMIT * Math.sqrt(poleArea); // accepted by 'mclyman'
 * ```
 */
export const SHORT_GAP_LIMIT = 0.25;

/**
 * How the gap's fringing flux is accounted for. The result is always a
 * factor F >= 1 on the gap area: R_g = l_g / (mu0 A_g F).
 *
 * - `none`: no fringing (F = 1), R_g = l_g/(mu0 A_g).
 * - `mclyman`: F = 1 + (l_g/sqrt(A_c)) ln(2 G/l_g), G the window height
 *   (the winding length along the gapped leg), A_c the core (pole face)
 *   area, default the gap area. Source: W. T. McLyman, Transformer and
 *   Inductor Design Handbook, inductor design chapter (READ as quoted in a
 *   journal paper; see REFERENCES.md section 3).
 * - `matsch`: add the gap length to each side of a rectangular pole face,
 *   F = (a + l_g)(b + l_g)/(a b). Source: L. W. Matsch, Capacitors, Magnetic
 *   Circuits, and Transformers (Prentice-Hall, 1964), sect. 3-12 "Correction
 *   for fringing at short air gaps" (READ in an online copy of the section).
 * - `factor`: a factor F >= 1 you computed elsewhere (field solution, measurement).
 *
 * Validity: short gaps. We accept l_g <= {@link SHORT_GAP_LIMIT} times
 * sqrt(A_c) and G (mclyman) or each face side (matsch).
 *
 * @example
 * ```ts
 * const f: FringingModel = { kind: 'mclyman', windowHeight: mm(20) };
 * gapReluctance({ length: mm(0.5), area: mm2(100), fringing: f });
 * ```
 */
export type FringingModel =
  | { readonly kind: 'none' }
  | { readonly kind: 'mclyman'; readonly windowHeight: number; readonly coreArea?: number }
  | { readonly kind: 'matsch'; readonly width: number; readonly depth: number }
  | { readonly kind: 'factor'; readonly value: number };

function tooLong(owner: string, gapLength: number, dimension: string, value: number, formula: string): InputError {
  return new InputError(
    'gap-too-long-for-fringing',
    `${owner}: gap length ${gapLength} m exceeds ${SHORT_GAP_LIMIT} x ${dimension} (${value} m), outside the short-gap range of the ${formula} fringing formula; shorten the gap, or use fringing 'none' or an explicit 'factor'`,
    ['gap length', dimension],
  );
}

/**
 * McLyman's fringing factor F = 1 + (l_g / sqrt(A_c)) ln(2 G / l_g).
 * Source: W. T. McLyman, Transformer and Inductor Design Handbook, inductor
 * design chapter (READ as quoted in a journal paper). G is the window height
 * (winding length along the gapped leg), A_c the core cross-section at the
 * gap. Valid for short gaps: throws `gap-too-long-for-fringing` when
 * l_g > {@link SHORT_GAP_LIMIT} sqrt(A_c) or l_g > SHORT_GAP_LIMIT G (our limit).
 *
 * @example
 * ```ts
 * mclymanFringingFactor({ gapLength: mm(1), coreArea: mm2(100), windowHeight: mm(20) });
 * // 1 + 0.1 ln 40 = 1.36889
 * ```
 */
export function mclymanFringingFactor(p: { gapLength: number; coreArea: number; windowHeight: number }, owner = 'mclymanFringingFactor'): number {
  const lg = requirePositive(p.gapLength, 'gap length', owner);
  const ac = requirePositive(p.coreArea, 'core area', owner, 'm^2');
  const g = requirePositive(p.windowHeight, 'window height', owner);
  const side = Math.sqrt(ac);
  if (lg > SHORT_GAP_LIMIT * side) throw tooLong(owner, lg, 'sqrt(core area)', side, "McLyman's");
  if (lg > SHORT_GAP_LIMIT * g) throw tooLong(owner, lg, 'window height', g, "McLyman's");
  return 1 + (lg / side) * Math.log((2 * g) / lg);
}

/**
 * Fringing factor by adding the gap length to each side of a rectangular pole
 * face: F = (a + l_g)(b + l_g) / (a b). Source: L. W. Matsch, Capacitors,
 * Magnetic Circuits, and Transformers (Prentice-Hall, 1964), sect. 3-12,
 * "Correction for fringing at short air gaps" (READ in an online copy).
 * Valid for short gaps: throws `gap-too-long-for-fringing` when l_g exceeds
 * {@link SHORT_GAP_LIMIT} times either side (our limit).
 *
 * @example
 * ```ts
 * matschFringingFactor({ gapLength: mm(1), width: mm(10), depth: mm(20) }); // 11*21/200 = 1.155
 * ```
 */
export function matschFringingFactor(p: { gapLength: number; width: number; depth: number }, owner = 'matschFringingFactor'): number {
  const lg = requirePositive(p.gapLength, 'gap length', owner);
  const a = requirePositive(p.width, 'face width', owner);
  const b = requirePositive(p.depth, 'face depth', owner);
  if (lg > SHORT_GAP_LIMIT * a) throw tooLong(owner, lg, 'face width', a, "Matsch's");
  if (lg > SHORT_GAP_LIMIT * b) throw tooLong(owner, lg, 'face depth', b, "Matsch's");
  return ((a + lg) * (b + lg)) / (a * b);
}

/**
 * Evaluate a fringing model for a gap of the given length and face area (internal dispatch).
 *
 * @internal
 * @example
 * ```ts
 * evaluateFringing({ kind: 'matsch', width: mm(10), depth: mm(20) }, mm(1), mm2(200), 'gap'); // 1.155
 * ```
 */
export function evaluateFringing(model: FringingModel, gapLength: number, gapArea: number, owner: string): number {
  switch (model.kind) {
    case 'none':
      return 1;
    case 'mclyman':
      return mclymanFringingFactor({ gapLength, coreArea: model.coreArea ?? gapArea, windowHeight: model.windowHeight }, owner);
    case 'matsch':
      return matschFringingFactor({ gapLength, width: model.width, depth: model.depth }, owner);
    case 'factor': {
      const f = model.value;
      if (typeof f !== 'number' || !Number.isFinite(f) || f < 1) {
        throw new InputError(
          'invalid-fringing-factor',
          `${owner}: fringing factor ${String(f)} is not a finite number >= 1; fringing only widens the gap's flux path (F >= 1; 1 = no fringing)`,
          ['fringing factor'],
        );
      }
      return f;
    }
    default:
      throw new InputError(
        'invalid-option',
        `${owner}: fringing kind '${String((model as { kind: unknown }).kind)}' is unknown; use 'none', 'mclyman', 'matsch' or 'factor'`,
        ['fringing'],
      );
  }
}
