import { describe, expect, it } from 'vitest';
import { createDaeIntegrator, createDaeIntegratorWithDependents } from '../../src/solver/dae-integrator.js';
import { stepErrorNorm, type DependentError } from '../../src/solver/dependent-error.js';
import { weightedRmsNorm } from '../../src/solver/weighted-norm.js';
import type { DaeProblem } from '../../src/solver/types.js';

/** A dependent share of fixed size and sum, counting its calls. */
class FixedShare implements DependentError {
  squares = 0;
  calls = 0;
  constructor(
    readonly count: number,
    private readonly sum: number,
  ) {}

  measure(): void {
    this.calls++;
    this.squares = this.sum;
  }

  /** No share in the Newton increment: the iteration stops as it does without dependents. */
  measureIncrement(): void {
    this.squares = 0;
  }
}

// Prothero-Robinson: y' = -50 (y - cos t) - sin t, y(0) = 1, exact y = cos t (Prothero and Robinson, Math. Comp. 28, 1974;
// the stiff test equation; from memory).
const problem: DaeProblem = {
  size: 1,
  y0: [1],
  t0: 0,
  tEnd: 1,
  rhs: (t, y, out) => {
    out[0] = -50 * (y[0]! - Math.cos(t)) - Math.sin(t);
  },
  jacobian: (_t, _y, jac) => {
    jac[0] = -50;
  },
};

describe('the error norm with unknowns that follow from the state (DependentError)', () => {
  it('is the RMS of the scaled errors over the state and the dependent unknowns together', () => {
    // Weighted RMS norm, Hairer and Wanner II, sect. IV.8 (from memory): sqrt(sum (e_i / sc_i)^2 / n).
    const err = Float64Array.of(3e-6, -4e-6);
    const scale = Float64Array.of(1e-6, 2e-6);
    const share = new FixedShare(3, 7);
    const at = { t: 0 };
    const norm = stepErrorNorm(at, new Float64Array(2), err, scale, share);
    // (3)^2 + (-2)^2 = 13 over the state, 7 over the three dependent unknowns: sqrt(20 / 5) = 2.
    expect(norm).toBeCloseTo(2, 14);
    expect(share.calls).toBe(1);
    // With no dependent share it is the state's own norm.
    expect(stepErrorNorm(at, new Float64Array(2), err, scale, new FixedShare(0, 0))).toBe(weightedRmsNorm(err, scale));
  });

  it('a zero share leaves the steps those of a larger problem whose extra unknowns carry no error; a large one shortens them', () => {
    const plain = createDaeIntegrator(problem, { rtol: 1e-6, atol: 1e-9 });
    plain.advanceTo(1);
    const quiet = createDaeIntegratorWithDependents(problem, { rtol: 1e-6, atol: 1e-9 }, new FixedShare(1, 0));
    quiet.advanceTo(1);
    // The mean over two unknowns, one without error: the norm is 1/sqrt(2) of the plain one, so no more steps.
    expect(quiet.status).toBe('success');
    expect(quiet.stats.acceptedSteps).toBeLessThanOrEqual(plain.stats.acceptedSteps);
    const loud = createDaeIntegratorWithDependents(problem, { rtol: 1e-6, atol: 1e-9 }, new FixedShare(1, 0.5));
    loud.advanceTo(1);
    expect(loud.status).toBe('success');
    expect(loud.stats.acceptedSteps).toBeGreaterThan(plain.stats.acceptedSteps);
    // Both still follow y = cos t.
    expect(Math.abs(loud.y[0]! - Math.cos(1))).toBeLessThan(1e-5);
  });

  it('a measure that throws (user code evaluated at a shifted state) ends the run as rhs-error, not as an exception', () => {
    const throwing: DependentError = {
      count: 1,
      squares: 0,
      measure: () => {
        throw new Error('law undefined here');
      },
      measureIncrement: () => {},
    };
    const integ = createDaeIntegratorWithDependents(problem, { rtol: 1e-6 }, throwing);
    const r = integ.step();
    expect(r.status).toBe('rhs-error');
    expect(integ.message).toMatch(/law undefined here/);
    expect(integ.message).toMatch(/eliminated unknowns/);
  });
});
