import { blockOf, massBlocks, sparseMassOfDense, type SparseMass } from './sparse-mass.js';
import type { JacobianFunction, RhsFunction } from './types.js';

/**
 * Hidden algebraic equations of M y' = f(t, y): rows of M that are linear
 * combinations of other rows. Two windings on one flux path give two
 * proportional rows (N1 (B^T psi')_b and N2 (B^T psi')_b): the combination
 * N2 row1 - N1 row2 has no derivative in it, so it is an algebraic equation.
 * Left as they are, such rows make the iteration matrix (gamma/h) M - J
 * ill-conditioned as h shrinks: elimination cancels the (gamma/h) M parts of
 * size N/h and leaves the O(1) J parts under a rounding error of size
 * eps N/h, so below h of about 1e-13 s the LU reports a singular matrix that
 * is not singular (and Newton's increments lose their accuracy before that).
 *
 * The cure is the standard one for a non-diagonal singular M: recombine the
 * equations so that the algebraic ones are explicit (left-multiply by an
 * invertible T with T M = [M1; 0]; e.g. Hairer and Wanner, Solving ODEs II,
 * sect. VI.1 on reducing M y' = f to semi-explicit form; common practice).
 * Here T is the identity except for the dependent rows, which become
 * row_r - sum_j c_j row_j, with exact zeros in M; the other equations, and
 * so the rows' scales, are untouched. The solution y is the same.
 *
 * @internal
 * @example
 * ```ts
 * const c: MassRowCompression | undefined = massRowCompression(mass, n);
 * ```
 */
export interface MassRowCompression {
  /** Dependent rows r and their combinations: equation r becomes f_r - sum c_j f_{rows_j}. */
  readonly dependent: readonly { readonly row: number; readonly rows: Int32Array; readonly coefficients: Float64Array }[];
}

/**
 * Find rows of M that are combinations of earlier rows, by Gaussian
 * elimination on the non-zero rows with the largest entry of each
 * independent remainder as pivot. A remainder below 64 eps max|row| counts
 * as zero. Returns undefined when every non-zero row is independent (the
 * usual case: nothing to do).
 *
 * M is row-major dense (n x n) or compressed rows. The elimination runs on
 * each connected block of M ({@link massBlocks}) on its own: a row's
 * remainder stays within its block's columns, so the pivots of other blocks
 * read zeros there and the elimination of the whole M skips them anyway;
 * block by block it takes the same steps in the same order (the same
 * result, rounding included) at the cost of the blocks' sizes instead of n^2.
 *
 * @internal
 * @example
 * ```ts
 * // rows 0 and 1 proportional (two windings on one flux path): row 1 becomes row 1 + 1.01 row 0
 * massRowCompression(Float64Array.of(200, 200, -202, -202), 2)!.dependent[0]!.coefficients; // [-1.01]
 * ```
 */
export function massRowCompression(mass: Float64Array | SparseMass, n: number): MassRowCompression | undefined {
  const m = mass instanceof Float64Array ? sparseMassOfDense(mass, n) : mass;
  const dependent: { row: number; rows: Int32Array; coefficients: Float64Array }[] = [];
  for (const block of massBlocks(m)) {
    if (block.rows.length < 2) continue; // one non-zero row is independent
    const q = block.cols.length;
    const sub = blockOf(m, block);
    // Basis of independent remainders: vector, pivot column, and its expression in original rows.
    const basis: { v: Float64Array; pivot: number; combo: Map<number, number> }[] = [];
    block.rows.forEach((r, local) => {
      const v = sub.slice(local * q, local * q + q);
      let scale = 0;
      for (let j = 0; j < q; j++) scale = Math.max(scale, Math.abs(v[j]!));
      if (scale === 0) return;
      // v = row_r - sum over basis of c * (basis vector); track it in original rows.
      const combo = new Map<number, number>([[r, 1]]);
      for (const b of basis) {
        const c = v[b.pivot]! / b.v[b.pivot]!;
        if (c === 0) continue;
        for (let j = 0; j < q; j++) v[j] = v[j]! - c * b.v[j]!;
        for (const [row, k] of b.combo) combo.set(row, (combo.get(row) ?? 0) - c * k);
      }
      let rest = 0;
      let pivot = -1;
      for (let j = 0; j < q; j++) {
        if (Math.abs(v[j]!) > rest) {
          rest = Math.abs(v[j]!);
          pivot = j;
        }
      }
      if (rest <= 64 * Number.EPSILON * scale) {
        const others = [...combo].filter(([row, k]) => row !== r && k !== 0);
        dependent.push({
          row: r,
          rows: Int32Array.from(others, ([row]) => row),
          // equation r becomes f_r + sum (combo coefficient) f_row: store the negated coefficients c_j.
          coefficients: Float64Array.from(others, ([, k]) => -k),
        });
      } else {
        basis.push({ v, pivot, combo });
      }
    });
  }
  dependent.sort((a, b) => a.row - b.row);
  return dependent.length > 0 ? { dependent } : undefined;
}

/**
 * The recombined mass matrix: dependent rows set to exact zeros.
 *
 * @internal
 * @example
 * ```ts
 * const m = Float64Array.of(200, 200, -202, -202);
 * compressedMass(m, 2, massRowCompression(m, 2)!); // [200, 200, 0, 0]
 * ```
 */
export function compressedMass(mass: Float64Array, n: number, c: MassRowCompression): Float64Array {
  const out = mass.slice();
  for (const d of c.dependent) out.fill(0, d.row * n, d.row * n + n);
  return out;
}

/**
 * The recombined mass matrix in compressed rows: the dependent rows' entries dropped.
 *
 * @internal
 * @example
 * ```ts
 * const m = sparseMassOfDense(Float64Array.of(200, 200, -202, -202), 2);
 * compressedSparseMass(m, massRowCompression(m, 2)!).col; // [0, 1]
 * ```
 */
export function compressedSparseMass(mass: SparseMass, c: MassRowCompression): SparseMass {
  const { n, rowStart, col, value } = mass;
  const drop = new Uint8Array(n);
  for (const d of c.dependent) drop[d.row] = 1;
  const start = new Int32Array(n + 1);
  const cols: number[] = [];
  const values: number[] = [];
  for (let i = 0; i < n; i++) {
    if (!drop[i]) {
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        cols.push(col[e]!);
        values.push(value[e]!);
      }
    }
    start[i + 1] = cols.length;
  }
  return { n, rowStart: start, col: Int32Array.from(cols), value: Float64Array.from(values) };
}

/**
 * f recombined: out_r = f_r - sum c_j f_{rows_j} for the dependent rows. When
 * f has a non-finite entry it is passed on unchanged, so the solver's
 * diagnosis names the very equation that failed.
 *
 * @internal
 * @example
 * ```ts
 * const rhs = compression ? compressedRhs(problem.rhs, compression) : problem.rhs;
 * ```
 */
export function compressedRhs(rhs: RhsFunction, c: MassRowCompression): RhsFunction {
  return (t, y, out) => {
    rhs(t, y, out);
    recombineRhsRows(out, c);
  };
}

/**
 * The recombination of {@link compressedRhs} on f already in `out`.
 *
 * @internal
 * @example
 * ```ts
 * problem.rhs(t, y, out);
 * recombineRhsRows(out, compression);
 * ```
 */
export function recombineRhsRows(out: Float64Array, c: MassRowCompression): void {
  for (let i = 0; i < out.length; i++) if (!Number.isFinite(out[i]!)) return;
  for (const d of c.dependent) {
    let s = out[d.row]!;
    for (let k = 0; k < d.rows.length; k++) s -= d.coefficients[k]! * out[d.rows[k]!]!;
    out[d.row] = s;
  }
}

/**
 * df/dy recombined the same way (row-major n x n).
 *
 * @internal
 * @example
 * ```ts
 * const jacobian = compression && problem.jacobian ? compressedJacobian(problem.jacobian, n, compression) : problem.jacobian;
 * ```
 */
export function compressedJacobian(jacobian: JacobianFunction, n: number, c: MassRowCompression): JacobianFunction {
  return (t, y, out) => {
    jacobian(t, y, out);
    recombineJacobianRows(out, n, c);
  };
}

/**
 * The recombination of {@link compressedJacobian} on df/dy already in `out` (row-major n x n).
 *
 * @internal
 * @example
 * ```ts
 * problem.jacobian(t, y, out);
 * recombineJacobianRows(out, n, compression);
 * ```
 */
export function recombineJacobianRows(out: Float64Array, n: number, c: MassRowCompression): void {
  // Dependent rows only combine independent rows (rows kept as they are), so the order of updates does not matter.
  for (const d of c.dependent) {
    const base = d.row * n;
    for (let k = 0; k < d.rows.length; k++) {
      const src = d.rows[k]! * n;
      const ck = d.coefficients[k]!;
      for (let j = 0; j < n; j++) out[base + j] = out[base + j]! - ck * out[src + j]!;
    }
  }
}
