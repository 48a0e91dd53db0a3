import { describe, expect, it } from 'vitest';
import { InputError, levenbergMarquardt } from '../../src/index.js';

describe('levenbergMarquardt', () => {
  it('reaches the NIST StRD certified values of Misra1a from both NIST starting points', () => {
    // NIST Statistical Reference Datasets, nonlinear regression, Misra1a (lower difficulty):
    // y = b1 (1 - exp(-b2 x)); certified b1 = 2.3894212918E+02, b2 = 5.5015643181E-04,
    // residual sum of squares 1.2455138894E-01; starts (500, 1e-4) and (250, 5e-4).
    // Data and certified values READ in two independent public copies of the NIST file.
    const x = [77.6, 114.9, 141.1, 190.8, 239.9, 289.0, 332.8, 378.4, 434.8, 477.3, 536.8, 593.1, 689.1, 760.0];
    const y = [10.07, 14.73, 17.94, 23.93, 29.61, 35.18, 40.02, 44.82, 50.76, 55.05, 61.01, 66.4, 75.47, 81.78];
    for (const initial of [
      [500, 1e-4],
      [250, 5e-4],
    ]) {
      const fit = levenbergMarquardt({
        residuals: (p) => Float64Array.from(x, (xi, i) => (y[i] as number) - (p[0] as number) * (1 - Math.exp(-(p[1] as number) * xi))),
        initial,
      });
      expect(fit.converged).toBe(true);
      // NIST certifies 11 significant digits; a central-difference Jacobian reaches ~1e-9.
      expect(Math.abs((fit.parameters[0] as number) / 2.3894212918e2 - 1)).toBeLessThan(1e-8);
      expect(Math.abs((fit.parameters[1] as number) / 5.5015643181e-4 - 1)).toBeLessThan(1e-8);
      expect(Math.abs((2 * fit.cost) / 1.2455138894e-1 - 1)).toBeLessThan(1e-9);
    }
  });

  it('solves the Rosenbrock problem as least squares from (-1.2, 1) to (1, 1)', () => {
    // More, Garbow and Hillstrom, "Testing unconstrained optimization software", ACM TOMS 7(1),
    // 1981, problem 1 (FROM MEMORY): r = (10 (x2 - x1^2), 1 - x1), minimum 0 at (1, 1).
    const fit = levenbergMarquardt({
      residuals: (p) => Float64Array.of(10 * ((p[1] as number) - (p[0] as number) ** 2), 1 - (p[0] as number)),
      initial: [-1.2, 1],
    });
    expect(fit.converged).toBe(true);
    expect(fit.parameters[0]).toBeCloseTo(1, 10);
    expect(fit.parameters[1]).toBeCloseTo(1, 10);
    expect(fit.cost).toBeLessThan(1e-20);
  });

  it('rejects steps where the model is undefined and still converges', () => {
    // r = sqrt(p) - 2 is undefined for p < 0; the optimum p = 4 is reached from p = 0.01.
    const fit = levenbergMarquardt({ residuals: (p) => Float64Array.of(Math.sqrt(p[0] as number) - 2), initial: [0.01] });
    expect(fit.parameters[0]).toBeCloseTo(4, 10);
  });

  it('throws fit-bad-start when the residuals are not finite at the start', () => {
    const call = (): unknown => levenbergMarquardt({ residuals: (p) => Float64Array.of(Math.log(p[0] as number)), initial: [-1] });
    expect(call).toThrow(InputError);
    try {
      call();
    } catch (e) {
      expect((e as InputError).code).toBe('fit-bad-start');
    }
  });
});
