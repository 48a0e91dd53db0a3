/**
 * Property tests (fast-check) on random VALID networks (test/reliability/random-network.ts):
 * ladders of magnetic nodes with loops, leakage paths, linear and saturating
 * materials, air gaps, eddy resistances, windings with resistance in circuits
 * driven by sine and pulse voltage sources or sine current sources, or loaded
 * by resistors, with RC snubbers and scheduled switches.
 *
 * Outside references: conservation of energy (source energy = losses +
 * change of stored energy), convergence of the integrator (a run at rtol
 * 1e-9 is the reference for the default rtol 1e-6: the error of a
 * convergent method shrinks with its tolerance; Hairer and Wanner II, sect.
 * IV.8), and forward differences as the oracle for the analytic Jacobian
 * (finiteDifferenceJacobian, radau5's increment; common practice).
 * Repeatability is our own contract. Kirchhoff's flux law is not tested here:
 * branch fluxes are sums of loop fluxes, so it holds by construction and such
 * a test could not fail.
 *
 * Tolerances, from measurements:
 * - energy audit of a successful run: relativeError <= 5e-3 (measured over 2000
 *   networks without snubbers or switches: median 4e-8, 99 % below 1.1e-4, max
 *   3.7e-4; over 436 successes with them, apart from the known defect below:
 *   max 3.1e-7 in a 40-case sample);
 * - default rtol against rtol 1e-9, at 21 common sampling times: tube fluxes
 *   within 1e-3 of the largest flux (measured over 37 networks, seeds
 *   7000-7039: median 1.3e-6, max 6.3e-5), winding currents within 1e-2 of
 *   the largest current (median 8.9e-7, max 1.1e-4);
 * - Jacobian: |J - J_fd| <= 1e-4 of the largest entry of its row (measured:
 *   median 2.7e-8, 90 % below 1.1e-6, max 3.1e-5; forward differences err by
 *   about sqrt(eps) times the curvature of the saturating laws).
 *
 * Known defect, left out of the energy property and pinned in
 * test/reliability/known-defects.test.ts: a switch that opens on a driven
 * winding with a small snubber (seen up to 1.02e-9 F; excluded below 1e-8 F)
 * ends 'success' with an energy audit error near 1 (energy created at the
 * opening).
 *
 * Default runs are small (CI seconds); FLUXSTATE_SOAK=1 runs 50 times as many
 * cases (FLUXSTATE_SOAK=n: n times), FLUXSTATE_SEED=<seed> replays a failure;
 * test/soak/soak.ts runs 10,000 and more.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { finiteDifferenceJacobian, simulate, type DaeStatus, type SimulationResult } from '../../src/index.js';
import { compileNetwork } from '../../src/formulation/compile-network.js';
import { maxRelativeDeviation } from '../helpers/conservation.js';
import { expectSameBits } from './bits.js';
import { buildNetwork, hasKnownOpeningDefect, networkPlanArb, runs, SOAK_FACTOR, type BuiltNetwork } from './random-network.js';

const ENERGY_TOLERANCE = 5e-3;
const FLUX_AGREEMENT = 1e-3;
const CURRENT_AGREEMENT = 1e-2;
const JACOBIAN_TOLERANCE = 1e-4;

const DOCUMENTED: readonly DaeStatus[] = [
  'success', 'step-size-underflow', 'newton-failure', 'singular-matrix', 'non-finite', 'rhs-error',
  'inconsistent-init', 'step-budget', 'time-budget', 'aborted',
];

/** Resolve every source period with at least 20 steps; budgets keep a bad case from stalling CI. */
const optionsFor = (b: BuiltNetwork) => ({
  stopTime: b.stopTime,
  maxStep: b.shortestPeriod / 20,
  maxSteps: 20_000,
  maxWallTimeMs: 5_000,
});

/** Every series of every tube, winding and element, at every sample. */
function everySeries(b: BuiltNetwork, r: SimulationResult): Float64Array[] {
  return [
    r.time,
    ...b.tubes.flatMap((t) => [r.flux(t), r.mmf(t), r.eddyPower(t)]),
    ...b.tubesWithArea.map((t) => r.fluxDensity(t)),
    ...b.magneticNodes.map((m) => r.magneticPotential(m)),
    ...b.elements.flatMap((e) => [r.current(e), r.voltage(e)]),
    ...b.nodes.map((n) => r.potential(n)),
  ];
}

const outcomes = new Map<string, number>();

describe('simulate on random valid networks (property tests)', () => {
  it('ends in a documented status, keeps finite data, and balances energy on success', () => {
    fc.assert(
      fc.property(networkPlanArb.filter((p) => !hasKnownOpeningDefect(p)), (plan) => {
        const b = buildNetwork(plan);
        const r = simulate(b.net, optionsFor(b));
        outcomes.set(r.status, (outcomes.get(r.status) ?? 0) + 1);
        expect(DOCUMENTED).toContain(r.status);
        expect(r.time.length).toBeGreaterThanOrEqual(1);
        for (const s of everySeries(b, r)) {
          expect(s.length).toBe(r.time.length);
          expect(s.every(Number.isFinite)).toBe(true);
        }
        const audit = r.energy();
        for (const x of [audit.sourceEnergy, audit.dissipated.total, audit.dissipated.eddy, audit.storedStart, audit.storedEnd, audit.relativeError]) {
          expect(Number.isFinite(x)).toBe(true);
        }
        if (r.status === 'success') {
          expect(r.time[r.time.length - 1]).toBe(b.stopTime);
          expect(audit.relativeError).toBeLessThanOrEqual(ENERGY_TOLERANCE);
        } else {
          // Not silent: a one-line reason, and the failure time is the last sample kept.
          expect(r.failure).toBeDefined();
          expect(r.failure!.time).toBe(r.time[r.time.length - 1]);
          expect(r.message).not.toMatch(/\n/);
        }
      }),
      runs(12),
    );
    if (SOAK_FACTOR > 1) console.info('random valid networks, outcomes:', Object.fromEntries(outcomes));
  });

  it('agrees with a run at a tolerance 1000 times tighter (fluxes and winding currents at common times)', () => {
    let compared = 0;
    fc.assert(
      fc.property(networkPlanArb, (plan) => {
        const b = buildNetwork(plan);
        const times = Array.from({ length: 21 }, (_, i) => Math.min((i * b.stopTime) / 20, b.stopTime));
        const options = { ...optionsFor(b), sampling: { times } };
        const r = simulate(b.net, options);
        const tight = simulate(b.net, { ...options, rtol: 1e-9 });
        // A run that stops early has nothing to compare: its status is checked by the property above.
        if (r.status !== 'success' || tight.status !== 'success') return;
        compared++;
        let largest = 0;
        let gap = 0;
        for (const t of b.tubes) {
          const a = r.flux(t);
          const ref = tight.flux(t);
          for (let k = 0; k < a.length; k++) {
            largest = Math.max(largest, Math.abs(ref[k]!));
            gap = Math.max(gap, Math.abs(a[k]! - ref[k]!));
          }
        }
        expect(gap).toBeLessThanOrEqual(FLUX_AGREEMENT * largest);
        for (const w of b.windings) expect(maxRelativeDeviation(r.current(w), tight.current(w))).toBeLessThanOrEqual(CURRENT_AGREEMENT);
      }),
      runs(6),
    );
    // Most random networks run to the end (measured: 97 %); if none did, the property compared nothing.
    expect(compared).toBeGreaterThan(0);
  });

  it('repeats bit for bit: a second run of the same network gives the same states', () => {
    fc.assert(
      fc.property(networkPlanArb, (plan) => {
        const b = buildNetwork(plan);
        const first = simulate(b.net, optionsFor(b));
        const second = simulate(b.net, optionsFor(b));
        expect(second.status).toBe(first.status);
        expect(second.stats).toEqual(first.stats);
        expectSameBits(second.time, first.time, 'time');
        for (let k = 0; k < first.length; k++) expectSameBits(second.state(k), first.state(k), `state ${k}`);
      }),
      runs(5),
    );
  });

  it('has an analytic Jacobian that agrees with finite differences at random states and times', () => {
    const unit = fc.integer({ min: -1_000_000, max: 1_000_000 }).map((x) => x / 1_000_000);
    fc.assert(
      fc.property(networkPlanArb, fc.array(unit, { minLength: 64, maxLength: 64 }), (plan, u) => {
        const b = buildNetwork(plan);
        const c = compileNetwork(b.net.describe());
        const n = c.layout.size;
        // Potentials up to the largest source voltage, currents up to 10 A, loop fluxes up to 2.5 T in the smallest tube.
        const typical = Float64Array.from(c.layout.kinds, (kind) =>
          kind === 'potential' ? b.scale.voltage : kind === 'current' ? 10 : 2.5 * b.scale.area,
        );
        const y = Float64Array.from(typical, (s, i) => s * u[i % 63]!);
        const t = Math.abs(u[63]!) * b.stopTime;
        c.inputs.setInterval(0, b.stopTime);
        const J = new Float64Array(n * n);
        c.jacobian(t, y, J);
        const f0 = new Float64Array(n);
        c.rhs(t, y, f0);
        const Jfd = new Float64Array(n * n);
        finiteDifferenceJacobian(c.rhs, t, y, f0, Jfd, undefined, typical);
        for (let i = 0; i < n; i++) {
          let rowMax = 0;
          for (let j = 0; j < n; j++) rowMax = Math.max(rowMax, Math.abs(J[i * n + j]!));
          for (let j = 0; j < n; j++) {
            const gap = Math.abs(J[i * n + j]! - Jfd[i * n + j]!);
            expect(gap, `row ${c.layout.labels[i]}, column ${c.layout.labels[j]}`).toBeLessThanOrEqual(JACOBIAN_TOLERANCE * rowMax);
          }
        }
      }),
      runs(30),
    );
  });
});
