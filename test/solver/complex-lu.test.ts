import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createComplexLu } from '../../src/solver/complex-lu.js';
import { createEmbeddedComplexLu } from '../../src/solver/ml-matrix-lu.js';

describe('createComplexLu', () => {
  it('solves like ml-matrix on the real 2n x 2n embedding [[re, -im], [im, re]] (n = 1..20)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 20 }).chain((n) =>
          fc.tuple(
            fc.constant(n),
            fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 2 * n * n, maxLength: 2 * n * n }),
            fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 2 * n, maxLength: 2 * n }),
          ),
        ),
        ([n, a, b]) => {
          const re = Float64Array.from(a.slice(0, n * n));
          const im = Float64Array.from(a.slice(n * n));
          for (let i = 0; i < n; i++) re[i * n + i] = re[i * n + i]! + 2 * n; // well conditioned
          const flat = createComplexLu(n);
          const ref = createEmbeddedComplexLu(n);
          expect(flat.factor(re, im)).toBe(-1);
          expect(ref.factor(re, im)).toBe(-1);
          const xr = Float64Array.from(b.slice(0, n));
          const xi = Float64Array.from(b.slice(n));
          const yr = Float64Array.from(xr);
          const yi = Float64Array.from(xi);
          flat.solve(xr, xi);
          ref.solve(yr, yi);
          for (let i = 0; i < n; i++) {
            expect(xr[i]!).toBeCloseTo(yr[i]!, 10);
            expect(xi[i]!).toBeCloseTo(yi[i]!, 10);
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  it('solves (1 + i) x = 2 as x = 1 - i (hand check)', () => {
    const lu = createComplexLu(1);
    lu.factor(Float64Array.of(1), Float64Array.of(1));
    const re = Float64Array.of(2);
    const im = Float64Array.of(0);
    lu.solve(re, im);
    expect(re[0]).toBeCloseTo(1, 15);
    expect(im[0]).toBeCloseTo(-1, 15);
  });

  it('reports a singular complex matrix (second row = i times the first) at its dependent column', () => {
    // rows [1, 2] and i*[1, 2]
    const bad = createComplexLu(2).factor(Float64Array.of(1, 2, 0, 0), Float64Array.of(0, 0, 1, 2));
    expect(bad).toBe(1);
  });
});
