import fc from 'fast-check';
import { LuDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { ComplexLu } from '../../src/solver/complex-lu.js';
import { DenseLu } from '../../src/solver/dense-lu.js';
import { sparseMassOfDense, type SparseMass } from '../../src/solver/sparse-mass.js';

/**
 * The Radau iteration matrices gamma M - J and (alpha + i beta) M - J
 * (Hairer and Wanner II, sect. IV.8, eq. 8.9-8.16) formed inside the LU
 * kernels' storage: the same factors, bit for bit, as the kernels' factor()
 * of the matrices formed beforehand, and the solution of ml-matrix's
 * LuDecomposition (an independent general-purpose npm library) on the real
 * system and on the complex one's real 2n x 2n embedding [[re, -im], [im, re]].
 */
function mlSolve(a: Float64Array, n: number, b: Float64Array): number[] {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, a[i * n + j]!);
  return new LuDecomposition(m).solve(Matrix.columnVector(Array.from(b))).to1DArray();
}

/** shift M - J formed entry by entry as the iteration system forms it: -J, plus shift m_ij where M is non-zero (M the identity when undefined). */
function formed(J: Float64Array, n: number, shift: number, mass: Float64Array | undefined): Float64Array {
  const a = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) {
    const m = mass ? mass[k]! : k % (n + 1) === 0 ? 1 : 0;
    a[k] = m !== 0 ? -J[k]! + shift * m : -J[k]!;
  }
  return a;
}

/** The imaginary part beta M of the complex iteration matrix, as the iteration system forms it. */
function formedImaginary(n: number, beta: number, mass: Float64Array | undefined): Float64Array {
  const a = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) {
    const m = mass ? mass[k]! : k % (n + 1) === 0 ? 1 : 0;
    if (m !== 0) a[k] = beta * m;
  }
  return a;
}

const cases = fc.integer({ min: 1, max: 12 }).chain((n) =>
  fc.tuple(
    fc.constant(n),
    fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: n * n, maxLength: n * n }),
    fc.array(fc.constantFrom(0, 0, 1, 2, -0.5), { minLength: n, maxLength: n }),
    fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 2 * n, maxLength: 2 * n }),
    fc.boolean(),
  ),
);

describe('iteration matrices formed in the factors', () => {
  it('real: gamma M - J factored in place solves as factor() of the formed matrix (bit for bit) and as ml-matrix', () => {
    fc.assert(
      fc.property(cases, ([n, j, diagM, b, identity]) => {
        const J = Float64Array.from(j);
        // A diagonal mass matrix with zeros (algebraic rows) or the identity; gamma large enough to be regular.
        const massDense = identity ? undefined : Float64Array.from({ length: n * n }, (_, k) => (k % (n + 1) === 0 ? diagM[k / (n + 1)]! : 0));
        const mass: SparseMass | undefined = massDense && sparseMassOfDense(massDense, n);
        const shift = 40;
        for (let i = 0; i < n; i++) if (massDense && massDense[i * n + i] === 0) J[i * n + i] = J[i * n + i]! + 10 * n;
        const a = formed(J, n, shift, massDense);
        const inPlace = new DenseLu(n);
        const reference = new DenseLu(n);
        expect(inPlace.factorShifted(J, shift, mass)).toBe(reference.factor(a));
        const x = Float64Array.from(b.slice(0, n));
        const y = Float64Array.from(x);
        const rhs = Float64Array.from(x);
        inPlace.solve(x);
        reference.solve(y);
        expect(Array.from(x)).toEqual(Array.from(y));
        const ml = mlSolve(a, n, rhs);
        for (let i = 0; i < n; i++) expect(x[i]!).toBeCloseTo(ml[i]!, 9);
      }),
      { numRuns: 300 },
    );
  });

  it('complex: (alpha + i beta) M - J factored in place solves as factor() of the formed pair (bit for bit) and as ml-matrix on the embedding', () => {
    fc.assert(
      fc.property(cases, ([n, j, diagM, b, identity]) => {
        const J = Float64Array.from(j);
        const massDense = identity ? undefined : Float64Array.from({ length: n * n }, (_, k) => (k % (n + 1) === 0 ? diagM[k / (n + 1)]! : 0));
        const mass: SparseMass | undefined = massDense && sparseMassOfDense(massDense, n);
        for (let i = 0; i < n; i++) if (massDense && massDense[i * n + i] === 0) J[i * n + i] = J[i * n + i]! + 10 * n;
        const alpha = 30;
        const beta = -35;
        const re = formed(J, n, alpha, massDense);
        const im = formedImaginary(n, beta, massDense);
        const inPlace = new ComplexLu(n);
        const reference = new ComplexLu(n);
        expect(inPlace.factorShifted(J, alpha, beta, mass)).toBe(reference.factor(re, im));
        const xr = Float64Array.from(b.slice(0, n));
        const xi = Float64Array.from(b.slice(n));
        const yr = Float64Array.from(xr);
        const yi = Float64Array.from(xi);
        const rhs = Float64Array.from(b);
        inPlace.solve(xr, xi);
        reference.solve(yr, yi);
        expect(Array.from(xr)).toEqual(Array.from(yr));
        expect(Array.from(xi)).toEqual(Array.from(yi));
        const emb = new Float64Array(4 * n * n);
        for (let r = 0; r < n; r++) {
          for (let c = 0; c < n; c++) {
            emb[r * 2 * n + c] = re[r * n + c]!;
            emb[r * 2 * n + n + c] = -im[r * n + c]!;
            emb[(n + r) * 2 * n + c] = im[r * n + c]!;
            emb[(n + r) * 2 * n + n + c] = re[r * n + c]!;
          }
        }
        const ml = mlSolve(emb, 2 * n, rhs);
        for (let i = 0; i < n; i++) {
          expect(xr[i]!).toBeCloseTo(ml[i]!, 9);
          expect(xi[i]!).toBeCloseTo(ml[n + i]!, 9);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('a non-finite entry of J: the same column returned as factor() of the formed matrices, real and complex', () => {
    // The formed rows are scanned as they are formed: the first non-finite entry in row order
    // must be the one equilibration of the whole formed matrix finds.
    fc.assert(
      fc.property(
        cases,
        fc.array(fc.tuple(fc.nat(), fc.constantFrom(Number.NaN, Infinity, -Infinity)), { minLength: 1, maxLength: 3 }),
        ([n, j, diagM, , identity], bad) => {
          const J = Float64Array.from(j);
          for (const [k, v] of bad) J[k % (n * n)] = v;
          const massDense = identity ? undefined : Float64Array.from({ length: n * n }, (_, k) => (k % (n + 1) === 0 ? diagM[k / (n + 1)]! : 0));
          const mass: SparseMass | undefined = massDense && sparseMassOfDense(massDense, n);
          const real = new DenseLu(n).factorShifted(J, 40, mass);
          expect(real).toBe(new DenseLu(n).factor(formed(J, n, 40, massDense)));
          expect(real).toBeGreaterThanOrEqual(0);
          const complex = new ComplexLu(n).factorShifted(J, 30, -35, mass);
          expect(complex).toBe(new ComplexLu(n).factor(formed(J, n, 30, massDense), formedImaginary(n, -35, massDense)));
          expect(complex).toBeGreaterThanOrEqual(0);
        },
      ),
      { numRuns: 300 },
    );
  });
});
