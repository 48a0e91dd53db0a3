import { describe, expect, it } from 'vitest';
import {
  MU0,
  InputError,
  bhTableMaterial,
  brauerMaterial,
  frohlichKennellyMaterial,
  type BhTableSpec,
  type MaterialLaw,
} from '../../src/index.js';
import { gaussLegendre5 } from '../helpers/quadrature.js';

const base: BhTableSpec = {
  kind: 'table',
  name: 'lab sample',
  fluxDensity: [0.4, 0.8, 1.2, 1.5, 1.6],
  fieldStrength: [30, 70, 160, 900, 3000],
};

function expectFault(patch: Partial<BhTableSpec>, code: string, ...fragments: RegExp[]): void {
  let caught: unknown;
  try {
    bhTableMaterial({ ...base, ...patch });
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(InputError);
  const err = caught as InputError;
  expect(err.code).toBe(code);
  expect(err.elements).toEqual(['lab sample']);
  expect(err.message).toMatch(/lab sample/);
  for (const f of fragments) expect(err.message).toMatch(f);
}

/** Max |H_table - H_law| over [0, bmax] divided by H_law(bmax), for n equally spaced points. */
function tableError(law: MaterialLaw, bmax: number, n: number): number {
  const bs = Array.from({ length: n }, (_, i) => (bmax * (i + 1)) / n);
  const table = bhTableMaterial({ kind: 'table', fluxDensity: bs, fieldStrength: bs.map((b) => law.fieldStrength(b)) });
  let worst = 0;
  for (let j = 1; j <= 20000; j++) {
    const b = (bmax * j) / 20000;
    worst = Math.max(worst, Math.abs(table.fieldStrength(b) - law.fieldStrength(b)));
  }
  return worst / law.fieldStrength(bmax);
}

describe('bhTableMaterial: validation', () => {
  it('rejects columns of different length and fewer than 3 rows', () => {
    expectFault({ fieldStrength: [30, 70, 160, 900] }, 'table-length-mismatch', /5 rows/, /4/);
    expectFault({ fluxDensity: [0.4, 0.8], fieldStrength: [30, 70] }, 'table-too-short', /2 rows/);
  });

  it('rejects a non-finite value, naming its row and value', () => {
    expectFault({ fluxDensity: [0.4, 0.8, Number.NaN, 1.5, 1.6] }, 'table-not-finite', /row 2/, /NaN/);
    expectFault({ fieldStrength: [30, 70, 160, Number.POSITIVE_INFINITY, 3000] }, 'table-not-finite', /row 3/, /Infinity/);
    expectFault({ fieldStrength: [30, 70, '160' as unknown as number, 900, 3000] }, 'table-not-finite', /row 2/);
  });

  it('rejects negative or zero values outside an exact origin row, naming row and value', () => {
    expectFault({ fluxDensity: [0.4, -0.8, 1.2, 1.5, 1.6] }, 'table-not-positive', /row 1/, /-0\.8/);
    expectFault({ fluxDensity: [0, 0.8, 1.2, 1.5, 1.6] }, 'table-not-positive', /row 0/, /\(0, 0\)/);
    expectFault({ fieldStrength: [0, 70, 160, 900, 3000] }, 'table-not-positive', /row 0/);
  });

  it('rejects B or H that do not increase strictly, naming the row and both values', () => {
    expectFault({ fluxDensity: [0.4, 0.8, 0.8, 1.5, 1.6] }, 'table-not-increasing', /row 2/, /B = 0\.8/);
    expectFault({ fieldStrength: [30, 70, 160, 150, 3000] }, 'table-not-increasing', /row 3/, /H = 150/, /160/);
  });

  it('does not mutate the input arrays', () => {
    const fluxDensity = [0.4, 0.8, 1.2];
    const fieldStrength = [30, 70, 160];
    bhTableMaterial({ kind: 'table', fluxDensity, fieldStrength });
    expect(fluxDensity).toEqual([0.4, 0.8, 1.2]);
    expect(fieldStrength).toEqual([30, 70, 160]);
  });
});

describe('bhTableMaterial: interpolation', () => {
  it('passes through every given point, adds the origin when missing and is odd', () => {
    const law = bhTableMaterial(base);
    expect(law.fieldStrength(0)).toBe(0);
    base.fluxDensity.forEach((b, i) => {
      expect(law.fieldStrength(b)).toBeCloseTo(base.fieldStrength[i] as number, 9);
      expect(law.fieldStrength(-b)).toBeCloseTo(-(base.fieldStrength[i] as number), 9);
    });
    const withOrigin = bhTableMaterial({ ...base, fluxDensity: [0, ...base.fluxDensity], fieldStrength: [0, ...base.fieldStrength] });
    for (const b of [0.1, 0.55, 1.3, 1.58, 2.5]) expect(withOrigin.fieldStrength(b)).toBe(law.fieldStrength(b));
  });

  it('meets the Fritsch-Carlson sufficient monotonicity condition alpha^2 + beta^2 <= 9 on every interval', () => {
    // Fritsch and Carlson, SIAM J. Numer. Anal. 17(2), 1980: with alpha = m_k/d_k and
    // beta = m_(k+1)/d_k (knot slopes over the secant slope), a cubic piece inside the disc of
    // radius 3 is monotone. Slopes read from the law itself at the knots.
    const law = bhTableMaterial(base);
    const b = [0, ...base.fluxDensity];
    const h = [0, ...base.fieldStrength];
    for (let k = 0; k + 1 < b.length; k++) {
      const d = ((h[k + 1] as number) - (h[k] as number)) / ((b[k + 1] as number) - (b[k] as number));
      const alpha = law.fieldSlope(b[k] as number) / d;
      const beta = law.fieldSlope(b[k + 1] as number) / d;
      expect(alpha).toBeGreaterThan(0);
      expect(beta).toBeGreaterThan(0);
      expect(alpha * alpha + beta * beta).toBeLessThanOrEqual(9 * (1 + 1e-12));
    }
  });

  it('converges to the analytic law it was sampled from at the O(h^3) rate of Fritsch-Carlson with three-point slopes', () => {
    // Theory (derived): cubic Hermite error O(h^4) plus h times the O(h^2) error of the
    // three-point slopes, so O(h^3) once the limiter is inactive (smooth strictly monotone data).
    // Observed order between successive doublings, n = 256 -> 512 -> 1024 points.
    const laws: [string, MaterialLaw, number][] = [
      ['Frohlich-Kennelly 5000 / 1.6 T', frohlichKennellyMaterial({ kind: 'frohlich-kennelly', initialRelativePermeability: 5000, saturationPolarisation: 1.6 }), 1.8],
      ['Brauer 8e-9 / 7 / 19', brauerMaterial({ kind: 'brauer', k1: 8e-9, k2: 7, k3: 19 }), 1.95],
      ['Frohlich-Kennelly 2800 / 0.47 T', frohlichKennellyMaterial({ kind: 'frohlich-kennelly', initialRelativePermeability: 2800, saturationPolarisation: 0.47 }), 0.45],
    ];
    for (const [, law, bmax] of laws) {
      const e = [256, 512, 1024].map((n) => tableError(law, bmax, n));
      const orders = [Math.log2((e[0] as number) / (e[1] as number)), Math.log2((e[1] as number) / (e[2] as number))];
      for (const p of orders) expect(p).toBeGreaterThan(2.8);
    }
  });

  it('integrates the cubic pieces exactly (5-point Gauss-Legendre per interval is exact for cubics)', () => {
    const law = bhTableMaterial(base);
    const b = [0, ...base.fluxDensity];
    let acc = 0;
    for (let k = 0; k + 1 < b.length; k++) {
      const lo = b[k] as number;
      const hi = b[k + 1] as number;
      const mid = 0.5 * (lo + hi);
      expect(law.energyDensity(mid) / (acc + gaussLegendre5(law.fieldStrength, lo, mid))).toBeCloseTo(1, 13);
      acc += gaussLegendre5(law.fieldStrength, lo, hi);
      expect(law.energyDensity(hi) / acc).toBeCloseTo(1, 13);
    }
  });
});

describe('bhTableMaterial: beyond the last point', () => {
  it('joins the tail with a continuous slope and the predicted limiting polarisation', () => {
    const law = bhTableMaterial(base);
    const bn = 1.6;
    const hn = 3000;
    const eps = 1e-10;
    const sn = law.fieldSlope(bn - eps);
    expect(law.fieldSlope(bn + eps) / sn).toBeCloseTo(1, 6);
    expect(law.fieldStrength(bn + eps)).toBeGreaterThan(law.fieldStrength(bn - eps));
    // Derived limit: J_inf = J_n + (1 - mu0 s_n) H_n / s_n.
    const jInf = bn - MU0 * hn + ((1 - MU0 * sn) * hn) / sn;
    const big = 1e6;
    expect(big - MU0 * law.fieldStrength(big)).toBeCloseTo(jInf, 6);
    expect(MU0 * law.fieldSlope(big)).toBeCloseTo(1, 9);
  });

  it('stays increasing towards the air line when the data already end steeper than 1/mu0', () => {
    // A last secant steeper than the air line (differential mu_r < 1, e.g. noisy data).
    const law = bhTableMaterial({ kind: 'table', fluxDensity: [0.5, 1.0, 1.01], fieldStrength: [100, 300, 20300] });
    expect(MU0 * law.fieldSlope(1.01)).toBeGreaterThan(1);
    let prev = law.fieldSlope(1.01);
    for (const d of [1e-3, 1e-2, 0.1, 1, 10]) {
      const s = law.fieldSlope(1.01 + d);
      expect(s).toBeLessThan(prev);
      expect(s).toBeGreaterThan(1 / MU0);
      prev = s;
    }
  });
});
