import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { createDaeIntegrator, type DaeIntegrator, type DaeIntegratorSnapshot } from '../solver/dae-integrator.js';
import type { DaeEvent, DaeEventRecord, DaeFailure, DaeStatus, SolverStats } from '../solver/types.js';
import { evaluateRecordedStep, stageExtrapolation, type RecordedStep } from './recorded-step.js';
import { createProjector } from './projection.js';
import type { InputState } from '../formulation/network-inputs.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';

/** Solver settings of a run (already resolved from the user's options). */
export interface RunSettings {
  readonly rtol: number;
  readonly atol: number | Float64Array;
  readonly maxStep?: number;
  readonly initialStep?: number;
  readonly maxSteps?: number;
  readonly maxWallTimeMs?: number;
  readonly signal?: AbortSignal;
  /** Start time. */
  readonly t0: number;
  /** Latest time the run may reach (the integrator's end of span). */
  readonly horizon: number;
  /** Event functions on the state (threshold crossings). */
  readonly events?: readonly DaeEvent[];
  /** Initial state to use instead of the network's initial conditions (raw state vector). */
  readonly initialState?: ArrayLike<number>;
}

/**
 * Two times closer than this (1e-12 relative) are the same instant for
 * stepping purposes: a stop time computed by a sum of periods and a
 * breakpoint computed by a product differ by round-off, and a step that
 * short is near the solver's round-off limit.
 */
export function timeTolerance(t: number): number {
  return 1e-12 * Math.max(Math.abs(t), Number.MIN_VALUE);
}

/** A run's restorable state (plain data). */
export interface RunSnapshot {
  readonly integrator: DaeIntegratorSnapshot;
  readonly interval: { readonly start: number; readonly end: number };
  readonly inputs: InputState;
  readonly status: 'running' | DaeStatus;
  readonly inputsChanged: boolean;
}

/** One stored sample. */
export interface RunSample {
  readonly t: number;
  readonly y: Float64Array;
  /** Index of the input interval it belongs to (see {@link NetworkRun.intervals}). */
  readonly interval: number;
}

/** How {@link NetworkRun.advanceTo} records what it computes. */
export interface RecordOptions {
  /** Keep the state at every accepted step (and both sides of every breakpoint). */
  readonly steps: boolean;
  /** Also keep samples at these times (sorted, in (t, tStop]); see `exact`. */
  readonly sampleTimes?: readonly number[];
  /**
   * Make the solver stop at every sample time (values at tolerance accuracy)
   * instead of evaluating the collocation polynomial between steps (cheaper,
   * third-order interpolation).
   */
  readonly exact?: boolean;
  /** Keep every step's interpolant (for dense output and the energy audit). */
  readonly interpolants: boolean;
  /** Called after accepted steps. */
  readonly onStep?: (t: number) => void;
}

/**
 * A running simulation of a compiled network on the stepping Radau IIA
 * integrator. It integrates one input interval (between consecutive
 * breakpoints of sources and switches) at a time: inputs are told the
 * interval so that a step ending on a switching instant sees the old input
 * values and the restart there sees the new ones; at each breakpoint the
 * integrator restarts (consistent re-initialisation of the algebraic
 * unknowns, step history dropped, step size kept).
 *
 * Used by `simulate` (one advance to the stop time) and by the stepping
 * interface for embedding (many short advances, input changes, snapshots).
 *
 * @example
 * ```ts
 * const run = new NetworkRun(compileNetwork(net.describe()), settings);
 * run.advanceTo(0.02, { steps: true, interpolants: true });
 * ```
 */
export class NetworkRun {
  readonly compiled: CompiledNetwork;
  private readonly integ: DaeIntegrator;
  private readonly index2: readonly number[];
  /** Input intervals in time order: [start, end]. */
  readonly intervals: { start: number; end: number }[] = [];
  /** Samples recorded so far, in time order. */
  readonly samples: RunSample[] = [];
  /** Step interpolants recorded so far, in time order. */
  readonly steps: RecordedStep[] = [];
  /** Events located so far. */
  readonly events: DaeEventRecord[] = [];
  private inputsChanged = false;
  /** The sample recorded at the last (re)start, whose index-2 values the next step repairs. */
  private pendingStartSample: number | undefined;
  /** The state at the start of the run (after initialisation; index-2 values from the first step). */
  private startState: Float64Array | undefined;
  private startStatePending = false;
  private restartPending = true;
  private statusCur: 'running' | DaeStatus;
  private readonly horizon: number;
  private lastIntervalLength = 0;
  private readonly adjusted = new Set<number>();
  /**
   * Projects an interpolated state onto the algebraic equations (see
   * createProjector); the inputs' interval must be set for t.
   */
  readonly project: (t: number, y: Float64Array) => void;

  constructor(compiled: CompiledNetwork, settings: RunSettings) {
    this.compiled = compiled;
    this.index2 = compiled.index2;
    this.horizon = settings.horizon;
    this.project = createProjector(compiled, settings.atol, settings.rtol);
    this.integ = createDaeIntegrator(
      {
        size: compiled.layout.size,
        rhs: compiled.rhs,
        jacobian: compiled.jacobian,
        mass: compiled.mass,
        y0: settings.initialState ?? compiled.y0,
        t0: settings.t0,
        tEnd: settings.horizon,
        index2: compiled.index2,
        ...(settings.events ? { events: settings.events } : {}),
      },
      {
        rtol: settings.rtol,
        atol: settings.atol,
        ...(settings.maxStep !== undefined ? { maxStep: settings.maxStep } : {}),
        ...(settings.initialStep !== undefined ? { initialStep: settings.initialStep } : {}),
        ...(settings.maxSteps !== undefined ? { maxSteps: settings.maxSteps } : {}),
        ...(settings.maxWallTimeMs !== undefined ? { maxWallTimeMs: settings.maxWallTimeMs } : {}),
        ...(settings.signal ? { signal: settings.signal } : {}),
      },
    );
    for (const i of this.integ.adjustedAtStart) this.adjusted.add(i);
    // The integrator initialised at t0 with the inputs of no interval yet; redo it on the right side.
    this.startInterval(settings.t0);
    this.statusCur = this.integ.status;
  }

  /** Present time, s. */
  get t(): number {
    return this.integ.t;
  }

  /** Present state (a copy). */
  get y(): Float64Array {
    return this.integ.y;
  }

  /** `'running'`, or why the run stopped. */
  get status(): 'running' | DaeStatus {
    return this.statusCur;
  }

  get message(): string {
    return this.integ.message;
  }

  get failure(): DaeFailure | undefined {
    return this.integ.failure;
  }

  get stats(): SolverStats {
    return this.integ.stats;
  }

  /** Differential unknowns any (re)initialisation so far moved to meet an index-2 hidden constraint. */
  get adjustedAtStart(): readonly number[] {
    return [...this.adjusted].sort((a, b) => a - b);
  }

  /** Hold a source at a value (or release it with undefined); takes effect at the present time. */
  overrideSource(element: number, value: number | undefined): void {
    this.compiled.inputs.overrideSource(element, value);
    this.inputsChanged = true;
  }

  /** Hold a switch open/closed (or release it with undefined); takes effect at the present time. */
  overrideSwitch(element: number, closed: boolean | undefined): void {
    this.compiled.inputs.overrideSwitch(element, closed);
    this.inputsChanged = true;
  }

  /**
   * Integrate to `tStop` (landing on it exactly), restarting at every input
   * breakpoint on the way. Stops early on a terminal event or a failure;
   * returns the status.
   */
  advanceTo(tStop: number, record: RecordOptions): 'running' | DaeStatus {
    if (!(tStop >= this.t) || tStop > this.horizon) {
      throw new InputError(
        'bad-stop-time',
        `cannot advance to t = ${tStop} s: the run is at t = ${this.t} s and may go up to ${this.horizon} s`,
        ['tStop'],
      );
    }
    if (this.statusCur !== 'running') return this.statusCur;
    if (this.inputsChanged) {
      this.inputsChanged = false;
      this.startInterval(this.t);
      if (this.statusCur !== 'running') return this.statusCur;
    }
    if (this.restartPending) this.recordStart(record);
    const samples = (record.sampleTimes ?? []).filter((s) => s > this.t && s <= tStop);
    let nextSample = 0;
    while (tStop - this.t > timeTolerance(tStop) && this.statusCur === 'running') {
      const interval = this.intervals[this.intervals.length - 1]!;
      // A stop a few round-offs away from a breakpoint is that breakpoint (no step is that short);
      // it takes the caller's time value, so a run ends exactly at its stop time.
      if (interval.end !== tStop && Math.abs(interval.end - tStop) <= timeTolerance(tStop)) {
        interval.end = tStop;
        this.compiled.inputs.setInterval(interval.start, tStop);
      }
      const edge = Math.min(interval.end, tStop);
      while (this.t < edge) {
        const sample = record.exact && nextSample < samples.length ? samples[nextSample]! : Infinity;
        const target = edge - sample <= timeTolerance(edge) ? edge : Math.min(edge, sample);
        const r = this.integ.step(target);
        if (r.status !== 'accepted' && r.status !== 'terminal-event') {
          this.statusCur = this.integ.status;
          return this.statusCur;
        }
        for (const e of r.events) this.events.push(e);
        const step = this.recordStep(record);
        // Samples inside the step first (time order), then the step's end.
        while (nextSample < samples.length && samples[nextSample]! < this.t) {
          const ts = samples[nextSample]!;
          const y = evaluateRecordedStep(step, ts, this.index2);
          this.project(ts, y);
          this.pushSample(ts, y);
          nextSample++;
        }
        const endIsSample = nextSample < samples.length && samples[nextSample] === this.t;
        if (endIsSample) nextSample++;
        if (record.steps || endIsSample) this.pushSample(this.t, this.integ.y);
        record.onStep?.(this.t);
        if (r.status === 'terminal-event') {
          this.statusCur = 'terminal-event';
          return this.statusCur;
        }
      }
      if (this.t === interval.end) {
        // A switching instant: the inputs change here.
        this.startInterval(this.t);
        if (this.statusCur !== 'running') return this.statusCur;
        this.recordStart(record);
      }
    }
    return this.statusCur;
  }

  /** Copy of the run's state for what-if runs: integrator, input interval and input changes (plain data). */
  snapshot(): RunSnapshot {
    const last = this.intervals[this.intervals.length - 1]!;
    return {
      integrator: this.integ.snapshot(),
      interval: { ...last },
      inputs: this.compiled.inputs.state(),
      status: this.statusCur,
      inputsChanged: this.inputsChanged,
    };
  }

  /**
   * Continue from a snapshot of this run. Recorded samples and steps after
   * the snapshot's time are dropped, so the record stays one history.
   */
  restore(s: RunSnapshot): void {
    this.integ.restore(s.integrator);
    this.compiled.inputs.setState(s.inputs);
    const t = s.integrator.t;
    while (this.samples.length > 0 && this.samples[this.samples.length - 1]!.t > t) this.samples.pop();
    while (this.steps.length > 0 && this.steps[this.steps.length - 1]!.t > t) this.steps.pop();
    while (this.events.length > 0 && this.events[this.events.length - 1]!.t > t) this.events.pop();
    this.intervals.push({ ...s.interval });
    this.compiled.inputs.setInterval(s.interval.start, s.interval.end);
    this.statusCur = s.status;
    this.inputsChanged = s.inputsChanged;
  }

  /** After a terminal event: continue from the event time (inputs may have changed), re-initialising there. */
  resume(record: RecordOptions): 'running' | DaeStatus {
    if (this.statusCur !== 'terminal-event') return this.statusCur;
    this.inputsChanged = false;
    if (this.startInterval(this.t) === 'running') this.recordStart(record);
    return this.statusCur;
  }

  /** Replace a source's waveform from now on. */
  replaceWaveform(element: number, spec: WaveformSpec): void {
    this.compiled.inputs.replaceWaveform(element, spec);
    this.inputsChanged = true;
  }

  /** The first input breakpoint after t (searched in growing windows, so long periodic drives stay cheap). */
  private nextBreakpoint(t: number): number {
    let width = this.lastIntervalLength > 0 ? this.lastIntervalLength : (this.horizon - t) / 64;
    for (;;) {
      const end = Math.min(this.horizon, t + width);
      // Breakpoints are searched in the open interval (t, upper) and merged into its ends when
      // closer than round-off: reach past the horizon so that one exactly at it is kept.
      const upper = end === this.horizon ? end + 1e-9 * Math.max(Math.abs(end), end - t) : end;
      const found = this.compiled.inputs.breakpoints(t, upper).filter((b) => b <= this.horizon);
      if (found.length > 0) return found[0]!;
      if (end >= this.horizon) return Infinity;
      width *= 4;
    }
  }

  /** Begin a new input interval at time t: tell the inputs, re-initialise consistently. */
  private startInterval(t: number): 'running' | DaeStatus {
    const previous = this.intervals[this.intervals.length - 1];
    if (previous && Number.isFinite(previous.end)) this.lastIntervalLength = previous.end - previous.start;
    const next = this.nextBreakpoint(t);
    this.compiled.inputs.setInterval(t, next);
    this.intervals.push({ start: t, end: next });
    this.statusCur = this.integ.restart(undefined, { capStepByEstimate: true });
    for (const i of this.integ.adjustedAtStart) this.adjusted.add(i);
    this.restartPending = true;
    return this.statusCur;
  }

  /** State at the start of the run, after consistent initialisation (undefined before the first advance). */
  get initialState(): Float64Array | undefined {
    return this.startState ? Float64Array.from(this.startState) : undefined;
  }

  /** Record the state at a (re)start: the right-hand side of a breakpoint, or t0. */
  private recordStart(record: RecordOptions): void {
    this.restartPending = false;
    if (!this.startState) {
      this.startState = this.integ.y;
      this.startStatePending = true;
    }
    if (record.steps || (record.sampleTimes ?? []).includes(this.t)) {
      this.pushSample(this.t, this.integ.y);
      this.pendingStartSample = this.samples.length - 1;
    } else {
      this.pendingStartSample = undefined;
    }
  }

  private recordStep(record: RecordOptions): RecordedStep {
    const it = this.integ.interpolant!;
    const first = this.steps.length === 0 || this.steps[this.steps.length - 1]!.t !== it.tOld || this.lastStepEndedInterval();
    const step: RecordedStep = {
      tOld: it.tOld, t: it.t, h: it.h, yOld: it.yOld, q: it.q,
      interval: this.intervals.length - 1,
      firstAfterStart: first,
    };
    if (first && this.index2.length > 0) {
      // The index-1 initialisation cannot set index-2 unknowns; take them from this step's stages.
      const y0 = stageExtrapolation(step, this.index2);
      if (this.pendingStartSample !== undefined) {
        const sample = this.samples[this.pendingStartSample]!;
        for (const j of this.index2) sample.y[j] = y0[j]!;
      }
      if (this.startStatePending && this.startState) for (const j of this.index2) this.startState[j] = y0[j]!;
    }
    this.pendingStartSample = undefined;
    this.startStatePending = false;
    if (record.interpolants) this.steps.push(step);
    else this.steps.splice(0, this.steps.length, step);
    return step;
  }

  private lastStepEndedInterval(): boolean {
    const last = this.steps[this.steps.length - 1];
    return last !== undefined && last.interval !== this.intervals.length - 1;
  }

  private pushSample(t: number, y: Float64Array): void {
    this.samples.push({ t, y: Float64Array.from(y), interval: this.intervals.length - 1 });
  }
}
