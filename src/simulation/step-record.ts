import { Float64Rows } from './float64-rows.js';
import type { RecordedStep } from './recorded-step.js';

/** Entries of a step's row before its start state and polynomial. */
const T_OLD = 0;
const T = 1;
const H = 2;
const INTERVAL = 3;
const FIRST = 4;
const Y_OLD = 5;

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
 * object and typed arrays per step. Readers load a step into a
 * {@link StepBuffer}.
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

  constructor(
    /** Length of a state. */
    readonly size: number,
    rows?: Float64Rows,
  ) {
    this.rows = rows ?? new Float64Rows(Y_OLD + 4 * size);
  }

  /** Number of steps. */
  get length(): number {
    return this.rows.length;
  }

  /** Numbers held (for memory bounds). */
  get storedNumbers(): number {
    return this.rows.storedNumbers;
  }

  /** Keep a copy of a step. */
  push(step: RecordedStep): void {
    const k = this.rows.pushZeros();
    const data = this.rows.writable(k);
    const o = this.rows.offsetOf(k);
    data[o + T_OLD] = step.tOld;
    data[o + T] = step.t;
    data[o + H] = step.h;
    data[o + INTERVAL] = step.interval;
    data[o + FIRST] = step.firstAfterStart ? 1 : 0;
    const n = this.size;
    const yOld = step.yOld;
    const q = step.q;
    for (let i = 0; i < n; i++) data[o + Y_OLD + i] = yOld[i]!;
    for (let i = 0; i < 3 * n; i++) data[o + Y_OLD + n + i] = q[i]!;
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
    const data = this.rows.blockOf(k);
    const o = this.rows.offsetOf(k);
    into.tOld = data[o + T_OLD]!;
    into.t = data[o + T]!;
    into.h = data[o + H]!;
    into.interval = data[o + INTERVAL]!;
    into.firstAfterStart = data[o + FIRST] === 1;
    const n = this.size;
    this.rows.copyOut(k, Y_OLD, n, into.yOld);
    this.rows.copyOut(k, Y_OLD + n, 3 * n, into.q);
    return into;
  }

  /** The last step in a buffer of its own, or undefined before the first step. */
  last(): StepBuffer | undefined {
    return this.length > 0 ? this.load(this.length - 1, new StepBuffer(this.size)) : undefined;
  }

  /** Keep the first `count` steps only. */
  truncate(count: number): void {
    this.rows.truncate(count);
  }

  /** The steps so far, as a record that never changes (for a result taken from a live run). */
  snapshot(): StepRecord {
    return new StepRecord(this.size, this.rows.snapshot());
  }
}
