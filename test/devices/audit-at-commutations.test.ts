/**
 * Where the forward converter's energy-audit floor comes from (issue 12).
 * Conservation of energy: source energy = losses (switch, diodes, windings,
 * load) + change of stored energy (magnetic, choke, capacitor).
 *
 * The default run of the forward converter (tests in
 * converters-forward.test.ts) closes its audit only to 7e-6 over 10 periods
 * (1.5e-5 over 20), whatever rtol, where other device runs reach 1e-7. The
 * losses are booked right at the commutations: when the solver's steps end
 * just before each commutation (exact sampling there), the same circuit closes
 * to 3e-8. The floor is the state at a commutation: the reset diode turns off
 * inside one long step (the whole 3.9 us reset), the integrator cuts the step
 * at the located event and restarts from the collocation polynomial's value
 * there (third-order dense output, not error-controlled), and the output
 * capacitor's voltage carries the interpolation error (2e-6 V of 4.1 V, the
 * same sign each period, into 0.42 mJ stored against 37 uJ passed per period).
 *
 * Circuit values are test values of our own (converters-circuits.ts).
 */
import { describe, expect, it } from 'vitest';
import { demoMaterials, simulate } from '../../src/index.js';
import { forward, type ForwardParameters } from './converters-circuits.js';

const P: ForwardParameters = {
  vin: 24, period: 10e-6, n1: 20, n3: 20, n2: 10, diodeForward: 0.7,
  material: demoMaterials.ferrite, area: 5e-5, length: 0.05, load: 200, duty: 0.4,
};
const RTOL = 1e-8;
const PERIODS = 10;

function model() {
  const vo = 0.5 * P.duty * P.vin - P.diodeForward;
  return forward({ ...P, initialOutput: { voltage: vo, current: vo / P.load } });
}

describe('energy audit of the forward converter at its commutations', () => {
  it('closes within the solver tolerance when the steps end just before each commutation', () => {
    const first = simulate(model().net, { stopTime: PERIODS * P.period, rtol: RTOL });
    expect(first.status).toBe('success');
    // Restarts show as a repeated time; those that are not gate edges (k T, k T + D T) are commutations.
    const onGrid = (t: number): boolean => [0, P.duty].some((d) => {
      const x = t / P.period - d;
      return Math.abs(x - Math.round(x)) < 1e-9;
    });
    const commutations: number[] = [];
    for (let k = 1; k < first.time.length; k++) {
      const t = first.time[k]!;
      if (t === first.time[k - 1] && !onGrid(t) && t < PERIODS * P.period) commutations.push(t);
    }
    expect(commutations.length).toBeGreaterThanOrEqual(2 * PERIODS); // the reset diode's and the rectifiers' turn-offs
    const landed = simulate(model().net, {
      stopTime: PERIODS * P.period, rtol: RTOL,
      sampling: { times: commutations.map((t) => t * (1 - 1e-9)), includeSteps: true, exact: true },
    });
    expect(landed.status).toBe('success');
    // radau5's effective tolerance at rtol 1e-8: rtol' = 0.1 rtol^(2/3) = 4.6e-7 (Hairer and Wanner's
    // radau5 tolerance mapping, as in flyback-audit.test.ts). Measured 2.9e-8.
    expect(landed.energy().relativeError).toBeLessThan(0.1 * RTOL ** (2 / 3));
  });
});
