import { describe, expect, it } from 'vitest';
import { linearMaterial, MU0, InputError } from '../../src/index.js';

describe('linearMaterial', () => {
  it('gives H = B/(mu0 mu_r), its slope and energy density B^2/(2 mu0 mu_r)', () => {
    // Definition of a linear magnetic material (any electromagnetics textbook, e.g.
    // Fitzgerald, Kingsley and Umans, Electric Machinery, ch. 1): B = mu0 mu_r H.
    const law = linearMaterial({ kind: 'linear', relativePermeability: 2000 });
    const mu = MU0 * 2000;
    expect(law.fieldStrength(1.5)).toBeCloseTo(1.5 / mu, 9);
    expect(law.fieldSlope(-3)).toBeCloseTo(1 / mu, 9);
    expect(law.energyDensity(1.5)).toBeCloseTo((1.5 * 1.5) / (2 * mu), 9);
  });

  it('rejects a non-positive permeability, naming the material', () => {
    expect(() => linearMaterial({ kind: 'linear', relativePermeability: 0, name: 'bad core' })).toThrow(InputError);
    expect(() => linearMaterial({ kind: 'linear', relativePermeability: -1, name: 'bad core' })).toThrow(/bad core/);
  });
});
