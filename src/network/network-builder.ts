import { InputError } from '../errors.js';
import type { MaterialSpec } from '../materials/material-spec.js';
import type { MaterialLaw } from '../materials/material-law.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';
import { elementKind, isElementKind, isTubeKind, tubeKind, ELEMENT_KINDS, TUBE_KINDS } from '../elements/registry.js';
import { toggleTimesOf } from '../elements/switch.js';
import { requireFinite, requireName, requirePositive } from './argument-checks.js';
import { clonePlain, freezePlain } from './clone-plain.js';
import type {
  ElementDescription,
  NetworkDescription,
  TubeDescription,
  TubeLaw,
} from './description.js';
import type {
  AnyHandle,
  Capacitor,
  CurrentSource,
  Diode,
  ElectricNode,
  FluxTube,
  Inductor,
  MagneticNode,
  Resistor,
  Switch,
  TwoTerminal,
  VoltageSource,
  Winding,
} from './handles.js';

/**
 * Initial condition of a flux tube: give at most one of the two. Counted
 * from the tube's `from` node to its `to` node; the initial fluxes of all
 * tubes must conserve flux at every magnetic node.
 *
 * @example
 * ```ts
 * const remanence: TubeInitialCondition = { initialFluxDensity: 0.8 }; // T
 * net.fluxTube('leg', { from: bottom, to: top, length: 0.2, area: 1e-3, material, ...remanence });
 * ```
 */
export interface TubeInitialCondition {
  /** Initial flux in Wb. */
  readonly initialFlux?: number;
  /** Initial flux density in T (for example remanence); the tube needs an area. */
  readonly initialFluxDensity?: number;
}

/**
 * Options of {@link NetworkBuilder.fluxTube}.
 *
 * @example
 * ```ts
 * const options: FluxTubeOptions = {
 *   from: bottom, to: top, length: mm(150), area: mm2(900), material: demoMaterials.grainOrientedSteel,
 *   initialFluxDensity: 0.6, eddyResistance: 5e3,
 * };
 * const leg = net.fluxTube('leg', options);
 * ```
 */
export interface FluxTubeOptions extends TubeInitialCondition {
  /** Magnetic node where positive flux enters the tube. */
  readonly from: MagneticNode;
  /** Magnetic node where positive flux leaves the tube. */
  readonly to: MagneticNode;
  /** Mean magnetic path length, m. */
  readonly length: number;
  /** Cross-section area, m^2. */
  readonly area: number;
  /** Material law as a plain-data spec (serialisable) or a live law object. */
  readonly material: MaterialSpec | MaterialLaw;
  /**
   * Eddy-current resistance R_e in ohm, seen as one shorted turn around the
   * tube: adds R_e dphi/dt to the tube's MMF drop and dissipates
   * R_e (dphi/dt)^2. Omit for no eddy loss.
   */
  readonly eddyResistance?: number;
}

/**
 * Options of {@link NetworkBuilder.airGap}.
 *
 * @example
 * ```ts
 * const gap: AirGapOptions = { from: top, to: bottom, length: mm(0.5), area: mm2(144), fringingFactor: 1.2 };
 * net.airGap('centre gap', gap);
 * ```
 */
export interface AirGapOptions extends TubeInitialCondition {
  readonly from: MagneticNode;
  readonly to: MagneticNode;
  /** Gap length, m. */
  readonly length: number;
  /** Gap cross-section area, m^2. */
  readonly area: number;
  /**
   * Fringing factor F >= 1: the effective area is F * area, so the
   * reluctance is length/(mu0 F area). Default 1 (no fringing). See the
   * geometry helpers for published fringing formulas.
   */
  readonly fringingFactor?: number;
}

/**
 * Options of {@link NetworkBuilder.reluctance}.
 *
 * @example
 * ```ts
 * const leakage: ReluctanceOptions = { from: lower, to: upper, reluctance: 1.35e8, initialFlux: 0 };
 * net.reluctance('leakage', leakage);
 * ```
 */
export interface ReluctanceOptions extends TubeInitialCondition {
  readonly from: MagneticNode;
  readonly to: MagneticNode;
  /** Constant reluctance, A/Wb (= 1/H). */
  readonly reluctance: number;
  /** Optional cross-section area, m^2, so that a flux density can be reported. */
  readonly area?: number;
}

/**
 * Options of {@link NetworkBuilder.winding}.
 *
 * @example
 * ```ts
 * // Wound against the tube's direction: positive current drives flux from `to` to `from`.
 * const options: WindingOptions = { tube: rightLeg, turns: 116, resistance: 0.15, plus: mid, minus: net.ground, orientation: -1 };
 * net.winding('secondary right', options);
 * ```
 */
export interface WindingOptions {
  /** The flux tube the winding encircles. */
  readonly tube: FluxTube;
  /** Number of turns (> 0; need not be an integer, e.g. for a scaled model). */
  readonly turns: number;
  /** DC resistance of the winding, ohm. Default 0 (ideal). */
  readonly resistance?: number;
  /** Terminal where positive current enters. */
  readonly plus: ElectricNode;
  /** Terminal where positive current leaves. */
  readonly minus: ElectricNode;
  /**
   * +1 (default): positive current drives flux in the tube's positive
   * direction (from its `from` node to its `to` node); -1: against it.
   */
  readonly orientation?: 1 | -1;
}

/**
 * Options of {@link NetworkBuilder.switch}.
 *
 * @example
 * ```ts
 * // Open at first, closed at 5 ms, open again at 40 ms.
 * const breaker: SwitchOptions = { onResistance: 1e-3, schedule: [{ time: 0.005, closed: true }, { time: 0.04, closed: false }] };
 * net.switch('breaker', supply, line, breaker);
 * ```
 */
export interface SwitchOptions {
  /** Resistance when closed, ohm. Default 1e-3. */
  readonly onResistance?: number;
  /** Resistance when open, ohm. Default 1e6. Give this or `offConductance`. */
  readonly offResistance?: number;
  /** Conductance when open, S (the reciprocal of `offResistance`). */
  readonly offConductance?: number;
  /** State at the start (schedule-driven switches). Default false (open). */
  readonly closed?: boolean;
  /** State changes: at each time the switch takes the given state. Times strictly increasing. */
  readonly schedule?: readonly { readonly time: number; readonly closed: boolean }[];
  /**
   * Gate waveform (any waveform: a pulse train with duty and phase, a
   * piecewise table, a user function): the switch is closed while the gate
   * is above 0.5; its edges are exact breakpoints. Not together with `schedule`.
   */
  readonly gate?: WaveformSpec;
  /** Capacitance across the switch, F (its output capacitance, or a snubber's). Default none. */
  readonly capacitance?: number;
}

/**
 * Options of {@link NetworkBuilder.diode}.
 *
 * @example
 * ```ts
 * const fast: DiodeOptions = { forwardVoltage: 0.8, onResistance: 0.02, offConductance: 1e-9 };
 * const smooth: DiodeOptions = { junction: 'exponential', saturationCurrent: 1e-12, emissionCoefficient: 1.5, onResistance: 0.02 };
 * ```
 */
export interface DiodeOptions {
  /** Forward voltage of the ideal junction, V (>= 0). Default 0.7. */
  readonly forwardVoltage?: number;
  /** Series resistance when conducting, ohm (> 0). Default 0.01. */
  readonly onResistance?: number;
  /** Conductance when blocking, S (> 0). Default 1e-9. */
  readonly offConductance?: number;
  /** `'ideal'` (two states, events; default) or `'exponential'` (Shockley law, smooth). */
  readonly junction?: 'ideal' | 'exponential';
  /** Shockley saturation current Is, A. Default 1e-12. */
  readonly saturationCurrent?: number;
  /** Shockley emission coefficient n. Default 1. */
  readonly emissionCoefficient?: number;
  /** Thermal voltage k T / q, V. Default 0.025852 (300 K). */
  readonly thermalVoltage?: number;
  /** Junction capacitance across the diode, F. Default none. */
  readonly capacitance?: number;
  /** State of an ideal diode before the first consistent-state search (which decides). Default false. */
  readonly initiallyOn?: boolean;
}

let nextNetworkId = 1;

/**
 * Builds one network: electric and magnetic nodes, flux tubes and windings,
 * and electric elements. Each call validates its arguments and returns a
 * typed handle; results are read through the handles.
 *
 * @example
 * ```ts
 * const net = createNetwork('choke');
 * const top = net.magneticNode('top');
 * const bottom = net.magneticNode('bottom');
 * const core = net.fluxTube('core', { from: top, to: bottom, length: 0.2, area: 1e-4,
 *   material: { kind: 'linear', relativePermeability: 2000 } });
 * net.airGap('gap', { from: bottom, to: top, length: 1e-3, area: 1e-4 });
 * const a = net.node('a');
 * net.voltageSource('supply', a, net.ground, sine({ amplitude: 10, frequency: 50 }));
 * net.winding('coil', { tube: core, turns: 100, resistance: 0.5, plus: a, minus: net.ground });
 * ```
 */
export class NetworkBuilder {
  /** Identity of this network; handles carry it so that handles of another network are refused. */
  readonly id: number;
  /** The network's name, used in messages and reports. */
  readonly name: string;
  /** The reference electric node (potential 0). */
  readonly ground: ElectricNode;

  private readonly electricNodes: { name: string }[] = [];
  private readonly magneticNodes: { name: string }[] = [];
  private readonly tubes: TubeDescription[] = [];
  private readonly elements: ElementDescription[] = [];
  private readonly electricNames = new Map<string, number>();
  private readonly magneticNames = new Map<string, number>();
  private readonly tubeNames = new Map<string, number>();
  private readonly elementNames = new Map<string, number>();

  /** Use {@link createNetwork}. */
  constructor(name = 'network') {
    this.id = nextNetworkId++;
    this.name = requireName(name, 'network');
    this.electricNodes.push({ name: 'ground' });
    this.electricNames.set('ground', 0);
    this.ground = this.handle('electric-node', 'ground', 0);
  }

  /**
   * Add an electric node.
   *
   * @example
   * ```ts
   * const a = net.node('a');
   * ```
   */
  node(name: string): ElectricNode {
    this.claim(this.electricNames, requireName(name, 'electric node'), 'electric node', this.electricNodes.length);
    this.electricNodes.push({ name });
    return this.handle('electric-node', name, this.electricNodes.length - 1);
  }

  /**
   * Add a magnetic node (a junction of flux tubes).
   *
   * @example
   * ```ts
   * const top = net.magneticNode('top yoke');
   * ```
   */
  magneticNode(name: string): MagneticNode {
    this.claim(this.magneticNames, requireName(name, 'magnetic node'), 'magnetic node', this.magneticNodes.length);
    this.magneticNodes.push({ name });
    return this.handle('magnetic-node', name, this.magneticNodes.length - 1);
  }

  /**
   * Add a flux tube of material: its MMF drop is length * H(phi / area).
   *
   * @example
   * ```ts
   * const leg = net.fluxTube('leg', { from: top, to: bottom, length: 0.12, area: 9e-4,
   *   material: { kind: 'linear', relativePermeability: 5000 }, initialFluxDensity: 0.4 });
   * ```
   */
  fluxTube(name: string, options: FluxTubeOptions): FluxTube {
    requireName(name, 'flux tube');
    const owner = `tube "${name}"`;
    const law = TUBE_KINDS.material.check({ kind: 'material', length: options.length, area: options.area, material: options.material }, owner, name);
    const eddy = options.eddyResistance;
    if (eddy !== undefined) requirePositive(eddy, `${owner} eddy resistance`, name, 'ohm');
    return this.addTube(name, options, law, eddy);
  }

  /**
   * Add an air gap: reluctance length / (mu0 * fringingFactor * area).
   *
   * @example
   * ```ts
   * net.airGap('centre gap', { from: a, to: b, length: 0.5e-3, area: 9e-4, fringingFactor: 1.15 });
   * ```
   */
  airGap(name: string, options: AirGapOptions): FluxTube {
    requireName(name, 'air gap');
    const law = TUBE_KINDS['air-gap'].check(
      { kind: 'air-gap', length: options.length, area: options.area, fringingFactor: options.fringingFactor ?? 1 },
      `air gap "${name}"`,
      name,
    );
    return this.addTube(name, options, law, undefined);
  }

  /**
   * Add a constant reluctance (A/Wb) between two magnetic nodes, for example
   * a leakage path computed from the window geometry.
   *
   * @example
   * ```ts
   * net.reluctance('leakage', { from: top, to: bottom, reluctance: 2e7 });
   * ```
   */
  reluctance(name: string, options: ReluctanceOptions): FluxTube {
    requireName(name, 'reluctance');
    const law = TUBE_KINDS.reluctance.check(
      options.area === undefined ? { kind: 'reluctance', reluctance: options.reluctance } : { kind: 'reluctance', reluctance: options.reluctance, area: options.area },
      `reluctance "${name}"`,
      name,
    );
    return this.addTube(name, options, law, undefined);
  }

  /**
   * Add a winding of `turns` turns around a flux tube. Its terminal voltage is
   * v_plus - v_minus = R i + orientation * N dphi/dt.
   *
   * @example
   * ```ts
   * const primary = net.winding('primary', { tube: leg, turns: 240, resistance: 1.2, plus: a, minus: net.ground });
   * ```
   */
  winding(name: string, options: WindingOptions): Winding {
    this.checkElementName(name, 'winding');
    const tube = this.own(options.tube, 'flux-tube', `winding "${name}" tube`, name);
    const [plus, minus] = this.terminals(options.plus, options.minus, `winding "${name}"`, name);
    return this.add({
      kind: 'winding', name, plus, minus, tube: tube.index, turns: options.turns, resistance: options.resistance ?? 0, orientation: options.orientation ?? 1,
    });
  }

  /**
   * Add a linear resistor.
   *
   * @example
   * ```ts
   * net.resistor('load', a, net.ground, 12);
   * ```
   */
  resistor(name: string, plus: ElectricNode, minus: ElectricNode, resistance: number): Resistor {
    const [p, m] = this.twoTerminal(name, 'resistor', plus, minus);
    return this.add({ kind: 'resistor', name, plus: p, minus: m, resistance });
  }

  /**
   * Add a linear capacitor with an optional initial voltage v_plus - v_minus.
   *
   * @example
   * ```ts
   * net.capacitor('dc link', a, net.ground, 470e-6, { initialVoltage: 325 });
   * ```
   */
  capacitor(name: string, plus: ElectricNode, minus: ElectricNode, capacitance: number, options: { readonly initialVoltage?: number } = {}): Capacitor {
    const [p, m] = this.twoTerminal(name, 'capacitor', plus, minus);
    return this.add({ kind: 'capacitor', name, plus: p, minus: m, capacitance, initialVoltage: options.initialVoltage ?? 0 });
  }

  /**
   * Add a linear inductor with an optional initial current (plus to minus).
   *
   * @example
   * ```ts
   * net.inductor('line', a, b, 2e-3, { initialCurrent: 0 });
   * ```
   */
  inductor(name: string, plus: ElectricNode, minus: ElectricNode, inductance: number, options: { readonly initialCurrent?: number } = {}): Inductor {
    const [p, m] = this.twoTerminal(name, 'inductor', plus, minus);
    return this.add({ kind: 'inductor', name, plus: p, minus: m, inductance, initialCurrent: options.initialCurrent ?? 0 });
  }

  /**
   * Add an ideal voltage source: v_plus - v_minus = waveform(t). Its current
   * is reported as the current it delivers out of its plus terminal.
   *
   * @example
   * ```ts
   * net.voltageSource('mains', a, net.ground, sine({ amplitude: 325, frequency: 50 }));
   * ```
   */
  voltageSource(name: string, plus: ElectricNode, minus: ElectricNode, waveform: WaveformSpec): VoltageSource {
    const [p, m] = this.twoTerminal(name, 'voltage source', plus, minus);
    return this.add({ kind: 'voltage-source', name, plus: p, minus: m, waveform });
  }

  /**
   * Add an ideal current source driving waveform(t) out of its plus terminal
   * into the circuit.
   *
   * @example
   * ```ts
   * net.currentSource('bias', a, net.ground, constant(1.5));
   * ```
   */
  currentSource(name: string, plus: ElectricNode, minus: ElectricNode, waveform: WaveformSpec): CurrentSource {
    const [p, m] = this.twoTerminal(name, 'current source', plus, minus);
    return this.add({ kind: 'current-source', name, plus: p, minus: m, waveform });
  }

  /**
   * Add a switch: a resistance that takes `onResistance` when closed and
   * `offResistance` when open, changing state at scheduled times.
   *
   * @example
   * ```ts
   * net.switch('breaker', a, b, { closed: false, schedule: [{ time: 0.005, closed: true }] });
   * ```
   */
  switch(name: string, plus: ElectricNode, minus: ElectricNode, options: SwitchOptions = {}): Switch {
    const [p, m] = this.twoTerminal(name, 'switch', plus, minus);
    const initiallyClosed = options.closed ?? false;
    if (options.offResistance !== undefined && options.offConductance !== undefined) {
      throw new InputError('bad-switch-resistance', `switch "${name}" has both offResistance and offConductance; give one of them`, [name]);
    }
    const offResistance = options.offConductance !== undefined
      ? 1 / requirePositive(options.offConductance, `switch "${name}" off-conductance`, name, 'S')
      : (options.offResistance ?? 1e6);
    if (options.gate !== undefined && options.schedule !== undefined && options.schedule.length > 0) {
      throw new InputError('gate-with-schedule', `switch "${name}" has both a gate and a schedule; drive it by one of them (drop the schedule or the gate)`, [name]);
    }
    return this.add({
      kind: 'switch', name, plus: p, minus: m,
      onResistance: options.onResistance ?? 1e-3,
      offResistance,
      initiallyClosed,
      toggleTimes: toggleTimesOf(initiallyClosed, options.schedule ?? [], `switch "${name}"`, name),
      ...(options.gate !== undefined ? { gate: options.gate } : {}),
      ...(options.capacitance !== undefined ? { capacitance: options.capacitance } : {}),
    });
  }

  /**
   * Add a diode from `anode` to `cathode`. The ideal junction (default) has
   * two states: on (forward voltage in series with onResistance) and off
   * (offConductance); it changes state at events located by the solver and
   * after every jump by a consistent-state search. The exponential junction
   * follows the Shockley law, smoothly. See docs/devices.md.
   *
   * @example
   * ```ts
   * const d1 = net.diode('D1', secondary, out, { forwardVoltage: 0.7, onResistance: 0.02 });
   * const d2 = net.diode('D2', a, b, { junction: 'exponential', saturationCurrent: 1e-12, emissionCoefficient: 1.5 });
   * ```
   */
  diode(name: string, anode: ElectricNode, cathode: ElectricNode, options: DiodeOptions = {}): Diode {
    const [p, m] = this.twoTerminal(name, 'diode', anode, cathode);
    return this.add({
      kind: 'diode', name, plus: p, minus: m,
      junction: options.junction ?? 'ideal',
      forwardVoltage: options.forwardVoltage ?? (options.junction === 'exponential' ? 0 : 0.7),
      onResistance: options.onResistance ?? 0.01,
      offConductance: options.offConductance ?? 1e-9,
      saturationCurrent: options.saturationCurrent ?? 1e-12,
      emissionCoefficient: options.emissionCoefficient ?? 1,
      thermalVoltage: options.thermalVoltage ?? 0.025852,
      capacitance: options.capacitance ?? 0,
      initiallyOn: options.initiallyOn ?? false,
    });
  }

  /**
   * Add an element given as plain data (one entry of a description's
   * `elements`, indices into this builder's lists): the same checks and
   * codes as the typed methods, plus `bad-description` for what only plain
   * data can get wrong (an unknown kind, an index out of range). Used to
   * replay a description; scripts use the typed methods.
   *
   * @example
   * ```ts
   * net.element({ kind: 'resistor', name: 'load', plus: 1, minus: 0, resistance: 12 });
   * ```
   */
  element(description: ElementDescription): TwoTerminal {
    const raw = description as unknown as Record<string, unknown>;
    const name = typeof raw.name === 'string' ? raw.name : `element ${this.elements.length}`;
    if (!isElementKind(raw.kind)) {
      throw new InputError('bad-description', `network description: element "${name}" has kind ${JSON.stringify(raw.kind)}; use ${alternatives(Object.keys(ELEMENT_KINDS))}`, [name]);
    }
    const kind = elementKind(description);
    const node = (field: 'plus' | 'minus'): ElectricNode => {
      const k = raw[field];
      const handle = typeof k === 'number' && Number.isInteger(k) && k >= 0 && k < this.electricNodes.length
        ? this.handle('electric-node', this.electricNodes[k]!.name, k) : undefined;
      if (handle === undefined) {
        throw new InputError(
          'bad-description',
          `network description: "${name}" field "${field}" = ${String(k)} is not the index of an electric node (0..${this.electricNodes.length - 1}); give the index in the description's list`,
          [name],
        );
      }
      return handle;
    };
    const [p, m] = this.twoTerminal(raw.name as string, kind.noun, node('plus'), node('minus'));
    return this.add({ ...description, plus: p, minus: m });
  }

  /**
   * Add a flux tube given as plain data (one entry of a description's
   * `tubes`): the same checks and codes as the typed methods, plus
   * `bad-description` for an unknown law kind or an index out of range.
   *
   * @example
   * ```ts
   * net.tube({ name: 'gap', from: 0, to: 1, law: { kind: 'air-gap', length: 1e-3, area: 4e-4, fringingFactor: 1 } });
   * ```
   */
  tube(description: TubeDescription): FluxTube {
    const raw = description as unknown as Record<string, unknown>;
    const name = typeof raw.name === 'string' ? raw.name : `tube ${this.tubes.length}`;
    const law = (raw.law !== null && typeof raw.law === 'object' ? raw.law : {}) as Record<string, unknown>;
    if (!isTubeKind(law.kind)) {
      return bad(`tube "${name}" has law kind ${JSON.stringify(law.kind)}; use ${alternatives(Object.keys(TUBE_KINDS))}`, [name]);
    }
    const kind = tubeKind(description.law);
    const node = (field: 'from' | 'to'): MagneticNode => {
      const k = raw[field];
      const handle = typeof k === 'number' && Number.isInteger(k) && k >= 0 && k < this.magneticNodes.length
        ? this.handle('magnetic-node', this.magneticNodes[k]!.name, k) : undefined;
      if (handle === undefined) {
        const range = this.magneticNodes.length === 0 ? 'there are none' : `0..${this.magneticNodes.length - 1}`;
        return bad(`"${name}" field "${field}" = ${String(k)} is not the index of a magnetic node (${range}); give the index in the description's list`, [name]);
      }
      return handle;
    };
    const from = node('from');
    const to = node('to');
    requireName(raw.name, kind.noun);
    const owner = kind.kind === 'material' ? `tube "${name}"` : `${kind.noun} "${name}"`;
    const clean = kind.check(description.law, owner, name);
    const eddy = description.eddyResistance;
    if (eddy !== undefined) {
      if (!kind.allowsEddy) bad(`tube "${name}" has an eddy resistance but is not a tube of material; drop eddyResistance`, [name]);
      requirePositive(eddy, `${owner} eddy resistance`, name, 'ohm');
    }
    const ic = {
      from, to,
      ...(description.initialFlux !== undefined ? { initialFlux: description.initialFlux } : {}),
      ...(description.initialFluxDensity !== undefined ? { initialFluxDensity: description.initialFluxDensity } : {}),
    };
    return this.addTube(name, ic, clean, eddy);
  }

  /**
   * The network as plain data (a deep, frozen copy): what the formulation
   * compiles, what a worker receives, what a report lists.
   *
   * @example
   * ```ts
   * const json = JSON.stringify(net.describe());
   * ```
   */
  describe(): NetworkDescription {
    return freezePlain(clonePlain<NetworkDescription>({
      name: this.name,
      electricNodes: this.electricNodes,
      magneticNodes: this.magneticNodes,
      tubes: this.tubes,
      elements: this.elements,
    }));
  }

  /**
   * Check that a handle belongs to this network and has the expected kind;
   * returns it. Used by the result accessors and by helper modules.
   *
   * @example
   * ```ts
   * net.own(leg, 'flux-tube', 'argument "tube"', 'my script');
   * ```
   */
  own<K extends AnyHandle['kind']>(handle: AnyHandle, kind: K, what: string, owner: string): Extract<AnyHandle, { kind: K }> {
    if (handle === null || typeof handle !== 'object' || handle.kind !== kind) {
      throw new InputError(
        'wrong-handle-kind',
        `${what} must be a ${kind} handle from this network, got ${describeValue(handle)}`,
        [owner],
      );
    }
    if (handle.network !== this.id) {
      throw new InputError(
        'foreign-handle',
        `${what} "${handle.name}" belongs to another network; use handles created by network "${this.name}"`,
        [owner, handle.name],
      );
    }
    return handle as Extract<AnyHandle, { kind: K }>;
  }

  private addTube(name: string, ic: TubeInitialCondition, law: TubeLaw, eddyResistance: number | undefined): FluxTube {
    const owner = `tube "${name}"`;
    this.claim(this.tubeNames, name, 'flux tube', this.tubes.length);
    const from = this.own((ic as FluxTubeOptions).from, 'magnetic-node', `${owner} "from" node`, name);
    const to = this.own((ic as FluxTubeOptions).to, 'magnetic-node', `${owner} "to" node`, name);
    if (from.index === to.index) {
      this.tubeNames.delete(name);
      throw new InputError(
        'tube-self-loop',
        `${owner} starts and ends at magnetic node "${from.name}"; a tube must join two different nodes`,
        [name, from.name],
      );
    }
    if (ic.initialFlux !== undefined && ic.initialFluxDensity !== undefined) {
      this.tubeNames.delete(name);
      throw new InputError('conflicting-initial-flux', `${owner} has both initialFlux and initialFluxDensity; give one`, [name]);
    }
    if (ic.initialFlux !== undefined) requireFinite(ic.initialFlux, `${owner} initial flux`, name, 'Wb');
    if (ic.initialFluxDensity !== undefined) {
      requireFinite(ic.initialFluxDensity, `${owner} initial flux density`, name, 'T');
      if (!tubeKind(law).hasArea(law)) {
        this.tubeNames.delete(name);
        throw new InputError(
          'missing-area',
          `${owner} has an initial flux density but no area; give the reluctance an area or use initialFlux`,
          [name],
        );
      }
    }
    const tube: TubeDescription = {
      name, from: from.index, to: to.index, law,
      ...(eddyResistance !== undefined ? { eddyResistance } : {}),
      ...(ic.initialFlux !== undefined ? { initialFlux: ic.initialFlux } : {}),
      ...(ic.initialFluxDensity !== undefined ? { initialFluxDensity: ic.initialFluxDensity } : {}),
    };
    this.tubes.push(tube);
    return this.handle('flux-tube', name, this.tubes.length - 1);
  }

  private addElement<K extends ElementDescription['kind']>(kind: K, element: Extract<ElementDescription, { kind: K }>): Extract<AnyHandle, { kind: K }> {
    this.elementNames.set(element.name, this.elements.length);
    this.elements.push(element);
    return this.handle(kind, element.name, this.elements.length - 1) as Extract<AnyHandle, { kind: K }>;
  }

  /** Check an element's data by its kind and add it. */
  private add<D extends ElementDescription>(d: D): Extract<AnyHandle, { kind: D['kind'] }> {
    const kind = elementKind(d);
    const clean = kind.check(d, { owner: `${kind.noun} "${d.name}"`, tubeCount: this.tubes.length });
    return this.addElement(clean.kind, clean as unknown as Extract<ElementDescription, { kind: D['kind'] }>) as Extract<AnyHandle, { kind: D['kind'] }>;
  }

  /** Name and terminal checks of a two-terminal element: node indices [plus, minus]. */
  private twoTerminal(name: string, noun: string, plus: ElectricNode, minus: ElectricNode): [number, number] {
    this.checkElementName(name, noun);
    return this.terminals(plus, minus, `${noun} "${name}"`, name);
  }

  private checkElementName(name: string, kind: string): void {
    requireName(name, kind);
    if (this.elementNames.has(name)) {
      throw new InputError(
        'duplicate-name',
        `${kind} name "${name}" is already used by another element of network "${this.name}"; names must be unique`,
        [name],
      );
    }
  }

  private claim(map: Map<string, number>, name: string, kind: string, index: number): void {
    if (map.has(name)) {
      throw new InputError(
        'duplicate-name',
        `${kind} name "${name}" is already used in network "${this.name}"; names must be unique`,
        [name],
      );
    }
    map.set(name, index);
  }

  private terminals(plus: ElectricNode, minus: ElectricNode, owner: string, name: string): [number, number] {
    const p = this.own(plus, 'electric-node', `${owner} plus terminal`, name);
    const m = this.own(minus, 'electric-node', `${owner} minus terminal`, name);
    if (p.index === m.index) {
      throw new InputError(
        'shorted-element',
        `${owner} has both terminals on node "${p.name}"; connect it between two different nodes`,
        [name, p.name],
      );
    }
    return [p.index, m.index];
  }

  private handle<K extends AnyHandle['kind']>(kind: K, name: string, index: number): Extract<AnyHandle, { kind: K }> {
    return Object.freeze({ kind, name, index, network: this.id }) as unknown as Extract<AnyHandle, { kind: K }>;
  }
}

/**
 * Start a new network.
 *
 * @example
 * ```ts
 * const net = createNetwork('mains transformer');
 * ```
 */
export function createNetwork(name = 'network'): NetworkBuilder {
  return new NetworkBuilder(name);
}

/** `'a', 'b' or 'c'`. */
function alternatives(names: readonly string[]): string {
  const quoted = names.map((k) => `'${k}'`);
  return quoted.length < 2 ? quoted.join('') : `${quoted.slice(0, -1).join(', ')} or ${quoted[quoted.length - 1]!}`;
}

/**
 * Throw the `bad-description` error of a plain-data description (what only
 * plain data can get wrong: a missing list, an index out of range, an
 * unknown kind).
 *
 * @example
 * ```ts
 * badDescription('"elements" is missing; give a list (possibly empty)', ['elements']);
 * ```
 *
 * @internal
 */
export function badDescription(text: string, elements: readonly string[]): never {
  throw new InputError('bad-description', `network description: ${text}`, elements);
}

const bad = badDescription;

function describeValue(value: unknown): string {
  if (value !== null && typeof value === 'object' && 'kind' in value) {
    const v = value as { kind: unknown; name?: unknown };
    return `a ${String(v.kind)}${typeof v.name === 'string' ? ` ("${v.name}")` : ''}`;
  }
  return value === undefined ? 'nothing' : typeof value;
}
