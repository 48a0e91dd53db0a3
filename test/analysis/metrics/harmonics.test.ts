import { describe, expect, it } from 'vitest';
import { harmonics, InputError } from '../../../src/index.js';
import { jitteredGrid, sample } from './grids.js';

// References:
// - Orthogonality of sin(k w t), cos(k w t) over whole periods (derived): a sum of sines with known
//   amplitudes and phases returns exactly those.
// - Triangle wave of peak 1: b_k = 8 / (pi^2 k^2) * (-1)^((k-1)/2) for odd k, zero for even k
//   (standard Fourier series; e.g. Kreyszig, Advanced Engineering Mathematics, ch. 11 examples; from memory).
//   Sampled at its corners the triangle IS the linear interpolant, so the analysis is exact to rounding.
// - Square wave of peak 1: b_k = 4 / (pi k) for odd k (same source, from memory).
// - Parseval's identity: (1/T) int x^2 = dc^2 + sum A_k^2 / 2 (derived).

const f = 50;
const T = 1 / f;
const w = 2 * Math.PI * f;

describe('harmonics', () => {
  it('recovers DC, amplitudes and phases of a synthetic signal on a jittered grid', () => {
    const x = (s: number) => -0.3 + 4 * Math.sin(w * s + 0.4) + 1.2 * Math.sin(3 * w * s - 2) + 0.5 * Math.sin(7 * w * s + 3);
    const t = jitteredGrid(0.01, 0.01 + 3 * T, 6000);
    const h = harmonics(t, sample(t, x), { fundamental: f, count: 9 });
    expect(h.from).toBeCloseTo(0.01, 12);
    expect(h.to).toBeCloseTo(0.01 + 3 * T, 12);
    expect(h.dc).toBeCloseTo(-0.3, 4);
    expect(h.amplitude[1]).toBeCloseTo(4, 3);
    expect(h.phase[1]).toBeCloseTo(0.4, 3);
    expect(h.amplitude[3]).toBeCloseTo(1.2, 3);
    expect(h.phase[3]).toBeCloseTo(-2, 3);
    expect(h.amplitude[7]).toBeCloseTo(0.5, 3);
    expect(h.phase[7]).toBeCloseTo(3, 2);
    for (const k of [2, 4, 5, 6, 8, 9]) expect(h.amplitude[k]).toBeLessThan(2e-3);
    expect(h.thd).toBeCloseTo(Math.hypot(1.2, 0.5) / 4, 3);
    expect(h.phase[0]).toBe(Math.PI);
  });

  it('is exact to rounding for a triangle wave sampled at its corners (a linear interpolant)', () => {
    // Triangle of peak 1, rising through 0 at t = 0: corners at T/4 (1), 3T/4 (-1).
    const t = Float64Array.of(0, T / 4, (3 * T) / 4, T, (5 * T) / 4, (7 * T) / 4, 2 * T);
    const x = Float64Array.of(0, 1, -1, 0, 1, -1, 0);
    const h = harmonics(t, x, { fundamental: f, count: 41 });
    for (let k = 1; k <= 41; k++) {
      const expected = k % 2 === 1 ? 8 / (Math.PI * Math.PI * k * k) : 0;
      expect(Math.abs(h.amplitude[k]! - expected)).toBeLessThan(1e-13);
      if (k % 2 === 1) expect(h.phase[k]).toBeCloseTo(((k - 1) / 2) % 2 === 0 ? 0 : Math.PI, 10);
    }
    // Parseval: mean square 1/3; the orders up to 41 hold all but sum_{k>41 odd} (8/(pi^2 k^2))^2 / 2.
    expect(h.totalRms ** 2).toBeCloseTo(1 / 3, 14);
    let tail = 0;
    for (let k = 43; k < 200001; k += 2) tail += (8 / (Math.PI * Math.PI * k * k)) ** 2 / 2;
    expect(h.residualRms ** 2).toBeCloseTo(tail, 12);
  });

  it('Parseval: sum of harmonic powers plus the residual is the mean square, for a square wave', () => {
    // Square wave sampled finely (edges 1 ns wide): odd harmonics 4 / (pi k), mean square 1.
    const t: number[] = [];
    const x: number[] = [];
    const edge = 1e-9;
    for (let c = 0; c < 2; c++) {
      t.push(c * T, c * T + T / 2 - edge, c * T + T / 2);
      x.push(1, 1, -1);
      t.push(c * T + T - edge);
      x.push(-1);
    }
    t.push(2 * T);
    x.push(1);
    const h = harmonics(Float64Array.from(t), Float64Array.from(x), { fundamental: f, count: 31 });
    for (const k of [1, 3, 5, 11, 31]) expect(h.amplitude[k]).toBeCloseTo(4 / (Math.PI * k), 5);
    let sum = h.dc ** 2;
    for (let k = 1; k <= 31; k++) sum += h.rms[k]! ** 2;
    expect(sum + h.residualRms ** 2).toBeCloseTo(h.totalRms ** 2, 12);
    expect(h.totalRms).toBeCloseTo(1, 6);
    // The square wave's THD (orders to infinity) is sqrt(pi^2/8 - 1) = 0.483; up to 31 a little less.
    expect(h.thd).toBeGreaterThan(0.45);
    expect(h.thd).toBeLessThan(Math.sqrt((Math.PI * Math.PI) / 8 - 1));
  });

  it('uses the dense output when given (a coarse grid, exact evaluator)', () => {
    const x = (s: number) => 2 * Math.sin(w * s) + 0.7 * Math.sin(5 * w * s + 1);
    const t = jitteredGrid(0, T, 40);
    const h = harmonics(t, sample(t, x), { fundamental: f, count: 6, at: x, pointsPerInterval: 5 });
    expect(h.amplitude[1]).toBeCloseTo(2, 8);
    expect(h.amplitude[5]).toBeCloseTo(0.7, 8);
    expect(h.phase[5]).toBeCloseTo(1, 8);
    expect(h.residualRms).toBeLessThan(1e-6);
  });

  it('takes the last whole cycles by default and a given number of cycles from a start', () => {
    const t = Float64Array.from({ length: 5001 }, (_, i) => i * 1e-5); // 2.5 cycles
    const x = t.map((s) => Math.sin(w * s) + (s < 0.01 ? 5 : 0));
    const h = harmonics(t, x, { fundamental: f, count: 3 });
    expect(h.from).toBeCloseTo(0.01, 12);
    expect(h.to).toBeCloseTo(0.05, 12);
    expect(h.dc).toBeCloseTo(0, 6);
    const one = harmonics(t, x, { fundamental: f, from: 0.03, cycles: 1, count: 3 });
    expect(one.to).toBeCloseTo(0.05, 12);
  });

  it('refuses a window that does not fit, a bad fundamental or count', () => {
    const t = Float64Array.from({ length: 101 }, (_, i) => i * 1e-4); // 10 ms
    const x = t.map((s) => Math.sin(w * s));
    expect(() => harmonics(t, x, { fundamental: f })).toThrow(InputError);
    expect(() => harmonics(t, x, { fundamental: f })).toThrow(/bad-window|do not fit/);
    expect(() => harmonics(t, x, { fundamental: -1 })).toThrow(/fundamental/);
    expect(() => harmonics(t, x, { fundamental: 100, count: 0 })).toThrow(/count/);
    try {
      harmonics(t, x, { fundamental: f, name: 'primary' });
    } catch (e) {
      expect((e as InputError).code).toBe('bad-window');
      expect((e as InputError).message).toMatch(/^primary:/);
    }
  });
});
