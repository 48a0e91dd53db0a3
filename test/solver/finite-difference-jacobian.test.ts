import { describe, expect, it } from 'vitest';
import { finiteDifferenceJacobian } from '../../src/index.js';

describe('finiteDifferenceJacobian', () => {
  it('matches the hand-derived Jacobian of a nonlinear f to about sqrt(eps), costs n evaluations and restores y', () => {
    // f = (sin y0 + y1^2, exp(y0) y2, y0 y1 y2); J derived by hand.
    let calls = 0;
    const rhs = (_t: number, y: Float64Array, out: Float64Array): void => {
      calls++;
      out[0] = Math.sin(y[0]!) + y[1]! ** 2;
      out[1] = Math.exp(y[0]!) * y[2]!;
      out[2] = y[0]! * y[1]! * y[2]!;
    };
    const y = Float64Array.of(0.3, -1.2, 2.5);
    const yCopy = Float64Array.from(y);
    const f0 = new Float64Array(3);
    rhs(0, y, f0);
    calls = 0;
    const J = new Float64Array(9);
    expect(finiteDifferenceJacobian(rhs, 0, y, f0, J)).toBe(3);
    expect(calls).toBe(3);
    expect(Array.from(y)).toEqual(Array.from(yCopy));
    const [a, b, c] = [0.3, -1.2, 2.5];
    const exact = [Math.cos(a), 2 * b, 0, Math.exp(a) * c, 0, Math.exp(a), b * c, a * c, a * b];
    for (let k = 0; k < 9; k++) expect(Math.abs(J[k]! - exact[k]!)).toBeLessThan(1e-6 * Math.max(1, Math.abs(exact[k]!)));
  });

  it('with typical magnitudes resolves a component far below 1e-5 (f = y^2 at y = 1e-9)', () => {
    const rhs = (_t: number, y: Float64Array, out: Float64Array): void => {
      out[0] = y[0]! * y[0]!;
    };
    const y = Float64Array.of(1e-9);
    const f0 = Float64Array.of(1e-18);
    const J = new Float64Array(1);
    finiteDifferenceJacobian(rhs, 0, y, f0, J, undefined, [1e-12]);
    expect(J[0]! / 2e-9).toBeCloseTo(1, 6);
  });
});
