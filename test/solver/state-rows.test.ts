import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { StateRows } from '../../src/solver/state-rows.js';

/** Storage only (common practice: a store must give back what was put in, across chunk boundaries). */
describe('StateRows', () => {
  it('gives back every row pushed, as views and entry by entry, across chunks', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 700 }), fc.integer({ min: 0, max: 400 }), (n, rows) => {
        const store = new StateRows(n);
        const plain: Float64Array[] = [];
        const state = new Float64Array(n);
        for (let k = 0; k < rows; k++) {
          for (let i = 0; i < n; i++) state[i] = k * 1000 + i + 0.5;
          store.push(state); // a copy: the caller reuses its array
          plain.push(state.slice());
        }
        expect(store.length).toBe(rows);
        for (let k = 0; k < rows; k++) {
          expect(Array.from(store.row(k))).toEqual(Array.from(plain[k]!));
          expect(store.get(k, n - 1)).toBe(plain[k]![n - 1]);
        }
      }),
      { numRuns: 40 },
    );
  });
});
