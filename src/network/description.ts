import type { JilesAthertonSpec } from '../materials/hysteresis/inverse-jiles-atherton.js';
import type { MaterialSpec } from '../materials/material-spec.js';
import type { MaterialLaw } from '../materials/material-law.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';

/**
 * Plain-data description of a network, produced by the builder. Everything
 * here is JSON-serialisable except live {@link MaterialLaw} objects and
 * in-process user functions, which a script may pass for convenience.
 * Indices refer to the lists of this description; electric node 0 is ground.
 *
 * @example
 * ```ts
 * const description: NetworkDescription = net.describe();
 * writeFileSync('out/network.json', JSON.stringify(description));
 * const result = simulate(JSON.parse(readFileSync('out/network.json', 'utf8')), { stopTime: 0.1 });
 * result.fluxDensity(leg); // the builder's handles still read it
 * ```
 */
export interface NetworkDescription {
  readonly name: string;
  /** Electric nodes; index 0 is ground. */
  readonly electricNodes: readonly { readonly name: string }[];
  readonly magneticNodes: readonly { readonly name: string }[];
  readonly tubes: readonly TubeDescription[];
  /** Two-terminal electric elements and windings, in creation order. */
  readonly elements: readonly ElementDescription[];
}

/**
 * How a tube's MMF drop depends on its flux.
 *
 * @example
 * ```ts
 * const gap: TubeLaw = { kind: 'air-gap', length: 0.5e-3, area: 1.44e-4, fringingFactor: 1.2 };
 * ```
 */
export type TubeLaw =
  /** A body of material: F = length * H(phi / area). */
  | { readonly kind: 'material'; readonly length: number; readonly area: number; readonly material: MaterialSpec | MaterialLaw }
  /** An air gap: F = length * phi / (mu0 * area * fringingFactor). */
  | { readonly kind: 'air-gap'; readonly length: number; readonly area: number; readonly fringingFactor: number }
  /** A constant reluctance (A/Wb), e.g. a leakage path: F = reluctance * phi. */
  | { readonly kind: 'reluctance'; readonly reluctance: number; readonly area?: number }
  /** A body of hysteretic material (inverse Jiles-Atherton): F = length * (phi/area / mu0 - m), m an internal state. */
  | HystereticTubeLaw;

/**
 * Law of a hysteretic flux tube (see docs/materials.md, "Hysteresis"). The
 * tube must carry an eddy resistance (its flux then has a derivative the
 * model can follow: index 1).
 *
 * @example
 * ```ts
 * const core: TubeLaw = { kind: 'hysteretic', length: 0.3, area: 1e-3, material: demoHystereticMaterials.steel };
 * ```
 */
export interface HystereticTubeLaw {
  readonly kind: 'hysteretic';
  readonly length: number;
  readonly area: number;
  readonly material: JilesAthertonSpec;
  /** Magnetisation at the start, A/m; default: the tube's initial flux density / mu0 (H = 0, a remanent state). */
  readonly initialMagnetisation?: number;
}

/**
 * One flux tube (leg, yoke, gap, leakage path).
 *
 * @example
 * ```ts
 * const leg: TubeDescription = net.describe().tubes[0]!;
 * console.log(leg.name, leg.law.kind, leg.from, '->', leg.to);
 * ```
 */
export interface TubeDescription {
  readonly name: string;
  /** Magnetic node index where positive flux leaves the tube's start. */
  readonly from: number;
  /** Magnetic node index where positive flux arrives. */
  readonly to: number;
  readonly law: TubeLaw;
  /** Eddy-current resistance R_e (ohm, as a shorted single turn): adds R_e * dphi/dt to the MMF drop. */
  readonly eddyResistance?: number;
  /** Initial flux, Wb (mutually exclusive with initialFluxDensity). */
  readonly initialFlux?: number;
  /** Initial flux density, T (remanence); needs an area. */
  readonly initialFluxDensity?: number;
}

interface TwoTerminalBase {
  readonly name: string;
  /** Electric node index of the plus terminal. */
  readonly plus: number;
  /** Electric node index of the minus terminal. */
  readonly minus: number;
}

/**
 * A linear resistor, ohm.
 *
 * @example
 * ```ts
 * const r: ResistorDescription = { kind: 'resistor', name: 'load', plus: 2, minus: 0, resistance: 10 };
 * ```
 */
export interface ResistorDescription extends TwoTerminalBase {
  readonly kind: 'resistor';
  readonly resistance: number;
}

/**
 * A linear capacitor, F, with its initial voltage v_plus - v_minus.
 *
 * @example
 * ```ts
 * const c: CapacitorDescription = { kind: 'capacitor', name: 'dc link', plus: 1, minus: 0, capacitance: 470e-6, initialVoltage: 325 };
 * ```
 */
export interface CapacitorDescription extends TwoTerminalBase {
  readonly kind: 'capacitor';
  readonly capacitance: number;
  readonly initialVoltage: number;
}

/**
 * A linear inductor, H, with its initial current (plus to minus through the inductor).
 *
 * @example
 * ```ts
 * const l: InductorDescription = { kind: 'inductor', name: 'line', plus: 1, minus: 2, inductance: 8e-3, initialCurrent: 0 };
 * ```
 */
export interface InductorDescription extends TwoTerminalBase {
  readonly kind: 'inductor';
  readonly inductance: number;
  readonly initialCurrent: number;
}

/**
 * An ideal voltage source: v_plus - v_minus = waveform(t).
 *
 * @example
 * ```ts
 * const v: VoltageSourceDescription = { kind: 'voltage-source', name: 'mains', plus: 1, minus: 0, waveform: sine({ amplitude: 325, frequency: 50 }) };
 * ```
 */
export interface VoltageSourceDescription extends TwoTerminalBase {
  readonly kind: 'voltage-source';
  readonly waveform: WaveformSpec;
}

/**
 * An ideal current source driving waveform(t) out of its plus terminal into the circuit.
 *
 * @example
 * ```ts
 * const i: CurrentSourceDescription = { kind: 'current-source', name: 'bias', plus: 1, minus: 0, waveform: constant(2) };
 * ```
 */
export interface CurrentSourceDescription extends TwoTerminalBase {
  readonly kind: 'current-source';
  readonly waveform: WaveformSpec;
}

/**
 * A switch: resistance onResistance when closed, offResistance when open,
 * driven either by a schedule (initial state and toggle times) or by a gate
 * waveform (closed while the gate is above 0.5).
 *
 * @example
 * ```ts
 * const s: SwitchDescription = {
 *   kind: 'switch', name: 'breaker', plus: 1, minus: 2, onResistance: 1e-3, offResistance: 1e6, initiallyClosed: false, toggleTimes: [0.005],
 * };
 * const q: SwitchDescription = {
 *   kind: 'switch', name: 'Q1', plus: 3, minus: 0, onResistance: 0.05, offResistance: 1e6, initiallyClosed: false, toggleTimes: [],
 *   gate: { kind: 'pulse', high: 1, period: 1e-5, duty: 0.4 },
 * };
 * ```
 */
export interface SwitchDescription extends TwoTerminalBase {
  readonly kind: 'switch';
  readonly onResistance: number;
  readonly offResistance: number;
  readonly initiallyClosed: boolean;
  /** Times at which the switch changes state (toggles), strictly increasing. Empty for a gate-driven switch. */
  readonly toggleTimes: readonly number[];
  /** Gate waveform: the switch is closed while it is above 0.5 (the gate threshold); absent: the schedule drives it. */
  readonly gate?: WaveformSpec;
  /** Capacitance across the switch, F (absent or 0: none). */
  readonly capacitance?: number;
}

/**
 * A diode from anode (`plus`) to cathode (`minus`). `junction: 'ideal'`: two
 * states, on (forward voltage in series with onResistance) and off
 * (offConductance), changed by events and the consistent-state search;
 * `'exponential'`: the smooth Shockley law i = Is (exp(v_j / (n V_T)) - 1)
 * with onResistance in series and offConductance in parallel.
 *
 * @example
 * ```ts
 * const d: DiodeDescription = {
 *   kind: 'diode', name: 'D1', plus: 1, minus: 2, junction: 'ideal', forwardVoltage: 0.7, onResistance: 0.01,
 *   offConductance: 1e-9, saturationCurrent: 1e-12, emissionCoefficient: 1, thermalVoltage: 0.025852, capacitance: 0, initiallyOn: false,
 * };
 * ```
 */
export interface DiodeDescription extends TwoTerminalBase {
  readonly kind: 'diode';
  readonly junction: 'ideal' | 'exponential';
  /** Forward voltage of the ideal diode, V (>= 0). */
  readonly forwardVoltage: number;
  /** Series resistance when conducting, ohm (> 0). */
  readonly onResistance: number;
  /** Conductance when blocking (ideal) or in parallel (exponential), S (> 0). */
  readonly offConductance: number;
  /** Shockley saturation current Is, A (exponential junction). */
  readonly saturationCurrent: number;
  /** Emission coefficient n (exponential junction). */
  readonly emissionCoefficient: number;
  /** Thermal voltage k T / q, V (exponential junction). */
  readonly thermalVoltage: number;
  /** Junction capacitance in parallel, F (0: none). */
  readonly capacitance: number;
  /** State of an ideal diode before the first consistent-state search (the search decides). */
  readonly initiallyOn: boolean;
}

/**
 * A winding of `turns` turns on tube `tube`.
 *
 * @example
 * ```ts
 * const w: WindingDescription = { kind: 'winding', name: 'primary', plus: 1, minus: 0, tube: 0, turns: 820, resistance: 2.5, orientation: 1 };
 * ```
 */
export interface WindingDescription extends TwoTerminalBase {
  readonly kind: 'winding';
  readonly tube: number;
  readonly turns: number;
  readonly resistance: number;
  /** +1: positive current drives flux in the tube's positive direction; -1: against it. */
  readonly orientation: 1 | -1;
}

/**
 * Any two-terminal element or winding.
 *
 * @example
 * ```ts
 * const windings = net.describe().elements.filter((e: ElementDescription) => e.kind === 'winding');
 * ```
 */
export type ElementDescription =
  | ResistorDescription
  | CapacitorDescription
  | InductorDescription
  | VoltageSourceDescription
  | CurrentSourceDescription
  | SwitchDescription
  | DiodeDescription
  | WindingDescription;
