import { describe, expect, it } from 'vitest';
import { coreLoss, igseCoefficient, igseLossDensity, InputError, steinmetzLossDensity } from '../../../src/index.js';

// Source: K. Venkatachalam, C. R. Sullivan, T. Abdallah, H. Tacca, "Accurate prediction of ferrite core
// loss with nonsinusoidal waveforms using only Steinmetz parameters", IEEE COMPEL Workshop 2002, pp. 36-41
// (iGSE definition and k_i). The numbers below are DERIVED from those formulas (REFERENCES.md section 4)
// and were recomputed independently with mpmath (40 digits, including the |cos|^alpha integral by
// quadrature) before use.

const sineSeries = (f: number, bPeak: number, n: number, phase = 0.3): { t: Float64Array; b: Float64Array } => {
  const t = Float64Array.from({ length: n + 1 }, (_, i) => i / (n * f));
  return { t, b: t.map((s) => bPeak * Math.sin(2 * Math.PI * f * s + phase)) };
};

/** Triangle of duty D: B rises from -dB/2 to +dB/2 in D T, falls back in (1 - D) T; sampled at its corners only. */
const triangleCorners = (f: number, dB: number, D: number): { t: Float64Array; b: Float64Array } => ({
  t: Float64Array.of(0, D / f, 1 / f),
  b: Float64Array.of(-dB / 2, dB / 2, -dB / 2),
});

describe('igseCoefficient', () => {
  it.each([
    [1.5, 2.5, 0.0570557099],
    [1.2, 2.8, 0.0605163108],
    [1.0, 2.0, 0.125],
  ])('gives k_i / k for alpha %f, beta %f = %f (derived)', (alpha, beta, ratio) => {
    expect(igseCoefficient({ k: 1, alpha, beta })).toBeCloseTo(ratio, 10);
    expect(igseCoefficient({ k: 3.7, alpha, beta }) / 3.7).toBeCloseTo(ratio, 10);
  });

  it('rejects non-positive or non-finite coefficients, naming the core', () => {
    expect(() => igseCoefficient({ k: 0, alpha: 1.5, beta: 2.5 }, 'ferrite leg')).toThrow(/ferrite leg: Steinmetz k = 0 must be a positive/);
    expect(() => igseCoefficient({ k: 1, alpha: Number.NaN, beta: 2.5 })).toThrow(InputError);
  });
});

describe('igseLossDensity', () => {
  it.each([
    [1.5, 2.5],
    [1.2, 2.8],
    [1.0, 2.0],
    [2.0, 2.6],
  ])('equals the Steinmetz loss for a sinusoid (identity) within 1e-6 relative: alpha %f, beta %f', (alpha, beta) => {
    const c = { k: 2.3, alpha, beta };
    const { t, b } = sineSeries(25e3, 0.12, 4000);
    const ref = steinmetzLossDensity(c, 25e3, 0.12);
    expect(Math.abs(igseLossDensity(c, t, b) / ref - 1)).toBeLessThan(1e-6);
  });

  it('converges to the Steinmetz value at second order in the sampling of a sine', () => {
    const c = { k: 1, alpha: 1.5, beta: 2.5 };
    const ref = steinmetzLossDensity(c, 1e3, 1);
    const e = (n: number, phase: number): number => {
      const { t, b } = sineSeries(1e3, 1, n, phase);
      return igseLossDensity(c, t, b) / ref - 1;
    };
    // crests on samples (phase 0, n a multiple of 4): a clean second-order error
    const order = Math.log2(Math.abs(e(200, 0) / e(400, 0)));
    expect(order).toBeGreaterThan(1.9);
    expect(order).toBeLessThan(2.1);
    // crests between samples also shrink dB_pp by O(h^2), irregularly: check the bound |e| <= C / n^2
    for (const n of [50, 100, 200, 400, 800, 1600]) for (const phase of [0.3, 1]) expect(Math.abs(e(n, phase)) * n * n).toBeLessThan(10);
  });

  it.each([0.5, 0.2, 0.85])('gives k_i dB^beta f^alpha (D^(1-alpha) + (1-D)^(1-alpha)) for a triangle of duty %f (derived), exactly from its corners', (D) => {
    const c = { k: 1.7, alpha: 1.35, beta: 2.65 };
    const f = 50e3;
    const dB = 0.18;
    const { t, b } = triangleCorners(f, dB, D);
    const expected = igseCoefficient(c) * dB ** c.beta * f ** c.alpha * (D ** (1 - c.alpha) + (1 - D) ** (1 - c.alpha));
    expect(igseLossDensity(c, t, b) / expected).toBeCloseTo(1, 13);
  });

  it.each([
    [1.5, 2.5, 0.91289136],
    [1.2, 2.8, 0.96826097],
    [2.0, 2.0, 8 / Math.PI ** 2],
    [2.0, 2.7, 8 / Math.PI ** 2],
  ])('gives triangle (D = 0.5) over sine at equal peak = %f, %f: %f (derived)', (alpha, beta, ratio) => {
    const c = { k: 1, alpha, beta };
    const f = 10e3;
    const tri = triangleCorners(f, 2 * 0.1, 0.5);
    expect(igseLossDensity(c, tri.t, tri.b) / steinmetzLossDensity(c, f, 0.1)).toBeCloseTo(ratio, 8);
  });

  it('takes one period out of a longer series, and is independent of the DC level and of the window start', () => {
    const c = { k: 1, alpha: 1.5, beta: 2.5 };
    const f = 1e3;
    const n = 2000;
    const t = Float64Array.from({ length: 3 * n + 1 }, (_, i) => i / (n * f));
    const b = t.map((s) => 0.4 + 0.1 * Math.sin(2 * Math.PI * f * s));
    const p1 = igseLossDensity(c, t, b, { period: 1 / f, start: 0.37 / f });
    const p2 = igseLossDensity(c, t, b, { period: 1 / f, start: 1.9 / f });
    const ref = steinmetzLossDensity(c, f, 0.1);
    expect(p1 / ref).toBeCloseTo(1, 5);
    expect(p2 / ref).toBeCloseTo(1, 5);
    expect(() => igseLossDensity(c, t, b, { period: 1 / f, start: 2.5 / f, name: 'leg' })).toThrow(/leg: the period .* is not inside the data/);
  });
});

describe('coreLoss', () => {
  it('gives loss density, loss = density * volume per tube, and the total; the Steinmetz method agrees for sine flux', () => {
    const c = { k: 1.5, alpha: 1.4, beta: 2.6 };
    const f = 100e3;
    const n = 4000;
    const t = Float64Array.from({ length: n + 1 }, (_, i) => i / (n * f));
    const bLeg = t.map((s) => 0.1 * Math.sin(2 * Math.PI * f * s));
    const bYoke = t.map((s) => 0.05 * Math.sin(2 * Math.PI * f * s));
    const tubes = [
      { name: 'leg', b: bLeg, volume: 12e-6 },
      { name: 'yoke', b: bYoke, volume: 8e-6, coefficients: { ...c, k: 3 } },
    ];
    const igse = coreLoss(t, tubes, { period: 1 / f, coefficients: c });
    const stein = coreLoss(t, tubes, { period: 1 / f, coefficients: c, method: 'steinmetz' });
    const legRef = steinmetzLossDensity(c, f, 0.1);
    const yokeRef = steinmetzLossDensity({ ...c, k: 3 }, f, 0.05);
    expect((igse.tubes[0]?.lossDensity ?? Number.NaN) / legRef).toBeCloseTo(1, 6);
    expect((igse.tubes[0]?.loss ?? Number.NaN) / (legRef * 12e-6)).toBeCloseTo(1, 6);
    expect((igse.tubes[1]?.loss ?? Number.NaN) / (yokeRef * 8e-6)).toBeCloseTo(1, 6);
    expect(igse.tubes[0]?.peakToPeak).toBeCloseTo(0.2, 6);
    expect(igse.total).toBeCloseTo((igse.tubes[0]?.loss ?? 0) + (igse.tubes[1]?.loss ?? 0), 15);
    expect(stein.total / igse.total).toBeCloseTo(1, 6);
  });

  it('rejects a tube without coefficients or with a bad volume, naming it', () => {
    const t = Float64Array.of(0, 0.5, 1);
    const b = Float64Array.of(0, 1, 0);
    expect(() => coreLoss(t, [{ name: 'leg', b, volume: 1 }], { period: 1 })).toThrow(/leg: no Steinmetz coefficients/);
    expect(() => coreLoss(t, [{ name: 'leg', b, volume: 0 }], { period: 1, coefficients: { k: 1, alpha: 1.5, beta: 2.5 } })).toThrow(
      /leg: volume 0 m\^3/,
    );
  });
});
