import { describe, expect, it } from 'vitest';
import { inverseLangevin, langevin, langevinIntegral, langevinSlope } from '../../../src/materials/hysteresis/langevin.js';
import { integrate } from '../../helpers/quadrature.js';

// Closed forms (Abramowitz and Stegun 4.5: coth, sinh) evaluated where they do not cancel;
// series branch near 0 checked for continuity with them at the switch-over |x| = 0.1.
describe('langevin', () => {
  it('equals coth(x) - 1/x where that form is accurate, and is odd', () => {
    for (const x of [0.3, 1, 2.5, 7, 30]) {
      expect(langevin(x)).toBeCloseTo(1 / Math.tanh(x) - 1 / x, 14);
      expect(langevin(-x)).toBe(-langevin(x));
    }
    expect(langevin(1)).toBeCloseTo(0.3130352854993313, 15); // coth(1) - 1, coth 1 = 1.3130352854993313
  });

  it('joins its series and closed form continuously at |x| = 0.1 (value and slope)', () => {
    // Two points 2e-12 apart straddle the switch-over; their difference must be the slope times 2e-12.
    const below = 0.1 - 1e-12;
    const above = 0.1 + 1e-12;
    const jump = (f: (x: number) => number, slope: number): number => Math.abs(f(above) - f(below) - 2e-12 * slope);
    // The closed forms at 0.1 carry round-off of eps * 1/x = 2e-15 (value) and eps * 1/x^2 = 2e-14 (slope).
    expect(jump(langevin, langevinSlope(0.1))).toBeLessThan(5e-15);
    expect(jump(langevinSlope, -0.0133)).toBeLessThan(5e-14); // L''(0.1) = -2x/15 + ... = -0.0133
    // ln(sinh x / x) = 1.66e-3 at 0.1 loses about eps / 1.66e-3 = 1.3e-13 to cancellation in the closed form.
    expect(jump(langevinIntegral, langevin(0.1))).toBeLessThan(3e-13);
  });

  it('has slope equal to the central difference of the value, and integral equal to adaptive quadrature', () => {
    for (const x of [-3, -0.05, 0.02, 0.5, 4]) {
      const h = 1e-5;
      expect(langevinSlope(x)).toBeCloseTo((langevin(x + h) - langevin(x - h)) / (2 * h), 9);
      expect(langevinIntegral(x)).toBeCloseTo(integrate(langevin, 0, x, [], 1e-13), 11);
    }
  });

  it('inverts: inverseLangevin(langevin(x)) = x, NaN outside (-1, 1)', () => {
    for (const x of [-20, -1.3, -1e-6, 0, 0.04, 2, 15]) expect(inverseLangevin(langevin(x))).toBeCloseTo(x, 9);
    expect(inverseLangevin(1)).toBeNaN();
    expect(inverseLangevin(-1.2)).toBeNaN();
  });
});
