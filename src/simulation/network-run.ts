import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { createDaeIntegrator, type DaeIntegrator, type DaeIntegratorSnapshot } from '../solver/dae-integrator.js';
import type { DaeEvent, DaeEventRecord, DaeFailure, DaeStatus, SolverStats } from '../solver/types.js';
import { evaluateRecordedStep, stageExtrapolation, type RecordedStep } from './recorded-step.js';
import { createProjector } from './projection.js';
import type { InputView } from '../elements/element-kind.js';
import { DenseStampTarget } from '../elements/stamp-target.js';
import { InputsInForce, openInterval, type InputSchedule, type InputState } from '../formulation/network-inputs.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';
import type { ResolvedSolverSettings } from './solver-settings.js';

/**
 * A non-finite value found in a recorded state or in a quantity read from
 * it: what and where (see {@link RunSettings.check}).
 *
 * @example
 * ```ts
 * const hit: NonFiniteValue = { quantity: 'power', name: 'drive', value: Infinity };
 * ```
 */
export interface NonFiniteValue {
  /** The quantity (`'current'`, `'mmf'`...) or `'state'` for a raw unknown. */
  readonly quantity: string;
  /** The element, tube or node it belongs to (the unknown's label for `'state'`). */
  readonly name: string;
  readonly value: number;
}

/**
 * Settings of a run: the resolved solver settings plus its span and what it watches.
 *
 * @example
 * ```ts
 * const settings: RunSettings = { t0: 0, horizon: 0.02, rtol: 1e-6, atol: 1e-6, check: finitenessCheck(compiled) };
 * ```
 */
export interface RunSettings extends Omit<ResolvedSolverSettings, 'maxSteps'> {
  readonly maxSteps?: number;
  /** Start time. */
  readonly t0: number;
  /** Latest time the run may reach (the integrator's end of span). */
  readonly horizon: number;
  /** Event functions on the state (threshold crossings). */
  readonly events?: readonly DaeEvent[];
  /** Initial state to use instead of the network's initial conditions (raw state vector). */
  readonly initialState?: ArrayLike<number>;
  /**
   * Finiteness check of every recorded state (the inputs in force are
   * current): the first non-finite quantity, or undefined. A hit ends the
   * run with status `'non-finite'`, keeping what came before.
   */
  readonly check?: (t: number, y: Float64Array) => NonFiniteValue | undefined;
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
  readonly interval: { readonly start: number; readonly end: number; readonly rightOf: number; readonly leftOf: number };
  readonly inputs: InputState;
  readonly status: 'running' | DaeStatus;
  readonly inputsChanged: boolean;
}

/** One stored sample. */
export interface RunSample {
  readonly t: number;
  readonly y: Float64Array;
  /** Index of the input interval it belongs to: the inputs in force for it are `intervals[interval]` (see {@link NetworkRun.intervals}). */
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
  /** The inputs in force over each input interval, in time order (immutable values; steps and samples refer to them by index). */
  readonly intervals: InputsInForce[] = [];
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
  /** Length of the run's span, for the breakpoint merge gap near t = 0. */
  private readonly span: number;
  private readonly adjusted = new Set<number>();
  /** The live schedule: the description's inputs with what embedding code changed so far. */
  private schedule: InputSchedule;
  /** The inputs in force now (the last interval, or that interval under a schedule changed at the present time). */
  private live: InputsInForce;
  private readonly check: RunSettings['check'];
  /** A stop decided by the run itself (a throwing input at a sample, a non-finite quantity), overriding the integrator's account. */
  private stop: { readonly message: string; readonly failure: DaeFailure; readonly nonFinite?: NonFiniteValue & { readonly time: number } } | undefined;
  /** State at the end of the last step kept (the integrator's may be past a stop the run decided). */
  private endState: Float64Array | undefined;
  /**
   * Projects an interpolated state onto the algebraic equations (see
   * createProjector) with the network's inputs, as a reader of recorded
   * results has put them (`compiled.inputs.during`).
   */
  readonly project: (t: number, y: Float64Array) => void;
  private readonly projector: (t: number, y: Float64Array, inputs?: InputView) => void;

  constructor(compiled: CompiledNetwork, settings: RunSettings) {
    this.compiled = compiled;
    this.index2 = compiled.index2;
    this.horizon = settings.horizon;
    this.span = settings.horizon - settings.t0;
    this.check = settings.check;
    this.schedule = compiled.inputs.schedule;
    this.live = openInterval(this.schedule, settings.t0, settings.horizon, this.span);
    compiled.inputs.use(this.live);
    this.projector = createProjector(compiled, settings.atol, settings.rtol);
    this.project = (t, y) => this.projector(t, y);
    const jacobianTarget = new DenseStampTarget(compiled.layout.size);
    this.integ = createDaeIntegrator(
      {
        size: compiled.layout.size,
        // The run's own inputs in force, passed explicitly: nothing a reader does to the network's can reach it.
        rhs: (t, y, out) => compiled.evaluate(t, y, this.live, out),
        jacobian: (t, y, out) => compiled.stampJacobian(t, y, this.live, jacobianTarget.bind(out)),
        mass: compiled.mass,
        // The stamps' positions, fixed at compile time: large networks factor on them sparsely.
        ...(compiled.jacobianPattern ? { jacobianPattern: compiled.jacobianPattern } : {}),
        y0: settings.initialState ?? compiled.y0,
        t0: settings.t0,
        tEnd: settings.horizon,
        index2: compiled.index2,
        ...(settings.events ? { events: settings.events } : {}),
      },
      {
        rtol: settings.rtol,
        atol: settings.atol,
        ...(settings.atolFollowsRtol !== undefined ? { atolFollowsRtol: settings.atolFollowsRtol } : {}),
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

  /** Present time, s: the end of the last step kept. */
  get t(): number {
    return this.stop ? this.stop.failure.t : this.integ.t;
  }

  /** Present state (a copy): the end of the last step kept. */
  get y(): Float64Array {
    return this.endState ? Float64Array.from(this.endState) : this.integ.y;
  }

  /** The inputs in force now (an immutable value). */
  get inputs(): InputsInForce {
    return this.live;
  }

  /** `'running'`, or why the run stopped. */
  get status(): 'running' | DaeStatus {
    return this.statusCur;
  }

  get message(): string {
    return this.stop?.message ?? this.integ.message;
  }

  get failure(): DaeFailure | undefined {
    return this.stop?.failure ?? this.integ.failure;
  }

  /** The non-finite value that stopped the run, with its time (status `'non-finite'` from the run's check). */
  get nonFinite(): (NonFiniteValue & { readonly time: number }) | undefined {
    return this.stop?.nonFinite;
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
    this.changeSchedule(this.schedule.withSource(element, value));
  }

  /** Hold a switch open/closed (or release it with undefined); takes effect at the present time. */
  overrideSwitch(element: number, closed: boolean | undefined): void {
    this.changeSchedule(this.schedule.withSwitch(element, closed));
  }

  /**
   * A new schedule from the present time: present values read before the
   * next advance see it; recorded intervals keep the inputs of their time.
   */
  private changeSchedule(schedule: InputSchedule): void {
    this.schedule = schedule;
    this.live = this.live.withSchedule(schedule);
    this.compiled.inputs.use(this.live);
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
    // Another run or a reader on the same compiled network may have used it since.
    this.compiled.inputs.use(this.live);
    if (this.inputsChanged) {
      this.inputsChanged = false;
      this.startInterval(this.t);
      if (this.statusCur !== 'running') return this.statusCur;
    }
    if (this.restartPending) this.recordStart(record);
    // Sorted, without repeats: a repeated time is one sample (never a zero-length step that ends the run).
    const samples = [...new Set((record.sampleTimes ?? []).filter((s) => s > this.t && s <= tStop))].sort((a, b) => a - b);
    let nextSample = 0;
    while (tStop - this.t > timeTolerance(tStop) && this.statusCur === 'running') {
      // A stop a few round-offs away from a breakpoint is that breakpoint (no step is that short);
      // it takes the caller's time value, so a run ends exactly at its stop time.
      if (this.live.end !== tStop && Math.abs(this.live.end - tStop) <= timeTolerance(tStop)) {
        this.live = this.live.endingAt(tStop);
        this.intervals[this.intervals.length - 1] = this.live;
        this.compiled.inputs.use(this.live);
      }
      const edge = Math.min(this.live.end, tStop);
      while (this.t < edge) {
        // Exact samples: the solver stops at the next one that is a step away (closer ones are interpolated).
        let k = nextSample;
        while (record.exact && k < samples.length && samples[k]! - this.t <= timeTolerance(samples[k]!)) k++;
        const sample = record.exact && k < samples.length ? samples[k]! : Infinity;
        const target = edge - sample <= timeTolerance(edge) ? edge : Math.min(edge, sample);
        const r = this.integ.step(target);
        if (r.status !== 'accepted' && r.status !== 'terminal-event') {
          this.statusCur = this.integ.status;
          return this.statusCur;
        }
        for (const e of r.events) this.events.push(e);
        const step = this.recordStep(record);
        const kept = { steps: this.steps.length, samples: this.samples.length };
        // Samples inside the step first (time order), then the step's end.
        while (nextSample < samples.length && samples[nextSample]! < this.t) {
          const ts = samples[nextSample]!;
          const y = evaluateRecordedStep(step, ts, this.index2);
          // An input that throws here (a user function failing exactly at a sampling instant) ends the run as 'rhs-error'.
          try {
            this.projector(ts, y, this.live);
          } catch (cause) {
            return this.stopAt(step, kept, 'rhs-error', `f threw at t = ${ts}: ${cause instanceof Error ? cause.message : String(cause)}`, { cause });
          }
          if (!this.pushChecked(ts, y, step, kept)) return this.statusCur;
          nextSample++;
        }
        const endIsSample = nextSample < samples.length && samples[nextSample] === this.t;
        if (endIsSample) nextSample++;
        if (record.steps || endIsSample) {
          if (!this.pushChecked(this.t, this.integ.y, step, kept)) return this.statusCur;
        } else if (record.interpolants && !this.checked(this.t, this.integ.y, step, kept)) {
          return this.statusCur;
        }
        this.endState = undefined;
        record.onStep?.(this.t);
        if (r.status === 'terminal-event') {
          this.statusCur = 'terminal-event';
          return this.statusCur;
        }
      }
      if (this.t === this.live.end) {
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
    const live = this.live;
    return {
      integrator: this.integ.snapshot(),
      interval: { start: live.start, end: live.end, rightOf: live.rightOf, leftOf: live.leftOf },
      inputs: this.schedule.state(),
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
    this.schedule = this.compiled.inputs.schedule.withState(s.inputs);
    const t = s.integrator.t;
    while (this.samples.length > 0 && this.samples[this.samples.length - 1]!.t > t) this.samples.pop();
    while (this.steps.length > 0 && this.steps[this.steps.length - 1]!.t > t) this.steps.pop();
    while (this.events.length > 0 && this.events[this.events.length - 1]!.t > t) this.events.pop();
    this.live = new InputsInForce(this.schedule, s.interval.start, s.interval.end, s.interval.rightOf, s.interval.leftOf);
    this.intervals.push(this.live);
    this.compiled.inputs.use(this.live);
    this.stop = undefined;
    this.endState = undefined;
    this.statusCur = s.status;
    this.inputsChanged = s.inputsChanged;
  }

  /** After a terminal event: continue from the event time (inputs may have changed), re-initialising there. */
  resume(record: RecordOptions): 'running' | DaeStatus {
    if (this.statusCur !== 'terminal-event') return this.statusCur;
    this.inputsChanged = false;
    this.compiled.inputs.use(this.live);
    if (this.startInterval(this.t) === 'running') this.recordStart(record);
    return this.statusCur;
  }

  /** Replace a source's waveform from now on. */
  replaceWaveform(element: number, spec: WaveformSpec): void {
    this.changeSchedule(this.schedule.withWaveform(element, spec));
  }

  /**
   * Begin a new input interval at time t: the inputs in force from t to the
   * next breakpoint (found on demand, so any number of edges costs one
   * interval at a time), then consistent re-initialisation.
   */
  private startInterval(t: number): 'running' | DaeStatus {
    this.live = openInterval(this.schedule, t, this.horizon, this.span);
    this.intervals.push(this.live);
    this.compiled.inputs.use(this.live);
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

  /** Record a sample after the finiteness check; false when the check stopped the run. */
  private pushChecked(t: number, y: Float64Array, step: RecordedStep, kept: { steps: number; samples: number }): boolean {
    if (!this.checked(t, y, step, kept)) return false;
    this.pushSample(t, y);
    return true;
  }

  /** The finiteness check of a state about to be recorded; on a hit the run stops (false). */
  private checked(t: number, y: Float64Array, step: RecordedStep, kept: { steps: number; samples: number }): boolean {
    let hit: NonFiniteValue | undefined;
    for (let i = 0; i < y.length && !hit; i++) {
      if (!Number.isFinite(y[i]!)) hit = { quantity: 'state', name: this.compiled.layout.labels[i] ?? `unknown ${i}`, value: y[i]! };
    }
    try {
      const check = this.check;
      if (!hit && check) hit = this.compiled.inputs.during(this.live, () => check(t, y));
    } catch (cause) {
      this.stopAt(step, kept, 'rhs-error', `f threw at t = ${t}: ${cause instanceof Error ? cause.message : String(cause)}`, { cause });
      return false;
    }
    if (!hit) return true;
    const what = hit.quantity === 'state' ? `unknown ${hit.name}` : `${hit.quantity} of "${hit.name}"`;
    this.stopAt(step, kept, 'non-finite', `${what} is ${hit.value} at t = ${t} s; the data before it is kept`, { nonFinite: { ...hit, time: t } });
    return false;
  }

  /** The unknowns a non-finite value involves: the unknown itself, or those of its element, tube or node. */
  private unknownsOf(hit: NonFiniteValue | undefined): number[] {
    if (!hit) return [];
    const layout = this.compiled.layout;
    const out: number[] = [];
    for (let i = 0; i < layout.size; i++) {
      if (hit.quantity === 'state' ? layout.labels[i] === hit.name : (layout.owners[i] ?? []).includes(hit.name)) out.push(i);
    }
    return out;
  }

  /**
   * End the run inside the step just taken: drop the step (its polynomial
   * reaches past the stop) and the samples taken from it, keep everything
   * before; the run stands at the start of that step.
   */
  private stopAt(
    step: RecordedStep,
    kept: { steps: number; samples: number },
    status: DaeStatus,
    message: string,
    extra: { cause?: unknown; nonFinite?: NonFiniteValue & { time: number } },
  ): DaeStatus {
    if (this.steps[kept.steps - 1] === step) this.steps.length = kept.steps - 1;
    this.samples.length = Math.min(this.samples.length, kept.samples);
    this.endState = Float64Array.from(step.yOld);
    this.stop = {
      message,
      failure: { t: step.tOld, h: step.h, components: this.unknownsOf(extra.nonFinite), ...(extra.cause !== undefined ? { cause: extra.cause } : {}) },
      ...(extra.nonFinite ? { nonFinite: extra.nonFinite } : {}),
    };
    this.statusCur = status;
    return status;
  }
}
