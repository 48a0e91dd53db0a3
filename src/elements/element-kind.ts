import type { ElementDescription, NetworkDescription } from '../network/description.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';
import type { StampTarget } from './stamp-target.js';
import type { TubeLoops } from './tube-kind.js';

/**
 * The inputs in force for one evaluation: source values, switch states and
 * the discrete states of devices that switch on their own (an ideal diode
 * on or off). Passed explicitly to every stamp and quantity, never read
 * from shared state, so a reader of a past step cannot disturb a live run.
 *
 * @example
 * ```ts
 * const held: InputView = { sourceValue: () => 10, switchClosed: () => true, deviceOn: () => false };
 * ```
 */
export interface InputView {
  /** Value of source element `element` (V or A) at time t. */
  sourceValue(element: number, t: number): number;
  /** Whether switch element `element` is closed at time t. */
  switchClosed(element: number, t: number): boolean;
  /** Whether device element `element` (an ideal diode) is in its conducting state; held over an input interval. */
  deviceOn(element: number): boolean;
}

/**
 * How an element takes part in the circuit's topology and index analysis.
 * - `conductive`: a resistance (resistor, switch): joins its nodes, fixes nothing;
 * - `capacitive`: its voltage is a state (capacitor);
 * - `inductive`: its current is a state (inductor, winding);
 * - `voltage-source`: fixes its voltage;
 * - `current-source`: fixes its current.
 *
 * @example
 * ```ts
 * const role: TopologicalRole = ELEMENT_KINDS.capacitor.role; // 'capacitive'
 * ```
 */
export type TopologicalRole = 'conductive' | 'capacitive' | 'inductive' | 'voltage-source' | 'current-source';

/**
 * Where an element's loss goes in the energy audit.
 *
 * @example
 * ```ts
 * const where: LossCategory = 'windings';
 * ```
 */
export type LossCategory = 'resistors' | 'windings' | 'eddy';

/**
 * What the element kinds need from the network while checking one
 * element's data (from a builder call or a plain description).
 *
 * @example
 * ```ts
 * const ctx: CheckContext = { owner: 'winding "primary"', tubeCount: 3 };
 * ```
 */
export interface CheckContext {
  /** The element as messages name it, e.g. `winding "primary"`. */
  readonly owner: string;
  /** Number of flux tubes declared so far (windings refer to one). */
  readonly tubeCount: number;
}

/**
 * Unknown positions and magnetic incidence that element stamps need.
 *
 * @example
 * ```ts
 * const p = ctx.potential(element.plus); // -1 for ground
 * ```
 */
export interface StampContext {
  /** Index in y of an electric node's potential; -1 for ground. */
  potential(node: number): number;
  /** Index in y of an element's branch current; -1 when it has none. */
  branchCurrent(element: number): number;
  /** Loops through tube b: indices in y of their loop fluxes and the signs (flux of b = sum sign * y[index]). */
  tubeLoops(b: number): TubeLoops;
  /** Index in y of the first internal state of element `element` (see {@link ElementKind.internalStates}); -1 if none. */
  internalStates(element: number): number;
}

/**
 * Reads u^T y' from the state for a vector u in the row space of the mass
 * matrix (a capacitor's current C dv/dt): u^T y' = w^T f(t, y), M^T w = u.
 *
 * @example
 * ```ts
 * const i = rates.rate(`cap:${k}`, (u) => { u[p] = c; u[n] = -c; }, t, y, inputs);
 * ```
 */
export interface RateReader {
  /** u^T y' at (t, y); `key` caches the functional; NaN when u^T y' is not determined by M y' = f. */
  rate(key: string, fill: (u: Float64Array) => void, t: number, y: Float64Array, inputs: InputView): number;
}

/**
 * One element of a compiled network: everything the results, the energy
 * audit and the report need to know about it, asked of the element itself.
 *
 * @example
 * ```ts
 * const i = compiled.elements[k]!.current(t, y, inputs, rates);
 * ```
 */
export interface CompiledElement {
  readonly name: string;
  /** Index in the description's `elements`. */
  readonly index: number;
  readonly role: TopologicalRole;
  /** Current from plus to minus through the element, A (for sources: delivered out of plus). */
  current(t: number, y: Float64Array, inputs: InputView, rates: RateReader): number;
  /** Power the element delivers into the circuit (sources only), W. */
  sourcePower?(t: number, y: Float64Array, inputs: InputView, rates: RateReader): number;
  /** Power it dissipates, W, and where the audit books it. */
  readonly loss?: {
    readonly category: LossCategory;
    power(t: number, y: Float64Array, inputs: InputView): number;
  };
  /** Energy it stores at state y, J. */
  storedEnergy?(y: Float64Array): number;
  /**
   * Whether the element offers a path to a current right now (an open
   * switch or a blocking diode without capacitance does not): used to find
   * an inductive current cut off with no freewheeling path. Absent: always.
   */
  conducting?(t: number, inputs: InputView): boolean;
  /**
   * Conductance the element keeps while it does not conduct (an open
   * switch's 1/offResistance, a blocking diode's offConductance), S: the
   * freewheeling check takes a current this leakage carries at the
   * circuit's voltages for no cut current. Absent: 0.
   */
  readonly offConductance?: number;
  /** Quantities only this kind has (a winding's EMF, copper loss, flux linkage). */
  readonly extra?: Readonly<Partial<Record<ExtraQuantity, (t: number, y: Float64Array) => number>>>;
}

/**
 * Quantities that only some element kinds have.
 *
 * @example
 * ```ts
 * const q: ExtraQuantity = 'emf';
 * ```
 */
export type ExtraQuantity = 'emf' | 'fluxLinkage' | 'copperLoss';

/**
 * All elements of one kind, compiled together so that the hot loops (f and
 * its Jacobian) run once per kind over flat data.
 *
 * @example
 * ```ts
 * group.residual(t, y, inputs, f); // adds this kind's currents and branch equations
 * ```
 */
export interface ElementGroup {
  /** Add this kind's terms of f(t, y) into f (rows set by the group are added to, never overwritten). */
  residual(t: number, y: Float64Array, inputs: InputView, f: Float64Array): void;
  /** Add df/dy into J. */
  jacobian(t: number, y: Float64Array, inputs: InputView, J: StampTarget): void;
  /** Add the constant mass-matrix entries. */
  mass(M: StampTarget): void;
  /** Write initial values of this kind's states into y0 (before consistent initialisation). */
  initial?(y0: Float64Array): void;
  /** One compiled element per instance, in the order given to `compile`. */
  readonly elements: readonly CompiledElement[];
  /**
   * Event functions of elements that switch on their own (a diode's
   * current or voltage crossing zero): located on the dense output, the
   * run restarts there. Absent for elements driven only by schedules.
   */
  readonly events?: readonly ElementEvent[];
}

/**
 * A state function whose zero crossing changes an element's state: for a
 * device with a discrete state ({@link InputView.deviceOn}) it is the margin
 * of the present state (positive while the state is right), crossing zero
 * downwards when the device must change state.
 *
 * @example
 * ```ts
 * const turnOff: ElementEvent = { element: 3, direction: -1, value: (t, y) => y[7]! };
 * ```
 */
export interface ElementEvent {
  /** Index of the element in the description. */
  readonly element: number;
  /** +1: only rising crossings count, -1: only falling, 0: both. */
  readonly direction: -1 | 0 | 1;
  value(t: number, y: Float64Array, inputs: InputView): number;
  /**
   * Whether the device's present state is consistent at (t, y) (the
   * consistent-state search flips it otherwise). It must hold wherever
   * `value` is positive, with a margin, so that a state just settled never
   * fires its own event at once. Absent: `value >= 0`.
   */
  consistent?(t: number, y: Float64Array, inputs: InputView): boolean;
}

/**
 * A parameter row of the report's network listing.
 *
 * @example
 * ```ts
 * const row: ListingParameter = { name: 'resistance', value: 12, unit: 'ohm' };
 * ```
 */
export interface ListingParameter {
  readonly name: string;
  readonly value: number | string;
  readonly unit?: string;
  /** Significant digits to print (default: the report's). */
  readonly digits?: number;
}

/**
 * Everything about one electric element kind, behind one interface: checks
 * of its data, the unknowns it adds, its stamps, its quantities, its role
 * in the topology and index checks, its inputs and its listing. The
 * registry ({@link ELEMENT_KINDS}) holds one per kind; nothing else in the
 * library switches on an element's kind.
 *
 * @example
 * ```ts
 * const kind = ELEMENT_KINDS[element.kind] as ElementKind<typeof element>;
 * kind.noun; // 'voltage source'
 * ```
 */
export interface ElementKind<D extends ElementDescription = ElementDescription> {
  readonly kind: D['kind'];
  /** The kind in messages: 'voltage source'. */
  readonly noun: string;
  readonly role: TopologicalRole;
  /** Whether the element adds its branch current as an unknown. */
  readonly branchCurrent: boolean;
  /**
   * Check the element's data (terminals and tube indices are already
   * checked) and return the clean description; throws `InputError` naming
   * the element and the fix. The builder and the description replay both
   * call this, so the rules and codes are the same.
   */
  check(d: D, ctx: CheckContext): D;
  /** Compile every element of this kind. */
  compile(elements: readonly { readonly d: D; readonly index: number }[], ctx: StampContext, network: NetworkCompileInfo): ElementGroup;
  /** Parameter rows for the report's network listing. */
  listing(d: D, network: NetworkDescription): ListingParameter[];
  /** Error code when one terminal is connected to nothing else and that forces the current to zero; absent: allowed. */
  readonly openTerminalCode?: 'open-winding' | 'open-terminal';
  /** The element's waveform input (sources). */
  waveform?(d: D): WaveformSpec;
  /** The element's gate waveform (gate-driven switches): closed while above 0.5; undefined when a schedule drives it. */
  gate?(d: D): WaveformSpec | undefined;
  /**
   * The description fields that hold the element's waveform inputs (a
   * source's `waveform`, a switch's `gate`), so that code rewriting the
   * waveforms of every kind (the sweep's import of functions named by
   * module) needs no list of kinds. Absent: the element has none.
   */
  readonly waveformFields?: readonly (keyof D & string)[];
  /**
   * Whether its conduction changes faster than the states around it (a
   * diode, ideal or exponential): a run of a network with one caps its step
   * by the periods of the sine sources, so that the solver, whose error
   * control follows the states, does not step over a conduction window.
   */
  readonly capsStepBySources?: boolean;
  /** The initial discrete state of a device that switches on its own (an ideal diode: on or off); undefined for none. */
  deviceState?(d: D): boolean | undefined;
  /** The element's switching schedule (switches). */
  schedule?(d: D): { readonly initiallyClosed: boolean; readonly toggleTimes: readonly number[] };
  /**
   * Capacitance across the terminals of an element whose role is not
   * capacitive (a diode's junction capacitance, a switch's output
   * capacitance), F; 0 or absent: none. The capacitor/voltage-source loop
   * (index-2) analysis counts an element with one as a capacitor.
   */
  parallelCapacitance?(d: D): number;
  /** Initial voltage plus - minus (capacitive elements), V. */
  initialVoltage?(d: D): number;
  /**
   * Whether the element holds its terminal voltage rigidly (a voltage
   * source; a winding without resistance): used to find over-constrained
   * flux loops.
   */
  rigidVoltage?(d: D): boolean;
  /** Flux the element links: tube and signed turns (windings). */
  linkedFlux?(d: D): { readonly tube: number; readonly turns: number };
  /**
   * Labels of internal state unknowns the element adds (a device with
   * memory); their positions come from {@link StampContext.internalStates}.
   */
  internalStates?(d: D): readonly string[];
  /**
   * The unknowns this element's terms of f enter other than affinely, for
   * the reduced formulation (`formulation: 'reduced'`, which eliminates the
   * algebraic unknowns inside f): the element's terms must be a(t, y_S) + B y
   * with S the unknowns listed and B fixed over an input interval (an
   * unlisted unknown multiplies no unknown). An empty list declares the
   * element affine (a resistor, a source, a switch: its conductance is fixed
   * between breakpoints). A kind without this method declares nothing, and a
   * network holding it is refused in reduced form (the safe default).
   */
  nonAffineUnknowns?(d: D, ctx: StampContext): readonly number[];
}

/**
 * Network-level facts an element group may need while compiling.
 *
 * @example
 * ```ts
 * const info: NetworkCompileInfo = { description, size: 12 };
 * ```
 */
export interface NetworkCompileInfo {
  readonly description: NetworkDescription;
  /** Number of unknowns. */
  readonly size: number;
}
