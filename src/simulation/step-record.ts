import { Float64Rows } from './float64-rows.js';
import type { DeferredInnerNodes, DeferredInputs } from './deferred-inner-nodes.js';
import type { RecordedStep } from './recorded-step.js';
import type { SampleRecord } from './sample-record.js';

/** Entries of a step's row before its start state and polynomial. */
const T_OLD = 0;
const T = 1;
const H = 2;
const INTERVAL = 3;
const FIRST = 4;
/** Where the start state is: sample s for s >= 0, else row -1 - s of the step record's own start states. */
const START = 5;
/** The index of the step's DeferredInputs when it was kept in the deferred form (see push), else -1. */
const DEFERRED = 6;
const Q = 7;

/**
 * A step's interpolant in arrays of its own, refilled in place: the run's
 * step in hand and the step a reader of a {@link StepRecord} loads (one per
 * reader, not one per step).
 *
 * @example
 * ```ts
 * const step = new StepBuffer(n);
 * record.load(k, step);
 * evaluateRecordedStep(step, t, index2, y);
 * ```
 *
 * @internal
 */
export class StepBuffer implements RecordedStep {
  tOld = NaN;
  t = NaN;
  h = NaN;
  interval = 0;
  firstAfterStart = false;
  readonly yOld: Float64Array;
  readonly q: Float64Array;

  constructor(size: number) {
    this.yOld = new Float64Array(size);
    this.q = new Float64Array(3 * size);
  }
}

/**
 * The accepted steps of a run, in time order: per step its span, input
 * interval, start state and collocation polynomial (see {@link RecordedStep}),
 * stored as one row of numbers each (see {@link Float64Rows}) rather than an
 * object and typed arrays per step. A step's start state is usually the
 * state of a sample kept already (the previous step's end, or the restart),
 * bit for bit: then the row names that sample instead of holding a copy.
 * Readers load a step into a {@link StepBuffer}.
 *
 * @example
 * ```ts
 * const steps = new StepRecord(n);
 * steps.push(step);
 * const last = steps.load(steps.length - 1, new StepBuffer(n));
 * ```
 *
 * @internal
 */
export class StepRecord {
  private readonly rows: Float64Rows;
  /** Start states that are no sample's. */
  private readonly starts: Float64Rows;

  constructor(
    /** Length of a state. */
    readonly size: number,
    /** The samples a step's start state may be read from (see push). */
    private readonly samples: SampleRecord,
    rows?: Float64Rows,
    starts?: Float64Rows,
    /** What completes a step kept in the deferred form when it is loaded (see push). */
    private readonly completion?: DeferredInnerNodes,
    /** The inputs and maps of the deferred steps, in step order. */
    private readonly deferred: DeferredInputs[] = [],
  ) {
    this.rows = rows ?? new Float64Rows(Q + 3 * size);
    this.starts = starts ?? new Float64Rows(size);
  }

  /** Number of steps. */
  get length(): number {
    return this.rows.length;
  }

  /** Numbers held (for memory bounds). */
  get storedNumbers(): number {
    return this.rows.storedNumbers + this.starts.storedNumbers;
  }

  /**
   * Keep a copy of a step. `startSample` is the index of a sample of the
   * record whose state is the step's start state bit for bit (it must stay
   * so: not a sample rewritten later), or -1 to keep a copy of the start state.
   * `deferred`: the step's algebraic coefficients are in the reduced
   * formulation's deferred form (see InnerNodes), completed under these
   * inputs and map at each load (the record needs its completion then).
   */
  push(step: RecordedStep, startSample: number, deferred?: DeferredInputs): void {
    const k = this.rows.pushZeros();
    const block = this.rows.writable(k);
    const o = this.rows.offsetOf(k);
    block[o + T_OLD] = step.tOld;
    block[o + T] = step.t;
    block[o + H] = step.h;
    block[o + INTERVAL] = step.interval;
    block[o + FIRST] = step.firstAfterStart ? 1 : 0;
    if (deferred) {
      if (this.deferred[this.deferred.length - 1] !== deferred) this.deferred.push(deferred);
      block[o + DEFERRED] = this.deferred.length - 1;
    } else {
      block[o + DEFERRED] = -1;
    }
    const n = this.size;
    const q = step.q;
    for (let i = 0; i < 3 * n; i++) block[o + Q + i] = q[i]!;
    if (startSample >= 0) {
      block[o + START] = startSample;
    } else {
      const j = this.starts.pushZeros();
      block[o + START] = -1 - j;
      const own = this.starts.writable(j);
      const so = this.starts.offsetOf(j);
      const yOld = step.yOld;
      for (let i = 0; i < n; i++) own[so + i] = yOld[i]!;
    }
  }

  /** Start time of step k, s. */
  tOld(k: number): number {
    return this.rows.get(k, T_OLD);
  }

  /** End time of step k, s. */
  t(k: number): number {
    return this.rows.get(k, T);
  }

  /** Input interval of step k. */
  interval(k: number): number {
    return this.rows.get(k, INTERVAL);
  }

  /** Step k copied into `into`; returns it. */
  load(k: number, into: StepBuffer): StepBuffer {
    const block = this.rows.blockOf(k);
    const o = this.rows.offsetOf(k);
    into.tOld = block[o + T_OLD]!;
    into.t = block[o + T]!;
    into.h = block[o + H]!;
    into.interval = block[o + INTERVAL]!;
    into.firstAfterStart = block[o + FIRST] === 1;
    const start = block[o + START]!;
    const n = this.size;
    if (start >= 0) this.samples.state(start, into.yOld);
    else this.starts.copyOut(-1 - start, 0, n, into.yOld);
    this.rows.copyOut(k, Q, 3 * n, into.q);
    const deferred = block[o + DEFERRED]!;
    if (deferred >= 0) this.completion!.complete(into, this.deferred[deferred]!);
    return into;
  }

  /** The last step in a buffer of its own, or undefined before the first step. */
  last(): StepBuffer | undefined {
    return this.length > 0 ? this.load(this.length - 1, new StepBuffer(this.size)) : undefined;
  }

  /** Keep the first `count` steps only (with their own start states). */
  truncate(count: number): void {
    if (count >= this.length) return;
    // Own start states are kept in step order: those of the steps kept come first.
    let starts = 0;
    for (let k = Math.max(0, count) - 1; k >= 0; k--) {
      const start = this.rows.get(k, START);
      if (start < 0) {
        starts = -start;
        break;
      }
    }
    this.starts.truncate(starts);
    // The deferred steps' inputs likewise: a streamed run holds those of its last step only.
    let deferred = 0;
    for (let k = Math.max(0, count) - 1; k >= 0 && this.deferred.length > 0; k--) {
      const index = this.rows.get(k, DEFERRED);
      if (index >= 0) {
        deferred = index + 1;
        break;
      }
    }
    this.deferred.length = deferred;
    this.rows.truncate(count);
  }

  /**
   * The steps so far, as a record that never changes (for a result taken
   * from a live run), reading start states from `samples`, a snapshot of
   * this record's samples taken at the same time.
   */
  snapshot(samples: SampleRecord): StepRecord {
    return new StepRecord(this.size, samples, this.rows.snapshot(), this.starts.snapshot(), this.completion, this.deferred.slice());
  }
}
