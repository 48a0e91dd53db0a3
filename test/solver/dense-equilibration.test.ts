import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { equilibrateComplex, equilibrateReal } from '../../src/solver/dense-equilibration.js';
import { equilibrationScales } from '../../src/solver/linear-solver.js';
import { packedDoubles } from '../../src/solver/packed-doubles.js';

/**
 * Reference: the row-then-column equilibration by its definition (LAPACK's
 * xGEEQU with power-of-two factors, Golub and Van Loan, Matrix
 * Computations, sect. 3.5.2), written with a per-entry callback and a
 * separate column pass (`equilibrationScales`). The array kernels collect the
 * column maxima row by row instead; the factors must be the same, exactly.
 */
const entry = fc.oneof(
  fc.double({ min: -1e6, max: 1e6, noNaN: true }),
  fc.double({ min: -1e-300, max: 1e-300, noNaN: true }),
  fc.constantFrom(0, -0, 1, -1, 1e300, -1e-310),
);

const matrices = fc.integer({ min: 1, max: 12 }).chain((n) =>
  fc.tuple(fc.constant(n), fc.array(entry, { minLength: n * n, maxLength: n * n }), fc.array(entry, { minLength: n * n, maxLength: n * n })),
);

describe('dense equilibration kernels', () => {
  it('give the same power-of-two factors as the definition (real)', () => {
    fc.assert(
      fc.property(matrices, ([n, a]) => {
        const m = Array.from(a);
        const r1 = packedDoubles(n);
        const c1 = packedDoubles(n);
        const r2 = new Float64Array(n);
        const c2 = new Float64Array(n);
        expect(equilibrateReal(n, m, r1, c1)).toBe(-1);
        expect(equilibrationScales(n, (i, j) => Math.abs(m[i * n + j]!), r2, c2)).toBe(-1);
        expect(Array.from(r1)).toEqual(Array.from(r2));
        expect(Array.from(c1)).toEqual(Array.from(c2));
      }),
      { numRuns: 400 },
    );
  });

  it('give the same power-of-two factors as the definition (complex, |re| + |im|)', () => {
    fc.assert(
      fc.property(matrices, ([n, a, b]) => {
        const re = Array.from(a);
        const im = Array.from(b);
        const r1 = packedDoubles(n);
        const c1 = packedDoubles(n);
        const r2 = new Float64Array(n);
        const c2 = new Float64Array(n);
        expect(equilibrateComplex(n, re, im, r1, c1)).toBe(-1);
        expect(equilibrationScales(n, (i, j) => Math.abs(re[i * n + j]!) + Math.abs(im[i * n + j]!), r2, c2)).toBe(-1);
        expect(Array.from(r1)).toEqual(Array.from(r2));
        expect(Array.from(c1)).toEqual(Array.from(c2));
      }),
      { numRuns: 400 },
    );
  });

  it('report the column of the first non-finite entry, rows scanned in order', () => {
    const n = 3;
    const a = [1, 2, 3, 4, Infinity, 6, NaN, 8, 9];
    const r = packedDoubles(n);
    const c = packedDoubles(n);
    expect(equilibrateReal(n, a, r, c)).toBe(1);
    expect(equilibrateComplex(n, [1, 2, 3, 4, 5, 6, 7, 8, 9], [0, 0, 0, 0, 0, 0, 0, 0, NaN], r, c)).toBe(2);
  });
});
