import { describe, expect, it } from 'vitest';
import { bipolarSquare, bipolarSquareOnTimes, bipolarSquareWaveform, InputError } from '../../src/index.js';
import { piecewiseLinearIntegral } from './piecewise-integral.js';

// Expected values are DERIVED from the timing documented on BipolarSquareSpec:
// +A on [d + kT, d + kT + t_pos), 0, -A on [d + kT + T/2, d + kT + T/2 + t_neg), 0,
// t_pos = T/2 - deadTime + mismatch/2, t_neg = T/2 - deadTime - mismatch/2.

describe('bipolarSquareWaveform', () => {
  const A = 48;
  const T = 10e-6;
  const dead = 0.3e-6;
  const mismatch = 0.1e-6;
  const d = 1e-6;
  const spec = bipolarSquare({ amplitude: A, period: T, deadTime: dead, mismatch, delay: d });
  const w = bipolarSquareWaveform(spec, 'bridge');
  const { positive: tPos, negative: tNeg } = bipolarSquareOnTimes(spec);

  it('bipolarSquareOnTimes gives T/2 - deadTime +- mismatch/2', () => {
    expect(tPos).toBeCloseTo(T / 2 - dead + mismatch / 2, 20);
    expect(tNeg).toBeCloseTo(T / 2 - dead - mismatch / 2, 20);
  });

  it('is 0 before the delay, +A, 0 (dead time), -A, 0 within each period', () => {
    expect(w.value(0.5e-6)).toBe(0);
    expect(w.value(d)).toBe(A);
    expect(w.value(d + 0.5 * tPos)).toBe(A);
    expect(w.value(d + tPos + 0.5 * (T / 2 - tPos))).toBe(0);
    expect(w.value(d + T / 2)).toBe(-A);
    expect(w.value(d + T / 2 + 0.5 * tNeg)).toBe(-A);
    expect(w.value(d + T / 2 + tNeg + 0.5 * (T / 2 - tNeg))).toBe(0);
    expect(w.value(d + 3 * T + 0.5 * tPos)).toBe(A);
  });

  it('breakpoints are the four switching instants of every period', () => {
    expect(w.breakpoints(0, d + T)).toEqual([d, d + tPos, d + T / 2, d + T / 2 + tNeg, d + T]);
    const k = 2_000_000; // far into a long run
    const base = d + k * T;
    expect(w.breakpoints(base - 1e-9, base + T / 2 + 1e-9)).toEqual([base, d + tPos + k * T, d + T / 2 + k * T]);
    expect(w.value(base)).toBe(A);
    expect(w.value(d + T / 2 + k * T)).toBe(-A);
  });

  it('without dead time switches straight from +A to -A at T/2', () => {
    const sq = bipolarSquareWaveform(bipolarSquare({ amplitude: 1, period: 2 }), 'V');
    expect(sq.breakpoints(0, 4)).toEqual([0, 1, 2, 3, 4]);
    expect(sq.value(0.999)).toBe(1);
    expect(sq.value(1)).toBe(-1);
    expect(sq.value(2)).toBe(1);
  });

  it('has volt-seconds A*t_pos and -A*t_neg per half-cycle and mean A*(t_pos - t_neg)/T (derived)', () => {
    for (const k of [0, 5, 123_456]) {
      const s = d + k * T;
      expect(piecewiseLinearIntegral(w, s, s + T / 2)).toBeCloseTo(A * tPos, 14);
      expect(piecewiseLinearIntegral(w, s + T / 2, s + T)).toBeCloseTo(-A * tNeg, 14);
      expect(piecewiseLinearIntegral(w, s, s + T) / T).toBeCloseTo((A * (tPos - tNeg)) / T, 6);
    }
    expect((A * (tPos - tNeg)) / T).toBeCloseTo((A * mismatch) / T, 9);
  });

  it('allows a mismatch of up to twice the dead time (one half then has no dead time)', () => {
    const sq = bipolarSquareWaveform(bipolarSquare({ amplitude: 1, period: 1, deadTime: 0.05, mismatch: 0.1 }), 'V');
    expect(sq.value(0.49)).toBe(1);
    expect(sq.value(0.5)).toBe(-1);
    expect(sq.value(0.9)).toBe(0);
  });

  it.each([
    [{ amplitude: 1, period: -1 }, /period -1 s must be > 0/],
    [{ amplitude: 1, period: 1, deadTime: 0.5 }, /dead time 0.5 s is too long for the period 1 s/],
    [{ amplitude: 1, period: 1, deadTime: -0.1 }, /dead time -0.1 s is negative/],
    [{ amplitude: 1, period: 1, deadTime: 0.01, mismatch: 0.05 }, /needs a dead time of at least/],
    [{ amplitude: 1, period: 1, deadTime: 0.3, mismatch: 0.5 }, /leaves a negative on-time/],
    [{ amplitude: Infinity, period: 1 }, /amplitude Infinity is not a finite number/],
  ])('rejects %o with a bad-waveform InputError naming the source', (params, message) => {
    try {
      bipolarSquareWaveform(bipolarSquare(params), 'bridge');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).code).toBe('bad-waveform');
      expect((e as InputError).elements).toEqual(['bridge']);
      expect((e as InputError).message).toMatch(message);
    }
  });
});
