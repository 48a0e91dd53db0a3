/**
 * Test helpers: sample grids. Non-uniform grids exercise the time weighting
 * of the integrals (an unweighted average of samples would be wrong on them).
 */

/** n + 1 points on [a, b], smoothly stretched: spacing varies by a factor of about 2. */
export function stretchedGrid(a: number, b: number, n: number): Float64Array {
  const out = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    const s = i / n;
    out[i] = a + (b - a) * (s + (0.3 * Math.sin(2 * Math.PI * s)) / (2 * Math.PI));
  }
  out[n] = b;
  return out;
}

/** n + 1 points on [a, b] with each interior point jittered by up to 40 % of the mean spacing (seeded, reproducible). */
export function jitteredGrid(a: number, b: number, n: number, seed = 12345): Float64Array {
  let state = seed >>> 0;
  const rand = (): number => {
    // xorshift32
    state ^= state << 13;
    state >>>= 0;
    state ^= state >>> 17;
    state ^= state << 5;
    state >>>= 0;
    return state / 4294967296;
  };
  const out = new Float64Array(n + 1);
  const h = (b - a) / n;
  for (let i = 0; i <= n; i++) out[i] = a + h * (i + (i > 0 && i < n ? 0.8 * (rand() - 0.5) : 0));
  return out;
}

/** x(t) sampled on a grid. */
export function sample(t: Float64Array, f: (t: number) => number): Float64Array {
  return t.map(f);
}

/** Observed order of convergence from errors at spacing h and h/2. */
export function observedOrder(errCoarse: number, errFine: number): number {
  return Math.log2(Math.abs(errCoarse) / Math.abs(errFine));
}
