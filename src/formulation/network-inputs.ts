import { elementKind } from '../elements/registry.js';
import type { ElementDescription, NetworkDescription } from '../network/description.js';
import { compileWaveform, type WaveformSpec } from '../waveforms/waveform-spec.js';
import type { Waveform } from '../waveforms/waveform.js';

/** What embedding code changed in a network's inputs (plain data). */
export interface InputState {
  readonly sourceOverride: readonly (number | undefined)[];
  readonly switchOverride: readonly (boolean | undefined)[];
  readonly waveforms: readonly (readonly [number, WaveformSpec])[];
}

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

/** The float next above x (x finite). */
export function nextUp(x: number): number {
  if (x === 0) return Number.MIN_VALUE;
  const buf = new Float64Array([x]);
  const bits = new BigInt64Array(buf.buffer);
  bits[0] = bits[0]! + (x > 0 ? 1n : -1n);
  return buf[0]!;
}

/** The float next below x (x finite). */
export function nextDown(x: number): number {
  return -nextUp(-x);
}

/**
 * Time-dependent inputs of a compiled network: source waveforms and switch
 * states, plus overrides set by embedding code between advances.
 *
 * Inputs are piecewise smooth; at a breakpoint the value depends on the side
 * we come from. The driver integrates one interval [a, b] between
 * consecutive breakpoints at a time and tells the inputs which interval is
 * active: at t <= a they give the right limit, at t >= b the left limit. So
 * a step that ends on a switching instant sees the old state, and the
 * restart there sees the new one.
 */
export class NetworkInputs {
  private readonly waveforms: (Waveform | undefined)[];
  /** Waveforms given by embedding code in place of the description's (by element). */
  private readonly replaced = new Map<number, WaveformSpec>();
  private readonly sourceOverride: (number | undefined)[];
  private readonly switchOverride: (boolean | undefined)[];
  private readonly switchInitial: boolean[];
  private readonly switchToggles: (readonly number[])[];
  /** Whether element e follows a switching schedule. */
  private readonly hasSchedule: boolean[];
  private intervalStart = -Infinity;
  private intervalEnd = Infinity;
  /** Breakpoint kept -> last time merged into it (a cluster of edges that counts as one jump at that time). */
  private readonly clusterEnd = new Map<number, number>();
  /** End of a span -> earliest time merged into it from before. */
  private readonly clusterStart = new Map<number, number>();

  constructor(private readonly description: NetworkDescription) {
    const els = description.elements;
    this.waveforms = els.map((e) => this.compileOwnWaveform(e));
    this.sourceOverride = els.map(() => undefined);
    this.switchOverride = els.map(() => undefined);
    const schedules = els.map((e) => elementKind(e).schedule?.(e));
    this.switchInitial = schedules.map((s) => s?.initiallyClosed ?? false);
    this.switchToggles = schedules.map((s) => s?.toggleTimes ?? []);
    this.hasSchedule = schedules.map((s) => s !== undefined);
  }

  /** The element's own waveform (sources), compiled; undefined for elements without one. */
  private compileOwnWaveform(e: ElementDescription): Waveform | undefined {
    const spec = elementKind(e).waveform?.(e);
    return spec === undefined ? undefined : compileWaveform(spec, { label: `${elementKind(e).noun} "${e.name}"`, element: e.name });
  }

  /** Declare the interval being integrated (see the class comment). */
  setInterval(a: number, b: number): void {
    this.intervalStart = a;
    this.intervalEnd = b;
  }

  /**
   * Time at which to evaluate piecewise inputs for a call at t: just after
   * the start of the interval (after every edge merged into it), just before
   * its end (before every edge merged into it), t in between.
   */
  private sided(t: number): number {
    const a = this.intervalStart;
    const b = this.intervalEnd;
    if (t >= b) return nextDown(Math.max(this.clusterStart.get(b) ?? b, a));
    if (t <= a) return nextUp(Math.min(this.clusterEnd.get(a) ?? a, b));
    return t;
  }

  /** Value of source element e at time t (V or A). */
  sourceValue(e: number, t: number): number {
    const o = this.sourceOverride[e];
    if (o !== undefined) return o;
    return this.waveforms[e]!.value(this.sided(t));
  }

  /** Whether switch element e is closed at time t. */
  switchClosed(e: number, t: number): boolean {
    const o = this.switchOverride[e];
    if (o !== undefined) return o;
    const ts = this.sided(t);
    const toggles = this.switchToggles[e]!;
    // Number of toggles at or before ts (binary search: schedules can be long).
    let lo = 0;
    let hi = toggles.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (toggles[mid]! <= ts) lo = mid + 1;
      else hi = mid;
    }
    return this.switchInitial[e]! !== (lo % 2 === 1);
  }

  /** Hold a source at a fixed value (embedding), or undefined to follow its waveform again. */
  overrideSource(e: number, value: number | undefined): void {
    this.sourceOverride[e] = value;
  }

  /** Hold a switch open/closed (embedding), or undefined to follow its schedule again. */
  overrideSwitch(e: number, closed: boolean | undefined): void {
    this.switchOverride[e] = closed;
  }

  /** Replace a source's waveform (embedding: a new duty cycle, amplitude or phase); validated here. */
  replaceWaveform(e: number, spec: WaveformSpec): void {
    const el = this.description.elements[e]!;
    this.waveforms[e] = compileWaveform(spec, { label: `${elementKind(el).noun} "${el.name}"`, element: el.name });
    this.replaced.set(e, spec);
    this.sourceOverride[e] = undefined;
  }

  /** Plain-data copy of everything embedding code changed (overrides, replaced waveforms). */
  state(): InputState {
    return {
      sourceOverride: [...this.sourceOverride],
      switchOverride: [...this.switchOverride],
      waveforms: [...this.replaced.entries()],
    };
  }

  /** Go back to a state from {@link NetworkInputs.state}. */
  setState(state: InputState): void {
    state.sourceOverride.forEach((v, e) => (this.sourceOverride[e] = v));
    state.switchOverride.forEach((v, e) => (this.switchOverride[e] = v));
    for (const e of [...this.replaced.keys()]) {
      if (!state.waveforms.some(([k]) => k === e)) {
        this.waveforms[e] = this.compileOwnWaveform(this.description.elements[e]!);
        this.replaced.delete(e);
      }
    }
    for (const [e, spec] of state.waveforms) this.replaceWaveform(e, spec);
    state.sourceOverride.forEach((v, e) => (this.sourceOverride[e] = v));
  }

  /**
   * Sorted, distinct times in (t0, t1) where an input jumps or kinks. Times
   * closer than {@link BREAKPOINT_MERGE} x max(|t|, 1e-10 (t1 - t0)) to the
   * previous one kept (or to t0, t1) are merged into it: an interval that
   * short is below the integrator's round-off floor on the step size
   * (10 uround |t|) and could not be integrated, while the input change across
   * it (a pulse edge of 1e-18 s at t = 1 ms) is a jump at double precision
   * anyway. The inputs remember the merge, so an interval starting at a kept
   * time sees the values after the whole cluster of edges, and one ending at
   * t1 the values before the edges merged into t1.
   */
  breakpoints(t0: number, t1: number): number[] {
    const all: number[] = [];
    this.description.elements.forEach((_el, e) => {
      const w = this.waveforms[e];
      if (w && this.sourceOverride[e] === undefined) all.push(...w.breakpoints(t0, t1));
      if (this.hasSchedule[e] && this.switchOverride[e] === undefined) {
        for (const t of this.switchToggles[e]!) if (t > t0 && t < t1) all.push(t);
      }
    });
    all.sort((x, y) => x - y);
    const out: number[] = [];
    const gap = (t: number): number => BREAKPOINT_MERGE * Math.max(Math.abs(t), 1e-10 * (t1 - t0));
    for (const t of all) {
      if (t < t0 || t > t1) continue;
      const previous = out.length === 0 ? t0 : out[out.length - 1]!;
      if (t1 - t <= gap(t)) {
        if (t < t1) this.clusterStart.set(t1, Math.min(this.clusterStart.get(t1) ?? t1, t));
      } else if (t - previous <= gap(t)) {
        if (t > previous) this.clusterEnd.set(previous, Math.max(this.clusterEnd.get(previous) ?? previous, t));
      } else {
        out.push(t);
      }
    }
    return out;
  }
}
