import { InputError } from '../errors.js';
import { deepFreeze, requirePositive } from './checks.js';
import type { CoreLayout, LayoutMember, LayoutPath } from './core-layout.js';
import type { FringingModel } from './fringing-factor.js';
import { gapReluctance } from './gap-reluctance.js';
import { checkToroid, ringConstants, type ToroidDimensions } from './toroid-constants.js';

/**
 * Input of {@link toroidLayout}: ring dimensions plus an optional radial gap.
 *
 * @example
 * ```ts
 * const input: ToroidInput = {
 *   innerRadius: mm(10), outerRadius: mm(20), height: mm(10), gap: { length: mm(0.5), fringing: 'matsch' },
 * };
 * ```
 */
export interface ToroidInput extends ToroidDimensions {
  /**
   * A radial slot with parallel faces, `length` wide (m, at most the inner
   * radius). Fringing: `'none'` (default), `'matsch'` (face (r2 - r1) x h),
   * or a factor F >= 1 of your own. McLyman's factor needs a window height,
   * which a ring lacks.
   */
  readonly gap?: { readonly length: number; readonly fringing?: 'none' | 'matsch' | number };
}

/**
 * Layout of a ring core (toroid) of rectangular section. The ring is two
 * equal halves 'ring-1' (n1 -> n2) and 'ring-2' (n2 -> n1); with a gap,
 * 'ring-2' ends at 'n3' and the gap 'gap' closes the loop (n3 -> n1).
 * Each half has the ring's effective area and half its effective length
 * (closed forms of {@link toroidConstants}; with a gap, the slotted-ring forms
 * with iron length 2 pi r - l_g at radius r). Windings go on 'ring-1'.
 * `constants`: the ungapped ring.
 *
 * Throws `InputError`: `invalid-dimension`, `radii-out-of-order`,
 * `invalid-stacking-factor`, `gap-longer-than-inner-radius`,
 * `gap-too-long-for-fringing`, `invalid-fringing-factor`, `invalid-option`.
 *
 * @example
 * ```ts
 * const layout = toroidLayout({
 *   innerRadius: mm(12), outerRadius: mm(20), height: mm(12), gap: { length: mm(1) },
 * });
 * layout.paths.map((p) => p.name); // ['ring-1', 'ring-2', 'gap']
 * ```
 */
export function toroidLayout(input: ToroidInput): CoreLayout {
  const owner = 'toroidLayout';
  const d = checkToroid(input, owner);
  let g = 0;
  if (input.gap !== undefined) {
    g = requirePositive(input.gap.length, 'gap.length', owner);
    if (g > d.innerRadius) {
      throw new InputError(
        'gap-longer-than-inner-radius',
        `${owner}: gap.length ${g} m exceeds innerRadius ${d.innerRadius} m; the slotted-ring model needs a gap short against the ring; shorten the gap`,
        ['gap.length', 'innerRadius'],
      );
    }
  }
  const iron = ringConstants(d, g);
  const member: LayoutMember = { kind: 'ring', name: 'ring' };
  const half = { length: iron.effectiveLength / 2, area: iron.effectiveArea };
  const sections = [{ ...half, label: 'half ring' }];
  const paths: LayoutPath[] = [
    { kind: 'core', name: 'ring-1', from: 'n1', to: 'n2', member, ...half, sections },
    { kind: 'core', name: 'ring-2', from: 'n2', to: g > 0 ? 'n3' : 'n1', member, ...half, sections },
  ];
  const nodes = g > 0 ? ['n1', 'n2', 'n3'] : ['n1', 'n2'];
  if (input.gap !== undefined) {
    const width = d.outerRadius - d.innerRadius;
    const faceArea = width * d.height;
    const f = input.gap.fringing ?? 'none';
    const model: FringingModel =
      typeof f === 'number'
        ? { kind: 'factor', value: f }
        : f === 'matsch'
          ? { kind: 'matsch', width, depth: d.height }
          : f === 'none'
            ? { kind: 'none' }
            : ({ kind: f } as unknown as FringingModel);
    if (model.kind === 'mclyman') {
      throw new InputError(
        'invalid-option',
        `${owner}: gap.fringing 'mclyman' needs a window height, which a ring core lacks; use 'matsch', 'none' or a factor`,
        ['gap.fringing'],
      );
    }
    const r = gapReluctance({ length: g, area: faceArea, fringing: model }, `${owner} gap`);
    paths.push({
      kind: 'gap',
      name: 'gap',
      from: 'n3',
      to: 'n1',
      member,
      length: g,
      area: r.effectiveArea,
      faceArea,
      fringingFactor: r.fringingFactor,
      fringing: model.kind,
    });
  }
  const layout: CoreLayout = {
    shape: 'toroid',
    meanPath: 'ring',
    nodes,
    paths,
    legs: [
      {
        name: 'ring',
        paths: paths.map((p) => p.name),
        windingPath: 'ring-1',
        outerWindingPath: 'ring-1',
        ...(g > 0 ? { gapPath: 'gap' } : {}),
        width: d.outerRadius - d.innerRadius,
        area: iron.effectiveArea,
      },
    ],
    windingLegs: ['ring'],
    windows: [
      { name: 'hole', width: 2 * d.innerRadius, height: 2 * d.innerRadius, area: Math.PI * d.innerRadius ** 2, legs: ['ring'] },
    ],
    constants: ringConstants(d, 0),
  };
  return deepFreeze(layout);
}
