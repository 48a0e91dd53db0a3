import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fritschCarlsonSlopes } from '../../src/materials/fritsch-carlson-slopes.js';

/** Cubic Hermite piece and its derivative on [x0, x1] (standard basis, test-side). */
function hermite(x0: number, x1: number, y0: number, y1: number, m0: number, m1: number, x: number): [number, number] {
  const h = x1 - x0;
  const t = (x - x0) / h;
  const h00 = 2 * t ** 3 - 3 * t ** 2 + 1;
  const h10 = t ** 3 - 2 * t ** 2 + t;
  const h01 = -2 * t ** 3 + 3 * t ** 2;
  const h11 = t ** 3 - t ** 2;
  const v = h00 * y0 + h10 * h * m0 + h01 * y1 + h11 * h * m1;
  const d = ((6 * t ** 2 - 6 * t) * y0 + (3 * t ** 2 - 4 * t + 1) * h * m0 + (-6 * t ** 2 + 6 * t) * y1 + (3 * t ** 2 - 2 * t) * h * m1) / h;
  return [v, d];
}

/** alpha_k^2 + beta_k^2 per interval (Fritsch and Carlson 1980 notation). */
function radii(x: readonly number[], y: readonly number[], m: Float64Array): number[] {
  const out: number[] = [];
  for (let k = 0; k + 1 < x.length; k++) {
    const d = ((y[k + 1] as number) - (y[k] as number)) / ((x[k + 1] as number) - (x[k] as number));
    out.push(((m[k] as number) / d) ** 2 + ((m[k + 1] as number) / d) ** 2);
  }
  return out;
}

/** Smallest derivative of the interpolant sampled on every piece, and whether it is monotone. */
function minDerivative(x: readonly number[], y: readonly number[], m: Float64Array): number {
  let min = Infinity;
  for (let k = 0; k + 1 < x.length; k++) {
    for (let j = 0; j <= 200; j++) {
      const xx = (x[k] as number) + (((x[k + 1] as number) - (x[k] as number)) * j) / 200;
      const [, d] = hermite(x[k] as number, x[k + 1] as number, y[k] as number, y[k + 1] as number, m[k] as number, m[k + 1] as number, xx);
      min = Math.min(min, d / Math.abs((y[x.length - 1] as number) - (y[0] as number)));
    }
  }
  return min;
}

describe('fritschCarlsonSlopes', () => {
  it('keeps every interval of the RPN 14 data set inside alpha^2 + beta^2 <= 9, with a monotone interpolant', () => {
    // "RPN 14" data used by Fritsch and Carlson, SIAM J. Numer. Anal. 17(2), 1980, as transcribed
    // in several public test suites (e.g. the GSL interpolation example, which attributes it to
    // Hyman, SIAM J. Sci. Stat. Comput. 4(4), 1983). Steep rise after a flat start: unlimited
    // cubics overshoot here.
    const x = [7.99, 8.09, 8.19, 8.7, 9.2, 10, 12, 15, 20];
    const y = [0, 2.76429e-5, 4.37498e-2, 0.169183, 0.469428, 0.94374, 0.998636, 0.999919, 0.999994];
    const m = fritschCarlsonSlopes(x, y);
    const r = radii(x, y, m);
    for (const v of r) expect(v).toBeLessThanOrEqual(9 * (1 + 1e-12));
    // The limiter did act on this data (some interval sits on the circle).
    expect(r.some((v) => Math.abs(v - 9) < 1e-9)).toBe(true);
    for (const v of m) expect(v).toBeGreaterThan(0);
    expect(minDerivative(x, y, m)).toBeGreaterThan(0);
  });

  it('reproduces the exact slopes of an increasing quadratic (the three-point formulas are exact for parabolas)', () => {
    // Derived: each three-point formula is the derivative of the interpolating parabola.
    const f = (t: number): number => 2 * t * t + 3 * t;
    const fp = (t: number): number => 4 * t + 3;
    const x = [0.5, 0.7, 1.1, 1.2, 1.9, 2.5];
    const m = fritschCarlsonSlopes(x, x.map(f));
    x.forEach((t, i) => expect(m[i]).toBeCloseTo(fp(t), 12));
  });

  it('gives strictly positive slopes and monotone pieces for any strictly increasing data (property test)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: 1e-3, max: 10, noNaN: true }), fc.double({ min: 1e-3, max: 1e4, noNaN: true })), {
          minLength: 2,
          maxLength: 30,
        }),
        (steps) => {
          const x = [0];
          const y = [0];
          for (const [dx, dy] of steps) {
            x.push((x[x.length - 1] as number) + dx);
            y.push((y[y.length - 1] as number) + dy);
          }
          const m = fritschCarlsonSlopes(x, y);
          for (const v of m) expect(v).toBeGreaterThan(0);
          for (const v of radii(x, y, m)) expect(v).toBeLessThanOrEqual(9 * (1 + 1e-12));
          expect(minDerivative(x, y, m)).toBeGreaterThan(0);
        },
      ),
      { numRuns: 300 },
    );
  });
});
