import { InputError } from '../errors.js';
import type { CoreLayout } from '../geometry/core-layout.js';
import type { MaterialLaw } from '../materials/material-law.js';
import type { MaterialSpec } from '../materials/material-spec.js';
import type { FluxTube, MagneticNode } from './handles.js';
import type { NetworkBuilder } from './network-builder.js';

/**
 * Options of {@link addCoreLayout}.
 *
 * @example
 * ```ts
 * const options: AddCoreLayoutOptions = { material: demoMaterials.grainOrientedSteel, prefix: 'T1 ', initialFluxDensity: { left: 0.8 } };
 * ```
 */
export interface AddCoreLayoutOptions {
  /** Material of every core path (gaps are air, leakage paths are constant reluctances). */
  readonly material: MaterialSpec | MaterialLaw;
  /** Prefix for node and tube names, so that one network can hold several cores. Default ''. */
  readonly prefix?: string;
  /**
   * Initial flux density (for example remanence) per leg name, T, set on the
   * path where the leg's inner winding sits; the rest of the core follows by
   * flux conservation.
   */
  readonly initialFluxDensity?: Readonly<Record<string, number>>;
  /** Eddy-current resistance per leg name, ohm, on the leg's inner-winding path (see `fluxTube`). */
  readonly eddyResistance?: Readonly<Record<string, number>>;
}

/**
 * Handles of a core added by {@link addCoreLayout}.
 *
 * @example
 * ```ts
 * const core: CoreHandles = addCoreLayout(net, layout, { material: demoMaterials.ferrite });
 * const primaryTube = core.windingTube('centre');
 * const yoke = core.tubes.get('yoke-top-left');
 * const topNode = core.nodes.get('top-centre');
 * ```
 */
export interface CoreHandles {
  /** The layout the core was built from. */
  readonly layout: CoreLayout;
  /** Magnetic nodes by layout node name. */
  readonly nodes: ReadonlyMap<string, MagneticNode>;
  /** Flux tubes by layout path name. */
  readonly tubes: ReadonlyMap<string, FluxTube>;
  /** Tube of a leg where its inner winding goes. */
  windingTube(leg: string): FluxTube;
  /** Tube of a leg where its outer winding goes (beyond the leakage path). */
  outerWindingTube(leg: string): FluxTube;
  /** The core tubes of a leg, bottom to top (gaps and leakage excluded). */
  legTubes(leg: string): FluxTube[];
}

/**
 * Add a core layout from the geometry helpers (`eCoreLayout`,
 * `threeLimbLayout`, ...) to a network: one magnetic node per layout node,
 * one flux tube per core path, an air gap per gap path (its area already
 * includes fringing), a constant reluctance per leakage path.
 *
 * @example
 * ```ts
 * const layout = uCoreLayout({ legWidth: mm(40), yokeHeight: mm(40), depth: mm(50), windowWidth: mm(45), windowHeight: mm(110) });
 * const core = addCoreLayout(net, layout, { material: demoMaterials.grainOrientedSteel, initialFluxDensity: { left: 0.8 } });
 * net.winding('primary', { tube: core.windingTube('left'), turns: 500, resistance: 1, plus: a, minus: net.ground });
 * ```
 */
export function addCoreLayout(net: NetworkBuilder, layout: CoreLayout, options: AddCoreLayoutOptions): CoreHandles {
  const prefix = options.prefix ?? '';
  const legNames = layout.legs.map((l) => l.name);
  const findLeg = (name: string, what: string) => {
    const leg = layout.legs.find((l) => l.name === name);
    if (!leg) {
      throw new InputError(
        'unknown-leg',
        `${what}: the ${layout.shape} layout has no leg "${name}"; its legs are ${legNames.map((n) => `"${n}"`).join(', ')}`,
        [name],
      );
    }
    return leg;
  };
  const remanence = new Map<string, number>();
  for (const [leg, b] of Object.entries(options.initialFluxDensity ?? {})) remanence.set(findLeg(leg, 'initialFluxDensity').windingPath, b);
  const eddy = new Map<string, number>();
  for (const [leg, r] of Object.entries(options.eddyResistance ?? {})) eddy.set(findLeg(leg, 'eddyResistance').windingPath, r);

  const nodes = new Map(layout.nodes.map((n) => [n, net.magneticNode(prefix + n)] as const));
  const tubes = new Map<string, FluxTube>();
  for (const p of layout.paths) {
    const ends = { from: nodes.get(p.from)!, to: nodes.get(p.to)! };
    const name = prefix + p.name;
    const b0 = remanence.get(p.name);
    const re = eddy.get(p.name);
    const tube =
      p.kind === 'core'
        ? net.fluxTube(name, {
            ...ends, length: p.length, area: p.area, material: options.material,
            ...(b0 !== undefined ? { initialFluxDensity: b0 } : {}),
            ...(re !== undefined ? { eddyResistance: re } : {}),
          })
        : p.kind === 'gap'
          ? net.airGap(name, { ...ends, length: p.length, area: p.area })
          : net.reluctance(name, { ...ends, reluctance: p.reluctance });
    tubes.set(p.name, tube);
  }
  return {
    layout,
    nodes,
    tubes,
    windingTube: (leg) => tubes.get(findLeg(leg, 'windingTube').windingPath)!,
    outerWindingTube: (leg) => tubes.get(findLeg(leg, 'outerWindingTube').outerWindingPath)!,
    legTubes: (leg) => {
      const l = findLeg(leg, 'legTubes');
      return l.paths.flatMap((p) => {
        const path = layout.paths.find((q) => q.name === p);
        return path && path.kind === 'core' ? [tubes.get(p)!] : [];
      });
    },
  };
}
