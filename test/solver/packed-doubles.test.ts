import { describe, expect, it } from 'vitest';
import { createComplexLu } from '../../src/solver/complex-lu.js';
import { createDenseLu } from '../../src/solver/dense-lu.js';
import { identityPermutation, packedDoubles, packedDoublesFrom } from '../../src/solver/packed-doubles.js';

describe("packed double arrays (the factorisations' storage)", () => {
  it('hold n zeros and keep every double stored in them exactly (IEEE 754 binary64 round trip)', () => {
    const a = packedDoubles(5);
    expect(a).toEqual([0, 0, 0, 0, 0]);
    const values = [Math.PI, -0, 5e-324, Number.MAX_VALUE, 1 / 3];
    for (let i = 0; i < 5; i++) a[i] = values[i]!;
    for (let i = 0; i < 5; i++) expect(Object.is(a[i], values[i])).toBe(true);
    expect(packedDoublesFrom(Float64Array.of(1, 0, 20))).toEqual([1, 0, 20]);
    expect(identityPermutation(4)).toEqual([0, 1, 2, 3]);
  });

  it('leave the LUs solving as before after an ArrayBuffer was detached in the process', () => {
    // Detaching a buffer changes how V8 compiles typed-array accesses, not their values: the same
    // system solved before and after gives the same bits. Reference values: x = A^-1 b by hand
    // (A = [[4, 1], [2, 3]], b = [1, 2]: x = [0.1, 0.6]; Cramer's rule, det A = 10).
    const solveReal = (): number[] => {
      const lu = createDenseLu(2);
      expect(lu.factor(Float64Array.of(4, 1, 2, 3))).toBe(-1);
      const b = Float64Array.of(1, 2);
      lu.solve(b);
      return Array.from(b);
    };
    const solveComplex = (): number[] => {
      // (2 + 2i) x = 4: x = 1 - i.
      const lu = createComplexLu(1);
      expect(lu.factor(Float64Array.of(2), Float64Array.of(2))).toBe(-1);
      const re = Float64Array.of(4);
      const im = Float64Array.of(0);
      lu.solve(re, im);
      return [re[0]!, im[0]!];
    };
    const before = [solveReal(), solveComplex()];
    const buffer = new ArrayBuffer(8);
    structuredClone(buffer, { transfer: [buffer] });
    expect(buffer.byteLength).toBe(0);
    expect([solveReal(), solveComplex()]).toEqual(before);
    expect(before[0]![0]).toBeCloseTo(0.1, 15);
    expect(before[0]![1]).toBeCloseTo(0.6, 15);
    expect(before[1]).toEqual([1, -1]);
  });
});
