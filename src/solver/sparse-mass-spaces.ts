import { Matrix, SVD } from 'ml-matrix';
import { blockOf, massBlocks, type SparseMass } from './sparse-mass.js';

/**
 * Columns of an n x k matrix with few non-zeros each (compressed columns):
 * column j holds `value[e]` at row `index[e]` for e in start[j] .. start[j + 1] - 1.
 *
 * @internal
 */
export interface SparseColumns {
  readonly n: number;
  readonly k: number;
  readonly start: Int32Array;
  readonly index: Int32Array;
  readonly value: Float64Array;
}

/** The row-major dense n x k array of `c` (@internal). */
export function denseOfColumns(c: SparseColumns): Float64Array {
  const out = new Float64Array(c.n * c.k);
  for (let j = 0; j < c.k; j++) for (let e = c.start[j]!; e < c.start[j + 1]!; e++) out[c.index[e]! * c.k + j] = c.value[e]!;
  return out;
}

/** Sparse columns from a row-major dense n x k array (exact zeros dropped) (@internal). */
export function columnsOfDense(a: Float64Array, n: number, k: number): SparseColumns {
  const start = new Int32Array(k + 1);
  const index: number[] = [];
  const value: number[] = [];
  for (let j = 0; j < k; j++) {
    for (let i = 0; i < n; i++) {
      const v = a[i * k + j]!;
      if (v !== 0) {
        index.push(i);
        value.push(v);
      }
    }
    start[j + 1] = index.length;
  }
  return { n, k, start, index: Int32Array.from(index), value: Float64Array.from(value) };
}

/**
 * Bases of the null spaces and the range of a constant mass matrix, as
 * sparse columns: right null space V0 (n x k), left null space W0 (n x k),
 * range U1 (n x rank); orthonormal columns.
 *
 * @internal
 */
export interface SparseMassBases {
  readonly rank: number;
  readonly k: number;
  readonly v0: SparseColumns;
  readonly w0: SparseColumns;
  readonly u1: SparseColumns;
}

/**
 * The null spaces of M from its structure, without an SVD of the whole
 * matrix. Permuting the rows and columns of M to its connected blocks (the
 * components of the bipartite graph of its non-zeros) makes it block
 * diagonal, and the singular values of a block-diagonal matrix are those of
 * its blocks, with singular vectors supported on one block each (Golub and
 * Van Loan, Matrix Computations, sect. 2.4 on the SVD; a standard
 * consequence). So: a zero row of M is a left null vector, a zero column a
 * right null vector, and each block (in the flux formulation: one inductor,
 * one capacitor, the windings on one flux loop) gets a small SVD of its own.
 * The rank test is the one of the dense SVD ({@link massSpaces}): singular
 * values below 16 n eps sigma_max of the whole M count as zero, with
 * sigma_max the largest over the blocks, so both decide the rank alike and
 * span the same spaces (checked in test/solver/sparse-mass-spaces.test.ts).
 * Cost: O(nnz) plus the blocks' SVDs, instead of O(n^3).
 *
 * @internal
 * @example
 * ```ts
 * const b = structuralMassBases(sparseMassOfDense(mass, n)); // b.k algebraic directions
 * ```
 */
export function structuralMassBases(mass: SparseMass): SparseMassBases {
  const n = mass.n;
  const blocks = massBlocks(mass);
  const rowUsed = new Uint8Array(n);
  const colUsed = new Uint8Array(n);
  for (const b of blocks) {
    for (const i of b.rows) rowUsed[i] = 1;
    for (const j of b.cols) colUsed[j] = 1;
  }

  // Each block's right singular split (row space and null space), for M_b and M_b^T.
  const splits = blocks.map((b) => {
    const sub = blockOf(mass, b);
    return { block: b, right: rightSingularSplit(sub, b.rows.length, b.cols.length), left: rightSingularSplit(transpose(sub, b.rows.length, b.cols.length), b.cols.length, b.rows.length) };
  });
  let smax = 0;
  for (const s of splits) for (const v of s.right.sigma) smax = Math.max(smax, v);
  const tol = smax * n * Number.EPSILON * 16;

  const v0 = new ColumnBuilder(n);
  const w0 = new ColumnBuilder(n);
  const u1 = new ColumnBuilder(n);
  for (let j = 0; j < n; j++) if (!colUsed[j]) v0.unit(j);
  for (let i = 0; i < n; i++) if (!rowUsed[i]) w0.unit(i);
  for (const { block, right, left } of splits) {
    // The block's rank from one SVD decides both splits (the two SVDs could round differently at the threshold).
    const rankOfBlock = right.sigma.filter((s) => s > tol).length;
    byDecreasing(right).forEach((c, r) => r >= rankOfBlock && v0.column(block.cols, right.vectors[c]!));
    byDecreasing(left).forEach((c, r) => (r < rankOfBlock ? u1 : w0).column(block.rows, left.vectors[c]!));
  }
  const rank = u1.count;
  return { rank, k: n - rank, v0: v0.build(), w0: w0.build(), u1: u1.build() };
}

/**
 * Right singular vectors of the p x q matrix a (row-major) with their
 * singular values (zero for the directions beyond min(p, q)). A wide matrix
 * gets zero rows appended, which changes neither its singular values nor its
 * right singular vectors, since ml-matrix's SVD wants p >= q.
 */
function rightSingularSplit(a: Float64Array, p: number, q: number): { sigma: number[]; vectors: Float64Array[] } {
  if (p === 1 && q === 1) return { sigma: [Math.abs(a[0]!)], vectors: [Float64Array.of(1)] };
  const rows = Math.max(p, q);
  const m = new Matrix(rows, q);
  for (let i = 0; i < p; i++) for (let j = 0; j < q; j++) m.set(i, j, a[i * q + j]!);
  const svd = new SVD(m, { computeLeftSingularVectors: false, computeRightSingularVectors: true, autoTranspose: false });
  const V = svd.rightSingularVectors;
  const sigma = svd.diagonal;
  return {
    sigma: Array.from({ length: q }, (_, c) => sigma[c] ?? 0),
    vectors: Array.from({ length: q }, (_, c) => Float64Array.from({ length: q }, (_, j) => V.get(j, c))),
  };
}

/** Indices of the singular values, largest first. */
function byDecreasing(split: { sigma: number[] }): number[] {
  return split.sigma.map((_, c) => c).sort((a, b) => split.sigma[b]! - split.sigma[a]! || a - b);
}

function transpose(a: Float64Array, p: number, q: number): Float64Array {
  const t = new Float64Array(p * q);
  for (let i = 0; i < p; i++) for (let j = 0; j < q; j++) t[j * p + i] = a[i * q + j]!;
  return t;
}

/** Accumulates sparse columns one by one. */
class ColumnBuilder {
  private readonly start: number[] = [0];
  private readonly index: number[] = [];
  private readonly value: number[] = [];

  constructor(private readonly n: number) {}

  get count(): number {
    return this.start.length - 1;
  }

  unit(i: number): void {
    this.index.push(i);
    this.value.push(1);
    this.start.push(this.index.length);
  }

  /** A column with v[l] at row at[l] (exact zeros dropped). */
  column(at: readonly number[], v: Float64Array): void {
    for (let l = 0; l < at.length; l++) {
      if (v[l] !== 0) {
        this.index.push(at[l]!);
        this.value.push(v[l]!);
      }
    }
    this.start.push(this.index.length);
  }

  build(): SparseColumns {
    return { n: this.n, k: this.count, start: Int32Array.from(this.start), index: Int32Array.from(this.index), value: Float64Array.from(this.value) };
  }
}
