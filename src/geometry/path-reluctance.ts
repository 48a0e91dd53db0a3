import { MU0 } from '../constants.js';
import { InputError } from '../errors.js';
import type { LayoutPath } from './core-layout.js';

/**
 * Reluctance of one layout path, A/Wb, for a LINEAR core material of relative
 * permeability mu_r: core l/(mu0 mu_r A); gap l/(mu0 A) (fringing already in
 * A); leakage and tank paths their constant reluctance. For hand checks and first estimates;
 * the simulation uses the material's full H(B) law.
 *
 * @example
 * ```ts
 * const layout = uCoreLayout({ legWidth: mm(10), yokeHeight: mm(10), depth: mm(10),
 *   windowWidth: mm(10), windowHeight: mm(30), gaps: { left: { length: mm(0.5) } } });
 * const total = layout.paths.reduce((s, p) => s + pathReluctance(p, 2000), 0); // series loop
 * const inductance = 50 ** 2 / total; // H, 50 turns
 * ```
 */
export function pathReluctance(path: LayoutPath, relativePermeability: number): number {
  if (!Number.isFinite(relativePermeability) || relativePermeability <= 0) {
    throw new InputError(
      'bad-permeability',
      `pathReluctance: relative permeability ${relativePermeability} for path "${path.name}" is not a positive finite number; give mu_r > 0`,
      [path.name],
    );
  }
  switch (path.kind) {
    case 'core':
      return path.length / (MU0 * relativePermeability * path.area);
    case 'gap':
      return path.length / (MU0 * path.area);
    case 'leakage':
    case 'tank':
      return path.reluctance;
  }
}
