import fc from 'fast-check';
import { LuDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { analyseBand } from '../../src/solver/band-structure.js';
import { createComplexLu } from '../../src/solver/complex-lu.js';
import { createDenseLu } from '../../src/solver/dense-lu.js';
import { reverseCuthillMcKee } from '../../src/solver/reverse-cuthill-mckee.js';
import { createSparseComplexLu } from '../../src/solver/sparse-complex-lu.js';
import { createSparseLu } from '../../src/solver/sparse-lu.js';
import { createSparseMatrix, patternOfDense, sparsePattern } from '../../src/solver/sparse-pattern.js';

/** Entries of circuit-like size (no subnormals: both kernels' equilibration overflows there alike). */
const entry = (m: number) => fc.double({ min: -m, max: m, noNaN: true }).map((v) => (Math.abs(v) < 1e-3 ? 0 : v));

/** A random sparse n x n matrix: random entries on a random pattern, the diagonal strong or weak (possibly zero). */
const sparseSystem = fc.integer({ min: 1, max: 40 }).chain((n) =>
  fc.tuple(
    fc.constant(n),
    fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 }), entry(4)), { maxLength: 3 * n }),
    fc.array(entry(3), { minLength: n, maxLength: n }),
    fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n, maxLength: n }),
    fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n, maxLength: n }),
    fc.boolean(),
  ),
);

function residual(a: Float64Array, n: number, x: Float64Array, b: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < n; i++) {
    let s = -b[i]!;
    for (let j = 0; j < n; j++) s += a[i * n + j]! * x[j]!;
    worst = Math.max(worst, Math.abs(s));
  }
  return worst;
}

describe('sparse LU (reverse Cuthill-McKee + band LU with partial pivoting)', () => {
  it('solves random sparse systems like the dense LU, and reports the same singular matrices', () => {
    fc.assert(
      fc.property(sparseSystem, ([n, extra, diag, b, bIm, weakDiagonal]) => {
        const a = new Float64Array(n * n);
        for (let i = 0; i < n; i++) a[i * n + i] = weakDiagonal ? diag[i]! : diag[i]! + (diag[i]! >= 0 ? 5 : -5);
        for (const [i, j, v] of extra) a[i * n + j] = a[i * n + j]! + v;
        const dense = createDenseLu(n);
        const sparse = createSparseLu(patternOfDense(a, n));
        const dBad = dense.factor(a);
        const sBad = sparse.factor(a);
        // Both kernels share the equilibration and the pivot threshold; pivot order differs, so only
        // the verdict is compared where one of them finds a negligible pivot.
        if (dBad >= 0 || sBad >= 0) return;
        const xd = Float64Array.from(b);
        const xs = Float64Array.from(b);
        dense.solve(xd);
        sparse.solve(xs);
        // Backward error of both (bounded whatever the conditioning): |A x - b| <= c eps n |A| |x|.
        let normA = 0;
        for (let i = 0; i < n; i++) {
          let row = 0;
          for (let j = 0; j < n; j++) row += Math.abs(a[i * n + j]!);
          normA = Math.max(normA, row);
        }
        const size = (x: Float64Array) => Math.max(1, ...Array.from(x, Math.abs));
        expect(residual(a, n, xs, b)).toBeLessThan(1e-12 * n * normA * size(xs) + 1e-12);
        expect(residual(a, n, xd, b)).toBeLessThan(1e-12 * n * normA * size(xd) + 1e-12);
        // Forward agreement where the system is well conditioned (strong diagonal).
        if (!weakDiagonal) for (let i = 0; i < n; i++) expect(Math.abs(xs[i]! - xd[i]!)).toBeLessThan(1e-9 * size(xd));
        // The complex kernel on A + i (diagonal shift), against the dense complex LU.
        const im = new Float64Array(n * n);
        for (let i = 0; i < n; i++) im[i * n + i] = 1 + (i % 3);
        const dc = createComplexLu(n);
        const sc = createSparseComplexLu(patternOfDense(a, n));
        if (dc.factor(a, im) >= 0 || sc.factor(a, im) >= 0) return;
        const dr = Float64Array.from(b);
        const di = Float64Array.from(bIm);
        const sr = Float64Array.from(b);
        const si = Float64Array.from(bIm);
        dc.solve(dr, di);
        sc.solve(sr, si);
        if (weakDiagonal) return;
        let cs = 1;
        for (let i = 0; i < n; i++) cs = Math.max(cs, Math.abs(dr[i]!), Math.abs(di[i]!));
        for (let i = 0; i < n; i++) {
          expect(Math.abs(sr[i]! - dr[i]!)).toBeLessThan(1e-9 * cs);
          expect(Math.abs(si[i]! - di[i]!)).toBeLessThan(1e-9 * cs);
        }
      }),
      { numRuns: 400 },
    );
  });

  it('needs row interchanges where the diagonal is zero (a voltage source row) and gets them right', () => {
    // [[0, 1], [1, 0]] x = [2, 3] -> x = [3, 2]: no elimination without pivoting.
    const a = Float64Array.of(0, 1, 1, 0);
    const lu = createSparseLu(sparsePattern(2, [0, 1], [1, 0]));
    expect(lu.factor(a)).toBe(-1);
    const x = Float64Array.of(2, 3);
    lu.solve(x);
    expect(Array.from(x)).toEqual([3, 2]);
  });

  it('flags a singular matrix (a floating unknown) with the unknown of the bad pivot', () => {
    const lu = createSparseLu(sparsePattern(3, [0, 1], [1, 0]));
    expect(lu.factor(Float64Array.of(1, 1, 0, 1, 1, 0, 0, 0, 0))).toBeGreaterThanOrEqual(0);
  });

  it('refuses a dense matrix with an entry outside the pattern instead of dropping it', () => {
    const lu = createSparseLu(sparsePattern(2, [], []));
    expect(() => lu.factor(Float64Array.of(1, 2, 0, 1))).toThrow(/outside the sparsity pattern/);
  });

  it('reverse Cuthill-McKee gives a shuffled chain its bandwidth of 1 (George and Liu 1981, sect. 4.3)', () => {
    const n = 200;
    // A path graph whose nodes are numbered in a random order: bandwidth up to n before reordering.
    const label = Array.from({ length: n }, (_, i) => i).sort((a, b) => ((a * 7919) % 211) - ((b * 7919) % 211));
    const rows: number[] = [];
    const cols: number[] = [];
    for (let k = 0; k + 1 < n; k++) {
      rows.push(label[k]!, label[k + 1]!);
      cols.push(label[k + 1]!, label[k]!);
    }
    const pattern = sparsePattern(n, rows, cols);
    const order = reverseCuthillMcKee(pattern);
    expect([...order].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, i) => i));
    const s = analyseBand(pattern);
    expect(s.lower).toBe(1);
    expect(s.upper).toBe(1);
  });

  it('a stamping target adds (row, col, value) into the fixed pattern, and factorValues matches factor', () => {
    const pattern = sparsePattern(3, [0, 1, 1, 2], [1, 0, 2, 1]);
    const m = createSparseMatrix(pattern);
    // Conductance stamps of two 1-S resistors in a chain (common practice, nodal analysis).
    for (const [p, q] of [
      [0, 1],
      [1, 2],
    ] as const) {
      m.add(p, p, 1);
      m.add(q, q, 1);
      m.add(p, q, -1);
      m.add(q, p, -1);
    }
    m.addAt(m.slot(0, 0), 1); // a 1-S leg to ground at node 0
    expect(() => m.add(0, 2, 1)).toThrow(/not in the sparsity pattern/);
    const lu = createSparseLu(pattern);
    expect(lu.factorValues(m.values)).toBe(-1);
    const x = Float64Array.of(1, 0, 0);
    lu.solve(x);
    const dense = createDenseLu(3);
    expect(dense.factor(m.toDense())).toBe(-1);
    const y = Float64Array.of(1, 0, 0);
    dense.solve(y);
    for (let i = 0; i < 3; i++) expect(x[i]!).toBeCloseTo(y[i]!, 14);
  });

  it('solves into a view of a larger buffer after a buffer was detached, leaving the rest alone (real and complex, against ml-matrix)', () => {
    // A detached ArrayBuffer in the process (as the TypeScript loader makes one): the kernels keep
    // their storage in plain arrays and only read and write the caller's Float64Array.
    const detached = new ArrayBuffer(8);
    structuredClone(detached, { transfer: [detached] });
    expect(detached.byteLength).toBe(0);
    // A grounded RC ladder's nodal matrix (diagonally dominant, common practice) plus a coupling
    // from the last node back to the first, so that the band ordering is not the identity.
    const n = 12;
    const a = new Float64Array(n * n);
    const im = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      a[i * n + i] = 3 + i / 7;
      im[i * n + i] = 0.5 + (i % 4) / 3;
      if (i + 1 < n) {
        a[i * n + i + 1] = -1;
        a[(i + 1) * n + i] = -1.25;
      }
    }
    a[(n - 1) * n] = 0.5;
    a[n - 1] = -0.75;
    const b = Array.from({ length: n }, (_, i) => Math.sin(i + 1));
    const bIm = Array.from({ length: n }, (_, i) => Math.cos(2 * i));
    // Reference: ml-matrix's LuDecomposition (general-purpose npm library); the complex system
    // through its real embedding [[A, -B], [B, A]] [xr; xi] = [br; bi].
    const rows = (m: Float64Array) => Array.from({ length: n }, (_, i) => Array.from(m.subarray(i * n, i * n + n)));
    const ref = new LuDecomposition(new Matrix(rows(a))).solve(Matrix.columnVector(b)).getColumn(0);
    const embedded = new Matrix(2 * n, 2 * n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        embedded.set(i, j, a[i * n + j]!);
        embedded.set(i, n + j, -im[i * n + j]!);
        embedded.set(n + i, j, im[i * n + j]!);
        embedded.set(n + i, n + j, a[i * n + j]!);
      }
    }
    const refC = new LuDecomposition(embedded).solve(Matrix.columnVector([...b, ...bIm])).getColumn(0);
    const guard = -7;
    const view = (values: number[]) => {
      const buffer = new Float64Array(n + 6).fill(guard);
      buffer.set(values, 3);
      return { buffer, x: buffer.subarray(3, 3 + n) };
    };
    const guardsKept = (buffer: Float64Array) => [0, 1, 2, n + 3, n + 4, n + 5].every((k) => buffer[k] === guard);
    const lu = createSparseLu(patternOfDense(a, n));
    expect(lu.factor(a)).toBe(-1);
    const real = view(b);
    lu.solve(real.x);
    expect(guardsKept(real.buffer)).toBe(true);
    for (let i = 0; i < n; i++) expect(Math.abs(real.x[i]! - ref[i]!)).toBeLessThan(1e-13);
    const both = new Float64Array(n * n);
    for (let k = 0; k < n * n; k++) both[k] = a[k] !== 0 || im[k] !== 0 ? 1 : 0;
    const clu = createSparseComplexLu(patternOfDense(both, n));
    expect(clu.factor(a, im)).toBe(-1);
    const re = view(b);
    const imag = view(bIm);
    clu.solve(re.x, imag.x);
    expect(guardsKept(re.buffer) && guardsKept(imag.buffer)).toBe(true);
    for (let i = 0; i < n; i++) {
      expect(Math.abs(re.x[i]! - refC[i]!)).toBeLessThan(1e-13);
      expect(Math.abs(imag.x[i]! - refC[n + i]!)).toBeLessThan(1e-13);
    }
  });
});
