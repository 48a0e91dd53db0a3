import { nextUp } from '../solver/float-neighbours.js';
import { packedDoublesFrom } from '../solver/packed-doubles.js';
import type { Waveform } from './waveform.js';

/**
 * Vertices of a piecewise-linear waveform, the common engine of the pulse
 * train, the bipolar square and the piecewise-linear table.
 *
 * - `times` are absolute times of the first period (or of the whole table when
 *   not repeating), non-decreasing. Two vertices at the same time make a jump;
 *   the waveform is right-continuous (at a jump it takes the later vertex's
 *   value).
 * - `period`: when given, the pattern repeats with this period from `times[0]`;
 *   `times[last]` must then equal `times[0] + period` (the closing vertex).
 * - before `times[0]` the value is `before`; after the last vertex of a
 *   non-repeating table it holds the last value.
 *
 * @internal
 */
export interface VertexTable {
  readonly times: Float64Array;
  readonly values: Float64Array;
  readonly period?: number;
  readonly before: number;
}

/**
 * Compile a {@link VertexTable} into a {@link Waveform}.
 *
 * Edge k of vertex j is at `times[j] + k * period`, computed from k directly
 * (never by accumulating periods), in one place ({@link edgeTime}) used by both
 * `value` and `breakpoints`, so the value at a reported breakpoint is always
 * the value after that edge, even after millions of periods.
 *
 * @internal
 */
export function vertexWaveform(table: VertexTable): Waveform {
  return new VertexWaveform(table);
}

/**
 * The waveform of {@link vertexWaveform} as a class: its methods are the same
 * functions for every waveform compiled, so a caller that walks edges run
 * after run (the input schedule's nextEdge) keeps one call target (closures
 * per compile were a new target each time, and deoptimised that caller).
 */
class VertexWaveform implements Waveform {
  /** The table's vertices in plain arrays (see packedDoubles): read at every source value the drive is not held. */
  private readonly times: number[];
  private readonly values: number[];
  private readonly last: number;
  private readonly period: number | undefined;
  private readonly before: number;
  private readonly first: number;
  private readonly closing: number;
  private readonly edgeVertices: number[];
  // Every vertex is a breakpoint (the closing vertex of a period is the next period's first), so
  // the value is affine between consecutive breakpoints.
  readonly piecewiseLinear = true;

  constructor(table: VertexTable) {
    const times = (this.times = packedDoublesFrom(table.times));
    this.values = packedDoublesFrom(table.values);
    const last = (this.last = times.length - 1);
    const period = (this.period = table.period);
    this.before = table.before;
    const first = (this.first = times[0] ?? 0);

    // Breakpoint vertices: distinct times, and for a repeating table none at (or
    // within rounding of) the closing vertex: that edge is the next period's first.
    const closing = (this.closing = times[last] ?? first);
    const eps = 8 * Number.EPSILON * Math.max(Math.abs(first), Math.abs(closing), period ?? 0);
    const edgeVertices: number[] = (this.edgeVertices = []);
    const limit = period === undefined ? last : last - 1;
    for (let j = 0; j <= limit; j++) {
      const tj = times[j] ?? 0;
      if (j > 0 && tj === times[j - 1]) continue;
      if (period !== undefined && j > 0 && closing - tj <= eps) continue;
      edgeVertices.push(j);
    }
  }

  private edgeTime(j: number, k: number): number {
    return (this.times[j] ?? 0) + k * (this.period ?? 0);
  }

  /** Largest j with edgeTime(j, k) <= t (t >= edgeTime(0, k) assumed). */
  private findVertex(t: number, k: number): number {
    let lo = 0;
    let hi = this.last;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.edgeTime(mid, k) <= t) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  value(t: number): number {
    const { values, last, period, first } = this;
    if (Number.isNaN(t)) return Number.NaN;
    if (t < first) return this.before;
    let k = 0;
    if (period !== undefined) {
      k = Math.floor((t - first) / period);
      // Rounding in the division can put k one off; settle it against the edge formula. Bounded:
      // a period below the rounding unit of t (k + 1 === k, or edges that no longer advance) ends it.
      for (let settle = 0; settle < 4 && k > 0 && this.edgeTime(0, k) > t; settle++) k--;
      for (let settle = 0; settle < 4 && this.edgeTime(0, k + 1) <= t && this.edgeTime(0, k + 1) > this.edgeTime(0, k); settle++) k++;
    }
    const j = this.findVertex(t, k);
    const vj = values[j] ?? 0;
    if (j >= last) return vj;
    const tj = this.edgeTime(j, k);
    const tn = this.edgeTime(j + 1, k);
    const vn = values[j + 1] ?? vj;
    if (vn === vj || !(tn > tj)) return vj;
    return vj + ((vn - vj) * (t - tj)) / (tn - tj);
  }

  breakpoints(t0: number, t1: number): number[] {
    const { period, edgeVertices, closing } = this;
    const out: number[] = [];
    if (!(t1 >= t0) || edgeVertices.length === 0) return out;
    const push = (b: number): void => {
      if (b >= t0 && b <= t1 && (out.length === 0 || b > (out[out.length - 1] ?? -Infinity))) out.push(b);
    };
    if (period === undefined) {
      for (const j of edgeVertices) push(this.edgeTime(j, 0));
      return out;
    }
    // First period whose edges can reach t0, computed (not scanned); one period of slack for rounding.
    let k = Math.max(0, Math.ceil((t0 - closing) / period) - 1);
    // k + 1 === k: the period is below the rounding unit of k (no further edge can be told apart).
    while (this.edgeTime(0, k) <= t1 && k + 1 > k) {
      for (const j of edgeVertices) push(this.edgeTime(j, k));
      k++;
    }
    return out;
  }

  nextBreakpoint(after: number): number {
    const { period, edgeVertices, first } = this;
    if (edgeVertices.length === 0 || Number.isNaN(after)) return Infinity;
    if (period === undefined) {
      for (const j of edgeVertices) if (this.edgeTime(j, 0) > after) return this.edgeTime(j, 0);
      return Infinity;
    }
    // The period index is computed, then at most a few periods are tried (one of slack each side for rounding).
    const k0 = Math.max(0, Math.floor((after - first) / period) - 1);
    for (let k = k0; k < k0 + 4; k++) {
      for (const j of edgeVertices) if (this.edgeTime(j, k) > after) return this.edgeTime(j, k);
    }
    // Edges denser than the floats around `after`: the next float is an edge.
    return nextUp(after);
  }
}
