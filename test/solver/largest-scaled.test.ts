import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ComponentList } from '../../src/solver/component-list.js';
import { largestScaled, largestScaledInto } from '../../src/solver/weighted-norm.js';
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

describe('ComponentList', () => {
  // The integrator records a failure's components into one list per run, rewritten at every failed
  // Newton iteration or rejected step: a list reused after any earlier selections must name exactly
  // what a fresh selection (the stable sort above) names.
  it('a reused list selects as a stable sort does, whatever it held before', () => {
    const entry = fc.oneof(fc.double(), fc.constantFrom(0, 1, -1, 2, Infinity, Number.NaN));
    const vectors = fc.array(fc.array(entry, { minLength: 1, maxLength: 12 }), { minLength: 1, maxLength: 4 });
    fc.assert(
      fc.property(vectors, fc.integer({ min: 1, max: 4 }), (vs, count) => {
        const list = new ComponentList(12);
        for (const values of vs) {
          const v = Float64Array.from(values);
          const scale = new Float64Array(v.length).fill(1);
          expect(largestScaledInto(v, scale, count, list).toArray()).toEqual(bySort(v, scale, count));
        }
      }),
      { numRuns: 1000 },
    );
  });

  it('push appends after clear, and toArray copies', () => {
    const list = new ComponentList(4);
    list.push(3);
    list.push(1);
    const named = list.toArray();
    list.clear();
    list.push(2);
    expect(named).toEqual([3, 1]);
    expect(list.toArray()).toEqual([2]);
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
