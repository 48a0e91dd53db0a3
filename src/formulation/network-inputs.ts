import type { InputView } from '../elements/element-kind.js';
import { InputError } from '../errors.js';
import { elementKind } from '../elements/registry.js';
import type { ElementDescription, NetworkDescription } from '../network/description.js';
import { nextDown, nextUp } from '../solver/float-neighbours.js';
import { compileWaveform, type WaveformSpec } from '../waveforms/waveform-spec.js';
import type { Waveform } from '../waveforms/waveform.js';

export { nextDown, nextUp } from '../solver/float-neighbours.js';

/**
 * What embedding code changed in a network's inputs (plain data).
 *
 * @example
 * ```ts
 * const saved: InputState = schedule.state();
 * const again = InputSchedule.of(description).withState(saved);
 * ```
 */
export interface InputState {
  readonly sourceOverride: readonly (number | undefined)[];
  readonly switchOverride: readonly (boolean | undefined)[];
  readonly waveforms: readonly (readonly [number, WaveformSpec])[];
  /** Gate waveforms put in place of the description's (gate-driven switches). */
  readonly gates?: readonly (readonly [number, WaveformSpec])[];
  /** Discrete device states (ideal diodes on/off), per element (false for elements without one). */
  readonly deviceStates?: readonly boolean[];
}

/**
 * A gate waveform is read as on while its value is above this level (a
 * logic-level gate signal of 0 and 1; a 0/15 V drive works as well).
 *
 * @example
 * ```ts
 * const on = gateWaveform.value(t) > GATE_THRESHOLD;
 * ```
 */
export const GATE_THRESHOLD = 0.5;

/** Bisection steps that pin a gate crossing inside a smooth piece down to adjacent floats. */
const GATE_BISECTIONS = 200;

/**
 * The first time after `after` where a gate changes state: at a breakpoint
 * of its waveform where the on/off reading jumps, or inside a piece where
 * the value crosses the threshold (found by bisection to adjacent floats,
 * so the state is constant between consecutive edges). A piece that
 * crosses the threshold and comes back before its end is not seen: give a
 * gate with breakpoints at its edges (pulse, piecewise table, user
 * function with `breakpoints`).
 */
function nextGateEdge(w: Waveform, after: number): number {
  const on = (t: number): boolean => w.value(t) > GATE_THRESHOLD;
  let a = after;
  for (let guard = 0; guard < 1e6; guard++) {
    const state = on(nextUp(a));
    const b = w.nextBreakpoint(a);
    if (!Number.isFinite(b)) return Infinity;
    const left = nextDown(b);
    if (left > a && on(left) !== state) {
      // A crossing inside (a, b): bisect on the reading.
      let lo = nextUp(a);
      let hi = left;
      for (let k = 0; k < GATE_BISECTIONS && nextUp(lo) < hi; k++) {
        const mid = lo + 0.5 * (hi - lo);
        if (on(mid) === state) lo = mid;
        else hi = mid;
      }
      return hi;
    }
    if (on(b) !== state) return b;
    a = b;
  }
  return Infinity;
}

/** Held-value lists a schedule remembers for sharing (a drive with a few levels needs a few). */
const HELD_LISTS_KEPT = 4;

/**
 * Relative spacing below which two breakpoints count as one: 1000 units of
 * round-off (about 1.1e-13 relative), 100 times the solver's smallest step.
 *
 * @example
 * ```ts
 * const mergeGap = BREAKPOINT_MERGE * Math.max(Math.abs(t), 1e-10 * (t1 - t0));
 * ```
 */
export const BREAKPOINT_MERGE = 1000 * (Number.EPSILON / 2);

/** Merge gap at time t for a run spanning `span` seconds (see {@link BREAKPOINT_MERGE}). */
function mergeGap(t: number, span: number): number {
  return BREAKPOINT_MERGE * Math.max(Math.abs(t), 1e-10 * span);
}

function sourceLabel(el: ElementDescription): { label: string; element: string } {
  return { label: `${elementKind(el).noun} "${el.name}"`, element: el.name };
}

/** The element's gate waveform (gate-driven switches), compiled; undefined for elements without one. */
function ownGate(el: ElementDescription): Waveform | undefined {
  const spec = elementKind(el).gate?.(el);
  return spec === undefined ? undefined : compileWaveform(spec, { label: `${elementKind(el).noun} "${el.name}" gate`, element: el.name });
}

/** The element's own waveform (sources), compiled; undefined for elements without one. */
function ownWaveform(el: ElementDescription): Waveform | undefined {
  const spec = elementKind(el).waveform?.(el);
  return spec === undefined ? undefined : compileWaveform(spec, sourceLabel(el));
}

/**
 * The inputs of a network as a value: compiled waveforms, switch schedules
 * and the set-points, switch states and waveforms that embedding code put in
 * their place. Immutable: a change gives a new schedule, so a schedule
 * recorded with a step still says what was in force then.
 *
 * @example
 * ```ts
 * const schedule = InputSchedule.of(description).withSource(2, 10); // element 2 held at 10 V
 * schedule.nextEdge(0); // first breakpoint after t = 0 of the inputs that follow a schedule
 * ```
 */
export class InputSchedule {
  private constructor(
    private readonly description: NetworkDescription,
    private readonly waveforms: readonly (Waveform | undefined)[],
    private readonly replaced: ReadonlyMap<number, WaveformSpec>,
    private readonly sourceOverride: readonly (number | undefined)[],
    private readonly switchOverride: readonly (boolean | undefined)[],
    private readonly switchInitial: readonly boolean[],
    private readonly switchToggles: readonly (readonly number[])[],
    /** Whether element e follows a switching schedule. */
    private readonly hasSchedule: readonly boolean[],
    /** Compiled gate waveforms of gate-driven switches (undefined elsewhere). */
    private readonly gates: readonly (Waveform | undefined)[],
    /** Gate specs put in place of the description's by embedding code. */
    private readonly replacedGates: ReadonlyMap<number, WaveformSpec>,
    /** Discrete device states (ideal diodes on/off), held until the run changes them. */
    readonly deviceStates: readonly boolean[],
  ) {}

  /** The schedule of a description: its waveforms and switch schedules, no overrides. */
  static of(description: NetworkDescription): InputSchedule {
    const els = description.elements;
    const schedules = els.map((e) => elementKind(e).schedule?.(e));
    const gates = els.map(ownGate);
    return new InputSchedule(
      description,
      els.map(ownWaveform),
      new Map(),
      els.map(() => undefined),
      els.map(() => undefined),
      schedules.map((s) => s?.initiallyClosed ?? false),
      schedules.map((s) => s?.toggleTimes ?? []),
      schedules.map((s, e) => s !== undefined && gates[e] === undefined),
      gates,
      new Map(),
      els.map((e) => elementKind(e).deviceState?.(e) ?? false),
    );
  }

  private with(
    changes: Partial<{
      waveforms: readonly (Waveform | undefined)[];
      replaced: ReadonlyMap<number, WaveformSpec>;
      sourceOverride: readonly (number | undefined)[];
      switchOverride: readonly (boolean | undefined)[];
      gates: readonly (Waveform | undefined)[];
      replacedGates: ReadonlyMap<number, WaveformSpec>;
      deviceStates: readonly boolean[];
    }>,
  ): InputSchedule {
    return new InputSchedule(
      this.description,
      changes.waveforms ?? this.waveforms,
      changes.replaced ?? this.replaced,
      changes.sourceOverride ?? this.sourceOverride,
      changes.switchOverride ?? this.switchOverride,
      this.switchInitial,
      this.switchToggles,
      this.hasSchedule,
      changes.gates ?? this.gates,
      changes.replacedGates ?? this.replacedGates,
      changes.deviceStates ?? this.deviceStates,
    );
  }

  /** The same inputs with the discrete device states `states` (one per element; the array is kept, not copied: do not change it). */
  withDeviceStates(states: readonly boolean[]): InputSchedule {
    return this.with({ deviceStates: states });
  }

  /**
   * Gate-driven switch element e with a new gate waveform from now on
   * (validated here): the stepper's way to change a duty or a phase.
   */
  withGate(e: number, spec: WaveformSpec): InputSchedule {
    if (this.gates[e] === undefined) {
      const el = this.description.elements[e]!;
      throw new InputError('not-gate-driven', `${elementKind(el).noun} "${el.name}" has no gate; give it one in the builder (options.gate) to drive it by a waveform`, [el.name]);
    }
    const gates = [...this.gates];
    gates[e] = compileWaveform(spec, sourceLabel(this.description.elements[e]!));
    const replacedGates = new Map(this.replacedGates);
    replacedGates.set(e, spec);
    return this.with({ gates, replacedGates });
  }

  /** Whether element e is a gate-driven switch. */
  isGateDriven(e: number): boolean {
    return this.gates[e] !== undefined;
  }

  /** Source element e held at a value (V or A), or following its waveform again (undefined). */
  withSource(e: number, value: number | undefined): InputSchedule {
    const sourceOverride = [...this.sourceOverride];
    sourceOverride[e] = value;
    return this.with({ sourceOverride });
  }

  /** Switch element e held open/closed, or following its schedule again (undefined). */
  withSwitch(e: number, closed: boolean | undefined): InputSchedule {
    const switchOverride = [...this.switchOverride];
    switchOverride[e] = closed;
    return this.with({ switchOverride });
  }

  /** Source element e with a new waveform (validated here); a set-point held on it is released. */
  withWaveform(e: number, spec: WaveformSpec): InputSchedule {
    const waveforms = [...this.waveforms];
    waveforms[e] = compileWaveform(spec, sourceLabel(this.description.elements[e]!));
    const replaced = new Map(this.replaced);
    replaced.set(e, spec);
    const sourceOverride = [...this.sourceOverride];
    sourceOverride[e] = undefined;
    return this.with({ waveforms, replaced, sourceOverride });
  }

  /** Plain-data copy of what embedding code changed (overrides, replaced waveforms). */
  state(): InputState {
    return {
      sourceOverride: [...this.sourceOverride],
      switchOverride: [...this.switchOverride],
      waveforms: [...this.replaced.entries()],
      gates: [...this.replacedGates.entries()],
      deviceStates: [...this.deviceStates],
    };
  }

  /** The description's schedule with the changes of a {@link InputSchedule.state}. */
  withState(state: InputState): InputSchedule {
    let s = InputSchedule.of(this.description);
    for (const [e, spec] of state.waveforms) s = s.withWaveform(e, spec);
    for (const [e, spec] of state.gates ?? []) s = s.withGate(e, spec);
    return s.with({
      sourceOverride: [...state.sourceOverride],
      switchOverride: [...state.switchOverride],
      ...(state.deviceStates ? { deviceStates: [...state.deviceStates] } : {}),
    });
  }

  /** Value of source element e at exactly time t (no choice of side at a breakpoint). */
  sourceValueAt(e: number, t: number): number {
    const o = this.sourceOverride[e];
    if (o !== undefined) return o;
    return this.waveforms[e]!.value(t);
  }

  /**
   * The value of each source element that holds one value at every time in
   * [a, b], where no input has a breakpoint strictly between a and b (an
   * input interval's sides): a held set-point, or a piecewise-linear
   * waveform with equal values at a and b. Undefined for the others (and
   * for other waveforms, which are never evaluated here: a user function is
   * called only at the times the solver asks for).
   */
  heldSources(a: number, b: number): readonly (number | undefined)[] {
    const out = (this.heldScratch ??= new Array<number | undefined>(this.waveforms.length));
    for (let e = 0; e < this.waveforms.length; e++) {
      const o = this.sourceOverride[e];
      const w = this.waveforms[e];
      let v: number | undefined;
      if (o !== undefined) v = o;
      else if (w?.piecewiseLinear === true) {
        const va = w.value(a);
        v = va === w.value(b) && Number.isFinite(va) ? va : undefined;
      }
      out[e] = v;
    }
    return this.internHeld(out);
  }

  /** Held-value lists handed out so far, most recent first (see internHeld). */
  private heldSeen: (readonly (number | undefined)[])[] | undefined;
  private heldScratch: (number | undefined)[] | undefined;

  /**
   * A list equal to `values` (entry by entry, Object.is: 0 and -0 apart)
   * handed out before, else a copy of it, remembered. A square drive holds
   * one of two values interval after interval: its thousands of intervals
   * share two lists instead of making one each (garbage the run's
   * collections had to copy). The lists are read only.
   */
  private internHeld(values: readonly (number | undefined)[]): readonly (number | undefined)[] {
    const seen = (this.heldSeen ??= []);
    for (let k = 0; k < seen.length; k++) {
      const list = seen[k]!;
      let same = true;
      for (let e = 0; same && e < values.length; e++) same = Object.is(list[e], values[e]);
      if (same) return list;
    }
    const copy = values.slice();
    seen.unshift(copy);
    if (seen.length > HELD_LISTS_KEPT) seen.length = HELD_LISTS_KEPT;
    return copy;
  }

  /** Whether switch element e is closed at exactly time t (toggles at or before t count). */
  switchClosedAt(e: number, t: number): boolean {
    const o = this.switchOverride[e];
    if (o !== undefined) return o;
    const gate = this.gates[e];
    if (gate !== undefined) return gate.value(t) > GATE_THRESHOLD;
    const toggles = this.switchToggles[e]!;
    // Number of toggles at or before t (binary search: schedules can be long).
    let lo = 0;
    let hi = toggles.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (toggles[mid]! <= t) lo = mid + 1;
      else hi = mid;
    }
    return this.switchInitial[e]! !== (lo % 2 === 1);
  }

  /** The first time after `after` where an input that follows its schedule jumps or kinks (Infinity if none). */
  nextEdge(after: number): number {
    let next = Infinity;
    // A plain loop (no closure per call: this runs at every interval).
    for (let e = 0; e < this.description.elements.length; e++) {
      const w = this.waveforms[e];
      if (w && this.sourceOverride[e] === undefined) next = Math.min(next, w.nextBreakpoint(after));
      const gate = this.gates[e];
      if (gate && this.switchOverride[e] === undefined) next = Math.min(next, nextGateEdge(gate, after));
      if (this.hasSchedule[e] && this.switchOverride[e] === undefined) {
        const toggles = this.switchToggles[e]!;
        let lo = 0;
        let hi = toggles.length;
        while (lo < hi) {
          const mid = (lo + hi) >> 1;
          if (toggles[mid]! <= after) lo = mid + 1;
          else hi = mid;
        }
        if (lo < toggles.length) next = Math.min(next, toggles[lo]!);
      }
    }
    return next;
  }

  /**
   * Sorted, distinct times in (t0, t1) where an input jumps or kinks, with
   * times closer than {@link BREAKPOINT_MERGE} x max(|t|, 1e-10 (t1 - t0))
   * to the previous one kept (or to t0, t1) merged into it, found edge by
   * edge (so a drive with a tiny period costs one step per edge, not one
   * array of every edge at once).
   */
  breakpoints(t0: number, t1: number): number[] {
    const out: number[] = [];
    const span = t1 - t0;
    let at = t0;
    for (;;) {
      const t = this.nextEdge(at + mergeGap(at, span));
      if (!(t < t1 - mergeGap(t1, span))) return out;
      out.push(t);
      at = t;
    }
  }
}

/**
 * The inputs in force over one input interval [start, end] of a run: an
 * immutable value that travels with every evaluation of the network and is
 * recorded with every step and sample, so a result read at any time uses
 * the inputs that were in force then, and no reader can change a live run.
 *
 * Inputs are piecewise smooth; at a breakpoint the value depends on the side
 * we come from: at t <= start the value gives the right limit (after every
 * edge merged into the start), at t >= end the left limit. So a step that
 * ends on a switching instant sees the old inputs, and the restart there
 * sees the new ones.
 *
 * @example
 * ```ts
 * const inputs = openInterval(InputSchedule.of(description), 0, 0.02, 0.02);
 * inputs.sourceValue(2, 0); // V or A
 * ```
 */
export class InputsInForce implements InputView {
  /**
   * @param rightOf time at which inputs are evaluated for t <= start
   * @param leftOf time at which inputs are evaluated for t >= end
   */
  constructor(
    readonly schedule: InputSchedule,
    readonly start: number,
    readonly end: number,
    readonly rightOf: number,
    readonly leftOf: number,
  ) {}

  private sided(t: number): number {
    if (t >= this.end) return this.leftOf;
    if (t <= this.start) return this.rightOf;
    return t;
  }

  /** Source values held over [rightOf, leftOf] (see InputSchedule.heldSources), found on first use. */
  private held: readonly (number | undefined)[] | undefined;

  /** Value of source element e at time t (V or A). */
  sourceValue(e: number, t: number): number {
    const u = this.sided(t);
    if (u >= this.rightOf && u <= this.leftOf) {
      // A drive held over the interval (a square wave between its edges): the value without the waveform's search.
      const v = (this.held ??= this.schedule.heldSources(this.rightOf, this.leftOf))[e];
      if (v !== undefined) return v;
    }
    return this.schedule.sourceValueAt(e, u);
  }

  /** Whether switch element e is closed at time t. */
  switchClosed(e: number, t: number): boolean {
    return this.schedule.switchClosedAt(e, this.sided(t));
  }

  /** Whether device element e (an ideal diode) conducts over this interval. */
  deviceOn(e: number): boolean {
    return this.schedule.deviceStates[e]!;
  }

  /** The same inputs ending at `end` instead (a stop time within round-off of the breakpoint); the left limit stays before the edge. */
  endingAt(end: number): InputsInForce {
    return new InputsInForce(this.schedule, this.start, end, Math.min(this.rightOf, end), Number.isFinite(end) ? nextDown(Math.min(end, this.end)) : this.leftOf);
  }

  /** The same interval under another schedule (an input changed at the present time). */
  withSchedule(schedule: InputSchedule): InputsInForce {
    return new InputsInForce(schedule, this.start, this.end, this.rightOf, this.leftOf);
  }
}

/**
 * The input interval that starts at t under a schedule: it ends at the next
 * breakpoint (Infinity when there is none up to `horizon`), found on demand.
 * Edges closer to t than the merge gap ({@link BREAKPOINT_MERGE}) count as
 * a jump at t: the interval starts with the values after them (an interval
 * that short could not be integrated, and the change across it is a jump at
 * double precision). `span` is the run's length, for the gap near t = 0.
 *
 * @example
 * ```ts
 * const first = openInterval(schedule, 0, 0.02, 0.02);
 * const second = openInterval(schedule, first.end, 0.02, 0.02);
 * ```
 */
export function openInterval(schedule: InputSchedule, t: number, horizon: number, span: number): InputsInForce {
  const gap = mergeGap(t, span);
  const first = schedule.nextEdge(t);
  const merged = first - t <= gap;
  const next = merged ? schedule.nextEdge(t + gap) : first;
  const end = next <= horizon ? next : Infinity;
  // Waveforms are right-continuous: at t + gap every merged edge is behind.
  const rightOf = merged ? t + gap : nextUp(t);
  return new InputsInForce(schedule, t, end, Number.isFinite(end) ? Math.min(rightOf, end) : rightOf, Number.isFinite(end) ? nextDown(end) : end);
}

/**
 * The network's own inputs, for code that reads quantities without being
 * given an {@link InputsInForce} (the state reader, the energy audit, the
 * projection of interpolated states): it reads the value made current by
 * {@link NetworkInputs.use} (a run, for present values) or, for the
 * duration of one call, by {@link NetworkInputs.during} (a reader of
 * recorded results, which puts back what was current). A run itself never
 * reads it: it passes its own value to every evaluation
 * (`compiled.evaluate(t, y, inputs, out)`), so no reader can change a live
 * run.
 *
 * @example
 * ```ts
 * const inputs = new NetworkInputs(description);
 * const value = openInterval(inputs.schedule, 0, 0.02, 0.02);
 * inputs.during(value, () => reader.build(request)(y, 0.01));
 * ```
 */
export class NetworkInputs implements InputView {
  /** The description's schedule (no overrides). */
  readonly schedule: InputSchedule;
  private current: InputsInForce;

  constructor(description: NetworkDescription) {
    this.schedule = InputSchedule.of(description);
    // Before any run: the description's schedule at t itself (no interval, so no side to choose).
    this.current = new InputsInForce(this.schedule, -Infinity, Infinity, -Infinity, Infinity);
  }

  /** The inputs every evaluation sees now. */
  get inForce(): InputsInForce {
    return this.current;
  }

  /** Make `value` the inputs of every evaluation from now on (the run does this per interval). */
  use(value: InputsInForce): void {
    this.current = value;
  }

  /** Run fn with `value` in force, then put back what was in force before (readers of recorded results). */
  during<T>(value: InputsInForce, fn: () => T): T {
    const before = this.current;
    this.current = value;
    try {
      return fn();
    } finally {
      this.current = before;
    }
  }

  /**
   * Make the interval [a, b] of the present schedule current (for code that
   * names an interval by its ends). Prefer {@link NetworkInputs.use} or
   * {@link NetworkInputs.during} with a recorded value.
   */
  setInterval(a: number, b: number): void {
    this.current = new InputsInForce(this.current.schedule, a, b, Number.isFinite(a) ? Math.min(nextUp(a), b) : a, Number.isFinite(b) ? nextDown(b) : b);
  }

  /** Value of source element e at time t (V or A), under the inputs in force. */
  sourceValue(e: number, t: number): number {
    return this.current.sourceValue(e, t);
  }

  /** Whether switch element e is closed at time t, under the inputs in force. */
  switchClosed(e: number, t: number): boolean {
    return this.current.switchClosed(e, t);
  }

  /** Whether device element e (an ideal diode) conducts, under the inputs in force. */
  deviceOn(e: number): boolean {
    return this.current.deviceOn(e);
  }

  /** The description's breakpoints in (t0, t1), merged (see {@link InputSchedule.breakpoints}). */
  breakpoints(t0: number, t1: number): number[] {
    return this.schedule.breakpoints(t0, t1);
  }
}
