import { describe, expect, it } from 'vitest';
import { demoHystereticMaterials, hysteresisLoopFeatures, inverseJilesAtherton } from '../../../src/index.js';

// The demo data are invented; this keeps the table in their TSDoc true and checks the loops are
// usable in a network: H rises with b everywhere on the loop (positive incremental reluctance).
describe('demoHystereticMaterials', () => {
  const cases = [
    { spec: demoHystereticMaterials.steel, peak: 1.5, hp: 243.6, hc: 40.8, br: 0.904, area: 249.6 },
    { spec: demoHystereticMaterials.ferrite, peak: 0.3, hp: 78.3, hc: 11.6, br: 0.077, area: 13.6 },
  ];
  for (const c of cases) {
    it(`${c.spec.name}: loop features as documented, dH/db > 0 along the loop`, () => {
      const f = hysteresisLoopFeatures(inverseJilesAtherton(c.spec), c.peak, { stepsPerSegment: 2000 });
      expect(f.peakFieldStrength).toBeCloseTo(c.hp, 1);
      expect(f.coerciveField).toBeCloseTo(c.hc, 1);
      expect(f.remanence).toBeCloseTo(c.br, 3);
      expect(f.loopArea).toBeCloseTo(c.area, 1);
      const t = f.trace;
      for (let i = 1; i < t.fluxDensity.length; i++) {
        const db = t.fluxDensity[i]! - t.fluxDensity[i - 1]!;
        if (db !== 0) expect((t.fieldStrength[i]! - t.fieldStrength[i - 1]!) / db).toBeGreaterThan(0);
      }
    });
  }
});
