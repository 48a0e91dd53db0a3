/**
 * A source waveform: its value at any time and the times where it (or its
 * slope) jumps, so that the solver can land on them exactly.
 *
 * @example
 * ```ts
 * const w = compileWaveform(sine({ amplitude: 325, frequency: 50 }));
 * w.value(0.005); // 325
 * ```
 */
export interface Waveform {
  /** Value at time t (V for a voltage source, A for a current source). */
  value(t: number): number;
  /** Sorted times in [t0, t1] where the value or its slope is discontinuous. */
  breakpoints(t0: number, t1: number): number[];
  /**
   * The first breakpoint strictly after `after` (Infinity when there is
   * none), computed on demand in bounded time and memory, so a run can walk
   * any number of edges one at a time. When edges are denser than the
   * floats around `after` (a period below its rounding unit), the next
   * float above `after` is returned.
   */
  nextBreakpoint(after: number): number;
  /**
   * True when the value is affine between consecutive breakpoints (a table
   * of vertices, a constant): equal values at two times with no breakpoint
   * strictly between them mean the same value at every time between.
   */
  readonly piecewiseLinear?: boolean;
}
