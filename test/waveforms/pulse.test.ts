import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileWaveform, InputError, pulse, pulseWaveform } from '../../src/index.js';
import { piecewiseLinearIntegral } from './piecewise-integral.js';

// Expected values below are DERIVED from the timing definition documented on
// PulseSpec (rising edge at delay + kT, falling edge duty*T later).

describe('pulseWaveform', () => {
  const spec = pulse({ low: -2, high: 10, period: 1e-3, duty: 0.25, delay: 2e-4 });
  const w = pulseWaveform(spec, 'Vg');

  it('is low before the delay, high from each rising edge for duty*period, low after', () => {
    expect(w.value(0)).toBe(-2);
    expect(w.value(1.999e-4)).toBe(-2);
    expect(w.value(2e-4)).toBe(10); // right-continuous: the value after the edge
    expect(w.value(4e-4)).toBe(10);
    expect(w.value(4.5e-4)).toBe(-2); // falling edge at 2e-4 + 0.25e-3
    expect(w.value(1.1e-3)).toBe(-2);
    expect(w.value(2e-4 + 1e-3)).toBe(10); // delay + 1*T, as the edge formula computes it
    expect(w.value(1.3e-3)).toBe(10);
  });

  it('breakpoints lists every edge in [t0, t1], computed from the period index', () => {
    expect(w.breakpoints(0, 2.3e-3)).toEqual([2e-4, 2e-4 + 2.5e-4, 2e-4 + 1e-3, 2e-4 + 2.5e-4 + 1e-3, 2e-4 + 2e-3]);
    expect(w.breakpoints(5e-4, 1.1e-3)).toEqual([]);
    expect(w.breakpoints(1, 0)).toEqual([]);
  });

  it('stays exact after millions of periods: edges at delay + k*T + offset, value switching exactly there', () => {
    const k = 7_654_321;
    const rise = 2e-4 + k * 1e-3; // the documented edge formula
    const fall = 2e-4 + 2.5e-4 + k * 1e-3;
    const bps = w.breakpoints(rise - 1e-4, fall + 1e-4);
    expect(bps).toEqual([rise, fall]);
    expect(w.value(rise)).toBe(10);
    expect(w.value(fall)).toBe(-2);
    // one ulp before each edge the previous level holds
    expect(w.value(rise - rise * Number.EPSILON)).toBe(-2);
    expect(w.value(fall - fall * Number.EPSILON)).toBe(10);
  });

  it('matches the definition at random times over a billion periods (dyadic timing, so the reference is exact)', () => {
    // T = 2^-10 s, delay = 3 * 2^-12 s, duty 1/4: every edge d + k T + duty T is exactly representable
    // for k < 2^30, so the reference below (which compares the phase u directly) is exact.
    const T = 2 ** -10;
    const d = 3 * 2 ** -12;
    const p = pulseWaveform(pulse({ low: 0, high: 1, period: T, duty: 0.25, delay: d }), 'V');
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 30 }), fc.integer({ min: 0, max: 2 ** 12 - 1 }), (k, m) => {
        const u = m * 2 ** -22; // phase in [0, T), exact
        const t = d + k * T + u;
        expect(p.value(t)).toBe(u < 0.25 * T ? 1 : 0);
      }),
    );
  });

  it('has mean low + duty*(high - low) over a period (derived)', () => {
    for (const duty of [0, 0.1, 0.5, 0.73, 1]) {
      const p = pulseWaveform(pulse({ low: 1, high: 5, period: 2e-5, duty, delay: 3e-6 }), 'V');
      const t0 = 3e-6 + 17 * 2e-5;
      const mean = piecewiseLinearIntegral(p, t0, t0 + 2e-5) / 2e-5;
      expect(mean).toBeCloseTo(1 + duty * 4, 10);
    }
  });

  it('ramps linearly on finite edges and keeps the mean low + (high - low)(duty + (fall - rise)/(2T)) (derived)', () => {
    const T = 1e-3;
    const p = pulseWaveform(pulse({ low: 0, high: 8, period: T, duty: 0.4, rise: 1e-4, fall: 2e-4 }), 'V');
    expect(p.value(5e-5)).toBeCloseTo(4, 12); // half-way up the rise
    expect(p.value(4e-4 + 5e-5)).toBeCloseTo(6, 12); // a quarter down the fall
    expect(p.breakpoints(0, T)).toEqual([0, 1e-4, 0.4 * T, 0.4 * T + 2e-4, T]); // delay + {0, rise, duty*T, duty*T + fall, T}
    const mean = piecewiseLinearIntegral(p, 3 * T, 4 * T) / T;
    expect(mean).toBeCloseTo(8 * (0.4 + (2e-4 - 1e-4) / (2 * T)), 10);
  });

  it('is plain data: the JSON round trip compiles to the same waveform', () => {
    const again = compileWaveform(JSON.parse(JSON.stringify(spec)), 'Vg');
    for (const t of [0, 2e-4, 3e-4, 7e-4, 1.25e-3]) expect(again.value(t)).toBe(w.value(t));
  });

  it.each([
    [{ high: 1, period: 0, duty: 0.5 }, /period 0 s must be > 0/],
    [{ high: 1, period: 1, duty: 1.2 }, /duty 1.2 is outside \[0, 1\]/],
    [{ high: Number.NaN, period: 1, duty: 0.5 }, /high level NaN is not a finite number/],
    [{ high: 1, period: 1, duty: 0.2, rise: 0.3 }, /rise time 0.3 s is longer than duty\*period/],
    [{ high: 1, period: 1, duty: 0.9, fall: 0.2 }, /fall time 0.2 s does not fit/],
    [{ high: 1, period: 1, duty: 0.5, rise: -1e-9 }, /rise time .* is negative/],
  ])('rejects %o with a bad-waveform InputError naming the source', (params, message) => {
    try {
      pulseWaveform(pulse(params), 'gate');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      const err = e as InputError;
      expect(err.code).toBe('bad-waveform');
      expect(err.elements).toEqual(['gate']);
      expect(err.message).toMatch(/^gate: /);
      expect(err.message).toMatch(message);
    }
  });
});
