import { InputError } from '../errors.js';
import { requirePositive, stackingFactorOf } from './checks.js';
import { constantsFromC1C2, type CoreConstants } from './core-constants.js';

/**
 * Dimensions of a ring core (toroid) of rectangular cross-section, in m.
 *
 * @example
 * ```ts
 * const ring: ToroidDimensions = { innerRadius: mm(10), outerRadius: mm(20), height: mm(10) };
 * ```
 */
export interface ToroidDimensions {
  /** Inner radius r1, m (> 0). */
  readonly innerRadius: number;
  /** Outer radius r2, m (> r1). */
  readonly outerRadius: number;
  /** Height h (axial), m (> 0). */
  readonly height: number;
  /** Iron fraction of the cross-section for tape-wound or laminated rings, (0, 1]; default 1. */
  readonly stackingFactor?: number;
}

/**
 * Check ring dimensions; returns them with the stacking factor resolved.
 *
 * @internal
 * @example
 * ```ts
 * const d = checkToroid({ innerRadius: mm(10), outerRadius: mm(20), height: mm(10) }, 'toroidLayout');
 * ```
 */
export function checkToroid(d: ToroidDimensions, owner: string): Required<ToroidDimensions> {
  requirePositive(d.innerRadius, 'innerRadius', owner);
  requirePositive(d.outerRadius, 'outerRadius', owner);
  requirePositive(d.height, 'height', owner);
  const stackingFactor = stackingFactorOf(d.stackingFactor, owner);
  if (d.outerRadius <= d.innerRadius) {
    throw new InputError(
      'radii-out-of-order',
      `${owner}: outerRadius ${d.outerRadius} m is not larger than innerRadius ${d.innerRadius} m; give r1 < r2 (radii, not diameters)`,
      ['innerRadius', 'outerRadius'],
    );
  }
  return { innerRadius: d.innerRadius, outerRadius: d.outerRadius, height: d.height, stackingFactor };
}

/**
 * C1 and C2 of the iron of a ring with a radial slot of width `gap` (0 for a
 * closed ring). The ring is a bundle of thin concentric rings in parallel
 * between the same two magnetic potentials; the thin ring at radius r has
 * iron length u(r) = 2 pi r - gap and section k h dr. Parallel rings give
 *   C1 = 1 / integral(k h dr / u) = 2 pi / (k h ln(u2/u1)),
 * and equating integral(B^3 dV) = phi^3 C2 (B = mu F / u in each thin ring) gives
 *   C2 = integral(k h dr / u^2) / (integral(k h dr / u))^3
 *      = (2 pi)^2 (1/u1 - 1/u2) / (k^2 h^2 ln^3(u2/u1)),
 * with u1 = 2 pi r1 - gap, u2 = 2 pi r2 - gap. For gap = 0 these are the
 * IEC 60205 ring-core forms C1 = 2 pi/(h ln(r2/r1)),
 * C2 = 2 pi (1/r1 - 1/r2)/(h^2 ln^3(r2/r1)) (DERIVED here; the slotted-ring
 * form is our extension, exact for a slot with parallel faces up to the
 * chord-versus-arc term gap^3/(24 r^2)).
 *
 * @internal
 * @example
 * ```ts
 * ringConstants(d, mm(1)).effectiveLength; // iron of a ring slotted 1 mm wide
 * ```
 */
export function ringConstants(d: Required<ToroidDimensions>, gap: number): CoreConstants {
  const u1 = 2 * Math.PI * d.innerRadius - gap;
  const u2 = 2 * Math.PI * d.outerRadius - gap;
  const kh = d.stackingFactor * d.height;
  const lnRatio = Math.log(u2 / u1);
  const c1 = (2 * Math.PI) / (kh * lnRatio);
  const c2 = (4 * Math.PI * Math.PI * (1 / u1 - 1 / u2)) / (kh * kh * lnRatio * lnRatio * lnRatio);
  return constantsFromC1C2(c1, c2);
}

/**
 * Core constants and effective parameters of a ring core (toroid) of
 * rectangular section, closed forms (the IEC 60205 treatment of ring cores;
 * forms FROM MEMORY in REFERENCES.md section 3, DERIVED and checked in our
 * tests by integrating over thin concentric rings):
 *
 *     C1 = 2 pi / (h ln(r2/r1))
 *     C2 = 2 pi (1/r1 - 1/r2) / (h^2 ln^3(r2/r1))
 *     le = 2 pi ln(r2/r1) / (1/r1 - 1/r2)
 *     Ae = h ln^2(r2/r1) / (1/r1 - 1/r2)
 *
 * C1 agrees with the air-toroid inductance L = mu0 N^2 h ln(r2/r1) / (2 pi)
 * = mu0 N^2 / C1. A stacking factor k scales every area by k.
 *
 * @example
 * ```ts
 * const k = toroidConstants({ innerRadius: mm(10), outerRadius: mm(20), height: mm(10) });
 * k.effectiveLength / mm(1); // 87.1034 (mm)
 * k.effectiveArea / mm2(1); // 96.0906 (mm^2)
 * ```
 */
export function toroidConstants(dimensions: ToroidDimensions): CoreConstants {
  return ringConstants(checkToroid(dimensions, 'toroidConstants'), 0);
}
