import type { MaterialLaw } from './material-law.js';
import { linearMaterial, type LinearMaterialSpec } from './linear.js';

/**
 * Plain-data (JSON-serialisable) description of a material. The builder
 * stores specs so that a network can be saved, sent to a worker and rebuilt.
 */
export type MaterialSpec = LinearMaterialSpec;

/**
 * Turn a material spec into an executable law; a live {@link MaterialLaw}
 * object is passed through unchanged.
 *
 * @example
 * ```ts
 * const law = compileMaterial({ kind: 'linear', relativePermeability: 3000 });
 * ```
 */
export function compileMaterial(spec: MaterialSpec | MaterialLaw): MaterialLaw {
  if ('fieldStrength' in spec) return spec;
  switch (spec.kind) {
    case 'linear':
      return linearMaterial(spec);
  }
}
