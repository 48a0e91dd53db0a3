import { describe, expect, it } from 'vitest';
import { solveDae, type DaeProblem } from '../../src/index.js';

/**
 * Index-2 DAE y1' = y2, 0 = y1 - sin t (M = diag(1, 0)). Differentiating the
 * constraint once gives y1' = cos t, hence y2 = cos t appears only after a
 * second differentiation: y2 is an index-2 component (Hairer and Wanner II,
 * sect. VII.1 on the index; DERIVED closed form y1 = sin t, y2 = cos t).
 * Radau IIA converges with order 3 in the index-2 component (book
 * sect. VII.4, Table 4.1: stage order); radau5 scales that component's error
 * estimate by h (book sect. VII.8 and the code's documentation of NIND2).
 */
function problem(index2: number[]): DaeProblem {
  return {
    size: 2,
    y0: [0, 1],
    t0: 0,
    tEnd: 10,
    mass: [[1, 0], [0, 0]],
    index2,
    rhs: (t, y, out) => {
      out[0] = y[1]!;
      out[1] = y[0]! - Math.sin(t);
    },
    jacobian: (_t, _y, J) => {
      J[1] = 1;
      J[2] = 1;
    },
  };
}

function errors(sol: ReturnType<typeof solveDae>): [number, number] {
  let e1 = 0;
  let e2 = 0;
  sol.t.forEach((t, k) => {
    e1 = Math.max(e1, Math.abs(sol.y[k]![0]! - Math.sin(t)));
    e2 = Math.max(e2, Math.abs(sol.y[k]![1]! - Math.cos(t)));
  });
  return [e1, e2];
}

describe('solveDae with problem.index2', () => {
  it('solves y1\' = y2, 0 = y1 - sin t to the closed form y1 = sin t, y2 = cos t', () => {
    const sol = solveDae(problem([1]), { rtol: 1e-9, atol: 1e-9 });
    expect(sol.status).toBe('success');
    const [e1, e2] = errors(sol);
    expect(e1).toBeLessThan(1e-12); // the constraint is met at every step
    expect(e2).toBeLessThan(2e-5); // measured 6.0e-6 (order 3 component)
  });

  it('the index-2 component converges as the tolerance shrinks', () => {
    const loose = errors(solveDae(problem([1]), { rtol: 1e-6, atol: 1e-6 }))[1];
    const tight = errors(solveDae(problem([1]), { rtol: 1e-9, atol: 1e-9 }))[1];
    expect(tight).toBeLessThan(loose / 20); // measured 2.5e-4 -> 6.0e-6
  });

  it('scaling the index-2 error by h saves steps against treating y2 as index 1 (measured 188 vs 503 at rtol 1e-9)', () => {
    const with2 = solveDae(problem([1]), { rtol: 1e-9, atol: 1e-9 });
    const without = solveDae(problem([]), { rtol: 1e-9, atol: 1e-9 });
    expect(without.status).toBe('success');
    expect(with2.stats.acceptedSteps).toBeLessThan(0.6 * without.stats.acceptedSteps);
  });

  it('moves a differential unknown the hidden constraint fixes, and says so: y1(0) = 0.5 violates 0 = y1 - sin 0', () => {
    // y1 is differential (it has y1' in M y' = f) but the algebraic row pins it to sin t: the
    // least-change initialisation moves it to sin 0 = 0 and reports it in adjustedAtStart.
    const sol = solveDae({ ...problem([1]), y0: [0.5, 1] });
    expect(sol.status).toBe('success');
    expect(sol.y[0]![0]).toBeCloseTo(0, 12);
    expect(sol.adjustedAtStart).toEqual([0]);
    const end = sol.y[sol.y.length - 1]!;
    expect(end[0]).toBeCloseTo(Math.sin(sol.tReached), 9);
  });

  it('still reports an algebraic equation no unknown can satisfy', () => {
    // 0 = 1 for every state: inconsistent whatever moves.
    const sol = solveDae({
      size: 2, y0: [0, 0], t0: 0, tEnd: 1, mass: [[1, 0], [0, 0]],
      rhs: (_t, y, out) => { out[0] = -y[0]!; out[1] = 1; },
    });
    expect(sol.status).toBe('inconsistent-init');
  });
});
