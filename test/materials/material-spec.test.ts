import { describe, expect, it } from 'vitest';
import { InputError, compileMaterial, demoMaterials, linearMaterial, type MaterialSpec } from '../../src/index.js';

describe('compileMaterial', () => {
  it('compiles every material kind, keeping the name and saturation flux density', () => {
    const specs: MaterialSpec[] = [
      { kind: 'linear', relativePermeability: 1000, name: 'lin' },
      demoMaterials.ferrite,
      demoMaterials.grainOrientedSteel,
      demoMaterials.amorphous,
    ];
    for (const spec of specs) {
      const law = compileMaterial(spec);
      expect(law.name).toBe(spec.name);
      expect(law.saturationFluxDensity).toBe(spec.saturationFluxDensity);
      expect(law.fieldStrength(0.1)).toBeGreaterThan(0);
    }
  });

  it('passes a live law through unchanged, and a table spec (which has a fieldStrength array) is compiled', () => {
    const live = linearMaterial({ kind: 'linear', relativePermeability: 10 });
    expect(compileMaterial(live)).toBe(live);
    expect(typeof compileMaterial(demoMaterials.amorphous).fieldStrength).toBe('function');
  });

  it('rejects an unknown kind with unknown-material-kind', () => {
    const call = (): unknown => compileMaterial({ kind: 'unobtainium' } as unknown as MaterialSpec);
    expect(call).toThrow(InputError);
    expect(call).toThrow(/unobtainium/);
  });
});
