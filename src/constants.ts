/**
 * Vacuum magnetic permeability mu0 in N/A^2 (H/m): the CODATA 2018
 * recommended value 1.25663706212e-6. (CODATA 2022 gives 1.25663706127e-6;
 * the two differ by 7e-10 relative, far below any model's accuracy.)
 *
 * @example
 * ```ts
 * const reluctance = gapLength / (MU0 * gapArea);
 * ```
 */
export const MU0 = 1.25663706212e-6;
