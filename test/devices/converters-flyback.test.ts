/**
 * Flyback converter with an ideal diode and a gate-driven switch (issue 12),
 * against the textbook converter relations:
 *
 * - continuous conduction: volt-second balance on the magnetising
 *   inductance, Vout = n D Vin / (1 - D) less the diode's forward voltage and
 *   the resistive drops (R. W. Erickson and D. Maksimovic, Fundamentals of
 *   Power Electronics, 2nd ed., ch. 6.3.4 flyback, with the loss modelling of
 *   ch. 3; N. Mohan, T. Undeland, W. Robbins, Power Electronics, ch. 10.5;
 *   from memory). Found by the periodic steady state (shooting), whose
 *   period map crosses the commutations;
 * - discontinuous conduction: the energy stored per period, 1/2 Lm Ip^2,
 *   leaves through the diode into the output, Vout (Vout + Vf) / R = 1/2 Lm
 *   Ip^2 f (Erickson and Maksimovic ch. 5.3, M = D / sqrt(K) with K = 2 L /
 *   (R T) when lossless; from memory, with the diode's drop added by the
 *   same energy balance; derived);
 * - the primary peak current of an RL circuit switched onto Vin,
 *   Ip = (Vin / R)(1 - exp(-D T R / Lm)) (circuits textbook, first-order
 *   step response), and the reset time of the secondary current,
 *   t_r = Lm n Ip / (Vout + Vf) (the secondary inductance n^2 Lm discharged
 *   at constant voltage; Mohan et al. ch. 10.5, from memory).
 *
 * The energy audit (conservation of energy) closes on every run. Circuit
 * values are test values of our own.
 */
import { describe, expect, it } from 'vitest';
import { periodicSteadyState, simulate, type SimulationResult } from '../../src/index.js';
import { flyback, type FlybackParameters } from './converters-circuits.js';

/** Mean of a quantity over (a, b) by composite Gauss-Legendre (3 points per panel) on the result's dense output. */
function meanOver(read: (t: number) => number, a: number, b: number, panels = 400): number {
  const x = [-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)];
  const w = [5 / 9, 8 / 9, 5 / 9];
  const h = (b - a) / panels;
  let sum = 0;
  for (let k = 0; k < panels; k++) {
    const c = a + (k + 0.5) * h;
    for (let j = 0; j < 3; j++) sum += w[j]! * read(c + (x[j]! * h) / 2) * (h / 2);
  }
  return sum / (b - a);
}

function expectAuditCloses(result: SimulationResult, bound: number): void {
  const audit = result.energy();
  expect(Number.isFinite(audit.relativeError)).toBe(true);
  expect(audit.relativeError).toBeLessThan(bound);
}

const CCM: FlybackParameters = {
  vin: 24, period: 10e-6, duty: 0.4, n1: 20, n2: 10, lm: 100e-6, load: 8, capacitance: 100e-6,
  diodeForward: 0.5, diodeOn: 0.01, switchOn: 0.05, initialVoltage: 7,
};

describe('flyback converter (ideal diode, gate-driven switch)', () => {
  it('continuous conduction: the periodic steady state converges from rest and Vout = n D Vin / (1 - D) less the drops', () => {
    const p = { ...CCM, initialVoltage: 0 };
    const model = flyback(p);
    const pss = periodicSteadyState(model.net, { period: p.period, rtol: 1e-8, samplesPerPeriod: 400 });
    expect(pss.status).toBe('converged');
    const r = pss.result;
    const vout = r.evaluator({ quantity: 'voltage', handle: model.output });
    const mean = meanOver(vout, 0, p.period);
    // Volt-second balance with the drops (see the header):
    // Vout (1 + (a Rsw n + Rd) / (R (1 - D))) = a Vin - Vf, a = n D / (1 - D), n = N2 / N1.
    const n = p.n2 / p.n1;
    const a = (n * p.duty) / (1 - p.duty);
    const expected = (a * p.vin - p.diodeForward) / (1 + (a * p.switchOn * n + p.diodeOn) / (p.load * (1 - p.duty)));
    // The relation takes Vout as constant and the ramps as straight lines: the output ripple
    // Iout D T / C is 0.5 % of Vout, so the relation holds to a fraction of that.
    expect(Math.abs(mean - expected) / expected).toBeLessThan(2e-3);
    // Continuous conduction indeed: the magnetising current never falls to zero (the secondary current
    // at the end of the off-time is above zero).
    const is = r.evaluator({ quantity: 'current', handle: model.diode });
    expect(is(p.period * (1 - 1e-6))).toBeGreaterThan(0.1);
    expectAuditCloses(r, 1e-5);
  });

  it('the periodic state from shooting agrees with a long transient run (300 periods)', () => {
    const p = { ...CCM, capacitance: 20e-6 };
    const model = flyback(p);
    const pss = periodicSteadyState(model.net, { period: p.period, rtol: 1e-8 });
    expect(pss.status).toBe('converged');
    const pssMean = meanOver(pss.result.evaluator({ quantity: 'voltage', handle: model.output }), 0, p.period);
    // RC = 160 us = 16 periods; the converter's slowest mode decays well within 300 periods.
    const run = simulate(model.net, { stopTime: 300 * p.period, rtol: 1e-7 });
    expect(run.status).toBe('success');
    const vout = run.evaluator({ quantity: 'voltage', handle: model.output });
    const lastMean = meanOver(vout, 299 * p.period, 300 * p.period);
    expect(Math.abs(lastMean - pssMean) / pssMean).toBeLessThan(1e-4);
    expectAuditCloses(run, 1e-5);
  });

  it('discontinuous conduction: output voltage, primary peak current and reset time against the hand formulas', () => {
    const p: FlybackParameters = {
      vin: 24, period: 10e-6, duty: 0.3, n1: 20, n2: 10, lm: 20e-6, load: 50, capacitance: 100e-6,
      diodeForward: 0.5, diodeOn: 0.01, switchOn: 0.05, initialVoltage: 25,
    };
    const model = flyback(p);
    const pss = periodicSteadyState(model.net, { period: p.period, rtol: 1e-8, samplesPerPeriod: 400 });
    expect(pss.status).toBe('converged');
    const r = pss.result;
    const n = p.n2 / p.n1;
    const T = p.period;
    // Primary peak: RL step response over the on-time.
    const ip = (p.vin / p.switchOn) * (1 - Math.exp((-p.duty * T * p.switchOn) / p.lm));
    const primary = r.evaluator({ quantity: 'current', handle: model.primary });
    const onEnd = p.duty * T;
    expect(Math.abs(primary(onEnd * (1 - 1e-9)) - ip) / ip).toBeLessThan(1e-4);
    // Output voltage by the energy balance: 1/2 Lm Ip^2 f = (Vout + Vf) Vout / R + Rd Is^2 t_r / (3 T),
    // with t_r = 2 Iout T / Is (triangle of height Is = Ip / n carrying the charge Iout T).
    const isPeak = ip / n;
    const power = (0.5 * p.lm * ip * ip) / T;
    const b = p.diodeForward + (2 * p.diodeOn * isPeak) / 3;
    const expected = (-b + Math.sqrt(b * b + 4 * p.load * power)) / 2;
    const vout = meanOver(r.evaluator({ quantity: 'voltage', handle: model.output }), 0, T);
    // Constant Vout assumed by the relation: the ripple Iout T / C is 0.2 % of Vout.
    expect(Math.abs(vout - expected) / expected).toBeLessThan(2e-3);
    // Reset time: the secondary current ramps down from Is at turn-off to zero; located on the dense
    // output by bisection on the sign of the current above a small fraction of its peak.
    const is = r.evaluator({ quantity: 'current', handle: model.diode });
    let lo = onEnd * (1 + 1e-6);
    let hi = T * (1 - 1e-6);
    expect(is(lo)).toBeGreaterThan(0.9 * isPeak);
    expect(Math.abs(is(hi))).toBeLessThan(1e-6 * isPeak);
    for (let k = 0; k < 60; k++) {
      const m = 0.5 * (lo + hi);
      if (is(m) > 1e-6 * isPeak) lo = m;
      else hi = m;
    }
    const reset = lo - onEnd;
    const expectedReset = (p.lm * n * ip) / (vout + p.diodeForward);
    // The diode's on-resistance steepens the start of the ramp by Rd Is / (Vout + Vf) = 0.3 %.
    expect(Math.abs(reset - expectedReset) / expectedReset).toBeLessThan(3e-3);
    expectAuditCloses(r, 1e-5);
  });
});
