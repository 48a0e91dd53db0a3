import type { MaterialSpec } from '../materials/material-spec.js';
import type { MaterialLaw } from '../materials/material-law.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';

/**
 * Plain-data description of a network, produced by the builder. Everything
 * here is JSON-serialisable except live {@link MaterialLaw} objects and
 * in-process user functions, which a script may pass for convenience.
 * Indices refer to the lists of this description; electric node 0 is ground.
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

/** How a tube's MMF drop depends on its flux. */
export type TubeLaw =
  /** A body of material: F = length * H(phi / area). */
  | { readonly kind: 'material'; readonly length: number; readonly area: number; readonly material: MaterialSpec | MaterialLaw }
  /** An air gap: F = length * phi / (mu0 * area * fringingFactor). */
  | { readonly kind: 'air-gap'; readonly length: number; readonly area: number; readonly fringingFactor: number }
  /** A constant reluctance (A/Wb), e.g. a leakage path: F = reluctance * phi. */
  | { readonly kind: 'reluctance'; readonly reluctance: number; readonly area?: number };

/** One flux tube (leg, yoke, gap, leakage path). */
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

/** A linear resistor, ohm. */
export interface ResistorDescription extends TwoTerminalBase {
  readonly kind: 'resistor';
  readonly resistance: number;
}

/** A linear capacitor, F, with its initial voltage v_plus - v_minus. */
export interface CapacitorDescription extends TwoTerminalBase {
  readonly kind: 'capacitor';
  readonly capacitance: number;
  readonly initialVoltage: number;
}

/** A linear inductor, H, with its initial current (plus to minus through the inductor). */
export interface InductorDescription extends TwoTerminalBase {
  readonly kind: 'inductor';
  readonly inductance: number;
  readonly initialCurrent: number;
}

/** An ideal voltage source: v_plus - v_minus = waveform(t). */
export interface VoltageSourceDescription extends TwoTerminalBase {
  readonly kind: 'voltage-source';
  readonly waveform: WaveformSpec;
}

/** An ideal current source driving waveform(t) out of its plus terminal into the circuit. */
export interface CurrentSourceDescription extends TwoTerminalBase {
  readonly kind: 'current-source';
  readonly waveform: WaveformSpec;
}

/** A switch: resistance onResistance when closed, offResistance when open. */
export interface SwitchDescription extends TwoTerminalBase {
  readonly kind: 'switch';
  readonly onResistance: number;
  readonly offResistance: number;
  readonly initiallyClosed: boolean;
  /** Times at which the switch changes state (toggles), strictly increasing. */
  readonly toggleTimes: readonly number[];
}

/** A winding of `turns` turns on tube `tube`. */
export interface WindingDescription extends TwoTerminalBase {
  readonly kind: 'winding';
  readonly tube: number;
  readonly turns: number;
  readonly resistance: number;
  /** +1: positive current drives flux in the tube's positive direction; -1: against it. */
  readonly orientation: 1 | -1;
}

/** Any two-terminal element or winding. */
export type ElementDescription =
  | ResistorDescription
  | CapacitorDescription
  | InductorDescription
  | VoltageSourceDescription
  | CurrentSourceDescription
  | SwitchDescription
  | WindingDescription;
