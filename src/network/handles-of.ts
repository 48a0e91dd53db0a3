import { InputError } from '../errors.js';
import type { ElementDescription, NetworkDescription } from './description.js';
import type { AnyHandle, ElectricNode, FluxTube, MagneticNode, TwoTerminal, Winding } from './handles.js';

/**
 * Handles of a network description, looked up by name. Returned by
 * {@link handlesOf}.
 *
 * @example
 * ```ts
 * const h = handlesOf(description);
 * const r = simulate(description, { stopTime: 0.1 });
 * const peak = Math.max(...r.current(h.winding('primary')).map(Math.abs));
 * ```
 */
export interface DescriptionHandles {
  /** Electric nodes by name (ground included). */
  readonly nodes: ReadonlyMap<string, ElectricNode>;
  /** Magnetic nodes by name. */
  readonly magneticNodes: ReadonlyMap<string, MagneticNode>;
  /** Flux tubes (legs, yokes, gaps, leakage paths) by name. */
  readonly tubes: ReadonlyMap<string, FluxTube>;
  /** Two-terminal elements and windings by name. */
  readonly elements: ReadonlyMap<string, TwoTerminal>;
  /** The electric node of this name; throws `InputError` `'unknown-name'` listing the names there are. */
  node(name: string): ElectricNode;
  /** The magnetic node of this name; throws `InputError` `'unknown-name'`. */
  magneticNode(name: string): MagneticNode;
  /** The flux tube of this name; throws `InputError` `'unknown-name'`. */
  tube(name: string): FluxTube;
  /** The two-terminal element or winding of this name; throws `InputError` `'unknown-name'`. */
  element(name: string): TwoTerminal;
  /** The element of this name, checked to be of `kind` (`'wrong-handle-kind'` otherwise). */
  element<K extends TwoTerminal['kind']>(name: string, kind: K): Extract<TwoTerminal, { kind: K }>;
  /** The winding of this name; throws `'unknown-name'` or `'wrong-handle-kind'`. */
  winding(name: string): Winding;
}

/**
 * Network identity carried by handles made from a description. No builder
 * has it (builder ids start at 1), so these handles are refused by builders,
 * while results simulated from a description accept handles of any network
 * whose names and positions match.
 */
const DESCRIPTION_NETWORK = 0;

/**
 * Rebuild typed handles from a plain-data network description, by name. A
 * worker thread or another process that received a description (as JSON)
 * reads its {@link SimulationResult} with these handles: the result of
 * `simulate(description, ...)` accepts any handle whose kind, name and
 * position match the simulated description.
 *
 * @example
 * ```ts
 * const description: NetworkDescription = JSON.parse(text);
 * const result = simulate(description, { stopTime: 0.2 });
 * const h = handlesOf(description);
 * const b = result.fluxDensity(h.tube('leg'));
 * const i = result.current(h.winding('primary'));
 * ```
 */
export function handlesOf(description: NetworkDescription): DescriptionHandles {
  const make = <H extends AnyHandle>(kind: H['kind'], name: string, index: number): H =>
    Object.freeze({ kind, name, index, network: DESCRIPTION_NETWORK }) as unknown as H;
  const nodes = new Map<string, ElectricNode>();
  description.electricNodes.forEach((n, i) => nodes.set(n.name, make<ElectricNode>('electric-node', n.name, i)));
  const magneticNodes = new Map<string, MagneticNode>();
  description.magneticNodes.forEach((n, i) => magneticNodes.set(n.name, make<MagneticNode>('magnetic-node', n.name, i)));
  const tubes = new Map<string, FluxTube>();
  description.tubes.forEach((t, i) => tubes.set(t.name, make<FluxTube>('flux-tube', t.name, i)));
  const elements = new Map<string, TwoTerminal>();
  description.elements.forEach((e: ElementDescription, i) => elements.set(e.name, make<TwoTerminal>(e.kind, e.name, i)));

  const pick = <H>(map: ReadonlyMap<string, H>, name: string, what: string): H => {
    const h = map.get(name);
    if (h === undefined) {
      const known = [...map.keys()].map((k) => `"${k}"`).join(', ') || 'none';
      throw new InputError(
        'unknown-name',
        `network "${description.name}" has no ${what} named "${name}" (${what}s: ${known}); check the name`,
        [name],
      );
    }
    return h;
  };
  function element(name: string): TwoTerminal;
  function element<K extends TwoTerminal['kind']>(name: string, kind: K): Extract<TwoTerminal, { kind: K }>;
  function element(name: string, kind?: TwoTerminal['kind']): TwoTerminal {
    const h = pick(elements, name, 'element');
    if (kind !== undefined && h.kind !== kind) {
      throw new InputError('wrong-handle-kind', `element "${name}" of network "${description.name}" is a ${h.kind}, not a ${kind}`, [name]);
    }
    return h;
  }
  return Object.freeze({
    nodes,
    magneticNodes,
    tubes,
    elements,
    node: (name: string) => pick(nodes, name, 'electric node'),
    magneticNode: (name: string) => pick(magneticNodes, name, 'magnetic node'),
    tube: (name: string) => pick(tubes, name, 'flux tube'),
    element,
    winding: (name: string) => element(name, 'winding'),
  });
}
