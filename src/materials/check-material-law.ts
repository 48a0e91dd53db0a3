import { InputError } from '../errors.js';
import type { MaterialLaw } from './material-law.js';

// Flux densities (T) at which a live law is probed: both signs, from the initial
// region to deep saturation, off round numbers so that the joints of piecewise
// laws (often placed at 1.0 T, 1.5 T...) are unlikely to be hit exactly.
const PROBES = [0.0517, 0.3131, 0.8887, 1.4243, 2.1979, 3.9711];

/** Relative agreement asked of fieldSlope with the slope of fieldStrength, and of H with dw/dB. */
const AGREEMENT = 1e-3;

/**
 * Check the contract of a live {@link MaterialLaw} object that a script
 * wrote itself (the plain-data specs are checked by their own compilers):
 * at a few flux densities of both signs, H(B), dH/dB and w(B) must be finite,
 * H(0) = 0, the slope positive, `fieldSlope` must agree with the slope of
 * `fieldStrength`, and H with the slope of `energyDensity` (central
 * differences, common practice). A wrong `fieldSlope` makes the solver's
 * Jacobian wrong; its Newton iteration can then stop on a wrong solution
 * without noticing, so the law is refused here instead (code
 * `bad-material-law`, naming the law, the flux density and both numbers).
 *
 * @example
 * ```ts
 * checkMaterialLaw({ name: 'toy', fieldStrength: (b) => 800 * b, fieldSlope: () => 800, energyDensity: (b) => 400 * b * b });
 * ```
 */
export function checkMaterialLaw(law: MaterialLaw): MaterialLaw {
  const name = typeof law.name === 'string' && law.name !== '' ? law.name : 'unnamed material law';
  const fail = (text: string): never => {
    throw new InputError(
      'bad-material-law',
      `material law "${name}": ${text}; a live law must give H(B) in A/m, fieldSlope = dH/dB > 0 and energyDensity = integral of H dB (see MaterialLaw)`,
      [name],
    );
  };
  for (const method of ['fieldStrength', 'fieldSlope', 'energyDensity'] as const) {
    if (typeof law[method] !== 'function') fail(`${method} is a ${typeof law[method]}, not a function`);
  }
  const call = (method: 'fieldStrength' | 'fieldSlope' | 'energyDensity', b: number): number => {
    let v: unknown;
    try {
      v = law[method](b);
    } catch (e) {
      fail(`${method}(${b}) threw (${e instanceof Error ? e.message : String(e)})`);
    }
    if (typeof v !== 'number' || !Number.isFinite(v)) fail(`${method}(${b}) returned ${String(v)}, not a finite number`);
    return v as number;
  };
  const h0 = call('fieldStrength', 0);
  if (h0 !== 0) fail(`fieldStrength(0) = ${h0}; an unmagnetised core has H = 0 at B = 0`);
  for (const magnitude of PROBES) {
    for (const b of [magnitude, -magnitude]) {
      const h = call('fieldStrength', b);
      const slope = call('fieldSlope', b);
      if (!(slope > 0)) fail(`fieldSlope(${b}) = ${slope}; the slope dH/dB must be > 0`);
      const d = 1e-6 * Math.max(1, Math.abs(b));
      const fd = (call('fieldStrength', b + d) - call('fieldStrength', b - d)) / (2 * d);
      if (!(Math.abs(fd - slope) <= AGREEMENT * Math.max(Math.abs(fd), Math.abs(slope)))) {
        fail(`fieldSlope(${b}) = ${slope} but the slope of fieldStrength there is ${fd}`);
      }
      const dw = (call('energyDensity', b + d) - call('energyDensity', b - d)) / (2 * d);
      if (!(Math.abs(dw - h) <= AGREEMENT * Math.max(Math.abs(h), Math.abs(dw)) + slope * d)) {
        fail(`fieldStrength(${b}) = ${h} but the slope of energyDensity there is ${dw}`);
      }
    }
  }
  return law;
}
