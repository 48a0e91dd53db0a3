import type { CoreConstants, CoreSection } from './core-constants.js';
import type { FringingModel } from './fringing-factor.js';

/**
 * The shapes the layout builders produce.
 *
 * @example
 * ```ts
 * if (layout.shape === 'e-core') console.log(layout.constants?.effectiveArea);
 * ```
 */
export type CoreShape = 'toroid' | 'u-core' | 'e-core' | 'three-limb' | 'five-limb';

/**
 * How mean path lengths were taken (see docs/geometry.md):
 * - `'iec-60205'`: straight parts plus, at each corner, the mean circular path
 *   joining the centres of area of the two sections, length pi (p + q)/4 with
 *   the mean of the two areas, half given to each adjacent path;
 * - `'centre-line'`: sharp corners; legs run between yoke centre-lines and
 *   yokes between leg centre-lines;
 * - `'ring'`: the toroid's exact ring integral.
 *
 * @example
 * ```ts
 * eCoreLayout({ ...dimensions, meanPath: 'centre-line' }).meanPath; // 'centre-line'
 * ```
 */
export type MeanPathConvention = 'iec-60205' | 'centre-line' | 'ring';

/**
 * The leg, yoke or ring a path belongs to.
 *
 * @example
 * ```ts
 * const centreLegPaths = layout.paths.filter((p) => p.member.kind === 'leg' && p.member.name === 'centre');
 * ```
 */
export interface LayoutMember {
  readonly kind: 'leg' | 'yoke' | 'ring';
  /** Leg name ('left', 'centre', 'a'...), yoke name ('top', 'bottom') or 'ring'. */
  readonly name: string;
}

interface LayoutPathBase {
  /** Unique within the layout; use it as the network element name (with a prefix if you add several cores). */
  readonly name: string;
  /** Magnetic node the positive flux leaves. Legs point from the bottom yoke to the top yoke, yokes from left to right. */
  readonly from: string;
  /** Magnetic node the positive flux enters. */
  readonly to: string;
  /** Leg, yoke or ring the path belongs to. */
  readonly member: LayoutMember;
}

/**
 * A piece of core material: give it to `net.fluxTube` with the core's material.
 *
 * @example
 * ```ts
 * for (const p of layout.paths) if (p.kind === 'core') console.log(p.name, p.length, p.area);
 * ```
 */
export interface LayoutCorePath extends LayoutPathBase {
  readonly kind: 'core';
  /**
   * Mean length, m: the effective length le = C1^2/C2 of `sections` (their
   * plain sum when all have the same area). With `area` it gives exactly the
   * sections' reluctance l/(mu A) for a linear material.
   */
  readonly length: number;
  /** Cross-section, m^2: the effective area Ae = C1/C2 of `sections` (iron area, stacking factor applied). */
  readonly area: number;
  /** The pieces the path was computed from (straight parts, corner shares), for checks and reports. */
  readonly sections: readonly CoreSection[];
}

/**
 * An air gap: give it to `net.airGap` (reluctance length / (mu0 area)).
 *
 * @example
 * ```ts
 * const gap = layout.paths.find((p): p is LayoutGapPath => p.kind === 'gap');
 * gap?.fringingFactor; // e.g. 1.22
 * ```
 */
export interface LayoutGapPath extends LayoutPathBase {
  readonly kind: 'gap';
  /** Gap length l_g, m. */
  readonly length: number;
  /** Effective gap area A_g F, m^2: fringing already applied, so R_g = length / (mu0 area). */
  readonly area: number;
  /** Geometric area of the gap face A_g, m^2. */
  readonly faceArea: number;
  /** Fringing factor F >= 1 used (1 when fringing is off). */
  readonly fringingFactor: number;
  /** Which fringing formula gave F. */
  readonly fringing: FringingModel['kind'];
}

/**
 * A leakage path of constant reluctance: give it to `net.reluctance`.
 *
 * @example
 * ```ts
 * const leak = layout.paths.find((p): p is LayoutLeakagePath => p.kind === 'leakage');
 * const leakageInductance = leak ? 40 ** 2 / leak.reluctance : 0; // H, 40 turns
 * ```
 */
export interface LayoutLeakagePath extends LayoutPathBase {
  readonly kind: 'leakage';
  /** Reluctance, A/Wb (1/H); see {@link concentricLeakageReluctance}. */
  readonly reluctance: number;
}

/**
 * The zero-sequence return path of a three-phase core-type core: flux that
 * the limbs carry in phase (zero sequence, or a DC bias common to the three
 * phases) has no iron return in a three-limb core and closes from the top
 * yoke to the bottom yoke through the oil, the tank wall and the clamps.
 * One such path beside each phase limb, between its top and bottom nodes, as
 * a constant reluctance; the limbs' paths in parallel make the total
 * reluctance the layout was given. See docs/geometry.md for the value.
 *
 * @example
 * ```ts
 * const tank = layout.paths.filter((p): p is LayoutTankPath => p.kind === 'tank'); // 'tank-a', 'tank-b', 'tank-c'
 * ```
 */
export interface LayoutTankPath extends LayoutPathBase {
  readonly kind: 'tank';
  /** Reluctance of this limb's share, A/Wb. */
  readonly reluctance: number;
}

/**
 * One path of a layout: core material, air gap, leakage, or the tank return.
 *
 * @example
 * ```ts
 * const r = layout.paths.map((p) => pathReluctance(p, 2000)); // A/Wb, linear estimate
 * ```
 */
export type LayoutPath = LayoutCorePath | LayoutGapPath | LayoutLeakagePath | LayoutTankPath;

/**
 * The windings geometry a leg was given, with defaults resolved.
 *
 * @example
 * ```ts
 * layout.legs.find((l) => l.name === 'centre')?.windings?.meanTurnLength; // m
 * ```
 */
export interface LayoutWindings {
  readonly innerBuild: number;
  readonly outerBuild: number;
  readonly spacing: number;
  /** Radial clearance from the leg surface to the inner winding (bobbin, insulation), m. */
  readonly clearance: number;
  readonly height: number;
  readonly meanTurnLength: number;
}

/**
 * A leg (or the ring of a toroid): where windings sit and which paths make it up.
 *
 * @example
 * ```ts
 * const centre = layout.legs.find((l) => l.name === 'centre');
 * // primary on centre?.windingPath, secondary on centre?.outerWindingPath
 * ```
 */
export interface LayoutLeg {
  readonly name: string;
  /** The leg's paths in order from its bottom junction to its top junction (leakage path last). */
  readonly paths: readonly string[];
  /** Core path to put a winding on; with `windings` modelled, the INNER winding's path. */
  readonly windingPath: string;
  /** Core path for the OUTER winding when `windings` are modelled; equals `windingPath` otherwise. */
  readonly outerWindingPath: string;
  /** The leg's air gap, if any. */
  readonly gapPath?: string;
  /** The leakage path between the inner and outer windings, if modelled. */
  readonly leakagePath?: string;
  /** Windings geometry behind the leakage path, if modelled. */
  readonly windings?: LayoutWindings;
  /** Width of the leg in the drawing plane, m (ring: r2 - r1). */
  readonly width: number;
  /** Iron cross-section, m^2 (ring: effective area). */
  readonly area: number;
}

/**
 * A winding window.
 *
 * @example
 * ```ts
 * const fill = copperArea / (layout.windows[0]?.area ?? 1); // window fill factor
 * ```
 */
export interface LayoutWindow {
  readonly name: string;
  /** Width between the legs, m (toroid: inner diameter). */
  readonly width: number;
  /** Height between the yokes, m (toroid: inner diameter). */
  readonly height: number;
  /** Area, m^2 (toroid: pi r1^2). */
  readonly area: number;
  /** Legs bordering the window. */
  readonly legs: readonly string[];
}

/**
 * Plain-data, frozen, JSON-serialisable description of a core as a magnetic
 * network: named nodes and named paths between them. Built by the shape
 * functions ({@link toroidLayout}, {@link uCoreLayout}, {@link eCoreLayout},
 * {@link threeLimbLayout}, {@link fiveLimbLayout}); it does not touch a network.
 *
 * Structure guaranteed by every builder (and tested): node names unique, path
 * names unique, every path's `from` and `to` are listed nodes, the graph is
 * connected and every node has at least two paths.
 *
 * Adding a layout to a network is one loop (the adapter; `net` is the
 * network builder):
 *
 * @example
 * ```ts
 * const layout = eCoreLayout({ ... });
 * const node = new Map(layout.nodes.map((n) => [n, net.magneticNode(n)]));
 * const tube = new Map<string, FluxTube>();
 * for (const p of layout.paths) {
 *   const ends = { from: node.get(p.from)!, to: node.get(p.to)! };
 *   tube.set(p.name,
 *     p.kind === 'core' ? net.fluxTube(p.name, { ...ends, length: p.length, area: p.area, material })
 *     : p.kind === 'gap' ? net.airGap(p.name, { ...ends, length: p.length, area: p.area })
 *     : net.reluctance(p.name, { ...ends, reluctance: p.reluctance }));
 * }
 * // windings go on tube.get(leg.windingPath) (inner) and tube.get(leg.outerWindingPath) (outer)
 * ```
 */
export interface CoreLayout {
  readonly shape: CoreShape;
  /** How mean path lengths were taken. */
  readonly meanPath: MeanPathConvention;
  /** Magnetic node names. */
  readonly nodes: readonly string[];
  /** Paths (flux tubes, gaps, leakage reluctances). */
  readonly paths: readonly LayoutPath[];
  /** Every leg (a toroid has one, 'ring'). */
  readonly legs: readonly LayoutLeg[];
  /** Names of the legs where windings can sit. */
  readonly windingLegs: readonly string[];
  /** Winding windows. */
  readonly windows: readonly LayoutWindow[];
  /**
   * IEC 60205 effective parameters of the core material as a whole, gaps
   * ignored (legs full length), where the standard defines them: toroid,
   * U core, E core (two symmetric halves). Absent for three- and five-limb
   * cores, which have no single magnetic path.
   */
  readonly constants?: CoreConstants;
}
