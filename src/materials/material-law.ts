/**
 * A single-valued magnetic material law H(B), evaluated directly from the
 * flux density (no inversion). The formulation calls it with B = phi/A for
 * every flux tube at every right-hand-side evaluation, and its slope for
 * every Jacobian.
 *
 * Contract (checked by the tests of every law): defined for every real B,
 * strictly increasing, continuous slope, odd (H(-B) = -H(B)), and far beyond
 * saturation the slope tends to 1/mu0 (the air line).
 *
 * @example
 * ```ts
 * const law = compileMaterial({ kind: 'linear', relativePermeability: 2000 });
 * law.fieldStrength(1.2); // A/m
 * ```
 */
export interface MaterialLaw {
  /** Human-readable name for messages and reports. */
  readonly name: string;
  /** Magnetic field strength H in A/m at flux density b in T. */
  fieldStrength(b: number): number;
  /** dH/dB in A/(m*T) at flux density b; strictly positive. */
  fieldSlope(b: number): number;
  /**
   * Stored magnetic energy density w(b) = integral from 0 to b of H dB', in
   * J/m^3. Used by the energy audit.
   */
  energyDensity(b: number): number;
  /**
   * Flux density regarded as saturation, in T, for margin reporting; absent
   * for laws that do not saturate (linear).
   */
  readonly saturationFluxDensity?: number;
}
