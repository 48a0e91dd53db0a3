/**
 * Materials example: B-H points of the demo materials and a fitted law.
 *
 *     npx tsx examples/materials.ts
 *
 * The demo materials are invented (inside handbook ranges), not data of any
 * real product. Caution: a B-H curve is an engineering estimate; saturation
 * margins taken from it do not replace measured data, the manufacturer's
 * limits, or the codes and licensed practice that govern a design.
 */
import { MU0, compileMaterial, demoMaterials, fitMaterial, type MaterialSpec } from '../src/index.js';

function table(spec: MaterialSpec, fluxDensities: readonly number[]): void {
  const law = compileMaterial(spec);
  console.log(`\n${law.name} (saturation flux density ${law.saturationFluxDensity ?? '-'} T)`);
  console.log('   B [T]      H [A/m]     mu_r secant   mu_r differential   w [J/m^3]');
  for (const b of fluxDensities) {
    const h = law.fieldStrength(b);
    const row = [
      b.toFixed(3).padStart(7),
      h.toPrecision(5).padStart(12),
      (b / (MU0 * h)).toPrecision(4).padStart(14),
      (1 / (MU0 * law.fieldSlope(b))).toPrecision(4).padStart(19),
      law.energyDensity(b).toPrecision(4).padStart(11),
    ];
    console.log(row.join(' '));
  }
}

table(demoMaterials.ferrite, [0.05, 0.1, 0.2, 0.3, 0.4, 0.45, 0.5]);
table(demoMaterials.grainOrientedSteel, [0.5, 1.0, 1.5, 1.7, 1.8, 1.9, 2.0, 2.1]);
table(demoMaterials.amorphous, [0.2, 0.8, 1.2, 1.4, 1.5, 1.55, 1.6, 1.7]);

// Fit both analytic laws to the amorphous demo table (relative least squares in H).
for (const model of ['frohlich-kennelly', 'brauer'] as const) {
  const fit = fitMaterial(demoMaterials.amorphous, { model });
  const e = fit.error;
  console.log(`\nfit of the ${model} law to "${demoMaterials.amorphous.name}" (${fit.status}, ${fit.iterations} iterations)`);
  console.log('  spec:', JSON.stringify(fit.spec));
  console.log(
    `  error in H at the table's B: rms ${e.rmsAbsolute.toPrecision(3)} A/m, max ${e.maxAbsolute.toPrecision(3)} A/m; ` +
      `relative rms ${(100 * e.rmsRelative).toPrecision(3)} %, max ${(100 * e.maxRelative).toPrecision(3)} %`,
  );
}
