import type { Waveform } from '../../src/index.js';

/**
 * Exact integral over [a, b] of a waveform that is linear between its
 * breakpoints: the midpoint rule is exact for a linear function, so summing
 * it over the intervals between consecutive breakpoints is exact up to
 * rounding (test helper; derived).
 */
export function piecewiseLinearIntegral(w: Waveform, a: number, b: number): number {
  const nodes = [a, ...w.breakpoints(a, b).filter((x) => x > a && x < b), b];
  let sum = 0;
  for (let i = 0; i + 1 < nodes.length; i++) {
    const lo = nodes[i] ?? 0;
    const hi = nodes[i + 1] ?? 0;
    sum += (hi - lo) * w.value(0.5 * (lo + hi));
  }
  return sum;
}
