import { MU0 } from '../../constants.js';
import type { HystereticMaterial } from './inverse-jiles-atherton.js';
import { advanceAlongPath, type PathState } from './flux-density-path.js';

/**
 * The residual flux density of a tube at state (b, m): the flux density it
 * settles at if its field strength is let relax to zero from here (the MMF
 * removed, as after a switch-off through a discharge path), found by
 * following the model from (b, m) in the direction that brings H to 0
 * (b moves against the sign of H) with classical Runge-Kutta steps of at
 * most `maxStep` tesla and bisection on the crossing. At H = 0 it is b itself.
 *
 * @example
 * ```ts
 * const steel = inverseJilesAtherton(demoHystereticMaterials.steel);
 * residualFluxDensity(steel, 1.5, 1.5 / MU0 - 243.6); // about 0.90 T
 * ```
 */
export function residualFluxDensity(model: HystereticMaterial, b: number, m: number, maxStep = 1e-4): number {
  const h0 = model.fieldStrength(b, m);
  if (h0 === 0) return b;
  const direction = -Math.sign(h0);
  let state: PathState = { b, m, work: 0, loss: 0 };
  // H is monotone along the path while dH/db > 0, and reaches 0 within 2 mu0 (|H| + M_s) of b.
  const span = 2 * (Math.abs(h0) * MU0 + model.saturationFluxDensity);
  const steps = Math.ceil(span / maxStep);
  for (let j = 1; j <= steps; j++) {
    const next = advanceAlongPath(model, state, state.b + direction * maxStep);
    const h = model.fieldStrength(next.b, next.m);
    if (h === 0) return next.b;
    if (Math.sign(h) !== Math.sign(h0)) {
      let lo = state.b;
      let hi = next.b;
      for (let k = 0; k < 200; k++) {
        const mid = 0.5 * (lo + hi);
        if (mid === lo || mid === hi) break;
        const s = advanceAlongPath(model, state, mid);
        if (Math.sign(model.fieldStrength(s.b, s.m)) === Math.sign(h0)) lo = mid;
        else hi = mid;
      }
      return 0.5 * (lo + hi);
    }
    state = next;
  }
  return Number.NaN;
}
