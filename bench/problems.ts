/**
 * Problems for `npm run bench`: the stiff test set (shared with the tests)
 * and a larger RC ladder that shows how the linear algebra scales with n.
 */
import type { DaeProblem } from '../src/index.js';
export { hires, ringModulator, robertsonDae, robertsonOde, transistorAmplifier, vanDerPol, maxRelativeError, type TestProblem } from '../test/solver/fixtures/test-set.js';

/** The Test Set's atol for a problem at rtol: ROBER's six orders below rtol (its smallest component is ~1e-5 times the others), rtol for the others. */
export function testSetAtol(name: string, rtol: number): number {
  return name === 'ROBER' ? rtol * 1e-6 : rtol;
}

/**
 * An RC ladder of n nodes driven by a 50 Hz sine through R0 at node 0:
 * node k has capacitance C to ground except every 5th node (no capacitor:
 * an algebraic row), resistances R between neighbours and R_g to ground at
 * the last node. M = diag(C or 0), f = -G v + source. Our own invented
 * values; it exists to time the n x n linear algebra at n ~ 100-200.
 */
export function rcLadder(n: number): DaeProblem {
  const R = 100;
  const R0 = 10;
  const Rg = 1000;
  const C = 1e-6;
  const mass = new Float64Array(n * n);
  for (let k = 0; k < n; k++) mass[k * n + k] = k % 5 === 4 ? 0 : C;
  const rhs = (t: number, v: Float64Array, out: Float64Array): void => {
    const u = 10 * Math.sin(2 * Math.PI * 50 * t);
    for (let k = 0; k < n; k++) {
      let i = 0;
      if (k > 0) i += (v[k - 1]! - v[k]!) / R;
      if (k < n - 1) i += (v[k + 1]! - v[k]!) / R;
      if (k === 0) i += (u - v[0]!) / R0;
      if (k === n - 1) i -= v[k]! / Rg;
      out[k] = i;
    }
  };
  const jacobian = (_t: number, _v: Float64Array, J: Float64Array): void => {
    for (let k = 0; k < n; k++) {
      let d = 0;
      if (k > 0) {
        J[k * n + k - 1] = 1 / R;
        d -= 1 / R;
      }
      if (k < n - 1) {
        J[k * n + k + 1] = 1 / R;
        d -= 1 / R;
      }
      if (k === 0) d -= 1 / R0;
      if (k === n - 1) d -= 1 / Rg;
      J[k * n + k] = d;
    }
  };
  return { size: n, y0: new Array(n).fill(0), t0: 0, tEnd: 0.04, rhs, jacobian, mass };
}
