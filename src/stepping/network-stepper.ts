import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import type { CurrentSource, ElectricNode, FluxTube, Switch, TwoTerminal, VoltageSource } from '../network/handles.js';
import { resultFromRun, type SimulationResult } from '../result/simulation-result.js';
import { StateReader, type QuantityRequest, type StateFunction } from '../result/state-reader.js';
import { NetworkRun, timeTolerance, type RecordOptions, type RunSnapshot } from '../simulation/network-run.js';
import type { DaeEvent, DaeStatus, SolverStats } from '../solver/types.js';
import { evaluateRecordedStep } from '../simulation/recorded-step.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';
import { checkedInitialState } from '../simulation/checked-initial-state.js';
import { finitenessCheck } from '../simulation/finiteness-check.js';
import { acceptNetwork, type NetworkInput } from '../simulation/accept-network.js';
import { checkSolverSettings, resolveSolverSettings, type SolverSettings } from '../simulation/solver-settings.js';

/** A level crossing watched during the run (located on the dense output). */
export interface Threshold {
  /** Name for messages and the callback. */
  readonly name: string;
  /** The quantity watched (any state quantity: flux density of a tube, current of a winding...). */
  readonly watch: QuantityRequest;
  /** The level, in the quantity's SI unit. */
  readonly level: number;
  /** Which crossings count. Default `'both'`. */
  readonly direction?: 'rising' | 'falling' | 'both';
  /**
   * Called at the crossing, with the stepper standing at the crossing time;
   * it may change inputs (they take effect from that instant). A quantity
   * that jumps across the level when an input changes (a switch edge, a
   * waveform breakpoint, a change made from the stepper or a callback)
   * crosses there, in the direction of the jump.
   */
  readonly onCross: (stepper: NetworkStepper, crossing: { readonly name: string; readonly time: number; readonly rising: boolean }) => void;
}

/**
 * Options of {@link createStepper}: the shared {@link SolverSettings} (rtol
 * default 1e-6; maxSteps and maxWallTimeMs count over the stepper's life,
 * maxSteps default 1e7) plus the span, recording and thresholds.
 *
 * @example
 * ```ts
 * const options: StepperOptions = { horizon: 0.1, rtol: 1e-7, record: false };
 * ```
 */
export interface StepperOptions extends SolverSettings {
  /** Start time, s. Default 0. */
  readonly startTime?: number;
  /** Latest time the stepper may reach, s (the solver's span). */
  readonly horizon: number;
  /** Raw state to start from instead of the network's initial conditions. */
  readonly initialState?: ArrayLike<number>;
  /** Keep the history (solver steps) so that {@link NetworkStepper.result} can return it. Default true. */
  readonly record?: boolean;
  /** Level crossings to watch. */
  readonly thresholds?: readonly Threshold[];
}

/** One solver event function: a threshold watched in one direction (a `'both'` threshold has two). */
interface ThresholdEvent {
  readonly threshold: number;
  readonly rising: boolean;
}

/** Jump crossings at one instant beyond which callbacks are taken to be flipping an input back and forth. */
const MAX_JUMP_ROUNDS = 100;

/** A controller called at a fixed sample period. */
interface PeriodicController {
  readonly id: number;
  readonly period: number;
  readonly start: number;
  /** Index of the next sample: it falls at start + count * period (a product, so no drift). */
  count: number;
  next: number;
  readonly onSample: (stepper: NetworkStepper) => void;
}

/** Restorable state of a stepper (plain data, structuredClone-able). */
export interface StepperSnapshot {
  /** The solver and input state (opaque plain data). */
  readonly run: object;
  readonly controllers: readonly { readonly id: number; readonly count: number; readonly next: number }[];
  readonly stopTimes: readonly number[];
}

/**
 * The stepping interface for embedding a magnetic device in a larger model
 * (a converter, a controller): advance to a time, read any handle's present
 * value, change inputs between advances (source set-points, waveforms such as
 * a duty cycle, switch states), add stop times, call controllers at a fixed
 * sample period or when a quantity crosses a level, snapshot and restore.
 *
 * Every input change takes effect at the present time: the solver
 * re-initialises there, so an algebraic jump (a switch closing) is exact.
 *
 * @example
 * ```ts
 * const stepper = createStepper(net, { horizon: 0.1 });
 * stepper.every(1e-4, (s) => {
 *   const b = s.value({ quantity: 'fluxDensity', handle: leg });
 *   s.setSource(bias, b > 0.3 ? 0 : 2); // a crude controller
 * });
 * stepper.advanceTo(0.05);
 * console.log(stepper.time, stepper.value({ quantity: 'current', handle: primary }));
 * const history = stepper.result();
 * ```
 */
export class NetworkStepper {
  private readonly compiled: CompiledNetwork;
  private readonly run: NetworkRun;
  private readonly reader: StateReader;
  private readonly networkId: number | undefined;
  private readonly record: RecordOptions;
  private readonly controllers: PeriodicController[] = [];
  private stopTimes: number[] = [];
  private nextControllerId = 1;
  private readonly thresholds: readonly Threshold[];
  /** The watched quantity of each threshold. */
  private readonly watched: readonly StateFunction[];
  /** What each solver event function stands for. */
  private readonly thresholdEvents: readonly ThresholdEvent[];
  /** Each threshold's value minus its level at the present time, under the inputs in force when last settled. */
  private settled: Float64Array;
  /** An input was changed from the stepper (or a callback) since the values were last settled. */
  private touched = false;
  private readonly horizon: number;
  private inCallback = false;

  /** Use {@link createStepper}. */
  constructor(network: NetworkInput, options: StepperOptions) {
    if (options === null || typeof options !== 'object') {
      throw new InputError('bad-option', `createStepper: options must be an object with at least horizon, got ${String(options)}`, ['options']);
    }
    const t0 = options.startTime ?? 0;
    if (!Number.isFinite(t0)) throw new InputError('bad-option', `stepper options: startTime ${t0} is not finite`, ['options']);
    if (!(Number.isFinite(options.horizon) && options.horizon > t0)) {
      throw new InputError('bad-time-span', `stepper options: horizon ${options.horizon} s must be a finite time after startTime ${t0} s`, ['options']);
    }
    checkSolverSettings(options, 'stepper options');
    const accepted = acceptNetwork(network, 'createStepper');
    this.networkId = accepted.networkId;
    this.compiled = accepted.compiled;
    this.reader = new StateReader(this.compiled, this.networkId);
    this.horizon = options.horizon;
    this.thresholds = options.thresholds ?? [];
    this.watched = this.thresholds.map((th) => {
      const fn: StateFunction = this.reader.build(th.watch);
      if (!Number.isFinite(th.level)) throw new InputError('bad-option', `threshold "${th.name}": level ${th.level} is not finite`, [th.name]);
      return fn;
    });
    // A 'both' threshold is watched as two one-way event functions, so the solver's pick says the
    // direction (the value at a located crossing may sit exactly on the level).
    const thresholdEvents: ThresholdEvent[] = [];
    const events: DaeEvent[] = [];
    this.thresholds.forEach((th, k) => {
      const fn = this.watched[k]!;
      for (const rising of [true, false]) {
        if (th.direction === (rising ? 'falling' : 'rising')) continue;
        thresholdEvents.push({ threshold: k, rising });
        events.push({ name: th.name, fn: (t, y) => fn(y, t) - th.level, direction: rising ? 1 : -1, terminal: true });
      }
    });
    this.thresholdEvents = thresholdEvents;
    // With thresholds, a device's own commutation ends an advance of the run, so a jump there is seen.
    this.record = { steps: options.record ?? true, interpolants: options.record ?? true, returnAtCommutation: this.thresholds.length > 0 };
    this.run = new NetworkRun(this.compiled, {
      t0,
      horizon: options.horizon,
      ...resolveSolverSettings(this.compiled, options, { rtol: 1e-6, maxSteps: 1e7 }),
      ...(this.record.steps ? { check: finitenessCheck(this.compiled) } : {}),
      ...(options.initialState ? { initialState: checkedInitialState(this.compiled, options.initialState, 'stepper options') } : {}),
      events,
    });
    this.settled = this.thresholdValues();
  }

  /** Present time, s. @example `stepper.time` */
  get time(): number {
    return this.run.t;
  }

  /** `'running'` while the stepper can advance, `'success'` once it reached its horizon, otherwise why it stopped (see `DaeStatus`). @example `if (stepper.status !== 'running') console.warn(stepper.message);` */
  get status(): 'running' | DaeStatus {
    return this.run.status === 'terminal-event' ? 'running' : this.run.status;
  }

  /** One line on the status. @example `stepper.message` */
  get message(): string {
    return this.run.message;
  }

  /** Solver work so far. @example `stepper.stats.acceptedSteps` */
  get stats(): SolverStats {
    return this.run.stats;
  }

  /** The raw state vector at the present time (a copy). @example `const y = stepper.state;` */
  get state(): Float64Array {
    return this.run.y;
  }

  /**
   * Present value of any quantity of a handle.
   *
   * @example
   * ```ts
   * stepper.value({ quantity: 'fluxDensity', handle: leg }); // T
   * ```
   */
  value(request: QuantityRequest): number {
    const fn = this.reader.build(request);
    return fn(this.run.y, this.run.t);
  }

  /** Present flux density of a tube, T. @example `stepper.fluxDensity(leg)` */
  fluxDensity(tube: FluxTube): number {
    return this.value({ quantity: 'fluxDensity', handle: tube });
  }

  /** Present flux of a tube, Wb. @example `stepper.flux(leg)` */
  flux(tube: FluxTube): number {
    return this.value({ quantity: 'flux', handle: tube });
  }

  /** Present current of an element, A (sign conventions as in results). @example `stepper.current(primary)` */
  current(element: TwoTerminal): number {
    return this.value({ quantity: 'current', handle: element });
  }

  /** Present voltage across an element, V. @example `stepper.voltage(load)` */
  voltage(element: TwoTerminal): number {
    return this.value({ quantity: 'voltage', handle: element });
  }

  /** Present potential of a node, V. @example `stepper.potential(a)` */
  potential(node: ElectricNode): number {
    return this.value({ quantity: 'potential', handle: node });
  }

  /**
   * Hold a source at a set-point from now on (V or A), or give `undefined` to
   * let it follow its waveform again.
   *
   * @example
   * ```ts
   * stepper.setSource(bias, 1.2);
   * ```
   */
  setSource(source: VoltageSource | CurrentSource, value: number | undefined): void {
    const e = this.sourceIndex(source);
    if (value !== undefined && !Number.isFinite(value)) {
      throw new InputError('bad-set-point', `set-point ${value} for source "${source.name}" is not finite`, [source.name]);
    }
    this.run.overrideSource(e, value);
    this.touched = true;
  }

  /**
   * Give a source a new waveform from now on (for example a bipolar square
   * with a trimmed on-time mismatch). Validated like the builder's.
   *
   * @example
   * ```ts
   * stepper.setWaveform(drive, bipolarSquare({ amplitude: 24, period: 2e-5, deadTime: 3e-7, mismatch: -1e-8 }));
   * ```
   */
  setWaveform(source: VoltageSource | CurrentSource, spec: WaveformSpec): void {
    const e = this.sourceIndex(source);
    this.run.replaceWaveform(e, spec);
    this.touched = true;
  }

  /**
   * Hold a switch open or closed from now on, or give `undefined` to let it
   * follow its schedule again.
   *
   * @example
   * ```ts
   * stepper.setSwitch(breaker, true);
   * ```
   */
  setSwitch(sw: Switch, closed: boolean | undefined): void {
    const e = this.reader.checkHandle(sw, 'switch').index;
    this.run.overrideSwitch(e, closed);
    this.touched = true;
  }

  /**
   * Give a gate-driven switch a new gate waveform from now on: the way a
   * controller changes a duty cycle or a phase between advances. The new
   * gate is read at the present time at once (a switch whose new gate is
   * high closes now) and its edges are exact breakpoints, as the builder's.
   * Validated like the builder's; throws `not-gate-driven` for a switch
   * that follows a schedule. A watched quantity that jumps across a
   * threshold's level by the change crosses there.
   *
   * @example
   * ```ts
   * stepper.setGate(q1, pulse({ high: 1, period: 10e-6, duty: 0.35, delay: 2.5e-6 }));
   * ```
   */
  setGate(sw: Switch, gate: WaveformSpec): void {
    const e = this.reader.checkHandle(sw, 'switch').index;
    this.run.replaceGate(e, gate);
    this.touched = true;
  }

  /**
   * Make the solver land exactly on time t when passing it (for example a
   * known event of the surrounding model).
   *
   * @example
   * ```ts
   * stepper.addStopTime(0.0125);
   * ```
   */
  addStopTime(t: number): void {
    if (!(Number.isFinite(t) && t > this.time && t <= this.horizon)) {
      throw new InputError('bad-stop-time', `stop time ${t} s must lie after the present time ${this.time} s and within the horizon ${this.horizon} s`, ['stopTime']);
    }
    this.stopTimes = [...this.stopTimes, t].sort((a, b) => a - b);
  }

  /**
   * Call `onSample` every `period` seconds, starting at `start` (default: the
   * present time plus one period). The callback sees the stepper at the
   * sample instant and may change inputs. Returns a function that removes
   * the controller.
   *
   * @example
   * ```ts
   * const stop = stepper.every(1e-5, (s) => { s.setSource(v, controller(s.fluxDensity(leg))); });
   * ```
   */
  every(period: number, onSample: (stepper: NetworkStepper) => void, start?: number): () => void {
    if (!(Number.isFinite(period) && period > 0)) throw new InputError('bad-option', `controller period ${period} s must be > 0`, ['period']);
    const first = start ?? this.time + period;
    if (!(Number.isFinite(first) && first >= this.time)) {
      throw new InputError('bad-option', `controller start ${first} s must not lie before the present time ${this.time} s`, ['start']);
    }
    const id = this.nextControllerId++;
    this.controllers.push({ id, period, start: first, count: 0, next: first, onSample });
    return () => {
      const k = this.controllers.findIndex((c) => c.id === id);
      if (k >= 0) this.controllers.splice(k, 1);
    };
  }

  /**
   * Advance to time t, landing on it exactly: runs controllers at their
   * sample instants, threshold callbacks at their crossings, and stops at
   * stop times on the way. Returns the status (`'running'` when t was
   * reached and more can follow).
   *
   * @example
   * ```ts
   * for (let k = 1; k <= 100; k++) stepper.advanceTo(k * 1e-4);
   * ```
   */
  advanceTo(t: number): 'running' | DaeStatus {
    if (this.inCallback) throw new InputError('reentrant-advance', 'advanceTo was called from a controller or threshold callback; change inputs there and return', []);
    if (!(Number.isFinite(t) && t >= this.time && t <= this.horizon)) {
      throw new InputError('bad-stop-time', `cannot advance to ${t} s: the stepper is at ${this.time} s and its horizon is ${this.horizon} s`, ['t']);
    }
    const due = (x: number): boolean => x - this.time <= timeTolerance(x);
    this.settleInputChanges();
    // With thresholds, every input breakpoint ends an advance of the run, so a jump there is seen.
    const watchJumps = this.thresholds.length > 0;
    while (!due(t) && this.status === 'running') {
      const nextController = Math.min(...this.controllers.map((c) => c.next), Infinity);
      const nextStop = this.stopTimes.find((s) => !due(s)) ?? Infinity;
      const nextEdge = watchJumps ? this.run.inputs.end : Infinity;
      const target = Math.min(t, nextController, nextStop, nextEdge > this.time ? nextEdge : Infinity);
      let status = !due(target) ? this.advanceRun(target) : this.run.status;
      while (status === 'terminal-event') {
        this.handleCrossings();
        status = this.run.resume(this.record);
        if (status === 'running') this.afterRestart();
        if (status === 'running' && !due(target)) status = this.advanceRun(target);
      }
      if (status !== 'running') break;
      this.stopTimes = this.stopTimes.filter((s) => !due(s));
      for (const c of [...this.controllers]) {
        if (due(c.next)) {
          this.callback(() => c.onSample(this));
          do {
            c.count++;
            c.next = c.start + c.count * c.period;
          } while (due(c.next));
        }
      }
      this.settleInputChanges();
    }
    return this.status;
  }

  /**
   * Advance by dt seconds.
   *
   * @example
   * ```ts
   * stepper.advanceBy(1e-3);
   * ```
   */
  advanceBy(dt: number): 'running' | DaeStatus {
    return this.advanceTo(this.time + dt);
  }

  /**
   * Copy the stepper's state (solver, inputs, controllers' next instants,
   * stop times) to continue from it later with {@link NetworkStepper.restore}.
   *
   * @example
   * ```ts
   * const before = stepper.snapshot();
   * stepper.setSwitch(s1, true); stepper.advanceBy(1e-3); // try one way
   * stepper.restore(before);                             // and go back
   * ```
   */
  snapshot(): StepperSnapshot {
    return structuredClone({
      run: this.run.snapshot(),
      controllers: this.controllers.map((c) => ({ id: c.id, count: c.count, next: c.next })),
      stopTimes: [...this.stopTimes],
    });
  }

  /**
   * Continue from a snapshot of this stepper. The recorded history after the
   * snapshot's time is dropped.
   *
   * @example
   * ```ts
   * stepper.restore(before);
   * ```
   */
  restore(snapshot: StepperSnapshot): void {
    this.run.restore(structuredClone(snapshot.run) as RunSnapshot);
    for (const c of this.controllers) {
      const saved = snapshot.controllers.find((s) => s.id === c.id);
      if (saved) {
        c.count = saved.count;
        c.next = saved.next;
      }
    }
    this.stopTimes = [...snapshot.stopTimes];
    this.touched = false;
    this.settled = this.thresholdValues();
  }

  /**
   * The history recorded so far (solver steps) as a simulation result, read
   * by the network's handles.
   *
   * @example
   * ```ts
   * const r = stepper.result();
   * r.fluxDensity(leg);
   * ```
   */
  result(): SimulationResult {
    if (!this.record.steps) {
      throw new InputError('no-history', 'this stepper was created with record: false; create it with record: true to get a result', []);
    }
    return resultFromRun(this.compiled, this.networkId, this.run, `stepped to t = ${this.time} s`);
  }

  private handleCrossings(): void {
    const events = this.run.events;
    const last = events[events.length - 1];
    if (!last) return;
    this.settled = this.thresholdValues();
    for (const e of events) {
      if (e.t !== last.t) continue;
      const watched = this.thresholdEvents[e.index];
      if (!watched) continue;
      const th = this.thresholds[watched.threshold]!;
      this.callback(() => th.onCross(this, { name: th.name, time: e.t, rising: watched.rising }));
    }
  }

  /**
   * Advance the run to target. A restart at the end of the last step (an input breakpoint, or a
   * device's own commutation) is checked for jumps: the step's end under the inputs it was taken
   * with is the left limit.
   */
  private advanceRun(target: number): 'running' | DaeStatus {
    // No input breakpoint lies inside the advance (see advanceTo), so these are the last step's inputs.
    const before = this.run.inputs;
    const status = this.run.advanceTo(target, this.record);
    if (status !== 'running' && status !== 'terminal-event') return status;
    const step = this.run.lastStep();
    if (this.thresholds.length > 0 && step && step.t === this.time && this.run.inputs !== before) {
      const y = evaluateRecordedStep(step, step.t, this.compiled.index2);
      this.settled = this.compiled.inputs.during(before, () => this.thresholdValues(y, step.t));
      this.touched = true;
      this.afterRestart();
    } else {
      this.settled = this.thresholdValues();
    }
    return status;
  }

  /**
   * Apply input changes made from the stepper or its callbacks (restart the
   * run at the present time) and report the jumps across levels they cause;
   * callbacks may change inputs again.
   */
  private settleInputChanges(): void {
    if (!this.touched || this.status !== 'running') return;
    const status = this.run.advanceTo(this.time, this.record);
    if (status === 'running') this.afterRestart();
  }

  /** After a restart at the present time: crossings by jumps since the settled values, repeated while callbacks change inputs. */
  private afterRestart(): void {
    for (let round = 0; this.touched; round++) {
      if (round >= MAX_JUMP_ROUNDS) {
        const names = this.thresholds.map((th) => `"${th.name}"`).join(', ');
        throw new InputError(
          'threshold-chatter',
          `threshold callbacks (${names}) changed inputs back and forth ${MAX_JUMP_ROUNDS} times at t = ${this.time} s, each change crossing a level again; ` +
            'give the levels hysteresis (a lower level to release than to act) or act once per crossing',
          this.thresholds.map((th) => th.name),
        );
      }
      this.touched = false;
      if (this.run.status !== 'running') return;
      if (round > 0 && this.run.advanceTo(this.time, this.record) !== 'running') return;
      const before = this.settled;
      const after = this.thresholdValues();
      this.settled = after;
      this.thresholds.forEach((th, k) => {
        const rising = before[k]! < 0 && after[k]! >= 0;
        const falling = before[k]! > 0 && after[k]! <= 0;
        if ((rising && th.direction !== 'falling') || (falling && th.direction !== 'rising')) {
          this.callback(() => th.onCross(this, { name: th.name, time: this.time, rising }));
        }
      });
    }
  }

  /** Each threshold's value minus its level at state y, time t (default: the present), under the inputs in use. */
  private thresholdValues(y: Float64Array = this.run.y, t: number = this.run.t): Float64Array {
    const out = new Float64Array(this.thresholds.length);
    this.thresholds.forEach((th, k) => {
      out[k] = this.watched[k]!(y, t) - th.level;
    });
    return out;
  }

  private callback(fn: () => void): void {
    this.inCallback = true;
    try {
      fn();
    } finally {
      this.inCallback = false;
    }
  }

  private sourceIndex(source: VoltageSource | CurrentSource): number {
    if (source && typeof source === 'object' && source.kind === 'current-source') return this.reader.checkHandle(source, 'current-source').index;
    return this.reader.checkHandle(source, 'voltage-source').index;
  }
}

/**
 * Create a stepping interface for a network (see {@link NetworkStepper}).
 *
 * @example
 * ```ts
 * const stepper = createStepper(net, { horizon: 0.2, rtol: 1e-6 });
 * stepper.advanceTo(0.01);
 * ```
 */
export function createStepper(network: NetworkInput, options: StepperOptions): NetworkStepper {
  return new NetworkStepper(network, options);
}
