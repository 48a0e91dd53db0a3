import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { createDaeIntegrator, type DaeIntegrator, type DaeIntegratorSnapshot, type RestartOptions } from '../solver/dae-integrator.js';
import type { DaeEvent, DaeEventRecord, DaeFailure, DaeStatus, SolverStats } from '../solver/types.js';
import { evaluateRecordedStep, stageExtrapolation, type RecordedStep } from './recorded-step.js';
import { SampleRecord } from './sample-record.js';
import { emptyObjectArray } from './empty-object-array.js';
import { StepBuffer, StepRecord } from './step-record.js';
import { createProjector } from './projection.js';
import type { InputView } from '../elements/element-kind.js';
import { NetworkDae } from './network-dae.js';
import { InputsInForce, openInterval, type InputSchedule, type InputState } from '../formulation/network-inputs.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';
import type { ResolvedSolverSettings } from './solver-settings.js';
import { algebraicSolver, settleDeviceStates, type SettleProblem } from './device-settle.js';
import { freewheelCheck, type CutInductiveCurrent } from './device-freewheel.js';
import { deviceStepCap } from './device-step-cap.js';
import { smoothJunctionCrossing, type SmoothJunctionCrossing } from './device-knee-jump.js';
import { elementKind } from '../elements/registry.js';
import { createReducedNetworkIntegrator } from './reduced-network.js';
import { DeferredInnerNodes, type DeferredInputs } from './deferred-inner-nodes.js';
import type { ReducedDaeIntegrator } from '../solver/reduced-integrator.js';

/**
 * One change of a device's own state (an ideal diode turning on or off),
 * at an event or at the consistent-state search after a jump.
 *
 * @example
 * ```ts
 * for (const c of run.deviceChanges) console.log(c.t, c.element, c.on ? 'on' : 'off');
 * ```
 */
export interface DeviceChange {
  readonly t: number;
  /** Index of the element in the description. */
  readonly element: number;
  /** The new state. */
  readonly on: boolean;
}

/** The integrator's restart options at an input jump and at a device's own event (one object each, not one per edge). */
const RESTART_AT_JUMP: RestartOptions = { capStepByEstimate: true };
const RESTART_AT_EVENT: RestartOptions = { capStepByEstimate: false };

/** First step after a knee jump, as a fraction of the jump (see NetworkRun.crossKnee). */
const FIRST_STEP_AFTER_JUMP = 0.25;

/** Device events in a row at one instant (within round-off) before the run calls it chattering. */
const CHATTER_LIMIT = 50;

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
  readonly check?: StateCheck;
}

/**
 * A check of recorded states (see {@link RunSettings.check}), called as a
 * method: a class instance keeps the run's call site on one function from
 * run to run.
 */
export interface StateCheck {
  /** `rhs`, when given, is f(t, y) under the inputs in force (the solver's own evaluation at a step's end). */
  check(t: number, y: Float64Array, rhs?: Float64Array): NonFiniteValue | undefined;
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

/** One stored sample, as {@link NetworkRun.samples} lists them. */
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
  /** Return right after a device's own commutation (the run restarted there), so the caller sees the jump. */
  readonly returnAtCommutation?: boolean;
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
  /** The same integrator in the reduced formulation (undefined in the full one). */
  private readonly reduced: ReducedDaeIntegrator | undefined;
  /** The inputs and expansion map the reduced integrator's last step was taken with (see recordStep). */
  private deferredInputs: DeferredInputs | undefined;
  /** Whether the step in hand is in the deferred form (see ReducedDaeIntegrator.copyInterpolantInto). */
  private handDeferred = false;
  private readonly index2: readonly number[];
  /** The inputs in force over each input interval, in time order (immutable values; steps and samples refer to them by index). */
  readonly intervals = emptyObjectArray<InputsInForce>();
  /** Samples recorded so far, in time order (one row of numbers each). */
  readonly sampleRecord: SampleRecord;
  /** Step interpolants recorded so far, in time order (one row of numbers each; only the last when streaming). */
  readonly stepRecord: StepRecord;
  /** Events located so far (threshold crossings; device commutations are in {@link NetworkRun.deviceChanges}). */
  readonly events: DaeEventRecord[] = [];
  /** Every change of a device's own state so far (ideal diodes), in time order. */
  readonly deviceChanges: DeviceChange[] = [];
  /** Number of device events located by the solver (each one a stop and a restart). */
  deviceEvents = 0;
  /** Number of user (threshold) events given to the integrator; device events follow them. */
  private readonly userEventCount: number;
  private readonly settleProblem: SettleProblem | undefined;
  /** Solves the algebraic unknowns under given inputs (the consistent-state search and the freewheeling check). */
  private readonly solveAlgebraic: ReturnType<typeof algebraicSolver>;
  private readonly freewheel: ReturnType<typeof freewheelCheck>;
  /** Crossings of smooth junctions' knees (networks with exponential diodes without capacitance). */
  private readonly junctions: SmoothJunctionCrossing | undefined;
  /** Trial device states of the next settle (reused: no allocation per event). */
  private readonly trialStates: boolean[];
  /** The device (element index) whose own event asked for the next settle, or -1. */
  private pendingFlip = -1;
  private chatter = { t: NaN, count: 0 };
  /** The state settled at the last jump (algebraic unknowns solved with the new inputs), and whether it is valid. */
  private readonly settled: Float64Array;
  private settledValid = false;
  /** Whether a restart far from the settled state starts again from it (networks with diodes only). */
  private readonly restartsFromSettled: boolean;
  /** Whether jumps need settling: ideal diodes, or a switching element beside an inductive one (the freewheeling check). */
  private readonly settlesAtJumps: boolean;
  private readonly atol: number | Float64Array;
  private readonly rtol: number;
  private inputsChanged = false;
  /** False once a step was recorded without keeping its interpolant (streaming: only samples kept). */
  private everyStepKept = true;
  /** What replaces an interval no sample refers to when streaming (see releaseUnreferencedInterval). */
  private standIn: InputsInForce | undefined;
  /** The step in hand: the last step's interpolant as the integrator hands it over (refilled per step, then copied into stepRecord). */
  private readonly hand: StepBuffer;
  /** A state about to be checked (and kept, copied into sampleRecord). */
  private readonly scratch: Float64Array;
  /** f at the state a step ended on, as the integrator evaluated it there (see recordStepEnd). */
  private readonly endRhs: Float64Array;
  /** A sample interpolated inside a step, about to be projected, checked and kept. */
  private readonly inside: Float64Array;
  /** The sample recorded at the last (re)start, whose index-2 values the next step repairs. */
  private pendingStartSample: number | undefined;
  /** The state at the start of the run (after initialisation; index-2 values from the first step). */
  private startState: Float64Array | undefined;
  private startStatePending = false;
  private restartPending = true;
  /** The record's lengths after the step in hand (see advanceTo, stopAt). */
  private readonly kept = { steps: 0, samples: 0 };
  private statusCur: 'running' | DaeStatus = 'running';
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
    this.scratch = new Float64Array(compiled.layout.size);
    this.inside = new Float64Array(compiled.layout.size);
    this.endRhs = new Float64Array(compiled.layout.size);
    this.hand = new StepBuffer(compiled.layout.size);
    this.sampleRecord = new SampleRecord(compiled.layout.size);
    this.horizon = settings.horizon;
    this.span = settings.horizon - settings.t0;
    this.check = settings.check;
    this.schedule = compiled.inputs.schedule;
    this.live = openInterval(this.schedule, settings.t0, settings.horizon, this.span);
    compiled.inputs.use(this.live);
    this.projector = createProjector(compiled, settings.atol, settings.rtol);
    if (compiled.description.elements.some((e) => elementKind(e).capsStepBySources)) {
      // Diodes: the dense output of a junction's current between steps can be far from the curve, and
      // the simplified Newton of the projector, with a matrix kept from call to call, may not reach it
      // (measured: an energy audit off by 2e-5 on a diode across a sine). Full Newton with a fresh
      // Jacobian per iteration first; the projector when that fails.
      const solve = algebraicSolver(compiled, settings.atol, settings.rtol);
      const start = new Float64Array(compiled.layout.size);
      this.project = (t, y) => {
        start.set(y);
        if (solve(t, y, compiled.inputs)) return;
        y.set(start);
        this.projector(t, y);
      };
    } else {
      this.project = (t, y) => this.projector(t, y);
    }
    this.userEventCount = settings.events?.length ?? 0;
    const eventProjector = createProjector(compiled, settings.atol, settings.rtol);
    const projected = new Float64Array(compiled.layout.size);
    const projectedFrom = new Float64Array(compiled.layout.size);
    let projectedAt = NaN;
    let projectedInputs: InputsInForce | undefined;
    /**
     * The state a device's margin is read from: the algebraic unknowns solved at the (interpolated)
     * differential state, as the consistent-state search sees them. The dense output of an algebraic
     * unknown (a node potential that a sine source sets) is only third order between steps, and an
     * event located on it would disagree with the search (measured: 4 events in 14 the search undid
     * on a half-wave rectifier). One projection serves every device at one point.
     */
    const deviceState = (t: number, y: Float64Array): Float64Array => {
      let same = t === projectedAt && projectedInputs === this.live;
      for (let i = 0; same && i < y.length; i++) same = y[i] === projectedFrom[i];
      if (!same) {
        projectedFrom.set(y);
        projected.set(y);
        eventProjector(t, projected, this.live);
        projectedAt = t;
        projectedInputs = this.live;
      }
      return projected;
    };
    const deviceEvents: DaeEvent[] = compiled.events.map((ev) => ({
      name: `device "${compiled.description.elements[ev.element]!.name}"`,
      fn: (t: number, y: Float64Array) => ev.value(t, deviceState(t, y), this.live),
      direction: ev.direction,
      terminal: true,
      // The run restarts from the state at a commutation: it must be a step's end, not the dense output.
      stepToEvent: true,
    }));
    const events = [...(settings.events ?? []), ...deviceEvents];
    this.solveAlgebraic = algebraicSolver(compiled, settings.atol, settings.rtol);
    this.settled = new Float64Array(compiled.layout.size);
    this.atol = settings.atol;
    this.rtol = settings.rtol;
    this.settleProblem = compiled.events.length > 0
      ? { devices: compiled.events, names: compiled.description.elements.map((e) => e.name), solve: this.solveAlgebraic }
      : undefined;
    this.freewheel = freewheelCheck(compiled, settings.atol);
    this.junctions = smoothJunctionCrossing(compiled, this.solveAlgebraic);
    this.restartsFromSettled = compiled.description.elements.some((e) => elementKind(e).capsStepBySources);
    this.settlesAtJumps = compiled.events.length > 0
      || (compiled.elements.some((e) => e.conducting !== undefined) && compiled.elements.some((e) => e.role === 'inductive'));
    this.trialStates = [...this.schedule.deviceStates];
    // Diodes fed by a sine: a step must not jump over a conduction window (see deviceStepCap).
    const maxStep = settings.maxStep ?? deviceStepCap(compiled.description);
    // The run's own inputs in force, read from the run at each call: nothing a reader does to the network's can reach it.
    const dae = new NetworkDae(compiled.equations, this, {
      size: compiled.layout.size,
      // M by its stamps: the set-up reads only its non-zeros.
      massEntries: compiled.massEntries,
      jacobianPattern: compiled.jacobianPattern,
      y0: settings.initialState ?? compiled.y0,
      t0: settings.t0,
      tEnd: settings.horizon,
      index2: compiled.index2,
      events,
    });
    const solverOptions = {
      rtol: settings.rtol,
      atol: settings.atol,
      ...(settings.atolFollowsRtol !== undefined ? { atolFollowsRtol: settings.atolFollowsRtol } : {}),
      ...(maxStep !== undefined ? { maxStep } : {}),
      ...(settings.initialStep !== undefined ? { initialStep: settings.initialStep } : {}),
      ...(settings.maxSteps !== undefined ? { maxSteps: settings.maxSteps } : {}),
      ...(settings.maxWallTimeMs !== undefined ? { maxWallTimeMs: settings.maxWallTimeMs } : {}),
      ...(settings.signal ? { signal: settings.signal } : {}),
    };
    // Reduced form: the algebraic unknowns eliminated inside f (refused, with the reason, where unsound).
    this.reduced = settings.formulation === 'reduced' ? createReducedNetworkIntegrator(compiled, dae, solverOptions) : undefined;
    this.integ = this.reduced ?? createDaeIntegrator(dae, solverOptions);
    // Reduced: steps are kept with their algebraic inner nodes left out, filled in when read.
    const completion = this.reduced ? new DeferredInnerNodes(compiled.equations, this.reduced.split) : undefined;
    this.stepRecord = new StepRecord(compiled.layout.size, this.sampleRecord, undefined, undefined, completion);
    for (const i of this.integ.adjustedAtStart) this.adjusted.add(i);
    // The integrator initialised at t0 with the inputs of no interval yet; redo it on the right side.
    this.startInterval(settings.t0);
    if (!this.stop) this.statusCur = this.integ.status;
  }

  /** Whether every step's interpolant so far is in {@link NetworkRun.stepRecord} (false once a step was streamed past). */
  get keptEveryStep(): boolean {
    return this.everyStepKept;
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

  /** Knee jumps of smooth junctions made so far (see smoothJunctionCrossing). */
  get kneeCrossings(): number {
    return this.junctions?.count ?? 0;
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
      // The present time read once per step (a read of the integrator's time out of line makes a number each time).
      let now = this.t;
      while (now < edge) {
        // Exact samples: the solver stops at the next one that is a step away (closer ones are interpolated).
        let k = nextSample;
        while (record.exact && k < samples.length && samples[k]! - now <= timeTolerance(samples[k]!)) k++;
        const sample = record.exact && k < samples.length ? samples[k]! : Infinity;
        const target = edge - sample <= timeTolerance(edge) ? edge : Math.min(edge, sample);
        const r = this.integ.step(target);
        if (r.status !== 'accepted' && r.status !== 'terminal-event') {
          if (this.crossKnee(edge)) {
            this.recordStart(record);
            now = this.t;
            continue;
          }
          this.statusCur = this.integ.status;
          return this.statusCur;
        }
        now = this.t;
        this.junctions?.stepped();
        let commutation = false;
        for (let k = 0; k < r.events.length; k++) {
          const e = r.events[k]!;
          if (e.index < this.userEventCount) this.events.push(e);
          else commutation = r.status === 'terminal-event';
        }
        const step = this.recordStep(record);
        // What to keep if the step is dropped (one object per run, rewritten per step).
        const kept = this.kept;
        kept.steps = this.stepRecord.length;
        kept.samples = this.sampleRecord.length;
        // Samples inside the step first (time order), then the step's end.
        while (nextSample < samples.length && samples[nextSample]! < now) {
          const ts = samples[nextSample]!;
          if (this.handDeferred) {
            // Inputs and map as the step was taken with (nothing changed since).
            this.reduced!.completeInside(step);
            this.handDeferred = false;
          }
          const y = evaluateRecordedStep(step, ts, this.index2, this.inside);
          // An input that throws here (a user function failing exactly at a sampling instant) ends the run as 'rhs-error'.
          try {
            this.projector(ts, y, this.live);
          } catch (cause) {
            return this.stopAt(step, kept, 'rhs-error', `f threw at t = ${ts}: ${cause instanceof Error ? cause.message : String(cause)}`, { cause });
          }
          if (!this.pushChecked(ts, y, step, kept)) return this.statusCur;
          nextSample++;
        }
        const endIsSample = nextSample < samples.length && samples[nextSample] === now;
        if (endIsSample) nextSample++;
        if ((record.steps || endIsSample || record.interpolants) && !this.recordStepEnd(record.steps || endIsSample, step, kept, now)) {
          return this.statusCur;
        }
        this.endState = undefined;
        record.onStep?.(now);
        if (commutation) {
          // A device's own event ended the step: flip it as the trial, settle every device, restart here.
          const last = r.events[r.events.length - 1]!;
          this.deviceEvents++;
          if (this.commutate(last.index - this.userEventCount) !== 'running') return this.statusCur;
          this.recordStart(record);
          if (record.returnAtCommutation) return this.statusCur;
          break; // the outer loop takes the new interval (its end, a stop time within round-off of it)
        }
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
    let samples = this.sampleRecord.length;
    while (samples > 0 && this.sampleRecord.time(samples - 1) > t) samples--;
    this.sampleRecord.truncate(samples);
    let steps = this.stepRecord.length;
    while (steps > 0 && this.stepRecord.t(steps - 1) > t) steps--;
    this.stepRecord.truncate(steps);
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
  private startInterval(t: number, fromEvent = false): 'running' | DaeStatus {
    const before = this.live;
    this.live = openInterval(this.schedule, t, this.horizon, this.span);
    // Only networks where a jump can change a device state or cut an inductive current settle (the
    // others would solve the algebraic unknowns twice per edge: here and in the integrator's restart).
    this.settledValid = false;
    const settled = this.settlesAtJumps ? this.settleDevices(t, before, fromEvent) : 'running';
    if (settled !== 'running') return settled;
    this.releaseUnreferencedInterval();
    this.intervals.push(this.live);
    this.compiled.inputs.use(this.live);
    // A device's own event changes no input: the state is continuous and the step the controller
    // proposed still suits it (a fresh estimate from y' would see the stiff modes a commutation
    // excites and start from steps of 1e-18 s, costing some 25 steps per event to grow back).
    this.statusCur = this.integ.restart(undefined, fromEvent ? RESTART_AT_EVENT : RESTART_AT_JUMP);
    if (this.statusCur === 'running' && this.restartsFromSettled && this.settledValid && this.farFromSettled()) {
      // The cheap restart's simplified Newton (a Jacobian taken before the jump) can land on a wrong
      // point when a smooth junction swings from blocking to conducting; the settled state was solved
      // with a fresh Jacobian at every iteration: start from it (full re-initialisation, rare).
      this.statusCur = this.integ.restart(this.settled, fromEvent ? RESTART_AT_EVENT : RESTART_AT_JUMP);
    }
    const adjusted = this.integ.adjustedAtStart;
    for (let k = 0; k < adjusted.length; k++) this.adjusted.add(adjusted[k]!);
    this.restartPending = true;
    return this.statusCur;
  }

  /**
   * Streaming (steps not kept): the interval that just ended gives way to one
   * shared stand-in when no sample refers to it, so a long run on a coarse
   * grid holds inputs in proportion to its samples, not to its edges. Only
   * samples and kept steps read intervals, by index; the stand-in (no sides)
   * is never read.
   */
  private releaseUnreferencedInterval(): void {
    const k = this.intervals.length - 1;
    if (this.everyStepKept || k < 0) return;
    const samples = this.sampleRecord;
    if (samples.length > 0 && samples.interval(samples.length - 1) === k) return;
    this.intervals[k] = this.standIn ??= new InputsInForce(this.schedule, NaN, NaN, NaN, NaN);
  }

  /**
   * A device's own event at the present time: the device flips as the
   * trial, every device is settled together, and the integrator restarts
   * here (cheaply: the step size and the Jacobian's shape are kept).
   */
  private commutate(device: number): 'running' | DaeStatus {
    const t = this.t;
    if (this.chatter.t === t || Math.abs(this.chatter.t - t) <= timeTolerance(t)) this.chatter.count++;
    else this.chatter = { t, count: 1 };
    if (this.chatter.count > CHATTER_LIMIT) {
      const name = this.compiled.description.elements[this.compiled.events[device]!.element]!.name;
      return this.stopAtJump(
        t,
        new InputError(
          'no-consistent-device-states',
          `diode "${name}" changed state ${CHATTER_LIMIT} times at t = ${t} s (chattering); give it an on-resistance, an off-conductance or a capacitance, or loosen the tolerances`,
          [name],
        ),
      );
    }
    this.pendingFlip = this.compiled.events[device]!.element;
    return this.startInterval(t, true);
  }

  /**
   * Settle the device states at a jump (the live interval is the new one,
   * `before` the one that ended): the consistent-state search on the trial
   * states, then (at an input jump) the check for an inductive current left with no path.
   * Updates the live schedule; on failure stops the run.
   */
  private settleDevices(t: number, before: InputsInForce, fromEvent: boolean): 'running' | DaeStatus {
    const y = this.integ.y;
    const settled = this.settled;
    settled.set(y);
    this.settledValid = false;
    const flip = this.pendingFlip;
    this.pendingFlip = -1;
    if (this.settleProblem) {
      const states = this.trialStates;
      const old = this.schedule.deviceStates;
      for (let k = 0; k < states.length; k++) states[k] = old[k]!;
      if (flip >= 0) states[flip] = !states[flip];
      const outcome = settleDeviceStates(this.settleProblem, t, settled, states, this.live);
      if (!outcome.ok) {
        const trial = this.live.withSchedule(this.schedule.withDeviceStates([...states]));
        const cut = this.solveAlgebraic(t, settled, trial) ? this.freewheel(t, y, settled, before, trial) : undefined;
        return this.stopAtJump(t, cut ? freewheelError(cut) : new InputError('no-consistent-device-states', outcome.message, outcome.elements));
      }
      let changed = false;
      for (const ev of this.settleProblem.devices) {
        const k = ev.element;
        if (states[k] !== old[k]) {
          changed = true;
          this.deviceChanges.push({ t, element: k, on: states[k]! });
        }
      }
      if (changed) {
        this.schedule = this.schedule.withDeviceStates([...states]);
        this.live = this.live.withSchedule(this.schedule);
      }
    } else if (!this.solveAlgebraic(t, settled, this.live)) {
      return 'running'; // the integrator's own re-initialisation meets (and reports) the trouble
    }
    this.settledValid = true;
    // A diode's own event turns it off at its current's zero crossing: it cuts no current (and the
    // current left by locating the crossing, slope times the time tolerance, is no fault).
    const cut = fromEvent ? undefined : this.freewheel(t, y, settled, before, this.live);
    if (cut) return this.stopAtJump(t, freewheelError(cut));
    return 'running';
  }

  /**
   * After a step-size underflow or a Newton failure in a network with smooth junctions: cross the
   * knee a junction is swinging across (see smoothJunctionCrossing) and restart there; true when done.
   * Otherwise the failure stands, its message naming the junctions and the fix.
   */
  private crossKnee(edge: number): boolean {
    const status = this.integ.status;
    if (!this.junctions || (status !== 'step-size-underflow' && status !== 'newton-failure')) return false;
    const t = this.integ.t;
    const landed = this.junctions.cross(t, this.integ.y, this.stepRecord.last(), edge, this.live);
    if (!landed) {
      this.stop = { message: this.integ.message + this.junctions.hint(), failure: this.integ.failure! };
      return false;
    }
    // The first step after the jump: a quarter of the jump. Past the knee the junction sits on its
    // logarithmic branch, v_j = n V_T ln(i / Is) with i growing from about zero over the jump, which
    // changes on the scale of the time since the crossing; a step much longer than that (the fresh
    // estimate gave 1.6e-11 s after a 3e-14 s jump on the flyback) fails the simplified Newton ten
    // times in a row before it has shrunk enough (measured: the stop at 267.4 periods).
    const s = this.integ.snapshot();
    const h = Math.min(edge - landed.t, FIRST_STEP_AFTER_JUMP * (landed.t - t));
    this.integ.restore({ ...s, t: landed.t, y: landed.y, h, interpolant: undefined, first: true, extrapolate: false });
    return this.integ.restart(landed.y, RESTART_AT_JUMP) === 'running';
  }

  /** Whether the integrator's restarted state is far (1000 tolerances) from the settled one. */
  private farFromSettled(): boolean {
    const y = this.integ.y;
    const s = this.settled;
    for (let i = 0; i < y.length; i++) {
      const scale = (typeof this.atol === 'number' ? this.atol : this.atol[i]!) + this.rtol * Math.abs(s[i]!);
      if (!(Math.abs(y[i]! - s[i]!) <= 1000 * scale)) return true;
    }
    return false;
  }

  /** End the run at a jump where no consistent continuation exists (the state before it is kept). */
  private stopAtJump(t: number, cause: InputError): DaeStatus {
    this.endState = this.integ.y;
    this.stop = { message: cause.message, failure: { t, h: 0, components: [], cause } };
    this.statusCur = 'inconsistent-init';
    return this.statusCur;
  }

  /** State at the start of the run, after consistent initialisation (undefined before the first advance). */
  get initialState(): Float64Array | undefined {
    return this.startState ? Float64Array.from(this.startState) : undefined;
  }

  /** Give a gate-driven switch a new gate waveform from now on (a new duty or phase). */
  replaceGate(element: number, spec: WaveformSpec): void {
    this.changeSchedule(this.schedule.withGate(element, spec));
  }

  /** Record the state at a (re)start: the right-hand side of a breakpoint, or t0. */
  private recordStart(record: RecordOptions): void {
    this.restartPending = false;
    if (!this.startState) {
      this.startState = this.integ.y;
      this.startStatePending = true;
    }
    if (record.steps || record.sampleTimes?.includes(this.t) === true) {
      this.pushSample(this.t, this.integ.readState(this.scratch));
      this.pendingStartSample = this.sampleRecord.length - 1;
    } else {
      this.pendingStartSample = undefined;
    }
  }

  /** Take the step just accepted into the step in hand and keep a copy of it; returns the step in hand. */
  private recordStep(record: RecordOptions): RecordedStep {
    // The integrator copies its start state and polynomial into the step in hand.
    // The reduced formulation's algebraic inner nodes (an evaluation of f each) are left for a reader
    // (it refuses index-2 unknowns, so no stage extrapolation below reads them).
    const reduced = this.reduced;
    const it = reduced ? reduced.copyInterpolantInto(this.hand.yOld, this.hand.q, true)! : this.integ.copyInterpolantInto(this.hand.yOld, this.hand.q)!;
    this.handDeferred = reduced !== undefined;
    const steps = this.stepRecord;
    const last = steps.length - 1;
    const first = last < 0 || steps.t(last) !== it.tOld || steps.interval(last) !== this.intervals.length - 1;
    const step = this.hand;
    step.tOld = it.tOld;
    step.t = it.t;
    step.h = it.h;
    step.interval = this.intervals.length - 1;
    step.firstAfterStart = first;
    if (first && this.index2.length > 0) {
      // The index-1 initialisation cannot set index-2 unknowns; take them from this step's stages.
      const y0 = stageExtrapolation(step, this.index2);
      if (this.pendingStartSample !== undefined) {
        for (const j of this.index2) this.sampleRecord.setValue(this.pendingStartSample, j, y0[j]!);
      }
      if (this.startStatePending && this.startState) for (const j of this.index2) this.startState[j] = y0[j]!;
    }
    this.pendingStartSample = undefined;
    this.startStatePending = false;
    // Streaming: without interpolants only the step in hand is kept (the samples inside it are taken from it).
    if (!record.interpolants) {
      this.everyStepKept = false;
      steps.truncate(0);
    }
    // The step starts where the last sample was taken (its end, or the restart): named, not copied.
    steps.push(step, this.lastSampleEqualTo(step.tOld, step.yOld), reduced ? this.inputsOfStep(reduced) : undefined);
    return step;
  }

  /** The inputs and map the reduced integrator's last step was taken with: one object while neither changes. */
  private inputsOfStep(reduced: ReducedDaeIntegrator): DeferredInputs {
    const last = this.deferredInputs;
    if (last && last.inputs === this.live && last.map === reduced.expansionMap) return last;
    this.deferredInputs = { inputs: this.live, map: reduced.expansionMap };
    return this.deferredInputs;
  }

  /**
   * The index of the last sample when it is the state `y` at time t of the present interval, bit
   * for bit (a step's start state, kept already as the sample at the previous step's end or at the
   * restart), else -1. Not with index-2 unknowns: the first step after a restart rewrites them in
   * the start sample, not in the step's start state.
   */
  private lastSampleEqualTo(t: number, y: Float64Array): number {
    const samples = this.sampleRecord;
    const last = samples.length - 1;
    if (last < 0 || this.index2.length > 0 || samples.time(last) !== t || samples.interval(last) !== this.intervals.length - 1) return -1;
    return samples.stateEquals(last, y) ? last : -1;
  }

  /** The last step kept, in arrays of its own (undefined before the first step). */
  lastStep(): RecordedStep | undefined {
    return this.stepRecord.last();
  }

  /** Samples recorded so far, in time order, each with a copy of its state (for inspection: the run keeps them in {@link NetworkRun.sampleRecord}). */
  get samples(): RunSample[] {
    const r = this.sampleRecord;
    const out: RunSample[] = [];
    for (let k = 0; k < r.length; k++) out.push({ t: r.time(k), y: r.state(k, new Float64Array(r.size)), interval: r.interval(k) });
    return out;
  }

  /** Keep a sample: a copy of y at time t in the present input interval. */
  private pushSample(t: number, y: Float64Array): void {
    this.sampleRecord.push(t, this.intervals.length - 1, y);
  }

  /**
   * Check the state the step just taken ended on, and keep it as a sample when `keep`; false when
   * the check stopped the run. The integrator evaluated f there itself, under the inputs in force
   * now (the run changes them only between steps), when it accepted the step: the check reads that
   * evaluation instead of making it again, the same function at the same time, state and inputs.
   */
  private recordStepEnd(keep: boolean, step: RecordedStep, kept: { steps: number; samples: number }, t: number): boolean {
    const y = this.integ.readState(this.scratch);
    const rhs = this.integ.readRhsAtState(this.endRhs) ? this.endRhs : undefined;
    if (!this.checked(t, y, step, kept, rhs)) return false;
    if (keep) this.pushSample(t, y);
    return true;
  }

  /** Record a sample after the finiteness check; false when the check stopped the run. */
  private pushChecked(t: number, y: Float64Array, step: RecordedStep, kept: { steps: number; samples: number }): boolean {
    if (!this.checked(t, y, step, kept)) return false;
    this.pushSample(t, y);
    return true;
  }

  /** The finiteness check of a state about to be recorded (`rhs`: f there, when known); on a hit the run stops (false). */
  private checked(t: number, y: Float64Array, step: RecordedStep, kept: { steps: number; samples: number }, rhs?: Float64Array): boolean {
    let hit: NonFiniteValue | undefined;
    for (let i = 0; i < y.length && !hit; i++) {
      if (!Number.isFinite(y[i]!)) hit = { quantity: 'state', name: this.compiled.layout.labels[i] ?? `unknown ${i}`, value: y[i]! };
    }
    try {
      const check = this.check;
      if (!hit && check) {
        // As inputs.during(this.live, ...), without a closure per recorded state.
        const inputs = this.compiled.inputs;
        const before = inputs.inForce;
        inputs.use(this.live);
        try {
          hit = check.check(t, y, rhs);
        } finally {
          inputs.use(before);
        }
      }
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
    // The step in hand was kept last (kept.steps counts it).
    this.stepRecord.truncate(kept.steps - 1);
    this.sampleRecord.truncate(kept.samples);
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

/** The error that names the switch and the winding or inductor whose current was cut. */
function freewheelError(cut: CutInductiveCurrent): InputError {
  return new InputError('no-freewheeling-path', cut.message, [...cut.devices, ...cut.inductive]);
}
