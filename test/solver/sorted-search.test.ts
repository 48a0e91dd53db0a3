import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { firstIndexAbove } from '../../src/solver/sorted-search.js';

describe('firstIndexAbove', () => {
  it('equals the count of entries <= x found by a linear scan (common practice: upper bound)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -20, max: 20 }), { maxLength: 40 }), fc.integer({ min: -25, max: 25 }), (raw, x) => {
        const sorted = Float64Array.from(raw).sort();
        const expected = Array.from(sorted).filter((v) => v <= x).length;
        expect(firstIndexAbove(sorted, x)).toBe(expected);
      }),
      { numRuns: 500 },
    );
  });
});
