import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { StateRows, type PointSource } from '../../src/solver/state-rows.js';

/** Storage only (common practice: a store must give back what was put in, across chunk boundaries). */
describe('StateRows', () => {
  it('gives back every row pushed, as views and entry by entry, and every time, across chunks', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 700 }), fc.integer({ min: 0, max: 400 }), (n, rows) => {
        const store = new StateRows(n);
        const plain: Float64Array[] = [];
        const point = new Float64Array(n + 1);
        for (let k = 0; k < rows; k++) {
          point[0] = k / 3;
          for (let i = 0; i < n; i++) point[1 + i] = k * 1000 + i + 0.5;
          store.push(point); // a copy: the caller reuses its array
          plain.push(point.slice(1));
        }
        expect(store.length).toBe(rows);
        expect(Array.from(store.times())).toEqual(Array.from({ length: rows }, (_, k) => k / 3));
        for (let k = 0; k < rows; k++) {
          expect(Array.from(store.row(k))).toEqual(Array.from(plain[k]!));
          expect(store.get(k, n - 1)).toBe(plain[k]![n - 1]);
        }
      }),
      { numRuns: 40 },
    );
  });

  it('stores rows written in place by a source as it stores pushed copies, mixed across chunks', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 300 }), fc.integer({ min: 0, max: 400 }), (n, rows) => {
        const store = new StateRows(n);
        const point = new Float64Array(n + 1);
        // A source writing row k's time and state at the offset it is given.
        let k = 0;
        const source: PointSource = {
          readPoint(out, offset) {
            out[offset] = k / 7;
            for (let i = 0; i < n; i++) out[offset + 1 + i] = -k * 1000 - i - 0.25;
          },
        };
        for (; k < rows; k++) {
          if (k % 3 === 0) {
            point[0] = k / 7;
            for (let i = 0; i < n; i++) point[1 + i] = -k * 1000 - i - 0.25;
            store.push(point);
          } else {
            store.pushFrom(source);
          }
        }
        expect(store.length).toBe(rows);
        expect(Array.from(store.times())).toEqual(Array.from({ length: rows }, (_, j) => j / 7));
        for (let j = 0; j < rows; j++) {
          expect(Array.from(store.row(j))).toEqual(Array.from({ length: n }, (_, i) => -j * 1000 - i - 0.25));
        }
      }),
      { numRuns: 40 },
    );
  });
});
