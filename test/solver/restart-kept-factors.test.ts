import { describe, expect, it } from 'vitest';
import { createDaeIntegrator } from '../../src/index.js';
import {
  algebraicJacobian,
  consistentDerivativeWith,
  createAlgebraicSolver,
  createDerivativeWork,
  factorAlgebraic,
  massSpaces,
  resolveAlgebraic,
  type ConsistencyContext,
  type DenseAlgebraicSolver,
} from '../../src/solver/consistent-initialization.js';

/**
 * What a cheap restart keeps from the last one: the factors of the algebraic
 * block W0^T J V0 (factored again only when the entries of J it reads
 * changed), the factors of the consistent-derivative system (only when J
 * changed) and the held Jacobian itself. The problem: a winding on a saturating
 * core driven by a source, unknowns (phi, v, i), equations
 *   phi' = v - R i,  0 = u - v,  0 = N i - l H(phi / A),
 * with H(B) = B / mu + c sinh(B / b) (invented numbers). Its Jacobian holds
 * dH/dB in the differential column phi only; the algebraic block (rows of
 * the two constraints, columns v and i) is constant.
 * References: the constraints themselves (v = u and i = l H(phi / A) / N
 * after the re-solve; both are linear in v and i, so one Newton update is
 * exact to rounding), and the block formed and factored afresh, which the
 * kept factors must reproduce bit for bit.
 */
const R = 0.5;
const N = 20;
const le = 0.05;
const area = 1e-4;
const mu = 4e-7 * Math.PI * 2000;
const field = (b: number): number => b / mu + 2 * Math.sinh(b / 0.04);
const slope = (b: number): number => 1 / mu + (2 / 0.04) * Math.cosh(b / 0.04);

function winding(u: () => number): ConsistencyContext & { jacAt: (y: Float64Array, out: Float64Array) => void } {
  const n = 3;
  const mass = Float64Array.of(1, 0, 0, 0, 0, 0, 0, 0, 0);
  const spaces = massSpaces(mass, n);
  const jacAt = (y: Float64Array, out: Float64Array): void => {
    out.fill(0);
    out[1] = 1;
    out[2] = -R;
    out[4] = -1;
    out[6] = -(le / area) * slope(y[0]! / area);
    out[8] = N;
  };
  return {
    n,
    spaces,
    rhs: (_t, y, out) => {
      out[0] = y[1]! - R * y[2]!;
      out[1] = u() - y[1]!;
      out[2] = N * y[2]! - le * field(y[0]! / area);
    },
    jacobian: (_t, y, _f, out) => jacAt(y, out),
    scale: Float64Array.of(1e-9, 1e-6, 1e-6),
    jacAt,
  };
}

/** An LU with its factorisations counted. */
function counted(solver: { readonly lu: DenseAlgebraicSolver['lu'] }): { factors: () => number } {
  const lu = solver.lu;
  const factor = lu.factor.bind(lu);
  let count = 0;
  lu.factor = (a) => {
    count++;
    return factor(a);
  };
  return { factors: () => count };
}

/** Re-solve y with the solver's factors (f evaluated at y first, as the restart does). */
function resolved(ctx: ConsistencyContext, solver: DenseAlgebraicSolver, y: Float64Array): Float64Array {
  const out = Float64Array.from(y);
  ctx.rhs(0, out, solver.f);
  resolveAlgebraic(ctx, 0, out, solver);
  return out;
}

describe('factorAlgebraic: the block is formed again only when the entries of J it reads moved', () => {
  it('keeps the factors when J changed in the differential column only, with the re-solve of a fresh factorisation bit for bit', () => {
    let u = 12;
    const ctx = winding(() => u);
    const jac = new Float64Array(9);
    const kept = createAlgebraicSolver(3, ctx.spaces.k);
    const count = counted(kept);
    ctx.jacAt(Float64Array.of(2e-6, 12, 0), jac);
    expect(factorAlgebraic(ctx.spaces, jac, kept)).toBe(true);
    expect(count.factors()).toBe(1);
    // The flux moved into saturation: dH/dB grew (column phi), the block did not.
    for (const phi of [2e-5, 3.1e-5, -2.7e-5]) {
      u = -u;
      const y = Float64Array.of(phi, -u, 0);
      ctx.jacAt(y, jac);
      expect(factorAlgebraic(ctx.spaces, jac, kept)).toBe(true);
      expect(count.factors()).toBe(1);
      const fresh = createAlgebraicSolver(3, ctx.spaces.k);
      expect(factorAlgebraic(ctx.spaces, jac, fresh)).toBe(true);
      const a = resolved(ctx, kept, y);
      const b = resolved(ctx, fresh, y);
      expect(Array.from(a)).toEqual(Array.from(b));
      // The constraints: v = u, i = l H(phi / A) / N (linear in v and i, so one update is exact to rounding).
      expect(a[0]).toBe(phi);
      expect(a[1]!).toBeCloseTo(u, 12);
      const i = (le * field(phi / area)) / N;
      expect(Math.abs(a[2]! - i)).toBeLessThan(1e-12 * Math.max(1, Math.abs(i)));
    }
  });

  it('forms and factors the block again when an entry it reads changed (the winding turns), as a fresh solver does', () => {
    const ctx = winding(() => 12);
    const jac = new Float64Array(9);
    const kept = createAlgebraicSolver(3, ctx.spaces.k);
    const count = counted(kept);
    ctx.jacAt(Float64Array.of(1e-6, 12, 0), jac);
    expect(factorAlgebraic(ctx.spaces, jac, kept)).toBe(true);
    jac[8] = 2 * N;
    expect(factorAlgebraic(ctx.spaces, jac, kept)).toBe(true);
    expect(count.factors()).toBe(2);
    const block = algebraicJacobian(ctx.spaces, jac, new Float64Array(ctx.spaces.k * ctx.spaces.k));
    expect(Array.from(kept.factoredBlock)).toEqual(Array.from(block));
    // Back to the first turns: the support moved again, the block is formed and differs from the held one.
    jac[8] = N;
    expect(factorAlgebraic(ctx.spaces, jac, kept)).toBe(true);
    expect(count.factors()).toBe(3);
  });

  it('forms the block again after a singular one (nothing kept to reuse)', () => {
    const ctx = winding(() => 12);
    const jac = new Float64Array(9);
    const kept = createAlgebraicSolver(3, ctx.spaces.k);
    const count = counted(kept);
    ctx.jacAt(Float64Array.of(1e-6, 12, 0), jac);
    jac[8] = 0; // no turns: i is not determined, the block is singular
    expect(factorAlgebraic(ctx.spaces, jac, kept)).toBe(false);
    expect(factorAlgebraic(ctx.spaces, jac, kept)).toBe(false);
    expect(count.factors()).toBe(2);
  });
});

describe('consistentDerivativeWith: the system is factored again only for another version of J', () => {
  it("keeps the factors for the same version, with a fresh work's y' bit for bit and the derivative of the constraints", () => {
    const u = 12;
    const ctx = winding(() => u);
    const mass = Float64Array.of(1, 0, 0, 0, 0, 0, 0, 0, 0);
    const jac = new Float64Array(9);
    const kept = createDerivativeWork(ctx.spaces, mass);
    const count = counted(kept);
    const dt = 1e-12;
    let version = 0;
    for (const phi of [2e-6, 2e-6, 2.9e-5, 2.9e-5, 2.9e-5, -1.5e-5]) {
      const y = Float64Array.of(phi, u, (le * field(phi / area)) / N);
      const f = new Float64Array(3);
      ctx.rhs(0, y, f);
      const changed = jac[6] !== -(le / area) * slope(phi / area);
      ctx.jacAt(y, jac);
      if (changed) version++;
      const before = count.factors();
      const yp = Float64Array.from(consistentDerivativeWith(ctx, 0, dt, y, f, jac, kept, version)!);
      expect(count.factors() - before).toBe(changed ? 1 : 0);
      const fresh = consistentDerivativeWith(ctx, 0, dt, y, f, jac, createDerivativeWork(ctx.spaces, mass))!;
      expect(Array.from(yp)).toEqual(Array.from(fresh));
      // The constraints differentiated (u held, so v' = 0): phi' = v - R i, N i' = (l / A) H'(phi / A) phi'.
      const phiDot = y[1]! - R * y[2]!;
      expect(Math.abs(yp[0]! - phiDot)).toBeLessThan(1e-12 * Math.abs(phiDot));
      expect(yp[1]).toBe(0);
      const iDot = ((le / area) * slope(phi / area) * phiDot) / N;
      expect(Math.abs(yp[2]! - iDot)).toBeLessThan(1e-9 * Math.abs(iDot));
    }
    expect(count.factors()).toBe(3);
  });

  it('factors every time without a version (the default), and keeps a singular verdict for the same version', () => {
    const ctx = winding(() => 12);
    const mass = Float64Array.of(1, 0, 0, 0, 0, 0, 0, 0, 0);
    const jac = new Float64Array(9);
    const y = Float64Array.of(1e-6, 12, 0);
    const f = new Float64Array(3);
    ctx.rhs(0, y, f);
    ctx.jacAt(y, jac);
    const work = createDerivativeWork(ctx.spaces, mass);
    const count = counted(work);
    consistentDerivativeWith(ctx, 0, 1e-12, y, f, jac, work);
    consistentDerivativeWith(ctx, 0, 1e-12, y, f, jac, work);
    expect(count.factors()).toBe(2);
    jac[8] = 0; // no turns: i' is not determined
    expect(consistentDerivativeWith(ctx, 0, 1e-12, y, f, jac, work, 7)).toBeUndefined();
    expect(consistentDerivativeWith(ctx, 0, 1e-12, y, f, jac, work, 7)).toBeUndefined();
    expect(count.factors()).toBe(3);
  });
});

describe('the cheap restart holds the Jacobian of its own state', () => {
  it('after each drive edge the held J is J at the restarted state, entry for entry, whether it changed or not', () => {
    let u = 12;
    const ctx = winding(() => u);
    const integ = createDaeIntegrator(
      {
        size: 3,
        y0: [0, u, 0],
        t0: 0,
        tEnd: 2e-4,
        mass: [
          [1, 0, 0],
          [0, 0, 0],
          [0, 0, 0],
        ],
        rhs: (t, y, out) => ctx.rhs(t, y, out),
        jacobian: (_t, y, out) => ctx.jacAt(y, out),
      },
      { rtol: 1e-6, atol: 1e-9 },
    );
    const expected = new Float64Array(9);
    for (let k = 1; k <= 8; k++) {
      expect(integ.advanceTo(k * 5e-6).status).toBe('success');
      u = -u;
      expect(integ.restart(undefined, { capStepByEstimate: true })).toBe('running');
      const held = integ.snapshot().jacobian!;
      ctx.jacAt(integ.y as Float64Array, expected);
      expect(Array.from(held)).toEqual(Array.from(expected));
      // v = u at once (the constraint, linear).
      expect(integ.y[1]!).toBeCloseTo(u, 9);
    }
    // A restart at the same state with the same inputs evaluates the same J: it stays held, unchanged.
    const before = integ.snapshot().jacobian!;
    expect(integ.restart(undefined, { capStepByEstimate: true })).toBe('running');
    expect(Array.from(integ.snapshot().jacobian!)).toEqual(Array.from(before));
  });
});
