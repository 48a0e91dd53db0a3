import type { CoreLayout } from './core-layout.js';
import { rowLayout, type LegGap, type LegWindings, type RectangularCoreDimensions } from './row-layout.js';

/**
 * Input of {@link uCoreLayout}: a two-leg core (U-U, U-I pair or C core), SI units.
 *
 * @example
 * ```ts
 * const input: UCoreInput = {
 *   legWidth: mm(12), yokeHeight: mm(12), depth: mm(15), windowWidth: mm(14), windowHeight: mm(30),
 * };
 * ```
 */
export interface UCoreInput extends RectangularCoreDimensions {
  /** Width of each leg in the drawing plane, m. */
  readonly legWidth: number;
  /** Air gaps, by leg. */
  readonly gaps?: { readonly left?: LegGap; readonly right?: LegGap };
  /** Concentric windings with a leakage path, by leg. */
  readonly windings?: { readonly left?: LegWindings; readonly right?: LegWindings };
}

/**
 * Layout of a two-leg core (U/C type): legs 'left' and 'right' between the
 * yokes 'top' and 'bottom', one window 'window'. Nodes 'top-left',
 * 'top-right', 'bottom-left', 'bottom-right'; paths 'leg-left', 'leg-right'
 * (pointing up), 'yoke-top', 'yoke-bottom' (pointing right), plus a gap
 * 'gap-<leg>' and, with windings, 'leg-<leg>-foot', 'leg-<leg>-head' and
 * 'leakage-<leg>' (see docs/geometry.md for the drawing). `constants`: the
 * IEC 60205 parameters of the closed loop (gaps ignored).
 *
 * Throws `InputError`: `invalid-dimension`, `invalid-stacking-factor`,
 * `gap-longer-than-leg`, `gap-longer-than-winding`,
 * `gap-too-long-for-fringing`, `winding-taller-than-window`,
 * `windings-exceed-window`, `unknown-leg`, `invalid-option`.
 *
 * @example
 * ```ts
 * const layout = uCoreLayout({
 *   legWidth: mm(12), yokeHeight: mm(12), depth: mm(15),
 *   windowWidth: mm(14), windowHeight: mm(30),
 *   gaps: { left: { length: mm(0.4) }, right: { length: mm(0.4) } },
 * });
 * layout.constants?.effectiveLength; // m
 * ```
 */
export function uCoreLayout(input: UCoreInput): CoreLayout {
  return rowLayout({
    shape: 'u-core',
    owner: 'uCoreLayout',
    legs: [
      { name: 'left', width: input.legWidth, widthName: 'legWidth', windable: true },
      { name: 'right', width: input.legWidth, widthName: 'legWidth', windable: true },
    ],
    windows: [{ name: 'window', width: input.windowWidth, widthName: 'windowWidth' }],
    dimensions: input,
    ...(input.gaps !== undefined ? { gaps: input.gaps } : {}),
    ...(input.windings !== undefined ? { windings: input.windings } : {}),
    constants: 'loop',
  });
}
