import type { CoreLayout } from './core-layout.js';
import { withTankPaths, type ZeroSequencePath } from './tank-path.js';
import { rowLayout, type LegGap, type LegWindings, type RectangularCoreDimensions } from './row-layout.js';
import type { PhaseLimb } from './three-limb-layout.js';

/**
 * Input of {@link fiveLimbLayout}: a three-phase, five-limb core-type core, SI units.
 *
 * @example
 * ```ts
 * const input: FiveLimbInput = {
 *   limbWidth: mm(80), returnLimbWidth: mm(45), yokeHeight: mm(45), depth: mm(80),
 *   windowWidth: mm(90), windowHeight: mm(250),
 * };
 * ```
 */
export interface FiveLimbInput extends RectangularCoreDimensions {
  /** Width of each phase limb in the drawing plane, m. */
  readonly limbWidth: number;
  /** Width of each unwound return limb, m. */
  readonly returnLimbWidth: number;
  /** Clear width of the two outer windows (return limb to phase limb), m; default `windowWidth`. */
  readonly returnWindowWidth?: number;
  /** Air gaps, by limb (phase or return). */
  readonly gaps?: { readonly [L in PhaseLimb | 'return-left' | 'return-right']?: LegGap };
  /** Concentric windings with a leakage path, by phase limb. */
  readonly windings?: { readonly [L in PhaseLimb]?: LegWindings };
  /**
   * A zero-sequence return path through the tank (paths 'tank-a', 'tank-b',
   * 'tank-c' beside the phase limbs). Without it, flux common to the three
   * limbs can only return through the iron: see docs/geometry.md.
   */
  readonly zeroSequence?: ZeroSequencePath;
}

/**
 * Layout of a three-phase, five-limb core-type core: the three phase limbs
 * 'a', 'b', 'c' flanked by unwound return limbs 'return-left' and
 * 'return-right'; windows 'left', 'ab', 'bc', 'right'; yoke paths
 * 'yoke-top-<window>' and 'yoke-bottom-<window>'. Every yoke segment has the
 * same `yokeHeight` (five-limb cores usually have reduced yokes: give the
 * reduced value). No `constants`. See docs/geometry.md.
 *
 * Throws `InputError` with the codes listed at {@link uCoreLayout}.
 *
 * @example
 * ```ts
 * const layout = fiveLimbLayout({
 *   limbWidth: mm(80), returnLimbWidth: mm(45), yokeHeight: mm(45), depth: mm(80),
 *   windowWidth: mm(90), returnWindowWidth: mm(60), windowHeight: mm(250),
 * });
 * layout.windingLegs; // ['a', 'b', 'c']
 * ```
 */
export function fiveLimbLayout(input: FiveLimbInput): CoreLayout {
  const ret = input.returnLimbWidth;
  const retWindow = input.returnWindowWidth ?? input.windowWidth;
  const retWindowName = input.returnWindowWidth === undefined ? 'windowWidth' : 'returnWindowWidth';
  const layout = rowLayout({
    shape: 'five-limb',
    owner: 'fiveLimbLayout',
    legs: [
      { name: 'return-left', width: ret, widthName: 'returnLimbWidth', windable: false },
      ...(['a', 'b', 'c'] as const).map((name) => ({ name, width: input.limbWidth, widthName: 'limbWidth', windable: true })),
      { name: 'return-right', width: ret, widthName: 'returnLimbWidth', windable: false },
    ],
    windows: [
      { name: 'left', width: retWindow, widthName: retWindowName },
      { name: 'ab', width: input.windowWidth, widthName: 'windowWidth' },
      { name: 'bc', width: input.windowWidth, widthName: 'windowWidth' },
      { name: 'right', width: retWindow, widthName: retWindowName },
    ],
    dimensions: input,
    ...(input.gaps !== undefined ? { gaps: input.gaps } : {}),
    ...(input.windings !== undefined ? { windings: input.windings } : {}),
    constants: 'none',
  });
  return withTankPaths(layout, ['a', 'b', 'c'], input.zeroSequence, 'fiveLimbLayout');
}
