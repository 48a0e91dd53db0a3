import type { CoreLayout } from './core-layout.js';
import { rowLayout, type LegGap, type LegWindings, type RectangularCoreDimensions } from './row-layout.js';

/**
 * Input of {@link eCoreLayout}: a three-leg shell core (E-E or E-I pair), SI units.
 *
 * @example
 * ```ts
 * const input: ECoreInput = {
 *   centreLegWidth: mm(10), outerLegWidth: mm(5), yokeHeight: mm(5), depth: mm(10),
 *   windowWidth: mm(7.5), windowHeight: mm(20), gaps: { centre: { length: mm(0.3), fringing: 'none' } },
 * };
 * ```
 */
export interface ECoreInput extends RectangularCoreDimensions {
  /** Width of the centre leg in the drawing plane, m. */
  readonly centreLegWidth: number;
  /** Width of each outer leg in the drawing plane, m. */
  readonly outerLegWidth: number;
  /** Air gaps, by leg (any leg). */
  readonly gaps?: { readonly left?: LegGap; readonly centre?: LegGap; readonly right?: LegGap };
  /** Concentric windings with a leakage path, by leg (usually the centre leg). */
  readonly windings?: { readonly left?: LegWindings; readonly centre?: LegWindings; readonly right?: LegWindings };
}

/**
 * Layout of a three-leg shell core (E type): legs 'left', 'centre', 'right';
 * windows 'left' and 'right' (both `windowWidth` wide); yokes 'top' and
 * 'bottom', each split at the centre leg into 'yoke-top-left',
 * 'yoke-top-right', 'yoke-bottom-left', 'yoke-bottom-right'. Nodes
 * 'top-<leg>' and 'bottom-<leg>'; legs point up, yokes point right; a gap in
 * any leg ('gap-<leg>'), concentric windings with a leakage path on any leg.
 * `constants`: IEC 60205 parameters of the whole core as two symmetric
 * halves (gaps ignored). See docs/geometry.md for the drawing.
 *
 * Throws `InputError` with the codes listed at {@link uCoreLayout}.
 *
 * @example
 * ```ts
 * const layout = eCoreLayout({
 *   centreLegWidth: mm(10), outerLegWidth: mm(5), yokeHeight: mm(5), depth: mm(10),
 *   windowWidth: mm(7.5), windowHeight: mm(20),
 *   gaps: { centre: { length: mm(0.5) } },
 * });
 * const gap = layout.paths.find((p) => p.name === 'gap-centre');
 * ```
 */
export function eCoreLayout(input: ECoreInput): CoreLayout {
  return rowLayout({
    shape: 'e-core',
    owner: 'eCoreLayout',
    legs: [
      { name: 'left', width: input.outerLegWidth, widthName: 'outerLegWidth', windable: true },
      { name: 'centre', width: input.centreLegWidth, widthName: 'centreLegWidth', windable: true },
      { name: 'right', width: input.outerLegWidth, widthName: 'outerLegWidth', windable: true },
    ],
    windows: [
      { name: 'left', width: input.windowWidth, widthName: 'windowWidth' },
      { name: 'right', width: input.windowWidth, widthName: 'windowWidth' },
    ],
    dimensions: input,
    ...(input.gaps !== undefined ? { gaps: input.gaps } : {}),
    ...(input.windings !== undefined ? { windings: input.windings } : {}),
    constants: 'symmetric-halves',
  });
}
