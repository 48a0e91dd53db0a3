import type { NetworkDescription } from '../../src/network/description.js';
import type { SimulationResult } from '../../src/result/simulation-result.js';
import type { FluxTube } from '../../src/network/handles.js';

/**
 * Largest flux imbalance at any magnetic node over all samples, relative to
 * the largest tube flux: Kirchhoff's flux law (div B = 0) says the flux into
 * a node equals the flux out.
 */
export function maxFluxImbalance(r: SimulationResult, tubes: readonly FluxTube[]): number {
  const d: NetworkDescription = r.network;
  const flux = tubes.map((t) => r.flux(t));
  let scale = 0;
  for (const f of flux) for (const x of f) scale = Math.max(scale, Math.abs(x));
  let worst = 0;
  d.magneticNodes.forEach((_, node) => {
    for (let k = 0; k < r.time.length; k++) {
      let s = 0;
      tubes.forEach((t, j) => {
        const desc = d.tubes[t.index]!;
        if (desc.from === node) s -= flux[j]![k]!;
        if (desc.to === node) s += flux[j]![k]!;
      });
      worst = Math.max(worst, Math.abs(s));
    }
  });
  return scale === 0 ? worst : worst / scale;
}

/** Largest |a - b| over the samples, relative to max |b|. */
export function maxRelativeDeviation(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let num = 0;
  let den = 0;
  for (let k = 0; k < a.length; k++) {
    num = Math.max(num, Math.abs(a[k]! - b[k]!));
    den = Math.max(den, Math.abs(b[k]!));
  }
  return den === 0 ? num : num / den;
}

/** Index of the first sample at or after time t. */
export function sampleAt(time: Float64Array, t: number): number {
  let k = 0;
  while (k < time.length && time[k]! < t) k++;
  return k;
}
