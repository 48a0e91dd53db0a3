import { describe, expect, it } from 'vitest';
import { solveDae, SPARSE_MIN_SIZE, type DaeProblem } from '../../src/index.js';

/**
 * A ladder of n nodes (R between neighbours, C to ground at four nodes of
 * five, the fifth algebraic), driven by a sine through R0: nodal analysis
 * (common practice), a DAE with a tridiagonal Jacobian.
 */
function ladder(n: number, withPattern: boolean): DaeProblem {
  const R = 100;
  const R0 = 10;
  const C = 1e-6;
  const mass = new Float64Array(n * n);
  for (let k = 0; k < n; k++) mass[k * n + k] = k % 5 === 4 ? 0 : C;
  const rows: number[] = [];
  const cols: number[] = [];
  for (let k = 0; k < n; k++) {
    rows.push(k);
    cols.push(k);
    if (k > 0) rows.push(k), cols.push(k - 1);
    if (k < n - 1) rows.push(k), cols.push(k + 1);
  }
  return {
    size: n,
    y0: new Array(n).fill(0),
    t0: 0,
    tEnd: 0.02,
    mass,
    rhs: (t, v, out) => {
      for (let k = 0; k < n; k++) {
        let i = 0;
        if (k > 0) i += (v[k - 1]! - v[k]!) / R;
        if (k < n - 1) i += (v[k + 1]! - v[k]!) / R;
        if (k === 0) i += (10 * Math.sin(2 * Math.PI * 50 * t) - v[0]!) / R0;
        out[k] = i;
      }
    },
    jacobian: (_t, _v, J) => {
      for (let k = 0; k < n; k++) {
        let d = 0;
        if (k > 0) (J[k * n + k - 1] = 1 / R), (d -= 1 / R);
        if (k < n - 1) (J[k * n + k + 1] = 1 / R), (d -= 1 / R);
        if (k === 0) d -= 1 / R0;
        J[k * n + k] = d;
      }
    },
    ...(withPattern ? { jacobianPattern: { rows, cols } } : {}),
  };
}

describe('solveDae with the sparse LU', () => {
  it('takes the same steps as the dense kernels and agrees to round-off (ladder, n = 60)', () => {
    const dense = solveDae(ladder(60, false), { rtol: 1e-8, atol: 1e-10 });
    const sparse = solveDae(ladder(60, true), { rtol: 1e-8, atol: 1e-10 });
    expect(60).toBeGreaterThanOrEqual(SPARSE_MIN_SIZE); // the pattern alone switches to the sparse LU
    expect(dense.status).toBe('success');
    expect(sparse.status).toBe('success');
    expect(sparse.stats.acceptedSteps).toBe(dense.stats.acceptedSteps);
    expect(sparse.stats.luFactorizations).toBe(dense.stats.luFactorizations);
    const a = dense.y[dense.y.length - 1]!;
    const b = sparse.y[sparse.y.length - 1]!;
    for (let i = 0; i < 60; i++) expect(Math.abs(a[i]! - b[i]!)).toBeLessThan(1e-12 * 10);
  });

  it('stops with rhs-error when the Jacobian has an entry outside the declared pattern', () => {
    const p = ladder(45, true);
    const pattern = p.jacobianPattern!;
    // Drop the entries of row 7: the Jacobian still writes them.
    const keep = Array.from(pattern.rows, (r, k) => (r === 7 && pattern.cols[k] !== 7 ? -1 : k)).filter((k) => k >= 0);
    const broken: DaeProblem = { ...p, jacobianPattern: { rows: keep.map((k) => pattern.rows[k]!), cols: keep.map((k) => pattern.cols[k]!) } };
    const sol = solveDae(broken, { linearAlgebra: 'sparse' });
    expect(sol.status).toBe('rhs-error');
    expect(sol.message).toMatch(/outside jacobianPattern/);
  });

  it('stops with rhs-error naming the entry when jacobianEntries adds outside the declared pattern', () => {
    const p = ladder(45, true);
    const pattern = p.jacobianPattern!;
    const keep = Array.from(pattern.rows, (r, k) => (r === 7 && pattern.cols[k] !== 7 ? -1 : k)).filter((k) => k >= 0);
    const jacobian = p.jacobian!;
    const dense = new Float64Array(45 * 45);
    // The same Jacobian entry by entry (its non-zeros), onto a pattern without row 7's off-diagonal entries.
    const broken: DaeProblem = {
      ...p,
      jacobianPattern: { rows: keep.map((k) => pattern.rows[k]!), cols: keep.map((k) => pattern.cols[k]!) },
      jacobianEntries: (t, y, target) => {
        dense.fill(0);
        jacobian(t, y, dense);
        for (let i = 0; i < 45 * 45; i++) if (dense[i] !== 0) target.add(Math.floor(i / 45), i % 45, dense[i]!);
      },
    };
    const sol = solveDae(broken, { linearAlgebra: 'sparse' });
    expect(sol.status).toBe('rhs-error');
    expect(sol.message).toMatch(/outside jacobianPattern/);
    expect(sol.message).toMatch(/entry \(7, (6|8)\)/);
  });

  it("refuses linearAlgebra 'sparse' without a pattern", () => {
    expect(() => solveDae(ladder(10, false), { linearAlgebra: 'sparse' })).toThrow(/jacobianPattern/);
  });
});
