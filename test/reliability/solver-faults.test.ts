/**
 * Numerical faults through `simulate`: each comes back as a documented
 * status (src/solver/types.ts, docs/errors.md) with a one-line message, the
 * data up to the last accepted step (time, every series of the same length,
 * finite values) and, for the numerical statuses, `failure.unknowns` naming
 * the elements. The networks are ours, built to provoke each fault; the
 * closed forms used are DERIVED in the comments.
 */
import { describe, expect, it } from 'vitest';
import {
  createNetwork,
  simulate,
  sine,
  userFunction,
  MU0,
  type MaterialLaw,
  type MaterialSpec,
  type SimulationResult,
  type WaveformSpec,
  type Winding,
  type FluxTube,
  type DaeStatus,
} from '../../src/index.js';

const material = { kind: 'linear', relativePermeability: 1000 } as const;

/** A closed two-tube core with one resistive winding fed by `wave`. */
function driven(wave: WaveformSpec, legMaterial: MaterialSpec | MaterialLaw = material) {
  const net = createNetwork('faults');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material: legMaterial });
  const yoke = net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material: legMaterial });
  const a = net.node('a');
  const supply = net.voltageSource('supply', a, net.ground, wave);
  const coil = net.winding('coil', { tube: leg, turns: 50, resistance: 1, plus: a, minus: net.ground });
  return { net, leg, yoke, supply, coil, tubes: [leg, yoke] as FluxTube[] };
}

/** Everything computed is kept: series as long as the time vector, finite, ending at the failure time. */
function expectDataKept(r: SimulationResult, tubes: readonly FluxTube[], windings: readonly Winding[], finiteAudit = true): void {
  expect(r.time.length).toBeGreaterThanOrEqual(1);
  expect(r.failure).toBeDefined();
  expect(r.failure!.time).toBe(r.time[r.time.length - 1]);
  for (let k = 1; k < r.time.length; k++) expect(r.time[k]!).toBeGreaterThanOrEqual(r.time[k - 1]!);
  const series = [...tubes.flatMap((t) => [r.flux(t), r.fluxDensity(t), r.mmf(t)]), ...windings.flatMap((w) => [r.current(w), r.voltage(w)])];
  for (const s of series) {
    expect(s.length).toBe(r.time.length);
    expect(s.every(Number.isFinite)).toBe(true);
  }
  expect(r.message).not.toMatch(/\n/);
  // The audit and the exports work on a partial result too (powers overflow in a run that ends near overflow).
  const audit = r.energy();
  if (finiteAudit) expect(Number.isFinite(audit.imbalance)).toBe(true);
  expect(r.toCSV().split('\n').length).toBeGreaterThan(r.time.length);
  expect(JSON.parse(JSON.stringify(r.toJSON())).status).toBe(r.status);
}

/** The failure names unknowns by element, and each named element exists in the network. */
function expectUnknownsNamed(r: SimulationResult, mustInclude: readonly string[]): void {
  const unknowns = r.failure!.unknowns;
  expect(unknowns.length).toBeGreaterThan(0);
  const names = new Set([...r.network.electricNodes, ...r.network.tubes, ...r.network.elements].map((x) => x.name));
  for (const u of unknowns) {
    expect(u.label.length).toBeGreaterThan(0);
    expect(u.elements.length).toBeGreaterThan(0);
    for (const e of u.elements) expect(names.has(e)).toBe(true);
  }
  expect(unknowns.flatMap((u) => u.elements)).toEqual(expect.arrayContaining([...mustInclude]));
  for (const u of unknowns) expect(r.message).toContain(u.label);
}

/** The documented statuses (src/solver/types.ts). */
const DOCUMENTED: readonly DaeStatus[] = [
  'success', 'terminal-event', 'step-size-underflow', 'newton-failure', 'singular-matrix', 'non-finite',
  'rhs-error', 'inconsistent-init', 'step-budget', 'time-budget', 'aborted',
];

describe('simulate: user functions that fail', () => {
  it("'rhs-error' when a source function throws: names the source, the function and the time; data before is the clean run's, bit for bit", () => {
    const clean = (t: number): number => Math.sin(2 * Math.PI * 50 * t);
    const failing = driven(userFunction({ name: 'gate drive', fn: (t) => { if (t > 5e-3) throw new Error('lookup table ends at 5 ms'); return clean(t); } }));
    const r = simulate(failing.net, { stopTime: 0.01 });
    expect(r.status).toBe('rhs-error');
    expect(DOCUMENTED).toContain(r.status);
    expect(r.message).toMatch(/voltage source "supply": function waveform "gate drive" threw at t = 0\.00\d+ s: lookup table ends at 5 ms/);
    const cause = r.failure!.cause as { code: string; elements: readonly string[] };
    expect(cause.code).toBe('bad-waveform');
    expect(cause.elements).toEqual(['supply']);
    expect(r.failure!.time).toBeLessThanOrEqual(5e-3);
    expect(r.failure!.time).toBeGreaterThan(3e-3);
    expectDataKept(r, failing.tubes, [failing.coil]);
    // Up to the failure the run is the same computation as a run with a function that never fails.
    const ok = driven(userFunction({ name: 'gate drive', fn: clean }));
    const ref = simulate(ok.net, { stopTime: 0.01 });
    expect(ref.status).toBe('success');
    const n = r.time.length;
    expect(Array.from(ref.time.subarray(0, n))).toEqual(Array.from(r.time));
    expect(Array.from(ref.current(ok.coil).subarray(0, n))).toEqual(Array.from(r.current(failing.coil)));
  });

  it("'rhs-error' when a source function returns NaN, naming the source and the time", () => {
    const f = driven(userFunction({ name: 'sensor replay', fn: (t) => (t > 5e-3 ? Number.NaN : Math.sin(314 * t)) }));
    const r = simulate(f.net, { stopTime: 0.01 });
    expect(r.status).toBe('rhs-error');
    expect(r.message).toMatch(/voltage source "supply": function waveform "sensor replay" returned NaN at t = 0\.00\d+ s; it must return a finite number/);
    expect((r.failure!.cause as { elements: readonly string[] }).elements).toEqual(['supply']);
    expectDataKept(r, f.tubes, [f.coil]);
  });

  it("'non-finite' when a live material law returns NaN beyond the flux densities its check probes, naming the loop's tubes", () => {
    // H = B/(mu0 mu_r) up to 5 T, NaN beyond. The flux density's amplitude
    // would reach V/(N w A) |Z_L/Z| (DERIVED, steady RL response) = 11 T with V = 40 V, N = 50, A = 1e-4 m^2,
    // wL = 0.49 ohm, R = 1 ohm.
    const nu = 1 / (MU0 * 1000);
    const law: MaterialLaw = {
      name: 'measured to 5 T',
      fieldStrength: (b) => (Math.abs(b) > 5 ? Number.NaN : nu * b),
      fieldSlope: (b) => (Math.abs(b) > 5 ? Number.NaN : nu),
      energyDensity: (b) => 0.5 * nu * b * b,
    };
    const f = driven(sine({ amplitude: 40, frequency: 50 }), law);
    const r = simulate(f.net, { stopTime: 0.02 });
    expect(r.status).toBe('non-finite');
    expectDataKept(r, f.tubes, [f.coil]);
    expectUnknownsNamed(r, ['leg', 'yoke']);
    expect(Math.max(...r.fluxDensity(f.leg).map(Math.abs))).toBeLessThanOrEqual(5);
    expect(r.failure!.time).toBeGreaterThan(0);
  });
});

describe('simulate: solver faults', () => {
  it("'step-size-underflow' for a source that blows up at t = 5 ms (1/(t1 - t)^2), data up to the blow-up kept", () => {
    const f = driven(userFunction({ name: 'runaway', fn: (t) => 1 / (5e-3 - t) ** 2 }));
    const r = simulate(f.net, { stopTime: 0.01 });
    expect(r.status).toBe('step-size-underflow');
    expect(r.message).toMatch(/fell below the round-off limit/);
    expect(r.failure!.time).toBeGreaterThan(4.99e-3);
    expect(r.failure!.time).toBeLessThan(5e-3);
    expectDataKept(r, f.tubes, [f.coil]);
    expectUnknownsNamed(r, ['coil']);
  });

  it("'non-finite' for a source that grows towards overflow (exp(1e5 t)): the first quantity to overflow is named, the data before it kept", () => {
    // Before every result quantity was checked, this run went on until the Newton iteration failed
    // ('newton-failure', currents above 1e300) while powers read as Infinity; now it stops where the
    // first quantity overflows. ('newton-failure' itself is reached in test/solver/failures.test.ts.)
    const f = driven(userFunction({ name: 'exponential', fn: (t) => Math.exp(1e5 * t) }));
    const r = simulate(f.net, { stopTime: 0.01 });
    expect(r.status).toBe('non-finite');
    expect(r.message).toMatch(/ of "(supply|coil)" is -?Infinity at t = /);
    const named = r.failure!.nonFinite!.name;
    expect(['supply', 'coil']).toContain(named);
    expect(Math.max(...r.current(f.coil))).toBeGreaterThan(1e100);
    expectDataKept(r, f.tubes, [f.coil], false);
    expectUnknownsNamed(r, [named]);
  });

  it("'singular-matrix' at the start for a loop of two tubes with mu_r = 1e300 and no winding (a model the topology checks let through)", () => {
    // Two parallel tubes of (near) zero reluctance form a loop that no winding links: its flux
    // has no equation that depends on it (dF/dphi = l/(mu0 mu_r A) is ~1e-294).
    const g = createNetwork('superconducting loop');
    const n1 = g.magneticNode('m1');
    const n2 = g.magneticNode('m2');
    const leg = g.fluxTube('leg', { from: n1, to: n2, length: 0.1, area: 1e-4, material });
    const yoke = g.fluxTube('yoke', { from: n2, to: n1, length: 0.1, area: 1e-4, material });
    const ideal = { kind: 'linear', relativePermeability: 1e300 } as const;
    const p1 = g.fluxTube('ideal 1', { from: n1, to: n2, length: 0.1, area: 1e-4, material: ideal });
    const p2 = g.fluxTube('ideal 2', { from: n2, to: n1, length: 0.1, area: 1e-4, material: ideal });
    const a = g.node('a');
    g.voltageSource('supply', a, g.ground, sine({ amplitude: 1, frequency: 50 }));
    const w = g.winding('coil', { tube: leg, turns: 50, resistance: 1, plus: a, minus: g.ground });
    const r = simulate(g, { stopTime: 0.01 });
    expect(r.status).toBe('singular-matrix');
    expect(r.message).toMatch(/is singular/);
    expectDataKept(r, [leg, yoke, p1, p2], [w]);
    expect(r.time.length).toBe(1);
    expectUnknownsNamed(r, ['ideal 2']);
  });

  it("'singular-matrix' mid-run for a live law whose field strength stops rising (H = 100 tanh B A/m), data before kept", () => {
    // dH/dB = 100 / cosh^2 B underflows once the flux density passes ~20 T: the loop that no winding
    // links (tubes "bypass" and "leg") loses its equation. A law that breaks the air-line contract on purpose.
    const law: MaterialLaw = {
      name: 'H stops rising',
      fieldStrength: (b) => 100 * Math.tanh(b),
      fieldSlope: (b) => 100 / Math.cosh(b) ** 2,
      energyDensity: (b) => 100 * Math.log(Math.cosh(b)),
    };
    const net = createNetwork('flat law');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material: law });
    const yoke = net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material: law });
    const bypass = net.fluxTube('bypass', { from: m2, to: m1, length: 0.1, area: 1e-4, material: law });
    const a = net.node('a');
    net.voltageSource('supply', a, net.ground, sine({ amplitude: 100, frequency: 50 }));
    const coil = net.winding('coil', { tube: leg, turns: 50, resistance: 1, plus: a, minus: net.ground });
    const r = simulate(net, { stopTime: 0.01 });
    expect(r.status).toBe('singular-matrix');
    expect(r.failure!.time).toBeGreaterThan(1e-3);
    expectDataKept(r, [leg, yoke, bypass], [coil]);
    expectUnknownsNamed(r, ['leg']);
  });
});

describe('simulate: budgets, cancellation and progress', () => {
  it("'step-budget' after maxSteps, data kept", () => {
    const f = driven(sine({ amplitude: 1, frequency: 50 }));
    const r = simulate(f.net, { stopTime: 0.1, maxSteps: 5 });
    expect(r.status).toBe('step-budget');
    expect(r.message).toMatch(/maxSteps = 5/);
    expect(r.stats.acceptedSteps + r.stats.rejectedSteps).toBe(5);
    expect(r.time.length).toBe(r.stats.acceptedSteps + 1);
    expectDataKept(r, f.tubes, [f.coil]);
  });

  it("'time-budget' after maxWallTimeMs, data kept", () => {
    const slow = (t: number): number => {
      const until = performance.now() + 0.2;
      while (performance.now() < until);
      return Math.sin(2 * Math.PI * 50 * t);
    };
    const f = driven(userFunction({ name: 'slow', fn: slow }));
    // At least 0.2 ms per evaluation of f and thousands of evaluations to reach 1 s: far beyond 30 ms.
    const r = simulate(f.net, { stopTime: 1, rtol: 1e-10, maxWallTimeMs: 30 });
    expect(r.status).toBe('time-budget');
    expect(r.failure!.time).toBeLessThan(1);
    expectDataKept(r, f.tubes, [f.coil]);
  });

  it("'aborted' at once for a signal aborted before the call: the initial state only", () => {
    const f = driven(sine({ amplitude: 1, frequency: 50 }));
    const ac = new AbortController();
    ac.abort();
    const r = simulate(f.net, { stopTime: 0.1, signal: ac.signal });
    expect(r.status).toBe('aborted');
    expect(Array.from(r.time)).toEqual([0]);
    expectDataKept(r, f.tubes, [f.coil]);
  });

  it("'aborted' from the progress callback mid-run; progress fractions increase and end at the time reached", () => {
    const f = driven(sine({ amplitude: 1, frequency: 50 }));
    const ac = new AbortController();
    const seen: { time: number; fraction: number; steps: number }[] = [];
    const r = simulate(f.net, {
      stopTime: 0.1, rtol: 1e-10, signal: ac.signal, progressIntervalMs: 0,
      onProgress: (p) => {
        seen.push({ time: p.time, fraction: p.fraction, steps: p.steps });
        if (p.fraction > 0.3) ac.abort();
      },
    });
    expect(r.status).toBe('aborted');
    expect(r.failure!.time).toBeGreaterThan(0.03);
    expect(r.failure!.time).toBeLessThan(0.05);
    expectDataKept(r, f.tubes, [f.coil]);
    expect(seen.length).toBeGreaterThan(3);
    for (let k = 1; k < seen.length; k++) {
      expect(seen[k]!.fraction).toBeGreaterThanOrEqual(seen[k - 1]!.fraction);
      expect(seen[k]!.steps).toBeGreaterThanOrEqual(seen[k - 1]!.steps);
    }
    const last = seen[seen.length - 1]!;
    expect(last.time).toBe(r.failure!.time);
    expect(last.fraction).toBeCloseTo(r.failure!.time / 0.1, 12);
  });

  it('reports progress with increasing fractions in (0, 1], ending at 1, over a run with breakpoints', () => {
    const f = driven(userFunction({ name: 'stepped', fn: (t) => (t < 0.02 ? 0 : 1), breakpoints: [0.02, 0.05] }));
    const fractions: number[] = [];
    const r = simulate(f.net, { stopTime: 0.1, progressIntervalMs: 0, onProgress: (p) => fractions.push(p.fraction) });
    expect(r.status).toBe('success');
    expect(fractions.length).toBeGreaterThan(3);
    expect(fractions[0]!).toBeGreaterThan(0);
    for (let k = 1; k < fractions.length; k++) expect(fractions[k]!).toBeGreaterThanOrEqual(fractions[k - 1]!);
    expect(fractions[fractions.length - 1]).toBe(1);
  });
});
