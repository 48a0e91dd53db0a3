import { describe, expect, it } from 'vitest';
import { InputError, seriesIntegral } from '../../../src/index.js';
import { jitteredGrid, observedOrder, sample, stretchedGrid } from './grids.js';

// Closed forms are elementary calculus (derived):
//   integral_0^L exp(-t/tau) dt = tau (1 - exp(-L/tau)),  integral_0^1 t^7 dt = 1/8.

describe('seriesIntegral', () => {
  it('is exact for a linear signal, with the window ends interpolated between samples', () => {
    const t = jitteredGrid(0, 2, 37);
    const x = sample(t, (s) => 3 * s - 1);
    expect(seriesIntegral(t, x)).toBeCloseTo(1.5 * 2 ** 2 - 2, 12); // [1.5 s^2 - s]_0^2 = 4
    expect(seriesIntegral(t, x, { from: 0.3, to: 1.1 })).toBeCloseTo(1.5 * (1.1 ** 2 - 0.3 ** 2) - 0.8, 12);
  });

  it('converges at second order on a non-uniform grid (trapezoidal rule), to the exact exponential integral', () => {
    const tau = 0.3;
    const L = 1;
    const exact = tau * (1 - Math.exp(-L / tau));
    const err = (n: number): number => {
      const t = stretchedGrid(0, L, n);
      return seriesIntegral(t, sample(t, (s) => Math.exp(-s / tau))) - exact;
    };
    const e1 = err(200);
    const e2 = err(400);
    expect(Math.abs(e1 / exact)).toBeLessThan(1e-4);
    expect(observedOrder(e1, e2)).toBeGreaterThan(1.9);
    expect(observedOrder(e1, e2)).toBeLessThan(2.1);
  });

  it('with a dense evaluator integrates each interval by Gauss-Legendre: degree 7 exactly with the default 4 points', () => {
    const t = jitteredGrid(0, 1, 5);
    const f = (s: number): number => s ** 7;
    expect(seriesIntegral(t, sample(t, f), { at: f })).toBeCloseTo(1 / 8, 15);
    // two points are exact only to degree 3: a visible error on t^7 over 5 intervals
    expect(Math.abs(seriesIntegral(t, sample(t, f), { at: f, pointsPerInterval: 2 }) - 1 / 8)).toBeGreaterThan(1e-7);
    const tau = 0.3;
    const tt = stretchedGrid(0, 1, 50);
    const dense = seriesIntegral(tt, sample(tt, (s) => Math.exp(-s / tau)), { at: (s) => Math.exp(-s / tau) });
    expect(dense).toBeCloseTo(tau * (1 - Math.exp(-1 / tau)), 13);
  });

  it('skips zero-width intervals (a sample repeated at a breakpoint, left and right values)', () => {
    const t = Float64Array.of(0, 1, 1, 2);
    const x = Float64Array.of(5, 5, -5, -5);
    expect(seriesIntegral(t, x)).toBe(0);
    expect(seriesIntegral(t, x, { to: 1 })).toBe(5);
  });

  it('rejects mismatched lengths, decreasing or non-finite times, and windows outside the data, naming the series', () => {
    const cases: [() => unknown, string, RegExp][] = [
      [() => seriesIntegral([0, 1], [1], { name: 'iL' }), 'bad-series', /iL: 2 times but 1 values/],
      [() => seriesIntegral([0, 2, 1], [1, 1, 1], { name: 'iL' }), 'bad-series', /iL: time 1 s at sample 2 is before 2 s/],
      [() => seriesIntegral([0, 1], [1, Number.NaN], { name: 'iL' }), 'bad-series', /sample 1 .* is not finite/],
      [() => seriesIntegral([0, 1], [1, 1], { name: 'iL', to: 2 }), 'bad-window', /reaches outside the data/],
      [() => seriesIntegral([0, 1], [1, 1], { name: 'iL', from: 0.5, to: 0.5 }), 'bad-window', /empty/],
      [() => seriesIntegral([0, 1], [1, 1], { name: 'iL', at: () => 1, pointsPerInterval: 9 }), 'bad-option', /1 to 5/],
    ];
    for (const [call, code, message] of cases) {
      try {
        call();
        expect.unreachable();
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
        expect((e as InputError).code).toBe(code);
        expect((e as InputError).elements).toEqual(['iL']);
        expect((e as InputError).message).toMatch(message);
      }
    }
  });
});
