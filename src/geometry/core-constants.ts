import { InputError } from '../errors.js';
import { compensatedSum } from './checks.js';

/**
 * One piece of a magnetic path: a length along the flux and a uniform cross-section.
 *
 * @example
 * ```ts
 * const corner: CoreSection = { length: mm(3.9), area: mm2(58.5), label: 'corner' };
 * ```
 */
export interface CoreSection {
  /** Length along the flux, m (> 0). */
  readonly length: number;
  /** Cross-section area, m^2 (> 0). */
  readonly area: number;
  /** Optional label for messages and reports (e.g. 'corner', 'straight'). */
  readonly label?: string;
}

/**
 * Core constants and effective parameters by the method of IEC 60205, with the
 * definitions of IEC 60050-221 (IEV 221-04-31). All in SI units.
 *
 * @example
 * ```ts
 * const { effectiveLength, effectiveArea } = coreConstants([{ length: mm(40), area: mm2(25) }]);
 * ```
 */
export interface CoreConstants {
  /** Core constant C1 = sum(l/A), 1/m. The reluctance of a linear core is C1/(mu0 mu_r). */
  readonly c1: number;
  /** Core constant C2 = sum(l/A^2), 1/m^3. */
  readonly c2: number;
  /** Effective length le = C1^2/C2, m. */
  readonly effectiveLength: number;
  /** Effective area Ae = C1/C2, m^2. */
  readonly effectiveArea: number;
  /** Effective volume Ve = C1^3/C2^2 = le Ae, m^3. */
  readonly effectiveVolume: number;
}

/**
 * Options of {@link coreConstants}.
 *
 * @example
 * ```ts
 * coreConstants(sections, { rounding: 'iec-60205' }); // as printed in tables
 * ```
 */
export interface CoreConstantsOptions {
  /**
   * `'none'` (default): full double precision.
   * `'iec-60205'`: the publication convention of IEC 60205: C1 and C2 rounded
   * to 5 significant figures (in mm units), le, Ae and Ve computed from the
   * rounded constants and rounded to 3 significant figures. Use it only to
   * compare with published tables; simulate with full precision.
   */
  readonly rounding?: 'none' | 'iec-60205';
}

/** Round to `digits` significant figures (half away from zero, as printed tables do). */
function roundSignificant(x: number, digits: number): number {
  return Number(x.toPrecision(digits));
}

/**
 * Core constants and effective parameters of a magnetic path made of sections
 * in series, by the method of IEC 60205 (definitions: IEC 60050-221,
 * IEV 221-04-31):
 *
 *     C1 = sum(l_i / A_i)     C2 = sum(l_i / A_i^2)
 *     Ae = C1 / C2            le = C1^2 / C2          Ve = C1^3 / C2^2 = le Ae
 *
 * The effective core is the uniform core with the same C1 (so the same
 * reluctance, hence inductance, for a linear material) and the same C2 (so
 * the same integral of B^3 over the volume, the term that governs Rayleigh
 * hysteresis loss). IEC 60205 conventions (see docs/geometry.md): at a sharp
 * corner the path is the mean circular path joining the centres of area of
 * the adjacent sections, with the mean of the two areas; the standard works
 * in millimetres with C1, C2 to 5 significant figures and results to 3
 * (option `rounding: 'iec-60205'`).
 *
 * Throws `InputError` `empty-sections` for an empty list and
 * `invalid-section` (naming the section) for a length or area that is not a
 * positive finite number.
 *
 * @example
 * ```ts
 * // a path of two sections: 10 mm of 10 mm^2, then 20 mm of 20 mm^2
 * const k = coreConstants([
 *   { length: mm(10), area: mm2(10) },
 *   { length: mm(20), area: mm2(20) },
 * ]);
 * k.effectiveArea / mm2(1); // 13.333... (mm^2)
 * k.effectiveLength / mm(1); // 26.666... (mm)
 * ```
 */
export function coreConstants(sections: readonly CoreSection[], options: CoreConstantsOptions = {}): CoreConstants {
  if (!Array.isArray(sections) || sections.length === 0) {
    throw new InputError('empty-sections', 'coreConstants: no sections given; give at least one { length, area } in m and m^2');
  }
  sections.forEach((s, i) => {
    const name = s.label ?? `section ${i}`;
    for (const [what, v, unit] of [['length', s.length, 'm'], ['area', s.area, 'm^2']] as const) {
      if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
        throw new InputError(
          'invalid-section',
          `coreConstants: ${name} has ${what} ${String(v)} ${unit}; give a positive finite ${what} in ${unit}`,
          [name],
        );
      }
    }
  });
  let c1 = compensatedSum(sections.map((s) => s.length / s.area));
  let c2 = compensatedSum(sections.map((s) => s.length / (s.area * s.area)));
  const rounding = options.rounding ?? 'none';
  if (rounding === 'iec-60205') {
    // Round in the standard's units (mm^-1, mm^-3) so the digits kept are the printed ones.
    c1 = roundSignificant(c1 * 1e-3, 5) * 1e3;
    c2 = roundSignificant(c2 * 1e-9, 5) * 1e9;
    const ae = roundSignificant((c1 / c2) * 1e6, 3) * 1e-6;
    const le = roundSignificant(((c1 * c1) / c2) * 1e3, 3) * 1e-3;
    const ve = roundSignificant(((c1 * c1 * c1) / (c2 * c2)) * 1e9, 3) * 1e-9;
    return Object.freeze({ c1, c2, effectiveLength: le, effectiveArea: ae, effectiveVolume: ve });
  }
  if (rounding !== 'none') {
    throw new InputError('invalid-option', `coreConstants: rounding '${String(rounding)}' is unknown; use 'none' or 'iec-60205'`, ['rounding']);
  }
  return constantsFromC1C2(c1, c2);
}

/**
 * Effective parameters from the two core constants (no checks; internal).
 *
 * @internal
 * @example
 * ```ts
 * constantsFromC1C2(2e3, 1.5e8).effectiveArea; // 1.333e-5 m^2
 * ```
 */
export function constantsFromC1C2(c1: number, c2: number): CoreConstants {
  const effectiveArea = c1 / c2;
  const effectiveLength = c1 * effectiveArea;
  return Object.freeze({ c1, c2, effectiveLength, effectiveArea, effectiveVolume: effectiveLength * effectiveArea });
}
