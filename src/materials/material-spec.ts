import { InputError } from '../errors.js';
import type { MaterialLaw } from './material-law.js';
import { linearMaterial, type LinearMaterialSpec } from './linear.js';
import { frohlichKennellyMaterial, type FrohlichKennellySpec } from './frohlich-kennelly.js';
import { brauerMaterial, type BrauerSpec } from './brauer.js';
import { bhTableMaterial, type BhTableSpec } from './bh-table.js';
import { checkMaterialLaw } from './check-material-law.js';

/**
 * Plain-data (JSON-serialisable) description of a material. The builder
 * stores specs so that a network can be saved, sent to a worker and rebuilt.
 *
 * - `linear`: H = B / (mu0 mu_r).
 * - `frohlich-kennelly`: saturating rational law with the air line.
 * - `brauer`: exponential reluctivity, continued on the air line.
 * - `table`: measured B-H points, monotone cubic interpolation.
 *
 * @example
 * ```ts
 * const spec: MaterialSpec = { kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: 0.48 };
 * const json = JSON.stringify(spec); // specs are plain data
 * ```
 */
export type MaterialSpec = LinearMaterialSpec | FrohlichKennellySpec | BrauerSpec | BhTableSpec;

/**
 * Turn a material spec into an executable law; a live {@link MaterialLaw}
 * object is checked against its contract ({@link checkMaterialLaw}: finite
 * values, positive slope, `fieldSlope` and `energyDensity` consistent with
 * `fieldStrength`) and passed through unchanged.
 *
 * @example
 * ```ts
 * const law = compileMaterial({ kind: 'linear', relativePermeability: 3000 });
 * const ferrite = compileMaterial(demoMaterials.ferrite);
 * ```
 */
export function compileMaterial(spec: MaterialSpec | MaterialLaw): MaterialLaw {
  if (spec === null || typeof spec !== 'object') {
    throw new InputError(
      'unknown-material-kind',
      `material ${String(spec)} is not a material; give a spec such as { kind: 'linear', relativePermeability: 2000 } or a MaterialLaw object`,
      [String(spec)],
    );
  }
  if ('fieldStrength' in spec && typeof spec.fieldStrength === 'function') {
    return checkMaterialLaw(spec as MaterialLaw);
  }
  const s = spec as MaterialSpec;
  switch (s.kind) {
    case 'linear':
      return linearMaterial(s);
    case 'frohlich-kennelly':
      return frohlichKennellyMaterial(s);
    case 'brauer':
      return brauerMaterial(s);
    case 'table':
      return bhTableMaterial(s);
    default: {
      const kind = String((s as { kind?: unknown }).kind);
      throw new InputError(
        'unknown-material-kind',
        `material kind "${kind}" is not known; use 'linear', 'frohlich-kennelly', 'brauer' or 'table'`,
        [kind],
      );
    }
  }
}
