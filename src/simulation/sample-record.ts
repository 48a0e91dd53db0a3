import { Float64Rows } from './float64-rows.js';

/** Entries of a sample's row before its state: its time and its input interval. */
const TIME = 0;
const INTERVAL = 1;
const STATE = 2;

/**
 * The samples of a run, in time order: per sample its time, the index of
 * its input interval (the inputs in force for it, see NetworkRun.intervals)
 * and its state, stored as one row of numbers each (see
 * {@link Float64Rows}) rather than an object and a typed array per sample.
 *
 * @example
 * ```ts
 * const samples = new SampleRecord(2);
 * samples.push(0, 0, Float64Array.of(1, 2));
 * samples.state(0, new Float64Array(2)); // [1, 2]
 * ```
 *
 * @internal
 */
export class SampleRecord {
  private readonly rows: Float64Rows;

  constructor(
    /** Length of a state. */
    readonly size: number,
    rows?: Float64Rows,
  ) {
    this.rows = rows ?? new Float64Rows(size + STATE);
  }

  /** Number of samples. */
  get length(): number {
    return this.rows.length;
  }

  /** Numbers held (for memory bounds). */
  get storedNumbers(): number {
    return this.rows.storedNumbers;
  }

  /** Keep a sample: a copy of y at time t in input interval `interval`. */
  push(t: number, interval: number, y: Float64Array): void {
    const k = this.rows.pushZeros();
    const data = this.rows.writable(k);
    const o = this.rows.offsetOf(k);
    data[o + TIME] = t;
    data[o + INTERVAL] = interval;
    const n = this.size;
    for (let i = 0; i < n; i++) data[o + STATE + i] = y[i]!;
  }

  /** Time of sample k, s. */
  time(k: number): number {
    return this.rows.get(k, TIME);
  }

  /** Input interval of sample k. */
  interval(k: number): number {
    return this.rows.get(k, INTERVAL);
  }

  /** Entry i of sample k's state. */
  value(k: number, i: number): number {
    return this.rows.get(k, STATE + i);
  }

  /** Replace entry i of sample k's state. */
  setValue(k: number, i: number, v: number): void {
    this.rows.set(k, STATE + i, v);
  }

  /** Sample k's state copied into out; returns out. */
  state(k: number, out: Float64Array): Float64Array {
    return this.rows.copyOut(k, STATE, this.size, out);
  }

  /**
   * Whether sample k's state is y bit for bit (signed zeros told apart by their reciprocals). The
   * reciprocals are compared for every entry, not only for zeros: zeros are mostly met at a run's
   * start only, where a branch of their own would have no type feedback when V8 optimises the steps'
   * code, and the next run's start would throw that code away (docs/solver.md).
   */
  stateEquals(k: number, y: Float64Array): boolean {
    const data = this.rows.blockOf(k);
    const o = this.rows.offsetOf(k) + STATE;
    for (let i = 0; i < this.size; i++) {
      const a = data[o + i]!;
      const b = y[i]!;
      if (a !== b || 1 / a !== 1 / b) return false;
    }
    return true;
  }

  /** Keep the first `count` samples only. */
  truncate(count: number): void {
    this.rows.truncate(count);
  }

  /** The samples so far, as a record that never changes (for a result taken from a live run). */
  snapshot(): SampleRecord {
    return new SampleRecord(this.size, this.rows.snapshot());
  }
}
