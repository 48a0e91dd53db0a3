import fc from 'fast-check';
import { LuDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { createDenseLu } from '../../src/solver/dense-lu.js';
import { createMlMatrixLu } from '../../src/solver/ml-matrix-lu.js';

/** Reference: ml-matrix's LuDecomposition (general-purpose npm library). */
function mlSolve(a: number[], n: number, b: number[]): number[] {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, a[i * n + j]!);
  const x = new LuDecomposition(m).solve(Matrix.columnVector(b));
  return x.to1DArray();
}

const diagDominant = (n: number) =>
  fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }).map((a) => {
    for (let i = 0; i < n; i++) a[i * n + i] = a[i * n + i]! + (a[i * n + i]! >= 0 ? n : -n);
    return a;
  });

describe('createDenseLu', () => {
  it('solves like ml-matrix LuDecomposition on random well-conditioned systems (n = 1..25)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 25 }).chain((n) => fc.tuple(fc.constant(n), diagDominant(n), fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n, maxLength: n }))), ([n, a, b]) => {
        const lu = createDenseLu(n);
        expect(lu.factor(Float64Array.from(a))).toBe(-1);
        const x = Float64Array.from(b);
        lu.solve(x);
        const ref = mlSolve(a, n, b);
        for (let i = 0; i < n; i++) expect(x[i]!).toBeCloseTo(ref[i]!, 10);
      }),
      { numRuns: 60 },
    );
  });

  it('solves badly scaled systems (entries from 1e-12 to 1e8) without calling them singular', () => {
    // Row/column scalings of a well-conditioned matrix: the solution must be exact to round-off.
    const n = 4;
    const base = [4, 1, 0, 1, 1, 5, 1, 0, 0, 1, 6, 1, 1, 0, 1, 7];
    const r = [1e-12, 1, 1e8, 1e-3];
    const c = [1e6, 1e-6, 1, 1e3];
    const a = Float64Array.from(base, (v, k) => r[Math.floor(k / n)]! * v * c[k % n]!);
    // Unknowns sized like their columns (x_j = u_j / c_j), so b is formed exactly from small integers.
    const u = [1, -2, 3, -4];
    const b = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < n; j++) s += base[i * n + j]! * u[j]!;
      b[i] = r[i]! * s;
    }
    const lu = createDenseLu(n);
    expect(lu.factor(a)).toBe(-1);
    lu.solve(b);
    for (let i = 0; i < n; i++) expect((b[i]! * c[i]!) / u[i]!).toBeCloseTo(1, 12);
  });

  it('reports the column of an exactly zero pivot (an unconstrained unknown)', () => {
    const lu = createDenseLu(3);
    expect(lu.factor(Float64Array.of(1, 0, 2, 0, 0, 3, 4, 0, 5))).toBe(1);
  });

  it('reports a pivot at round-off level (a floating pair: rows summing to zero), which ml-matrix does not flag', () => {
    // Two nodes joined by a conductance 0.1 and to nothing else, plus a grounded node.
    const g = 0.1;
    const gRounded = 0.1 + 0.2 - 0.2; // 0.10000000000000003: round-off in assembly
    const a = Float64Array.of(gRounded, -g, 0, -g, g, 0, 0, 0, 1);
    expect(createDenseLu(3).factor(a)).toBe(1);
    // ml-matrix's own test only sees exact zeros:
    const m = new Matrix([[gRounded, -g, 0], [-g, g, 0], [0, 0, 1]]);
    expect(new LuDecomposition(m).isSingular()).toBe(false);
  });

  it('agrees with the ml-matrix adapter, including its singular verdicts', () => {
    const a = Float64Array.of(2, 1, 1, 1, 3, 2, 1, 0, 0);
    const b1 = Float64Array.of(4, 5, 6);
    const b2 = Float64Array.from(b1);
    const flat = createDenseLu(3);
    const ml = createMlMatrixLu(3);
    expect(flat.factor(a)).toBe(-1);
    expect(ml.factor(a)).toBe(-1);
    flat.solve(b1);
    ml.solve(b2);
    for (let i = 0; i < 3; i++) expect(b1[i]!).toBeCloseTo(b2[i]!, 13);
    const sing = Float64Array.of(1, 2, 3, 2, 4, 6, 1, 1, 1);
    expect(flat.factor(sing)).toBeGreaterThanOrEqual(0);
    expect(ml.factor(sing)).toBeGreaterThanOrEqual(0);
  });

  it('flags non-finite entries as singular', () => {
    expect(createDenseLu(2).factor(Float64Array.of(1, NaN, 0, 1))).toBeGreaterThanOrEqual(0);
  });
});
