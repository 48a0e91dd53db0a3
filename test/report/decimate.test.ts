import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decimateMinMax } from '../../src/report/index.js';

// The method: U. Jugel et al., "M4: a visualization-oriented time series data
// aggregation", PVLDB 7(10), 2014, sect. 4: keeping first, last, min and max of
// every pixel column draws the same pixels as the full series. The invariants
// tested here follow from that definition.

/** The bucket index of each sample, as the implementation defines buckets (equal widths of [t0, t1]). */
function bucketsOf(t: ArrayLike<number>, nb: number, t0 = t[0] as number, t1 = t[t.length - 1] as number): number[] {
  const scale = t1 > t0 ? nb / (t1 - t0) : 0;
  return Array.from(t, (x) => Math.min(nb - 1, Math.max(0, Math.floor((x - t0) * scale))));
}

describe('decimateMinMax', () => {
  it('keeps a one-sample spike in a long sine (the inrush peak survives decimation)', () => {
    const n = 100_000;
    const t = new Float64Array(n);
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      t[i] = i * 1e-6;
      v[i] = Math.sin(2 * Math.PI * 50 * t[i]!);
    }
    v[31_337] = 42; // spike
    v[77_777] = -17; // negative spike
    const keep = decimateMinMax(t, [v], 500);
    expect(keep.length).toBeLessThanOrEqual(4 * 500);
    expect(keep.length).toBeLessThan(n / 40);
    const kept = Array.from(keep, (i) => v[i]!);
    expect(Math.max(...kept)).toBe(42);
    expect(Math.min(...kept)).toBe(-17);
    expect(Array.from(keep)).toContain(31_337);
    expect(Array.from(keep)).toContain(77_777);
    expect(keep[0]).toBe(0);
    expect(keep[keep.length - 1]).toBe(n - 1);
  });

  it('returns every index when the series is short (at most 4 samples per bucket)', () => {
    const t = [0, 1, 2, 3, 4, 5, 6, 7];
    expect(Array.from(decimateMinMax(t, [t], 2))).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
  });

  it('keeps each column\'s own extremes when several columns share the time vector', () => {
    const n = 10_000;
    const t = Array.from({ length: n }, (_, i) => i);
    const a = t.map((i) => (i === 1234 ? 9 : 0));
    const b = t.map((i) => (i === 8765 ? -9 : 0));
    const keep = Array.from(decimateMinMax(t, [a, b], 50));
    expect(keep).toContain(1234);
    expect(keep).toContain(8765);
  });

  it('keeps a non-finite sample of each bucket so gaps stay visible', () => {
    const n = 10_000;
    const t = Array.from({ length: n }, (_, i) => i);
    const v = t.map((i) => (i >= 5000 && i < 5003 ? NaN : Math.sin(i / 100)));
    const keep = Array.from(decimateMinMax(t, [v], 100));
    expect(keep.some((i) => Number.isNaN(v[i]!))).toBe(true);
  });

  it('keeps first, last, min and max of every bucket, in ascending order, within (2 + 3c) per bucket (property, M4)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 600 }),
        fc.array(fc.double({ min: 0, max: 10, noNaN: true }), { minLength: 1, maxLength: 600 }),
        fc.integer({ min: 1, max: 60 }),
        (values, steps, nb) => {
          const n = Math.min(values.length, steps.length);
          const v = values.slice(0, n);
          const t: number[] = [];
          let acc = 0;
          for (let i = 0; i < n; i++) t.push((acc += steps[i]!)); // non-decreasing, repeats allowed
          const keep = Array.from(decimateMinMax(t, [v], nb));
          for (let k = 1; k < keep.length; k++) expect(keep[k]!).toBeGreaterThan(keep[k - 1]!);
          expect(keep.length).toBeLessThanOrEqual(Math.max(n <= 4 * nb ? n : 0, 5 * nb));
          const b = bucketsOf(t, nb);
          const kept = new Set(keep);
          for (let bucket = 0; bucket < nb; bucket++) {
            const idx = b.flatMap((bb, i) => (bb === bucket ? [i] : []));
            if (idx.length === 0) continue;
            const inBucket = idx.map((i) => v[i]!);
            const shown = idx.filter((i) => kept.has(i)).map((i) => v[i]!);
            expect(kept.has(idx[0]!)).toBe(true);
            expect(kept.has(idx[idx.length - 1]!)).toBe(true);
            expect(Math.max(...shown)).toBe(Math.max(...inBucket));
            expect(Math.min(...shown)).toBe(Math.min(...inBucket));
          }
        },
      ),
      { numRuns: 300 },
    );
  });

  it('does not modify its inputs', () => {
    const t = Float64Array.from({ length: 1000 }, (_, i) => i);
    const v = Float64Array.from(t, (x) => Math.cos(x));
    const tCopy = t.slice();
    const vCopy = v.slice();
    decimateMinMax(t, [v], 10);
    expect(t).toEqual(tCopy);
    expect(v).toEqual(vCopy);
  });
});
