import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { largestScaled } from '../../src/solver/weighted-norm.js';
import { Float64Chunks } from '../../src/solver/float64-chunks.js';

/**
 * The components a failure names: the selection must give exactly what a
 * stable sort of every index by |v_i / scale_i|, largest first, gives (the
 * ECMAScript Array.prototype.sort is stable since ES2019, sect. 23.1.3.30),
 * NaN and zero left out. The reference here is that sort, written out.
 */
function bySort(v: Float64Array, scale: Float64Array, count: number): number[] {
  const idx: number[] = [];
  for (let i = 0; i < v.length; i++) {
    const a = Math.abs(v[i]! / scale[i]!);
    if (!Number.isNaN(a) && a > 0) idx.push(i);
  }
  idx.sort((a, b) => Math.abs(v[b]! / scale[b]!) - Math.abs(v[a]! / scale[a]!));
  return idx.slice(0, count);
}

describe('largestScaled', () => {
  it('agrees with a stable sort on random vectors with ties, zeros, NaN and infinities', () => {
    const entry = fc.oneof(fc.double(), fc.constantFrom(0, -0, 1, -1, 2, Infinity, -Infinity, Number.NaN, 1e-310));
    fc.assert(
      fc.property(fc.array(fc.tuple(entry, fc.constantFrom(1, 2, 0.5, 1e-300)), { maxLength: 12 }), fc.integer({ min: 0, max: 5 }), (pairs, count) => {
        const v = Float64Array.from(pairs, (p) => p[0]);
        const scale = Float64Array.from(pairs, (p) => p[1]);
        expect(largestScaled(v, scale, count)).toEqual(bySort(v, scale, count));
      }),
      { numRuns: 2000 },
    );
  });
});

describe('Float64Chunks', () => {
  it('hands out disjoint views that keep their values while later ones are taken', () => {
    const chunks = new Float64Chunks(10);
    const views = Array.from({ length: 7 }, (_, k) => chunks.copy(Float64Array.of(k, k + 0.5, -k)));
    views.forEach((v, k) => expect(Array.from(v)).toEqual([k, k + 0.5, -k]));
    expect(chunks.take(25).length).toBe(25); // longer than a chunk: a chunk of its own
  });
});
