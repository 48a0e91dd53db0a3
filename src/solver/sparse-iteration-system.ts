import { finiteDifferenceJacobian } from './finite-difference-jacobian.js';
import { NO_ROWS, OutsidePatternError, type IterationSystem } from './iteration-system.js';
import type { NormalizedDae } from './normalize-problem.js';
import { createSparseComplexLu } from './sparse-complex-lu.js';
import { createSparseLu } from './sparse-lu.js';
import { packedDoublesFrom, packedIndices } from './packed-doubles.js';
import { gatherOnPattern, type SparsePattern } from './sparse-pattern.js';
import type { JacobianEntryTarget } from './types.js';

/**
 * A {@link JacobianEntryTarget} adding into values on a fixed pattern
 * (compressed rows): each entry found by a binary search in its row. A
 * negative row or column (ground) is ignored; a position the pattern does
 * not hold throws {@link OutsidePatternError}.
 *
 * @internal
 * @example
 * ```ts
 * const target = new PatternValuesTarget(pattern).bind(values);
 * target.add(2, 3, 0.5);
 * ```
 */
export class PatternValuesTarget implements JacobianEntryTarget {
  private values: Float64Array;
  /** The pattern's row starts and columns as plain arrays of small integers (no typed-array detach check in the search). */
  private readonly rowStart: number[];
  private readonly col: number[];

  constructor(pattern: SparsePattern) {
    this.rowStart = packedIndices(pattern.rowStart);
    this.col = packedIndices(pattern.col);
    this.values = new Float64Array(0);
  }

  /** Make entries add into `values` (one per pattern entry, pattern order). */
  bind(values: Float64Array): this {
    this.values = values;
    return this;
  }

  add(row: number, c: number, value: number): void {
    if (row < 0 || c < 0) return;
    const col = this.col;
    let lo = this.rowStart[row]!;
    const end = this.rowStart[row + 1]!;
    let hi = end;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (col[mid]! < c) lo = mid + 1;
      else hi = mid;
    }
    if (lo >= end || col[lo] !== c) throw new OutsidePatternError(row, c);
    this.values[lo] = this.values[lo]! + value;
  }
}

/**
 * The {@link IterationSystem} on the fixed pattern of J, M and the diagonal
 * (the problem's `iterationPattern`): J is held as one value per pattern
 * entry, stamped there by the problem's `jacobianEntries`; the iteration
 * matrices fac1 M - J and (alphn + i betan) M - J are formed entry by entry
 * on the same pattern (O(nnz)) and factored from these values by the sparse
 * LUs, whose symbolic analysis (ordering, band) is made once here. No array
 * of size n^2 is held when the problem gives `jacobianEntries`; a problem
 * with only a dense Jacobian (or none: finite differences) is evaluated into
 * a dense scratch array made on first use and gathered onto the pattern,
 * with every non-zero outside it refused.
 *
 * @internal
 * @example
 * ```ts
 * const system = createSparseIterationSystem(normalizeDae(problem, { linearAlgebra: 'sparse' }));
 * ```
 */
export function createSparseIterationSystem(p: NormalizedDae): IterationSystem {
  if (!p.iterationPattern) throw new Error('createSparseIterationSystem: the problem has no iteration pattern');
  const pattern: SparsePattern = p.iterationPattern;
  const { n, rowStart, col } = pattern;
  const nnz = col.length;
  const luReal = createSparseLu(pattern);
  const luComplex = createSparseComplexLu(pattern, luReal.structure);
  // M on the pattern (the identity: ones on the diagonal, which the pattern always holds).
  // M's compressed rows are a subset of the pattern's, columns increasing in both: a merge per row.
  const massValues = new Float64Array(nnz);
  const m = p.mass;
  for (let i = 0; i < n; i++) {
    if (!m) {
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) if (col[e] === i) massValues[e] = 1;
      continue;
    }
    let e = rowStart[i]!;
    for (let k = m.rowStart[i]!; k < m.rowStart[i + 1]!; k++) {
      while (e < rowStart[i + 1]! && col[e]! < m.col[k]!) e++;
      if (col[e] !== m.col[k]) throw new Error(`iteration pattern lacks mass entry (${i}, ${m.col[k]})`);
      massValues[e] = m.value[k]!;
    }
  }
  // M read by every factorisation: a copy in a plain array of doubles (packedDoubles says why).
  const mass = packedDoublesFrom(massValues);
  const e1 = new Float64Array(nnz);
  const e2r = new Float64Array(nnz);
  const e2i = new Float64Array(nnz);
  const target = new PatternValuesTarget(pattern);
  const entries = p.jacobianEntries;
  const jf = p.jacobian;
  const recombine = recombination(pattern, p);
  let dense: Float64Array | undefined;
  let fdWork: Float64Array | undefined;

  /** values = the dense J on the pattern; throws for a non-zero outside it. */
  function gather(a: Float64Array, values: Float64Array): void {
    const i = gatherOnPattern(pattern, a, values);
    if (i < 0) return;
    let j = 0;
    // The first non-zero the pattern does not hold, to name it.
    for (let e = rowStart[i]!; j < n; j++) {
      while (e < rowStart[i + 1]! && col[e]! < j) e++;
      if (a[i * n + j] !== 0 && !(e < rowStart[i + 1]! && col[e] === j)) break;
    }
    throw new OutsidePatternError(i, j);
  }

  return {
    luReal,
    luComplex,
    sparse: { pattern, massValues },
    jacobianSize: nnz,
    analytic: entries !== undefined || jf !== undefined,
    evaluate(t, y, f, out) {
      if (entries) {
        out.fill(0);
        p.calls.jacobianEntries(t, y, target.bind(out));
        // Dependent rows of M become explicit algebraic equations (normalize-problem.ts): the same rows of J.
        for (let r = 0; r < recombine.destination.length; r++) {
          out[recombine.destination[r]!] = out[recombine.destination[r]!]! - recombine.coefficient[r]! * out[recombine.source[r]!]!;
        }
        return 0;
      }
      dense ??= new Float64Array(n * n);
      let evaluations = 0;
      if (jf) {
        dense.fill(0);
        p.calls.jacobian(t, y, dense);
      } else {
        evaluations = finiteDifferenceJacobian(p.rhs, t, y, f, dense, (fdWork ??= new Float64Array(n)));
      }
      gather(dense, out);
      return evaluations;
    },
    nonFiniteRows(jac) {
      let rows: number[] | undefined;
      for (let i = 0; i < n; i++) {
        for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
          if (!Number.isFinite(jac[e]!)) {
            (rows ??= []).push(i);
            break;
          }
        }
      }
      return rows ?? NO_ROWS;
    },
    factor(J, fac1, alphn, betan) {
      for (let e = 0; e < nnz; e++) {
        const m = mass[e]!;
        const v = -J[e]!;
        e1[e] = v + fac1 * m;
        e2r[e] = v + alphn * m;
        e2i[e] = betan * m;
      }
      const real = luReal.factorValues(e1);
      return real >= 0 ? real : luComplex.factorValues(e2r, e2i);
    },
    toDense(jac, out) {
      out.fill(0);
      for (let i = 0; i < n; i++) for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) out[i * n + col[e]!] = jac[e]!;
      return out;
    },
    storage() {
      const { width, lower } = luReal.structure;
      // Band and multipliers (real: once, complex: twice), the values gathered and kept for refinement,
      // vectors of n (7 real, 11 complex, pivots included), and the copies of the pattern (n + 1 row starts, nnz
      // columns) and of the ordering and band slots (n + nnz) in each LU and of the pattern in the target.
      const band = n * width + n * lower;
      const patternCopy = n + 1 + nnz;
      return {
        // The integrator holds J itself; the system only a dense scratch for a problem without jacobianEntries.
        jacobian: dense ? n * n : 0,
        // e1, e2r, e2i, M on the pattern and its copy.
        iterationMatrices: 5 * nnz,
        factors: 3 * band + 6 * nnz + 18 * n + 2 * (patternCopy + n + nnz) + patternCopy,
      };
    },
  };
}

/**
 * The recombination of dependent rows of M ({@link MassRowCompression}) as
 * updates of J's values on the pattern, in the order of the dense
 * recombination (compressedJacobian): values[destination] -= coefficient *
 * values[source], for each entry of each source row. The pattern holds the
 * destinations (normalizeDae adds the source rows' entries to the dependent rows).
 */
function recombination(pattern: SparsePattern, p: NormalizedDae): { destination: number[]; source: number[]; coefficient: number[] } {
  const destination: number[] = [];
  const source: number[] = [];
  const coefficient: number[] = [];
  const { rowStart, col } = pattern;
  for (const d of p.massCompression?.dependent ?? []) {
    for (let k = 0; k < d.rows.length; k++) {
      const src = d.rows[k]!;
      for (let e = rowStart[src]!; e < rowStart[src + 1]!; e++) {
        const j = col[e]!;
        let slot = rowStart[d.row]!;
        while (slot < rowStart[d.row + 1]! && col[slot]! < j) slot++;
        if (col[slot] !== j) throw new Error(`iteration pattern lacks entry (${d.row}, ${j}) of a recombined row`);
        destination.push(slot);
        source.push(e);
        coefficient.push(d.coefficients[k]!);
      }
    }
  }
  // Indices pushed as small integers; the coefficients as doubles from birth (packedDoublesFrom).
  return { destination, source, coefficient: packedDoublesFrom(coefficient) };
}
