import { describe, expect, it } from 'vitest';
import { fluxDensityMargin, fluxDensityMargins, InputError } from '../../../src/index.js';
import { jitteredGrid, sample } from './grids.js';

describe('fluxDensityMargin', () => {
  const f = 50;
  const w = 2 * Math.PI * f;
  const t = jitteredGrid(0, 2 / f, 400);

  it('gives peak |B| with its time, margin = B_sat - peak and ratio = peak / B_sat', () => {
    const bOf = (s: number): number => 0.2 - 1.45 * Math.sin(w * s); // largest |B|: 1.65 T at wt = 3 pi/2 (derived)
    const m = fluxDensityMargin(t, sample(t, bOf), { saturation: 1.9, name: 'leg A', at: bOf });
    expect(m.name).toBe('leg A');
    expect(m.peak).toBeCloseTo(1.65, 12);
    const phase = (m.time * f) % 1; // either period's crest
    expect(Math.abs(phase - 0.75)).toBeLessThan(1e-6);
    expect(m.margin).toBeCloseTo(0.25, 12);
    expect(m.ratio).toBeCloseTo(1.65 / 1.9, 12);
  });

  it('for many tubes sorts worst first, a saturated tube with a negative margin on top', () => {
    const list = fluxDensityMargins(t, [
      { name: 'yoke', b: sample(t, (s) => 1.0 * Math.sin(w * s)), saturation: 1.9 },
      { name: 'leg', b: sample(t, (s) => 2.1 * Math.sin(w * s)), saturation: 1.9 },
      { name: 'gap side', b: sample(t, (s) => 0.4 * Math.sin(w * s)), saturation: 0.45 },
    ]);
    expect(list.map((m) => m.name)).toEqual(['leg', 'gap side', 'yoke']);
    expect(list[0]?.margin).toBeLessThan(0);
  });

  it('rejects a non-positive saturation flux density', () => {
    expect(() => fluxDensityMargin(t, sample(t, Math.sin), { saturation: 0, name: 'leg' })).toThrow(InputError);
  });
});
