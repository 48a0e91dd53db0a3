import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { powerOfTwoInverse } from '../../src/solver/linear-solver.js';

/**
 * Reference: the definition the equilibration uses, 2^-round(log2 m) (the
 * power-of-two scaling of LAPACK's xGEEQU, Golub and Van Loan, Matrix
 * Computations, sect. 3.5.2), evaluated with Math.log2 and a power. The
 * bit-reading kernel must agree with it exactly, everywhere.
 */
const byFormula = (m: number): number => (m > 0 && Number.isFinite(m) ? 2 ** -Math.round(Math.log2(m)) : 1);

describe('powerOfTwoInverse', () => {
  it('equals 2^-round(log2 m) for any positive double', () => {
    fc.assert(
      fc.property(fc.double({ min: Number.MIN_VALUE, max: Number.MAX_VALUE, noNaN: true }), (m) => {
        expect(powerOfTwoInverse(m)).toBe(byFormula(m));
      }),
      { numRuns: 20000 },
    );
  });

  it('equals the formula next to sqrt 2 times every power of two, and on subnormals', () => {
    // The rounding boundary of log2 is the significand sqrt 2; the kernel decides there with the formula.
    const near = [1, Math.SQRT2, Math.SQRT2 * (1 + 2 ** -52), Math.SQRT2 * (1 - 2 ** -52), Math.SQRT2 * (1 + 1e-8), Math.SQRT2 * (1 - 1e-8), 1.4142, 1.41422, 1.9999999];
    for (let e = -1074; e <= 1023; e++) {
      for (const s of near) {
        const m = s * 2 ** e;
        if (m > 0 && Number.isFinite(m)) expect(powerOfTwoInverse(m)).toBe(byFormula(m));
      }
    }
  });

  it('gives 1 for zero, negative, NaN and infinite input', () => {
    for (const m of [0, -0, -3, NaN, Infinity, -Infinity]) expect(powerOfTwoInverse(m)).toBe(1);
  });
});
