import { InputError } from '../errors.js';
import { compensatedSum, deepFreeze, requireNonNegative, requirePositive, stackingFactorOf } from './checks.js';
import { coreConstants, type CoreSection } from './core-constants.js';
import type {
  CoreLayout,
  CoreShape,
  LayoutLeg,
  LayoutMember,
  LayoutPath,
  LayoutWindings,
  LayoutWindow,
} from './core-layout.js';
import type { FringingModel } from './fringing-factor.js';
import { gapReluctance } from './gap-reluctance.js';
import { concentricLeakageReluctance } from './leakage-reluctance.js';

// Shared builder for the rectangular shapes: a row of legs standing between a
// top and a bottom yoke, with a window between each pair of neighbouring legs.
// The U core is a row of 2 legs, the E core and the three-limb core rows of 3,
// the five-limb core a row of 5.

/**
 * Fringing of a leg's gap: `'mclyman'` (default; G = window height, A_c = the
 * leg's face area), `'matsch'` (face = leg width x depth), `'none'`, or a
 * factor F >= 1 of your own.
 *
 * @example
 * ```ts
 * eCoreLayout({ ...dimensions, gaps: { centre: { length: mm(0.5), fringing: 1.15 } } });
 * ```
 */
export type LegGapFringing = 'none' | 'mclyman' | 'matsch' | number;

/**
 * An air gap cut across a leg.
 *
 * @example
 * ```ts
 * const gap: LegGap = { length: mm(0.5), fringing: 'matsch' };
 * ```
 */
export interface LegGap {
  /** Gap length, m (> 0, shorter than the window height). */
  readonly length: number;
  /** Fringing correction; default `'mclyman'`. */
  readonly fringing?: LegGapFringing;
}

/**
 * Two concentric windings on a leg (inner next to the leg). Giving them makes
 * the builder split the leg and add a leakage path between the windings
 * ({@link concentricLeakageReluctance}).
 *
 * @example
 * ```ts
 * const lvInsideHv: LegWindings = { innerBuild: mm(15), outerBuild: mm(20), spacing: mm(8), clearance: mm(4) };
 * ```
 */
export interface LegWindings {
  /** Radial build a1 of the inner winding, m (> 0). */
  readonly innerBuild: number;
  /** Radial build a2 of the outer winding, m (> 0). */
  readonly outerBuild: number;
  /** Radial spacing d between the windings, m (>= 0). */
  readonly spacing: number;
  /** Radial clearance from the leg to the inner winding (bobbin, insulation), m (>= 0); default 0. */
  readonly clearance?: number;
  /** Winding height h_w, m; default the window height. */
  readonly height?: number;
  /**
   * Mean length of turn, m. Default: the turn around the leg's rectangular
   * section with rounded corners at the middle of the winding pack,
   * 2 (w + D) + 2 pi (clearance + (a1 + d + a2)/2) (w leg width, D depth).
   */
  readonly meanTurnLength?: number;
}

/**
 * Dimensions shared by the rectangular cores (SI units).
 *
 * @example
 * ```ts
 * const d: RectangularCoreDimensions = {
 *   windowWidth: mm(14), windowHeight: mm(30), yokeHeight: mm(9), depth: mm(15), meanPath: 'centre-line',
 * };
 * ```
 */
export interface RectangularCoreDimensions {
  /** Clear width of each window between legs, m. */
  readonly windowWidth: number;
  /** Clear height of the windows between the yokes, m. */
  readonly windowHeight: number;
  /** Height of the top and bottom yokes (their extent across the flux, in the drawing plane), m. */
  readonly yokeHeight: number;
  /** Depth of the core perpendicular to the drawing plane (stack height), m. */
  readonly depth: number;
  /** Iron fraction of laminated sections, (0, 1]; default 1. Gap faces and windows use the full geometry. */
  readonly stackingFactor?: number;
  /** Mean-path convention; default `'iec-60205'` (see {@link MeanPathConvention}). */
  readonly meanPath?: 'iec-60205' | 'centre-line';
}

/**
 * Internal description of a row of legs.
 *
 * @internal
 * @example
 * ```ts
 * rowLayout({ shape: 'u-core', owner: 'uCoreLayout', legs, windows, dimensions, constants: 'loop' });
 * ```
 */
export interface RowSpec {
  readonly shape: Exclude<CoreShape, 'toroid'>;
  readonly owner: string;
  readonly legs: readonly { readonly name: string; readonly width: number; readonly widthName: string; readonly windable: boolean }[];
  readonly windows: readonly { readonly name: string; readonly width: number; readonly widthName: string }[];
  readonly dimensions: RectangularCoreDimensions;
  readonly gaps?: Readonly<Record<string, LegGap | undefined>>;
  readonly windings?: Readonly<Record<string, LegWindings | undefined>>;
  /** How the core constants are formed: one loop (U), two symmetric halves (E), or none. */
  readonly constants: 'loop' | 'symmetric-halves' | 'none';
}

interface EndShares {
  /** Sections at each end of the leg (same at top and bottom). */
  readonly leg: readonly CoreSection[];
  /** Sections the yoke gets at the junction with this leg. */
  readonly yoke: readonly CoreSection[];
}

/**
 * One tube for a chain of sections: the plain sum of lengths when every area
 * is the same (exact, no rounding noise), else the IEC 60205 effective length
 * and area, which keep the chain's C1 (its linear reluctance) exactly.
 */
function lengthAndArea(sections: readonly CoreSection[]): { length: number; area: number } {
  const first = sections[0];
  if (first !== undefined && sections.every((s) => s.area === first.area)) {
    return { length: compensatedSum(sections.map((s) => s.length)), area: first.area };
  }
  const k = coreConstants(sections);
  return { length: k.effectiveLength, area: k.effectiveArea };
}

function check(spec: RowSpec): void {
  const { owner, dimensions: d } = spec;
  requirePositive(d.windowWidth, 'windowWidth', owner);
  requirePositive(d.windowHeight, 'windowHeight', owner);
  requirePositive(d.yokeHeight, 'yokeHeight', owner);
  requirePositive(d.depth, 'depth', owner);
  for (const leg of spec.legs) requirePositive(leg.width, leg.widthName, owner);
  for (const w of spec.windows) requirePositive(w.width, w.widthName, owner);
  const meanPath = d.meanPath ?? 'iec-60205';
  if (meanPath !== 'iec-60205' && meanPath !== 'centre-line') {
    throw new InputError('invalid-option', `${owner}: meanPath '${String(meanPath)}' is unknown; use 'iec-60205' or 'centre-line'`, ['meanPath']);
  }
  const legNames = spec.legs.map((l) => l.name);
  for (const key of Object.keys(spec.gaps ?? {})) {
    if (!legNames.includes(key)) {
      throw new InputError('unknown-leg', `${owner}: gaps.${key}: this core has no leg '${key}'; legs are ${legNames.join(', ')}`, [`gaps.${key}`]);
    }
  }
  for (const key of Object.keys(spec.windings ?? {})) {
    const leg = spec.legs.find((l) => l.name === key);
    if (leg === undefined || !leg.windable) {
      const windable = spec.legs.filter((l) => l.windable).map((l) => l.name);
      throw new InputError(
        'unknown-leg',
        `${owner}: windings.${key}: '${key}' is not a leg that carries windings here; use one of ${windable.join(', ')}`,
        [`windings.${key}`],
      );
    }
  }
}

/**
 * Build the layout of a row of legs. Exported for the shape functions only
 * (not part of the public API).
 *
 * @internal
 * @example
 * ```ts
 * rowLayout({ shape: 'u-core', owner: 'uCoreLayout', legs, windows, dimensions, constants: 'loop' });
 * ```
 */
export function rowLayout(spec: RowSpec): CoreLayout {
  check(spec);
  const { owner, dimensions: d } = spec;
  const k = stackingFactorOf(d.stackingFactor, owner);
  const meanPath = d.meanPath ?? 'iec-60205';
  const h = d.windowHeight;
  const b = d.yokeHeight;
  const depth = d.depth;
  const yokeArea = k * b * depth;
  const n = spec.legs.length;
  const singleWindow = spec.windows.length === 1;

  // Corner or junction shares at each end of every leg (same at top and bottom).
  const shares: EndShares[] = spec.legs.map((leg, i) => {
    const legArea = k * leg.width * depth;
    if (meanPath === 'centre-line') {
      return {
        leg: [{ length: b / 2, area: legArea, label: 'junction' }],
        yoke: [{ length: leg.width / 2, area: yokeArea, label: 'junction' }],
      };
    }
    // IEC 60205 corner: mean circular path (radius the mean of p and q) around
    // the window corner, joining the centres of area; area the mean of the two.
    const endLeg = i === 0 || i === n - 1;
    // A leg between two windows turns both ways: treat each half of it as
    // turning its own corner (the symmetric-halves treatment of an E core).
    const turning = endLeg ? legArea : legArea / 2;
    const p = endLeg ? leg.width / 2 : leg.width / 4;
    const q = b / 2;
    const cornerLength = (Math.PI * (p + q)) / 4;
    const cornerArea = (turning + yokeArea) / 2;
    return {
      leg: [{ length: cornerLength / 2, area: endLeg ? cornerArea : 2 * cornerArea, label: 'corner' }],
      yoke: [{ length: cornerLength / 2, area: cornerArea, label: 'corner' }],
    };
  });

  const nodes: string[] = [];
  const paths: LayoutPath[] = [];
  const legs: LayoutLeg[] = [];
  const ungapped = new Map<string, CoreSection[]>(); // for the core constants
  for (const leg of spec.legs) nodes.push(`top-${leg.name}`);
  for (const leg of spec.legs) nodes.push(`bottom-${leg.name}`);

  // Windings: resolve and check that they fit their windows.
  const resolved = new Map<string, LayoutWindings>();
  for (const leg of spec.legs) {
    const w = spec.windings?.[leg.name];
    if (w === undefined) continue;
    const prefix = `windings.${leg.name}`;
    const innerBuild = requirePositive(w.innerBuild, `${prefix}.innerBuild`, owner);
    const outerBuild = requirePositive(w.outerBuild, `${prefix}.outerBuild`, owner);
    const spacing = requireNonNegative(w.spacing, `${prefix}.spacing`, owner);
    const clearance = w.clearance === undefined ? 0 : requireNonNegative(w.clearance, `${prefix}.clearance`, owner);
    const height = w.height === undefined ? h : requirePositive(w.height, `${prefix}.height`, owner);
    if (height > h) {
      throw new InputError(
        'winding-taller-than-window',
        `${owner}: ${prefix}.height ${height} m exceeds windowHeight ${h} m; shorten the windings or heighten the window`,
        [`${prefix}.height`, 'windowHeight'],
      );
    }
    const meanTurnLength =
      w.meanTurnLength === undefined
        ? 2 * (leg.width + depth) + 2 * Math.PI * (clearance + (innerBuild + spacing + outerBuild) / 2)
        : requirePositive(w.meanTurnLength, `${prefix}.meanTurnLength`, owner);
    resolved.set(leg.name, { innerBuild, outerBuild, spacing, clearance, height, meanTurnLength });
  }
  const build = (legName: string | undefined): number => {
    const w = legName === undefined ? undefined : resolved.get(legName);
    return w === undefined ? 0 : w.clearance + w.innerBuild + w.spacing + w.outerBuild;
  };
  spec.windows.forEach((win, j) => {
    const left = spec.legs[j]?.name;
    const right = spec.legs[j + 1]?.name;
    const used = build(left) + build(right);
    if (used > win.width) {
      const culprits = [left, right].filter((x): x is string => x !== undefined && resolved.has(x));
      throw new InputError(
        'windings-exceed-window',
        `${owner}: window '${win.name}' is ${win.width} m wide but the windings on ${culprits.map((c) => `'${c}'`).join(' and ')} need ${used} m (clearance + inner build + spacing + outer build per leg); reduce the builds or widen ${win.widthName}`,
        [win.widthName, ...culprits.map((c) => `windings.${c}`)],
      );
    }
  });

  // Legs.
  spec.legs.forEach((leg, i) => {
    const legArea = k * leg.width * depth;
    const faceArea = leg.width * depth;
    const end = shares[i]?.leg ?? [];
    const member: LayoutMember = { kind: 'leg', name: leg.name };
    const bottom = `bottom-${leg.name}`;
    const top = `top-${leg.name}`;
    const straight = (length: number): CoreSection[] => (length > 0 ? [{ length, area: legArea, label: 'straight' }] : []);
    ungapped.set(`leg-${leg.name}`, [...end, ...straight(h), ...end]);

    const gap = spec.gaps?.[leg.name];
    const windings = resolved.get(leg.name);
    let g = 0;
    if (gap !== undefined) {
      g = requirePositive(gap.length, `gaps.${leg.name}.length`, owner);
      if (g >= h) {
        throw new InputError(
          'gap-longer-than-leg',
          `${owner}: gaps.${leg.name}.length ${g} m is not shorter than the leg (windowHeight ${h} m); shorten the gap`,
          [`gaps.${leg.name}.length`, 'windowHeight'],
        );
      }
      if (windings !== undefined && g >= windings.height) {
        throw new InputError(
          'gap-longer-than-winding',
          `${owner}: gaps.${leg.name}.length ${g} m is not shorter than the winding height ${windings.height} m on that leg; the gap sits inside the windings: shorten the gap or heighten windings.${leg.name}.height`,
          [`gaps.${leg.name}.length`, `windings.${leg.name}.height`],
        );
      }
    }
    const legPaths: string[] = [];
    const corePath = (name: string, from: string, to: string, sections: CoreSection[]): void => {
      paths.push({ kind: 'core', name, from, to, member, ...lengthAndArea(sections), sections });
      legPaths.push(name);
    };
    // The winding region: from `lower` to `upper`; holds the gap (if any) after the iron.
    const lower = windings === undefined ? bottom : `${leg.name}-lower`;
    const upper = windings === undefined ? top : `${leg.name}-upper`;
    const bodyEnd = gap === undefined ? upper : `${leg.name}-gap`;
    if (windings === undefined) {
      corePath(`leg-${leg.name}`, bottom, bodyEnd, [...end, ...straight(h - g), ...end]);
    } else {
      const outside = (h - windings.height) / 2;
      nodes.push(lower, upper);
      corePath(`leg-${leg.name}-foot`, bottom, lower, [...end, ...straight(outside)]);
      corePath(`leg-${leg.name}`, lower, bodyEnd, straight(windings.height - g));
    }
    if (gap !== undefined) {
      nodes.push(bodyEnd);
      const fringing = gap.fringing ?? 'mclyman';
      const model: FringingModel =
        typeof fringing === 'number'
          ? { kind: 'factor', value: fringing }
          : fringing === 'mclyman'
            ? { kind: 'mclyman', windowHeight: h, coreArea: faceArea }
            : fringing === 'matsch'
              ? { kind: 'matsch', width: leg.width, depth }
              : fringing === 'none'
                ? { kind: 'none' }
                : ({ kind: fringing } as unknown as FringingModel);
      const r = gapReluctance({ length: g, area: faceArea, fringing: model }, `${owner} gaps.${leg.name}`);
      paths.push({
        kind: 'gap',
        name: `gap-${leg.name}`,
        from: bodyEnd,
        to: upper,
        member,
        length: g,
        area: r.effectiveArea,
        faceArea,
        fringingFactor: r.fringingFactor,
        fringing: model.kind,
      });
      legPaths.push(`gap-${leg.name}`);
    }
    if (windings !== undefined) {
      corePath(`leg-${leg.name}-head`, upper, top, [...straight((h - windings.height) / 2), ...end]);
      const reluctance = concentricLeakageReluctance(windings, `${owner} windings.${leg.name}`);
      paths.push({ kind: 'leakage', name: `leakage-${leg.name}`, from: lower, to: upper, member, reluctance });
      legPaths.push(`leakage-${leg.name}`);
    }
    legs.push({
      name: leg.name,
      paths: legPaths,
      windingPath: `leg-${leg.name}`,
      outerWindingPath: windings === undefined ? `leg-${leg.name}` : `leg-${leg.name}-head`,
      ...(gap !== undefined ? { gapPath: `gap-${leg.name}` } : {}),
      ...(windings !== undefined ? { leakagePath: `leakage-${leg.name}`, windings } : {}),
      width: leg.width,
      area: legArea,
    });
  });

  // Yokes: one path per window, top and bottom, pointing left to right.
  const windows: LayoutWindow[] = [];
  for (const yoke of ['top', 'bottom'] as const) {
    spec.windows.forEach((win, j) => {
      const left = spec.legs[j];
      const right = spec.legs[j + 1];
      if (left === undefined || right === undefined) return;
      const name = singleWindow ? `yoke-${yoke}` : `yoke-${yoke}-${win.name}`;
      const sections: CoreSection[] = [
        ...(shares[j]?.yoke ?? []),
        { length: win.width, area: yokeArea, label: 'straight' },
        ...(shares[j + 1]?.yoke ?? []),
      ];
      ungapped.set(name, sections);
      paths.push({
        kind: 'core',
        name,
        from: `${yoke}-${left.name}`,
        to: `${yoke}-${right.name}`,
        member: { kind: 'yoke', name: yoke },
        ...lengthAndArea(sections),
        sections,
      });
      if (yoke === 'top') {
        windows.push({ name: win.name, width: win.width, height: h, area: win.width * h, legs: [left.name, right.name] });
      }
    });
  }

  const layout: CoreLayout = {
    shape: spec.shape,
    meanPath,
    nodes,
    paths,
    legs,
    windingLegs: spec.legs.filter((l) => l.windable).map((l) => l.name),
    windows,
  };
  const constants = layoutConstants(spec, ungapped);
  return deepFreeze(constants === undefined ? layout : { ...layout, constants });
}

/**
 * IEC 60205 effective parameters of the ungapped core: a U core is one loop;
 * an E core is two symmetric halves in parallel, so its centre leg counts
 * once and each outer-loop part (outer leg, half yokes) counts with both
 * halves' area (C1 = sum l/A over the centre leg + sum l/(2A) over one outer loop).
 */
function layoutConstants(spec: RowSpec, ungapped: Map<string, CoreSection[]>) {
  const get = (name: string): CoreSection[] => ungapped.get(name) ?? [];
  if (spec.constants === 'loop') {
    return coreConstants([...ungapped.values()].flat());
  }
  if (spec.constants === 'symmetric-halves') {
    const [left, centre] = spec.legs;
    const [win] = spec.windows;
    if (left === undefined || centre === undefined || win === undefined) return undefined;
    const outer = [...get(`leg-${left.name}`), ...get(`yoke-top-${win.name}`), ...get(`yoke-bottom-${win.name}`)];
    return coreConstants([...get(`leg-${centre.name}`), ...outer.map((s) => ({ ...s, area: 2 * s.area }))]);
  }
  return undefined;
}
