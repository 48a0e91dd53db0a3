/**
 * Typed handles returned by the network builder. A handle is a small frozen
 * object: its `kind` makes the handle types incompatible with each other (a
 * magnetic node cannot be passed where an electric node is expected), its
 * `index` locates the element in the network description, and `network`
 * ties it to the builder that made it (checked at run time).
 */

/**
 * Fields shared by every handle.
 *
 * @example
 * ```ts
 * const leg = net.fluxTube('leg', options);
 * console.log(leg.name, leg.kind); // 'leg' 'flux-tube'
 * ```
 */
export interface HandleBase {
  /** Name given by the user (unique per kind family in a network); used in messages and exports. */
  readonly name: string;
  /** Position in the description's list for this family. */
  readonly index: number;
  /** Identity of the network that created the handle. */
  readonly network: number;
}

/**
 * An electric node. `net.ground` is the reference node (potential 0).
 *
 * @example
 * ```ts
 * const a = net.node('a');
 * ```
 */
export interface ElectricNode extends HandleBase {
  readonly kind: 'electric-node';
}

/**
 * A magnetic node: a junction where flux tubes meet. Flux is conserved at
 * every magnetic node by construction.
 *
 * @example
 * ```ts
 * const top = net.magneticNode('top yoke');
 * ```
 */
export interface MagneticNode extends HandleBase {
  readonly kind: 'magnetic-node';
}

/**
 * A flux tube: a leg, yoke, air gap or leakage path between two magnetic
 * nodes. Its positive flux runs from `from` to `to`.
 *
 * @example
 * ```ts
 * const leg = net.fluxTube('leg', { from: top, to: bottom, length: 0.1, area: 4e-4, material });
 * ```
 */
export interface FluxTube extends HandleBase {
  readonly kind: 'flux-tube';
}

/**
 * A winding of N turns around a flux tube, with two electric terminals.
 *
 * @example
 * ```ts
 * const w = net.winding('primary', { tube: leg, turns: 200, resistance: 0.8, plus: a, minus: net.ground });
 * ```
 */
export interface Winding extends HandleBase {
  readonly kind: 'winding';
}

/** A linear resistor. @example `const r = net.resistor('load', a, net.ground, 10);` */
export interface Resistor extends HandleBase {
  readonly kind: 'resistor';
}

/** A linear capacitor. @example `const c = net.capacitor('snubber', a, b, 1e-6);` */
export interface Capacitor extends HandleBase {
  readonly kind: 'capacitor';
}

/** A linear inductor. @example `const l = net.inductor('choke', a, b, 1e-3);` */
export interface Inductor extends HandleBase {
  readonly kind: 'inductor';
}

/** An ideal voltage source. @example `const v = net.voltageSource('mains', a, net.ground, sine({ amplitude: 325, frequency: 50 }));` */
export interface VoltageSource extends HandleBase {
  readonly kind: 'voltage-source';
}

/** An ideal current source. @example `const i = net.currentSource('bias', a, net.ground, constant(2));` */
export interface CurrentSource extends HandleBase {
  readonly kind: 'current-source';
}

/** A switch: a resistance that changes between on and off values at scheduled times. @example `const s = net.switch('breaker', a, b, { schedule: [{ time: 0.01, closed: true }] });` */
export interface Switch extends HandleBase {
  readonly kind: 'switch';
}

/** A diode from anode (plus) to cathode (minus). @example `const d = net.diode('D1', a, out, { forwardVoltage: 0.7, onResistance: 0.01 });` */
export interface Diode extends HandleBase {
  readonly kind: 'diode';
}

/**
 * Any element with two electric terminals; current, voltage and power are read through these.
 *
 * @example
 * ```ts
 * const elements: TwoTerminal[] = [primary, load, supply];
 * for (const e of elements) console.log(e.name, Math.max(...result.current(e)));
 * ```
 */
export type TwoTerminal = Resistor | Capacitor | Inductor | VoltageSource | CurrentSource | Switch | Diode | Winding;

/**
 * A voltage or current source.
 *
 * @example
 * ```ts
 * const sources: Source[] = [net.voltageSource('mains', a, net.ground, sine({ amplitude: 325, frequency: 50 }))];
 * ```
 */
export type Source = VoltageSource | CurrentSource;

/**
 * Every kind of handle.
 *
 * @example
 * ```ts
 * const label = (h: AnyHandle) => `${h.kind} "${h.name}"`;
 * ```
 */
export type AnyHandle = ElectricNode | MagneticNode | FluxTube | TwoTerminal;
