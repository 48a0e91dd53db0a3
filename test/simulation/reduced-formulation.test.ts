import { describe, expect, it } from 'vitest';
import { errorOf } from '../support/thrown-error.js';
import { Solver } from '../support/odex.js';
import { angleJob } from '../sweep/rl-network.js';
import { parseSweepJob, runSweepCase } from '../../src/sweep/index.js';
import { constant, createNetwork, createStepper, pulse, simulate, sine, MU0, type MaterialLaw } from '../../src/index.js';

/** A saturating law of our own (the flux walk's, bench/flux-walk.ts): H(B) = B/(mu0 2000) + 2 sinh(B/0.04). */
const walkLaw: MaterialLaw = {
  name: 'walk law',
  fieldStrength: (b) => b / (MU0 * 2000) + 2 * Math.sinh(b / 0.04),
  fieldSlope: (b) => 1 / (MU0 * 2000) + (2 / 0.04) * Math.cosh(b / 0.04),
  energyDensity: (b) => (b * b) / (2 * MU0 * 2000) + 2 * 0.04 * (Math.cosh(b / 0.04) - 1),
};

describe("simulate, formulation 'reduced': the algebraic unknowns eliminated inside f", () => {
  it('an RL step on a linear core follows i = V/R (1 - exp(-t R / L)) with L = N^2 / reluctance', () => {
    // Test data of our own: 10 V on 50 turns (0.5 ohm) in series with 4.5 ohm, core of 2e6 A/Wb in two halves.
    const [V, N, Rw, Rx] = [10, 50, 0.5, 4.5];
    const reluctance = 2e6;
    const net = createNetwork('rl step');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const core = net.reluctance('core', { from: m1, to: m2, reluctance: reluctance / 2 });
    net.reluctance('back', { from: m2, to: m1, reluctance: reluctance / 2 });
    const s = net.node('s');
    const a = net.node('a');
    net.voltageSource('supply', s, net.ground, constant(V));
    net.resistor('series', s, a, Rx);
    const coil = net.winding('coil', { tube: core, turns: N, resistance: Rw, plus: a, minus: net.ground });
    // Inductance of a winding on a magnetic circuit, L = N^2 / R_m (handbook formula, common practice).
    const L = (N * N) / reluctance;
    const R = Rw + Rx;
    const tau = L / R;
    const times = Array.from({ length: 40 }, (_, k) => ((k + 1) * 5 * tau) / 40);
    const r = simulate(net, { stopTime: 5 * tau, rtol: 1e-8, formulation: 'reduced', sampling: { times } });
    expect(r.status).toBe('success');
    const i = r.current(coil);
    let worst = 0;
    r.time.forEach((t, k) => {
      // First-order RL step response (circuit theory textbook formula, common practice).
      worst = Math.max(worst, Math.abs(i[k]! - (V / R) * (1 - Math.exp(-t / tau))));
    });
    expect(r.time.length).toBe(times.length);
    // rtol 1e-8 on the flux; the current is its algebraic image N i = R_m phi: 1e-6 of V/R leaves room for the global error.
    expect(worst / (V / R)).toBeLessThan(1e-6);
  });

  it('the flux walk agrees with odex on the one-unknown ODE, piecewise between the drive edges, and with the full formulation', () => {
    // The flux walk (bench/flux-walk.ts), 3 periods: 20 turns, 0.5 ohm, +/-12 V square at 100 kHz, duty 0.52.
    const [N, R, area, l, T, duty, V] = [20, 0.5, 1e-4, 0.025, 1e-5, 0.52, 12];
    const net = createNetwork('flux walk');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: l, area, material: walkLaw });
    net.fluxTube('rest', { from: m2, to: m1, length: l, area, material: walkLaw });
    const d = net.node('drive');
    net.voltageSource('drive', d, net.ground, pulse({ low: -V, high: V, period: T, duty }));
    const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: d, minus: net.ground });
    const periods = 3;
    // Samples at a quarter and three quarters of each half period (inside, not on an edge).
    const edges: number[] = [0];
    for (let k = 0; k < periods; k++) edges.push((k + duty) * T, (k + 1) * T);
    const times: number[] = [];
    for (let e = 1; e < edges.length; e++) times.push(0.75 * edges[e - 1]! + 0.25 * edges[e]!, 0.25 * edges[e - 1]! + 0.75 * edges[e]!);
    // The default flux atol (1e-7 T x area, 1e-11 Wb) is a few 1e-6 of this walk's peak flux: tighter here.
    const atol = { voltage: 1e-10, current: 1e-10, fluxDensity: 1e-12 };
    const reduced = simulate(net, { stopTime: periods * T, rtol: 1e-9, atol, formulation: 'reduced', sampling: { times } });
    const full = simulate(net, { stopTime: periods * T, rtol: 1e-11, atol, sampling: { times } });
    expect(reduced.status).toBe('success');
    expect(full.status).toBe('success');

    // Faraday and Ampere on the one loop (both tubes carry phi): N dphi/dt = v(t) - R i, N i = 2 l H(phi/A).
    const current = (phi: number): number => (2 * l * walkLaw.fieldStrength(phi / area)) / N;
    const odex = new Solver(1);
    odex.absoluteTolerance = 1e-18;
    odex.relativeTolerance = 1e-12;
    const ref: number[] = [];
    let phi = 0;
    for (let e = 1; e < edges.length; e++) {
      // The drive is high over [k T, (k + duty) T), low after (the pulse's definition); constant between edges.
      const v = e % 2 === 1 ? V : -V;
      const f = (_t: number, y: number[]): number[] => [(v - R * current(y[0]!)) / N];
      const [t0, t1] = [edges[e - 1]!, edges[e]!];
      const [q1, q3] = [0.75 * t0 + 0.25 * t1, 0.25 * t0 + 0.75 * t1];
      phi = odex.solve(f, t0, [phi], q1).y[0]!;
      ref.push(phi);
      phi = odex.solve(f, q1, [phi], q3).y[0]!;
      ref.push(phi);
      phi = odex.solve(f, q3, [phi], t1).y[0]!;
    }
    const phiR = reduced.flux(leg);
    const phiF = full.flux(leg);
    const iR = reduced.current(coil);
    expect(phiR.length).toBe(ref.length);
    const phiScale = Math.max(...ref.map(Math.abs));
    const iScale = Math.max(...ref.map((x) => Math.abs(current(x))));
    let worstOdex = 0;
    let worstFull = 0;
    let worstCurrent = 0;
    for (let k = 0; k < ref.length; k++) {
      worstOdex = Math.max(worstOdex, Math.abs(phiR[k]! - ref[k]!));
      worstFull = Math.max(worstFull, Math.abs(phiR[k]! - phiF[k]!));
      worstCurrent = Math.max(worstCurrent, Math.abs(iR[k]! - current(ref[k]!)));
    }
    // The walk is nonlinear: at the peak flux density the sinh term is more than a tenth of the linear one.
    const bPeak = phiScale / area;
    expect((2 * Math.sinh(bPeak / 0.04)) / (bPeak / (MU0 * 2000))).toBeGreaterThan(0.1);
    // rtol 1e-9 against a 1e-12 reference: 1e-7 of the scale leaves two decades for the global error.
    expect(worstOdex / phiScale).toBeLessThan(1e-7);
    expect(worstFull / phiScale).toBeLessThan(1e-7);
    // The current is the steep image of the flux (dI/dphi large when saturated): one decade more.
    expect(worstCurrent / iScale).toBeLessThan(1e-6);
  });

  it('the energy audit closes on a transformer with a capacitor, an inductor and a switch (dependent mass rows recombined)', () => {
    // Test data of our own: a sine-fed primary, a secondary on the same saturating leg (two proportional
    // rows of M), an RC load, an inductor, and a switch that connects a second load halfway.
    const net = createNetwork('reduced audit');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 4e-4, material: walkLaw });
    net.airGap('gap', { from: m2, to: m1, length: 2e-4, area: 4e-4 });
    const p = net.node('p');
    const sec = net.node('sec');
    const out = net.node('out');
    net.voltageSource('mains', p, net.ground, sine({ amplitude: 20, frequency: 1000 }));
    net.winding('primary', { tube: leg, turns: 40, resistance: 0.2, plus: p, minus: net.ground });
    net.winding('secondary', { tube: leg, turns: 20, resistance: 0.1, plus: sec, minus: net.ground });
    net.inductor('choke', sec, out, 1e-4);
    net.resistor('load', out, net.ground, 8);
    net.capacitor('filter', out, net.ground, 2e-6);
    const x = net.node('x');
    net.switch('second load', out, x, { schedule: [{ time: 1.5e-3, closed: true }] });
    net.resistor('load 2', x, net.ground, 20);
    const r = simulate(net, { stopTime: 3e-3, rtol: 1e-8, formulation: 'reduced' });
    expect(r.status).toBe('success');
    const audit = r.energy();
    expect(audit.dissipated.resistors).toBeGreaterThan(0);
    // Conservation of energy: source energy = dissipated + change of stored energy (first law; the audit's
    // accuracy at rtol 1e-8 is set by the tolerance, as for the full formulation: 1e-5 relative).
    expect(audit.relativeError).toBeLessThan(1e-5);
  });

  it('a stepper in reduced form continues bit for bit from a snapshot, and its eliminated current meets the loop law', () => {
    // Determinism of a restored run (the stepping interface's contract, docs/embedding.md).
    const net = createNetwork('stepped');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.05, area: 1e-4, material: walkLaw });
    net.reluctance('back', { from: m2, to: m1, reluctance: 1e6 });
    const d = net.node('d');
    const drive = net.voltageSource('drive', d, net.ground, sine({ amplitude: 5, frequency: 1e4 }));
    const coil = net.winding('coil', { tube: leg, turns: 20, resistance: 0.5, plus: d, minus: net.ground });
    const stepper = createStepper(net, { horizon: 4e-4, formulation: 'reduced' });
    expect(stepper.advanceTo(1e-4)).toBe('running');
    const snap = stepper.snapshot();
    stepper.setSource(drive, 0);
    stepper.advanceTo(2e-4);
    const first = [stepper.flux(leg), stepper.current(coil)];
    stepper.restore(snap);
    stepper.setSource(drive, 0);
    stepper.advanceTo(2e-4);
    expect([stepper.flux(leg), stepper.current(coil)]).toEqual(first);
    // The eliminated current meets the loop's law, N i = l H(phi/A) + R_back phi (Ampere's circuital law
    // on the one loop, common practice), to round-off.
    const phi = stepper.flux(leg);
    const mmf = 0.05 * walkLaw.fieldStrength(phi / 1e-4) + 1e6 * phi;
    expect(Math.abs(20 * stepper.current(coil) - mmf)).toBeLessThan(1e-12 * Math.max(1, Math.abs(mmf)));
  });

  // The second name holds quotes: the error's element list carries the name as given, not as parsed back from the message.
  it.each(['s1', 'side "a"'])('refuses a loop through a saturating tube that no winding drives, naming the tube (%s)', (sideName) => {
    const net = createNetwork('hanging loop');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const m3 = net.magneticNode('m3');
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.05, area: 1e-4, material: walkLaw });
    net.reluctance('back', { from: m2, to: m1, reluctance: 1e6 });
    // A second loop (s1, s2) off m1 that no winding links: its flux is algebraic and enters H(B) non-affinely.
    net.fluxTube(sideName, { from: m3, to: m1, length: 0.05, area: 1e-4, material: walkLaw });
    net.fluxTube('s2', { from: m1, to: m3, length: 0.05, area: 1e-4, material: walkLaw });
    const d = net.node('d');
    net.voltageSource('drive', d, net.ground, constant(1));
    net.winding('coil', { tube: leg, turns: 20, resistance: 0.5, plus: d, minus: net.ground });
    // The full formulation takes it.
    expect(simulate(net, { stopTime: 1e-6 }).status).toBe('success');
    const e = errorOf(() => simulate(net, { stopTime: 1e-6, formulation: 'reduced' }));
    expect(e?.code).toBe('not-reducible');
    expect(e?.elements).toEqual([sideName]);
    expect(e?.message).toContain(`flux tube "${sideName}"`);
    expect(e?.message).toContain("use formulation 'full'");
  });

  it('refuses a winding on a tube that two loops share (its derivative acts on a sum of loop fluxes), naming the tubes', () => {
    const net = createNetwork('shared leg');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const m3 = net.magneticNode('m3');
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.05, area: 1e-4, material: walkLaw });
    net.reluctance('yoke', { from: m2, to: m3, reluctance: 1e6 });
    net.reluctance('back', { from: m3, to: m1, reluctance: 1e6 });
    net.fluxTube('shunt', { from: m2, to: m3, length: 0.05, area: 1e-4, material: walkLaw });
    const d = net.node('d');
    net.voltageSource('drive', d, net.ground, constant(1));
    net.winding('coil', { tube: leg, turns: 20, resistance: 0.5, plus: d, minus: net.ground });
    expect(simulate(net, { stopTime: 1e-6 }).status).toBe('success');
    const e = errorOf(() => simulate(net, { stopTime: 1e-6, formulation: 'reduced' }));
    expect(e?.code).toBe('not-reducible');
    expect(e?.elements).toContain('leg');
    expect(e?.message).toContain('combinations of unknowns');
  });

  it('takes an ideal diode, and refuses a network with no unknown left to integrate (a rectifier into a bare resistor)', () => {
    // Ideal diodes run reduced (test/simulation/reduced-ideal-diode.test.ts); this rectifier has no
    // capacitor, inductor or winding, so every unknown is algebraic and nothing is left to integrate.
    const net = createNetwork('rectifier');
    const a = net.node('a');
    const b = net.node('b');
    net.voltageSource('mains', a, net.ground, sine({ amplitude: 10, frequency: 50 }));
    net.diode('D1', a, b);
    net.resistor('load', b, net.ground, 10);
    expect(simulate(net, { stopTime: 1e-3 }).status).toBe('success');
    const e = errorOf(() => simulate(net, { stopTime: 1e-3, formulation: 'reduced' }));
    expect(e?.code).toBe('not-reducible');
    expect(e?.message).toContain('nothing is left to integrate');
    // With a capacitor across the load the same rectifier runs reduced.
    net.capacitor('filter', b, net.ground, 1e-6);
    expect(simulate(net, { stopTime: 1e-3, formulation: 'reduced' }).status).toBe('success');
  });

  it('refuses an index-2 unknown (a current source forcing a winding current)', () => {
    const net = createNetwork('forced');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const core = net.reluctance('core', { from: m1, to: m2, reluctance: 1e6 });
    net.reluctance('back', { from: m2, to: m1, reluctance: 1e6 });
    const a = net.node('a');
    net.currentSource('feed', net.ground, a, sine({ amplitude: 1, frequency: 50 }));
    net.winding('coil', { tube: core, turns: 10, resistance: 0.1, plus: a, minus: net.ground });
    const e = errorOf(() => simulate(net, { stopTime: 1e-3, formulation: 'reduced' }));
    expect(e?.code).toBe('not-reducible');
    expect(e?.message).toContain('index 2');
  });

  it('a sweep job carries the formulation: the reduced case agrees with the full one to the tolerance', async () => {
    // The RL switching-angle job of the sweep tests (a winding on a linear core, docs/sweeps.md).
    // Peaks read on one fixed grid (over the steps they would differ by where each run's steps fall).
    const plain = angleJob([0.7]);
    const base = { ...plain, simulate: { ...plain.simulate, sampling: { interval: 1e-5 } } };
    const full = await runSweepCase(parseSweepJob(base), 0);
    const reduced = await runSweepCase(parseSweepJob({ ...base, simulate: { ...base.simulate, formulation: 'reduced' } }), 0);
    expect(reduced.status).toBe(full.status);
    for (const name of ['peak current', 'peak B', 'final current']) {
      const [a, b] = [full.outputs[name] as number, reduced.outputs[name] as number];
      // Both at the default rtol 1e-6: the two runs differ by their error control, at the tolerance level.
      expect(Math.abs(b - a)).toBeLessThan(1e-5 * Math.abs(a));
    }
    expect(() => parseSweepJob({ ...base, simulate: { ...base.simulate, formulation: 'compact' as 'full' } })).toThrow(expect.objectContaining({ code: 'sweep-bad-job' }));
  });

  it('rejects an unknown formulation as a bad option', () => {
    const net = createNetwork('r');
    const a = net.node('a');
    net.voltageSource('v', a, net.ground, constant(1));
    net.resistor('r', a, net.ground, 1);
    const e = errorOf(() => simulate(net, { stopTime: 1e-3, formulation: 'compact' as 'full' }));
    expect(e?.code).toBe('bad-option');
  });
});
