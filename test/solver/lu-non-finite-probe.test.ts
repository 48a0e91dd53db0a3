import { describe, expect, it } from 'vitest';
import { ComplexLu } from '../../src/solver/complex-lu.js';
import { DenseLu } from '../../src/solver/dense-lu.js';
import { equilibrationScales } from '../../src/solver/linear-solver.js';
import { sparseMassOfDense, type SparseMass } from '../../src/solver/sparse-mass.js';

/**
 * The LU kernels test a formed row for finiteness once (the sum of its
 * |entries|) and read it again only when that sum is not finite. Reference:
 * the equilibration by its definition (LAPACK's xGEEQU with power-of-two
 * factors; Golub and Van Loan, Matrix Computations, sect. 3.5.2;
 * `equilibrationScales` in linear-solver.ts), which tests every entry in
 * storage order and returns the column of the first non-finite one. The
 * kernels must return that column, leave the rows below it unread and
 * unwritten, and, when every entry is finite (a sum that only overflowed, a
 * row so small that its scale is Infinity), give the same scales, exactly.
 */

const N = 5;
const SENTINEL = 12345.5;

/** A finite J with entries over a few decades (deterministic). */
function baseJacobian(n: number): Float64Array {
  let s = 7;
  const rnd = (): number => (s = (s * 16807) % 2147483647) / 2147483647;
  return Float64Array.from({ length: n * n }, () => (rnd() - 0.5) * 10 ** (4 * rnd() - 2));
}

/** M for the with-mass path: the identity with one zero diagonal entry (a DAE's) and one entry off the diagonal. */
function testMass(n: number): { dense: Float64Array; sparse: SparseMass } {
  const dense = new Float64Array(n * n);
  for (let i = 0; i < n; i++) dense[i * n + i] = i === 1 ? 0 : 1;
  dense[2 * n + 3] = 0.5;
  return { dense, sparse: sparseMassOfDense(dense, n) };
}

/** shift M - J as the kernels form it (-J first, then + shift m_ij where M has an entry). */
function formed(n: number, jac: Float64Array, shiftRe: number, shiftIm: number, mass: Float64Array | undefined): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) {
    const mk = mass ? mass[k]! : Math.floor(k / n) === k % n ? 1 : 0;
    re[k] = mk !== 0 ? -jac[k]! + shiftRe * mk : -jac[k]!;
    im[k] = mk !== 0 ? shiftIm * mk : 0;
  }
  return { re, im };
}

interface Held {
  rowScale: number[];
  colScale: number[];
}

/** The row of the first non-finite entry the reference finds (rows scanned in order), or -1. */
function firstBadRow(n: number, abs: (i: number, j: number) => number): number {
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (!Number.isFinite(abs(i, j))) return i;
  return -1;
}

/**
 * The kernel's answer against the reference's: the same returned column and no scale written from
 * the bad row on, or (no bad entry) the reference's scales exactly.
 */
function expectColumnOrScales(held: Held, got: number, want: number, abs: (i: number, j: number) => number, r: Float64Array, c: Float64Array): void {
  const n = N;
  if (want >= 0) {
    expect(got).toBe(want);
    const badRow = firstBadRow(n, abs);
    expect(held.rowScale.slice(badRow)).toEqual(new Array(n - badRow).fill(SENTINEL));
  } else {
    expect(held.rowScale).toEqual(Array.from(r));
    expect(held.colScale).toEqual(Array.from(c));
  }
}

/** Real kernel against the reference: returned column, rows below untouched, or the same scales. */
function checkReal(jac: Float64Array, shift: number, withMass: boolean): number {
  const n = N;
  const mass = withMass ? testMass(n) : undefined;
  const { re } = formed(n, jac, shift, 0, mass?.dense);
  const abs = (i: number, j: number): number => Math.abs(re[i * n + j]!);
  const r = new Float64Array(n);
  const c = new Float64Array(n);
  const want = equilibrationScales(n, abs, r, c);
  const lu = new DenseLu(n);
  const held = lu as unknown as Held & { lu: number[] };
  held.lu.fill(SENTINEL);
  held.rowScale.fill(SENTINEL);
  const got = lu.factorShifted(jac, shift, mass?.sparse);
  expectColumnOrScales(held, got, want, abs, r, c);
  if (want >= 0) {
    // Nothing below the bad row formed: the scan stopped at that row.
    const badRow = firstBadRow(n, abs);
    expect(held.lu.slice((badRow + 1) * n)).toEqual(new Array((n - badRow - 1) * n).fill(SENTINEL));
  }
  // factor() of the formed matrix: the same column (its copy-in writes every row, so only the scales are watched).
  const plain = new DenseLu(n);
  const heldPlain = plain as unknown as Held;
  heldPlain.rowScale.fill(SENTINEL);
  const gotPlain = plain.factor(re);
  expectColumnOrScales(heldPlain, gotPlain, want, abs, r, c);
  return want;
}

/** Complex kernel against the reference (|z| as |re| + |im|). */
function checkComplex(jac: Float64Array, shiftRe: number, shiftIm: number, withMass: boolean): number {
  const n = N;
  const mass = withMass ? testMass(n) : undefined;
  const { re, im } = formed(n, jac, shiftRe, shiftIm, mass?.dense);
  const abs = (i: number, j: number): number => Math.abs(re[i * n + j]!) + Math.abs(im[i * n + j]!);
  const r = new Float64Array(n);
  const c = new Float64Array(n);
  const want = equilibrationScales(n, abs, r, c);
  const lu = new ComplexLu(n);
  const held = lu as unknown as Held & { ar: number[]; ai: number[] };
  held.ar.fill(SENTINEL);
  held.ai.fill(SENTINEL);
  held.rowScale.fill(SENTINEL);
  const got = lu.factorShifted(jac, shiftRe, shiftIm, mass?.sparse);
  expectColumnOrScales(held, got, want, abs, r, c);
  if (want >= 0) {
    // Nothing below the bad row formed: the scan stopped at that row.
    const badRow = firstBadRow(n, abs);
    const below = new Array((n - badRow - 1) * n).fill(SENTINEL);
    expect(held.ar.slice((badRow + 1) * n)).toEqual(below);
    expect(held.ai.slice((badRow + 1) * n)).toEqual(below);
  }
  const plain = new ComplexLu(n);
  const heldPlain = plain as unknown as Held;
  heldPlain.rowScale.fill(SENTINEL);
  const gotPlain = plain.factor(re, im);
  expectColumnOrScales(heldPlain, gotPlain, want, abs, r, c);
  return want;
}

const NON_FINITE = [Number.NaN, Infinity, -Infinity];
const POSITIONS = [0, 2, N - 1]; // first, middle, last (rows and columns)

describe('LU kernels: one finiteness probe per row, the same first non-finite column', () => {
  it('a NaN or an infinity in J at the first, middle or last place of the first, middle or last row', () => {
    for (const bad of NON_FINITE) {
      for (const i of POSITIONS) {
        for (const j of POSITIONS) {
          const jac = baseJacobian(N);
          jac[i * N + j] = bad;
          for (const withMass of [false, true]) {
            expect(checkReal(jac, 1e3, withMass)).toBe(j);
            expect(checkComplex(jac, 1e3, 4e2, withMass)).toBe(j);
          }
        }
      }
    }
  });

  it('the first of two non-finite entries in a row, the later one of the other kind', () => {
    const jac = baseJacobian(N);
    jac[2 * N + 3] = Number.NaN;
    jac[2 * N + 1] = -Infinity;
    jac[4 * N + 0] = Number.NaN;
    for (const withMass of [false, true]) {
      expect(checkReal(jac, 1e3, withMass)).toBe(1);
      expect(checkComplex(jac, 1e3, 4e2, withMass)).toBe(1);
    }
  });

  it('a non-finite diagonal made by the shift: a NaN or infinite shift, and -J + shift overflowing', () => {
    for (const shift of NON_FINITE) {
      // Row 0's diagonal is the first entry the shift reaches.
      expect(checkReal(baseJacobian(N), shift, false)).toBe(0);
      expect(checkComplex(baseJacobian(N), shift, 4e2, false)).toBe(0);
      expect(checkComplex(baseJacobian(N), 1e3, shift, false)).toBe(0);
      // With M's zero at (1, 1) the shift reaches row 0 first as well.
      expect(checkReal(baseJacobian(N), shift, true)).toBe(0);
      expect(checkComplex(baseJacobian(N), 1e3, shift, true)).toBe(0);
    }
    for (const i of POSITIONS) {
      const jac = baseJacobian(N);
      jac[i * N + i] = -1.5e308; // -(-1.5e308) + 1e308 overflows to Infinity
      expect(checkReal(jac, 1e308, false)).toBe(i);
      expect(checkComplex(jac, 1e308, 0, false)).toBe(i);
      // Both parts finite, |re| + |im| not: counts as not finite, as the test per entry had it.
      const jac2 = baseJacobian(N);
      jac2[i * N + i] = -1e308;
      expect(checkComplex(jac2, 1, 1e308, false)).toBe(i);
      expect(checkComplex(jac2, 1, 1e308, true)).toBe(i === 1 ? -1 : i);
    }
  });

  it('no false alarm: a row whose |entries| sum past the largest double, every entry finite', () => {
    const jac = baseJacobian(N);
    for (const j of [0, 1, 3]) jac[2 * N + j] = j === 1 ? -1.2e308 : 1.2e308;
    for (const withMass of [false, true]) {
      expect(checkReal(jac, 1e3, withMass)).toBe(-1);
      expect(checkComplex(jac, 1e3, 4e2, withMass)).toBe(-1);
    }
  });

  it('a row so small that its scale is Infinity (NaN column maxima from Infinity times 0, as the definition keeps them)', () => {
    const jac = baseJacobian(N);
    for (let j = 0; j < N; j++) jac[3 * N + j] = j === 2 ? 5e-324 : 0;
    // Shift 0: row 3's diagonal stays 0, so its largest entry is the subnormal 5e-324 and 2^1074 overflows.
    for (const withMass of [false, true]) {
      expect(checkReal(jac, 0, withMass)).toBe(-1);
      expect(checkComplex(jac, 0, 0, withMass)).toBe(-1);
    }
  });
});
