import type { CoreLayout } from './core-layout.js';
import { withTankPaths, type ZeroSequencePath } from './tank-path.js';
import { rowLayout, type LegGap, type LegWindings, type RectangularCoreDimensions } from './row-layout.js';

/**
 * Phase limbs of a three-phase core.
 *
 * @example
 * ```ts
 * const limb: PhaseLimb = 'b';
 * layout.legs.find((l) => l.name === limb)?.windingPath; // 'leg-b'
 * ```
 */
export type PhaseLimb = 'a' | 'b' | 'c';

/**
 * Input of {@link threeLimbLayout}: a three-phase, three-limb core-type core, SI units.
 *
 * @example
 * ```ts
 * const input: ThreeLimbInput = {
 *   limbWidth: mm(80), yokeHeight: mm(80), depth: mm(80), windowWidth: mm(90), windowHeight: mm(250),
 * };
 * ```
 */
export interface ThreeLimbInput extends RectangularCoreDimensions {
  /** Width of each limb in the drawing plane, m. */
  readonly limbWidth: number;
  /** Air gaps (e.g. a lumped joint gap), by limb. */
  readonly gaps?: { readonly [L in PhaseLimb]?: LegGap };
  /** Concentric windings (e.g. LV inside HV) with a leakage path, by limb. */
  readonly windings?: { readonly [L in PhaseLimb]?: LegWindings };
  /**
   * A zero-sequence return path through the tank (paths 'tank-a', 'tank-b',
   * 'tank-c' beside the phase limbs). Without it, flux common to the three
   * limbs can only return through the iron: see docs/geometry.md.
   */
  readonly zeroSequence?: ZeroSequencePath;
}

/**
 * Layout of a three-phase, three-limb core-type core: limbs 'a', 'b', 'c'
 * (legs, pointing up), windows 'ab' and 'bc', yokes 'top' and 'bottom' split
 * at the limbs into 'yoke-top-ab', 'yoke-top-bc', 'yoke-bottom-ab',
 * 'yoke-bottom-bc' (pointing right). Nodes 'top-<limb>', 'bottom-<limb>'.
 * No `constants`: the core has no single magnetic path. See docs/geometry.md.
 *
 * Throws `InputError` with the codes listed at {@link uCoreLayout}.
 *
 * @example
 * ```ts
 * const layout = threeLimbLayout({
 *   limbWidth: mm(80), yokeHeight: mm(80), depth: mm(80), stackingFactor: 0.96,
 *   windowWidth: mm(90), windowHeight: mm(250),
 *   windings: { a: { innerBuild: mm(15), outerBuild: mm(20), spacing: mm(8), clearance: mm(4) } },
 * });
 * layout.legs.find((l) => l.name === 'a')?.leakagePath; // 'leakage-a'
 * ```
 */
export function threeLimbLayout(input: ThreeLimbInput): CoreLayout {
  const layout = rowLayout({
    shape: 'three-limb',
    owner: 'threeLimbLayout',
    legs: (['a', 'b', 'c'] as const).map((name) => ({ name, width: input.limbWidth, widthName: 'limbWidth', windable: true })),
    windows: [
      { name: 'ab', width: input.windowWidth, widthName: 'windowWidth' },
      { name: 'bc', width: input.windowWidth, widthName: 'windowWidth' },
    ],
    dimensions: input,
    ...(input.gaps !== undefined ? { gaps: input.gaps } : {}),
    ...(input.windings !== undefined ? { windings: input.windings } : {}),
    constants: 'none',
  });
  return withTankPaths(layout, ['a', 'b', 'c'], input.zeroSequence, 'threeLimbLayout');
}
