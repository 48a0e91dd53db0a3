/**
 * packedDoubles and packedDoublesFrom: plain arrays that stand in for
 * Float64Array storage in the solver's kernels and the network's f and
 * Jacobian, so they must hold what a Float64Array would: `new Float64Array(n)` is n entries of +0
 * (ECMAScript 2024, sect. 23.2.5.1: TypedArray(length) allocates a buffer
 * whose bytes are all zero, and the all-zero IEEE 754 binary64 pattern is
 * +0), and `Float64Array.from(values)` keeps each number's binary64 value.
 * Their elements kind (packed doubles) is V8's and not observable from
 * JavaScript; bench/network-calls-versus.ts measures what it is for.
 */
import { describe, expect, it } from 'vitest';
import { createComplexLu } from '../../src/solver/complex-lu.js';
import { createDenseLu } from '../../src/solver/dense-lu.js';
import { identityPermutation, packedDoubles, packedDoublesFrom, packedIndices } from '../../src/solver/packed-doubles.js';

describe('packedDoubles', () => {
  it('holds n entries of +0, as new Float64Array(n) does (the -0 it starts from is not left behind)', () => {
    // Both ways of making one: sliced from a template of zeros (up to 4096) and pushed (above).
    for (const n of [0, 1, 2, 7, 100, 4096, 4097]) {
      const a = packedDoubles(n);
      const reference = new Float64Array(n);
      expect(Array.isArray(a)).toBe(true);
      expect(a.length).toBe(n);
      for (let i = 0; i < n; i++) expect(Object.is(a[i], reference[i])).toBe(true);
    }
  });

  it('gives each caller an array of its own: what one stores is not in the next one made', () => {
    const a = packedDoubles(8);
    a.fill(3.5);
    const b = packedDoubles(8);
    expect(b).toEqual(new Array<number>(8).fill(0));
    b[7] = -2;
    expect(a[7]).toBe(3.5);
  });

  it('takes doubles and integers stored into it and reads them back as stored', () => {
    const a = packedDoubles(3);
    a[0] = 2.5;
    a[1] = -1;
    a[2] = -0;
    expect(a).toEqual([2.5, -1, -0]);
    expect(Object.is(a[2], -0)).toBe(true);
  });
});

describe('packedDoublesFrom', () => {
  it('keeps every value bit for bit, as Float64Array.from does (integers, -0, subnormals, infinities, NaN)', () => {
    const values = [1, -1, 0.1, -0, 5e-324, 1.7976931348623157e308, Infinity, -Infinity, NaN, 20];
    const a = packedDoublesFrom(values);
    const reference = Float64Array.from(values);
    expect(a.length).toBe(values.length);
    for (let i = 0; i < values.length; i++) expect(Object.is(a[i], reference[i])).toBe(true);
  });

  it('maps each element with its index when given a function', () => {
    const windings = [{ turns: 20, orientation: -1 }, { turns: 3.5, orientation: 1 }];
    expect(packedDoublesFrom(windings, (w, i) => w.orientation * w.turns + i)).toEqual([-20, 4.5]);
    expect(packedDoublesFrom([], (x: number) => x)).toEqual([]);
  });

  it('converts what is not a number as Float64Array.from does (ToNumber)', () => {
    const fields = [undefined, '2.5', null, true] as unknown as number[];
    const a = packedDoublesFrom(fields);
    const reference = Float64Array.from(fields);
    for (let i = 0; i < fields.length; i++) expect(Object.is(a[i], reference[i])).toBe(true);
    expect(a.every((v) => typeof v === 'number')).toBe(true);
  });
});

describe('identityPermutation and packedIndices', () => {
  it('are 0, 1, ..., n - 1, and a copy of the indices given', () => {
    expect(identityPermutation(4)).toEqual([0, 1, 2, 3]);
    expect(identityPermutation(0)).toEqual([]);
    const rowStart = Int32Array.of(0, 2, 5, 7);
    const copy = packedIndices(rowStart);
    expect(copy).toEqual([0, 2, 5, 7]);
    rowStart[1] = 3;
    expect(copy[1]).toBe(2);
  });
});

describe('the LUs on plain arrays', () => {
  it('solve as before after an ArrayBuffer was detached in the process', () => {
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
