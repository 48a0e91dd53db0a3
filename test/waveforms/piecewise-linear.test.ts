import { describe, expect, it } from 'vitest';
import { InputError, piecewiseLinear, piecewiseLinearWaveform } from '../../src/index.js';
import { piecewiseLinearIntegral } from './piecewise-integral.js';

// Expected values are DERIVED from linear interpolation between the vertices.

describe('piecewiseLinearWaveform', () => {
  it('interpolates linearly between vertices and holds the end values outside the table', () => {
    const w = piecewiseLinearWaveform(piecewiseLinear({ times: [1, 2, 4, 5], values: [0, 10, -2, -2] }), 'I1');
    expect(w.value(0)).toBe(0);
    expect(w.value(1.5)).toBe(5);
    expect(w.value(3)).toBe(4);
    expect(w.value(3.5)).toBe(1);
    expect(w.value(4.5)).toBe(-2);
    expect(w.value(100)).toBe(-2);
    expect(w.breakpoints(0, 10)).toEqual([1, 2, 4, 5]);
    expect(w.breakpoints(1.5, 4)).toEqual([2, 4]);
  });

  it('repeats with a period equal to the span: a sawtooth with a jump at every period start', () => {
    const T = 50e-6;
    const w = piecewiseLinearWaveform(piecewiseLinear({ times: [0, T], values: [0, 5], period: T }), 'Isaw');
    expect(w.value(0.25 * T)).toBeCloseTo(1.25, 12);
    expect(w.value(3 * T + 0.5 * T)).toBeCloseTo(2.5, 9);
    expect(w.value(3 * T)).toBe(0);
    expect(w.breakpoints(0, 3 * T)).toEqual([0, T, 2 * T, 3 * T]);
    // mean of a 0..5 sawtooth is 2.5 (derived)
    expect(piecewiseLinearIntegral(w, 10 * T, 11 * T) / T).toBeCloseTo(2.5, 9);
  });

  it('repeats with a period longer than the span, holding the last value until the period ends', () => {
    const w = piecewiseLinearWaveform(piecewiseLinear({ times: [1, 2, 3], values: [0, 4, 2], period: 5 }), 'V');
    expect(w.value(2.5)).toBe(3);
    expect(w.value(5)).toBe(2); // held
    expect(w.value(6)).toBe(0); // next period starts at 1 + 5
    expect(w.value(6 + 5 * 1000 + 0.5)).toBe(2);
    expect(w.breakpoints(0, 11)).toEqual([1, 2, 3, 6, 7, 8, 11]);
    // area per period: 2 (0->4) + 3 (4->2) + 2*3 (hold) = 11 (derived)
    expect(piecewiseLinearIntegral(w, 1 + 5 * 40, 1 + 5 * 41)).toBeCloseTo(11, 9);
    // breakpoints deep into the run, computed from the period index
    expect(w.breakpoints(1 + 5 * 1e6, 3 + 5 * 1e6)).toEqual([1 + 5e6, 2 + 5e6, 3 + 5e6]);
  });

  it('copies the caller arrays: later edits do not change the spec', () => {
    const times = [0, 1];
    const values = [0, 1];
    const spec = piecewiseLinear({ times, values });
    times[1] = 0.5;
    values[1] = 7;
    expect(spec.times).toEqual([0, 1]);
    expect(piecewiseLinearWaveform(spec).value(1)).toBe(1);
  });

  it.each([
    [{ times: [], values: [] }, /table is empty/],
    [{ times: [0, 1], values: [0] }, /2 times but 1 values/],
    [{ times: [0, 2, 1], values: [0, 1, 2] }, /strictly increasing, but times\[2\] = 1 s follows 2 s/],
    [{ times: [0, 0], values: [0, 1] }, /strictly increasing/],
    [{ times: [0, 1], values: [0, Number.NaN] }, /value \[1\] NaN is not a finite number/],
    [{ times: [0, 1, 2], values: [0, 1, 0], period: 1.5 }, /period 1.5 s is shorter than the table's span 2 s/],
    [{ times: [0], values: [1], period: 0 }, /period 0 s must be > 0/],
  ])('rejects %o with a bad-waveform InputError naming the source', (params, message) => {
    try {
      piecewiseLinearWaveform(piecewiseLinear(params), 'Vtab');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).code).toBe('bad-waveform');
      expect((e as InputError).elements).toEqual(['Vtab']);
      expect((e as InputError).message).toMatch(message);
    }
  });
});
