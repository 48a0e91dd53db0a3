import { describe, expect, it } from 'vitest';
import { solveDae, type DaeProblem, type JacobianEntryTarget } from '../../src/index.js';

/**
 * The solver calls a problem's callbacks as methods of the problem object,
 * so a class instance whose methods read their data through `this` is a
 * problem like any other (and an object literal of arrow functions still is).
 *
 * Reference: exponential decay y' = -k y, y(0) = y0 has the closed form
 * y(t) = y0 exp(-k t) (the linear first-order equation with constant
 * coefficient; Boyce and DiPrima, Elementary Differential Equations and
 * Boundary Value Problems, sect. 2.1).
 */
const K = 3;
const Y0 = 2;
const T_END = 2;
const exact = (t: number): number => Y0 * Math.exp(-K * t);

/** y' = -k y with f and J as prototype methods reading k through `this`. */
class ExponentialDecay implements DaeProblem {
  readonly size = 1;
  readonly y0 = [Y0];
  readonly t0 = 0;
  readonly tEnd = T_END;

  constructor(private readonly k: number) {}

  rhs(_t: number, y: Float64Array, out: Float64Array): void {
    out[0] = -this.k * y[0]!;
  }

  jacobian(_t: number, _y: Float64Array, out: Float64Array): void {
    out[0] = -this.k;
  }
}

/**
 * The same decay written twice, M = [[1, 0], [1, 0]]: the second row of M
 * repeats the first, so the solver recombines it into the algebraic
 * equation f2 - f1 = k (y1 - y2) = 0, i.e. y2 = y1 (the mass-row
 * compression path). J is given entry by entry only (the dense J is then
 * made from the entries). Both read k through `this`.
 */
class RepeatedDecay implements DaeProblem {
  readonly size = 2;
  readonly y0 = [Y0, Y0];
  readonly t0 = 0;
  readonly tEnd = T_END;
  readonly mass = [
    [1, 0],
    [1, 0],
  ];

  constructor(private readonly k: number) {}

  rhs(_t: number, y: Float64Array, out: Float64Array): void {
    out[0] = -this.k * y[0]!;
    out[1] = -this.k * y[1]!;
  }

  jacobianEntries(_t: number, _y: Float64Array, target: JacobianEntryTarget): void {
    target.add(0, 0, -this.k);
    target.add(1, 1, -this.k);
  }
}

/** Largest relative error against the closed form over every step of component `c`. */
function worstError(sol: ReturnType<typeof solveDae>, c: number): number {
  let worst = 0;
  for (let i = 0; i < sol.t.length; i++) worst = Math.max(worst, Math.abs(sol.y[i]![c]! - exact(sol.t[i]!)) / exact(sol.t[i]!));
  return worst;
}

// Measured largest relative error over the steps: 3.7e-9 for each of the three problems (rtol 1e-8, atol 1e-12).
const WORST = 1e-8;
const OPTIONS = { rtol: 1e-8, atol: 1e-12 };

describe('a problem given as a class instance', () => {
  it('integrates y\' = -k y with f and J as methods using `this` (closed form y0 exp(-k t), Boyce and DiPrima sect. 2.1)', () => {
    const sol = solveDae(new ExponentialDecay(K), OPTIONS);
    expect(sol.status).toBe('success');
    expect(sol.t[sol.t.length - 1]).toBe(T_END);
    expect(sol.stats.jacobianEvaluations).toBeGreaterThan(0);
    // The closed form y0 exp(-k t) (Boyce and DiPrima sect. 2.1) at every step.
    expect(worstError(sol, 0)).toBeLessThan(WORST);
  });

  it('recombines repeated mass rows and makes the dense J from entries through methods using `this` (closed form as above)', () => {
    const sol = solveDae(new RepeatedDecay(K), OPTIONS);
    expect(sol.status).toBe('success');
    // Both components follow y0 exp(-k t) (Boyce and DiPrima sect. 2.1): y2 = y1 is the hidden algebraic equation.
    expect(worstError(sol, 0)).toBeLessThan(WORST);
    expect(worstError(sol, 1)).toBeLessThan(WORST);
  });

  it('still takes a plain object literal of arrow functions, with the same result as the class', () => {
    const k = K;
    const literal: DaeProblem = {
      size: 1,
      y0: [Y0],
      t0: 0,
      tEnd: T_END,
      rhs: (_t, y, out) => {
        out[0] = -k * y[0]!;
      },
      jacobian: (_t, _y, out) => {
        out[0] = -k;
      },
    };
    const sol = solveDae(literal, OPTIONS);
    expect(sol.status).toBe('success');
    // The closed form y0 exp(-k t) (Boyce and DiPrima sect. 2.1).
    expect(worstError(sol, 0)).toBeLessThan(WORST);
    // Same arithmetic whether f is a method or a closure: the same steps and values, bit for bit.
    const fromClass = solveDae(new ExponentialDecay(K), OPTIONS);
    expect(Array.from(sol.t)).toEqual(Array.from(fromClass.t));
    expect(sol.y.map((r) => r[0])).toEqual(fromClass.y.map((r) => r[0]));
  });
});
