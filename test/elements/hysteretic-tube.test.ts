import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MU0 } from '../../src/constants.js';
import { createNetwork, simulate, sine, type JilesAthertonSpec } from '../../src/index.js';
import { inverseJilesAtherton } from '../../src/materials/hysteresis/inverse-jiles-atherton.js';
import { magnetisationRate } from '../../src/materials/hysteresis/magnetisation-rate.js';
import { residualFluxDensity } from '../../src/materials/hysteresis/residual-flux-density.js';
import { hystereticTubeReadings } from '../../src/elements/hysteretic-tube-readings.js';
import { suggestedEddyCeiling } from '../../src/elements/hysteretic-tube.js';
import { Solver } from '../support/odex.js';

// Parameter set attributed to Jiles and Atherton 1986 (REFERENCES.md section 5, read secondary).
const JA: JilesAthertonSpec = {
  kind: 'jiles-atherton',
  name: 'JA 1986 set',
  saturationMagnetisation: 1.6e6,
  anhystereticShape: 1100,
  pinning: 400,
  reversibility: 0.2,
  interdomainCoupling: 1.6e-3,
};
const model = inverseJilesAtherton(JA);

// Our scenario (invented values): a core of two equal hysteretic tubes (leg and yoke, 0.15 m each,
// 1e-3 m^2, eddy resistance 5 mohm each), 200 turns (0.5 ohm), fed through a switch from a 50 Hz
// source of 1.5 T peak; a 1 kohm discharge resistor across the winding.
const AREA = 1e-3;
const LENGTH = 0.3; // both tubes
const EDDY = 0.01; // both tubes
const TURNS = 200;
const R_WINDING = 0.1;
const R_DISCHARGE = 1e3;
const ON = 1e-3;
const OFF = 1e9;
const OMEGA = 100 * Math.PI;
const AMPLITUDE = TURNS * AREA * OMEGA * 1.5;

interface Scenario {
  /** Source phase: v = A sin(omega t + phase). */
  readonly phase: number;
  /** Switch schedule: closed at 0, then toggles. */
  readonly schedule: readonly { readonly time: number; readonly closed: boolean }[];
  readonly stopTime: number;
  /** Eddy resistance of the two tubes together, ohm (default EDDY; 0: none). */
  readonly eddy?: number;
  /** Discharge resistor, ohm (default R_DISCHARGE). */
  readonly discharge?: number;
}

function network(s: Scenario) {
  const net = createNetwork('hysteretic core');
  net.magneticNode('bottom');
  net.magneticNode('top');
  const law = { kind: 'hysteretic' as const, length: LENGTH / 2, area: AREA, material: JA };
  const eddy = s.eddy ?? EDDY;
  const eddyOption = eddy > 0 ? { eddyResistance: eddy / 2 } : {};
  const leg = net.tube({ name: 'leg', from: 0, to: 1, ...eddyOption, law });
  const yoke = net.tube({ name: 'yoke', from: 1, to: 0, ...eddyOption, law });
  const line = net.node('line');
  const coil = net.node('coil');
  net.voltageSource('supply', line, net.ground, sine({ amplitude: AMPLITUDE, frequency: 50, phase: s.phase }));
  net.switch('breaker', line, coil, { onResistance: ON, offResistance: OFF, closed: true, schedule: s.schedule });
  net.resistor('discharge', coil, net.ground, s.discharge ?? R_DISCHARGE);
  const winding = net.winding('coil', { tube: leg, turns: TURNS, resistance: R_WINDING, plus: coil, minus: net.ground });
  return { net, leg, yoke, winding };
}

/** The same circuit as an ODE in (phi, m) for odex: see the derivation in the comment. */
function odexReference(s: Scenario, times: readonly number[]): number[][] {
  // KCL at the coil node: (v - v_w)/R_s = v_w/R_d + i; winding: v_w = R_w i + N phi';
  // loop: R_e phi' + l H = N i. Eliminating i and v_w gives phi' (derived).
  const rSwitch = (t: number): number => {
    let closed = true;
    for (const e of s.schedule) if (t >= e.time) closed = e.closed;
    return closed ? ON : OFF;
  };
  const out: number[][] = [];
  let y = [0, 0];
  let t = 0;
  const stops = [...s.schedule.map((e) => e.time), ...times].filter((x) => x > 0 && x <= s.stopTime).sort((p, q) => p - q);
  for (const stop of stops) {
    if (stop > t) {
      const rs = rSwitch(0.5 * (t + stop));
      const g = 1 / rs + 1 / (s.discharge ?? R_DISCHARGE);
      const eddy = s.eddy ?? EDDY;
      const f = (tt: number, yy: number[]): number[] => {
        const b = yy[0]! / AREA;
        const h = b / MU0 - yy[1]!;
        const v = AMPLITUDE * Math.sin(OMEGA * tt + s.phase);
        const k = g * R_WINDING + 1;
        const dphi = (v / rs - (k * LENGTH * h) / TURNS) / ((k * eddy) / TURNS + g * TURNS);
        return [dphi, magnetisationRate(model, b, yy[1]!, dphi / AREA)];
      };
      const solver = new Solver(2);
      solver.absoluteTolerance = [1e-15, 1e-5];
      solver.relativeTolerance = 1e-12;
      solver.maxSteps = 1e6;
      const r = solver.solve(f, t, y, stop);
      expect(r.outcome).toBe(0);
      y = r.y;
      t = stop;
    }
    if (times.includes(stop)) out.push([...y]);
  }
  return out;
}

// Tolerances: after the switch-off the coil node sits near -4 kV; with a voltage tolerance of 1e-7 V
// the round-off of that potential is about 1 tolerance unit, and the consistent re-initialisation at the
// switching instant then fails its damped-Newton monotonicity test on noise (status inconsistent-init;
// reported to the solver's owner). 1e-5 V keeps round-off below 1e-7 units.
const tight = { rtol: 1e-10, atol: { fluxDensity: 1e-10, current: 1e-8, voltage: 1e-5 }, maxSteps: 500_000 };

describe('hysteretic tube in a network', () => {
  it('agrees with odex on the same circuit to 1e-6 through energisation and switch-off', () => {
    const s: Scenario = { phase: Math.PI / 2, schedule: [{ time: 0.045, closed: false }], stopTime: 0.07 };
    const { net, leg } = network(s);
    const times = Array.from({ length: 69 }, (_, k) => 0.0005 + 0.001 * (k + 1)); // off the switching instant
    const r = simulate(net, { ...tight, stopTime: s.stopTime, sampling: { times } });
    expect(r.status).toBe('success');
    const ref = odexReference(s, times);
    const b = r.fluxDensity(leg);
    const m = hystereticTubeReadings(r, leg).magnetisation;
    let worstB = 0;
    let worstM = 0;
    times.forEach((time, k) => {
      const j = r.time.indexOf(time);
      expect(j).toBeGreaterThanOrEqual(0);
      worstB = Math.max(worstB, Math.abs(b[j]! - ref[k]![0]! / AREA));
      worstM = Math.max(worstM, Math.abs(m[j]! - ref[k]![1]!) / JA.saturationMagnetisation);
    });
    console.log(`network vs odex: max |dB| ${worstB.toExponential(2)} T, max |dm|/Ms ${worstM.toExponential(2)}`);
    expect(worstB).toBeLessThan(1e-6);
    expect(worstM).toBeLessThan(1e-6);
  });

  it('runs without eddy resistance where the winding fixes the flux rate: agrees with odex to 1e-6, settles after 1 Mohm', () => {
    // Same circuit and reference as above with R_e = 0 (the tube's flux rate comes from the voltage-fed winding).
    const s: Scenario = { phase: Math.PI / 2, schedule: [{ time: 0.045, closed: false }], stopTime: 0.07, eddy: 0 };
    const { net, leg } = network(s);
    const times = Array.from({ length: 69 }, (_, k) => 0.0005 + 0.001 * (k + 1));
    const r = simulate(net, { ...tight, stopTime: s.stopTime, sampling: { times } });
    expect(r.status).toBe('success');
    const ref = odexReference(s, times);
    const b = r.fluxDensity(leg);
    const m = hystereticTubeReadings(r, leg).magnetisation;
    let worstB = 0;
    let worstM = 0;
    times.forEach((time, k) => {
      const j = r.time.indexOf(time);
      worstB = Math.max(worstB, Math.abs(b[j]! - ref[k]![0]! / AREA));
      worstM = Math.max(worstM, Math.abs(m[j]! - ref[k]![1]!) / JA.saturationMagnetisation);
    });
    // Switch-off into 1 Mohm (was 'newton-failure' while the tube's state was m, see
    // test/materials/hysteresis/reversal-band.test.ts): settles at the loop's residual.
    const high: Scenario = { ...s, discharge: 1e6, stopTime: 0.08 };
    const h = network(high);
    const run = simulate(h.net, { ...tight, stopTime: high.stopTime, sampling: { times: [0.045, 0.08] } });
    expect(run.status).toBe('success');
    const bh = run.fluxDensity(h.leg);
    const at = (time: number) => run.time.indexOf(time);
    const expected = residualFluxDensity(model, bh[at(0.045)]!, hystereticTubeReadings(run, h.leg).magnetisation[at(0.045)]!, 1e-4);
    console.log(
      `no eddy: network vs odex max |dB| ${worstB.toExponential(2)} T, max |dm|/Ms ${worstM.toExponential(2)}; ` +
        `1 Mohm discharge settled at ${bh[at(0.08)]!.toFixed(6)} T, loop residual ${expected.toFixed(6)} T`,
    );
    expect(worstB).toBeLessThan(1e-6);
    expect(worstM).toBeLessThan(1e-6);
    expect(Math.abs(bh[at(0.08)]! - expected)).toBeLessThan(1e-5);
  });

  it('settles at the residual flux density the loop gives after an opening switch, and reports it per tube', () => {
    const s: Scenario = { phase: Math.PI / 2, schedule: [{ time: 0.045, closed: false }], stopTime: 0.08 };
    const { net, leg, yoke } = network(s);
    const r = simulate(net, { ...tight, stopTime: s.stopTime, sampling: { times: [0.045, 0.08] } });
    expect(r.status).toBe('success');
    const at = (k: number) => r.time.indexOf([0.045, 0.08][k]!);
    const legReadings = hystereticTubeReadings(r, leg);
    const b = r.fluxDensity(leg);
    const expected = residualFluxDensity(model, b[at(0)]!, legReadings.magnetisation[at(0)]!, 1e-4);
    console.log(`opened at B = ${b[at(0)]!.toFixed(4)} T: settled at ${b[at(1)]!.toFixed(6)} T, loop residual ${expected.toFixed(6)} T`);
    expect(Math.abs(b[at(1)]! - expected)).toBeLessThan(1e-5);
    // The reading at the opening instant already names where the tube will settle; the yoke carries the same flux.
    expect(Math.abs(legReadings.residualFluxDensity[at(0)]! - expected)).toBeLessThan(1e-5);
    expect(Math.abs(hystereticTubeReadings(r, yoke).residualFluxDensity[at(1)]! - b[at(1)]!)).toBeLessThan(1e-5);
  });

  it('books loop area x volume per cycle as hysteresis loss in the energy audit (1e-3), and the audit balances', () => {
    // Steady drive (voltage peak at t = 0); cycle 3 = difference of the audits of runs to 3 and 2 periods.
    const run = (cycles: number) => {
      const { net, leg } = network({ phase: Math.PI / 2, schedule: [], stopTime: 0.02 * cycles });
      return { leg, r: simulate(net, { ...tight, stopTime: 0.02 * cycles }) };
    };
    const two = run(2);
    const three = run(3);
    expect(three.r.status).toBe('success');
    const audit = three.r.energy();
    const lastCycle = audit.dissipated.hysteresis - two.r.energy().dissipated.hysteresis;
    // Loop area of cycle 3 by the trapezoid rule on the B-H trace (dense output of the run). H has kinks at
    // the reversals, so the rule converges at first order: Richardson on spacings h and h/2 (derived).
    const bAt = three.r.evaluator({ quantity: 'fluxDensity', handle: three.leg });
    const hAt = three.r.evaluator({ quantity: 'fieldStrength', handle: three.leg });
    const trapezoid = (count: number): number => {
      let area = 0;
      let bPrev = bAt(0.04);
      let hPrev = hAt(0.04);
      for (let k = 1; k <= count; k++) {
        const t = 0.04 + (0.02 * k) / count;
        const b = bAt(t);
        const h = hAt(t);
        area += 0.5 * (h + hPrev) * (b - bPrev);
        bPrev = b;
        hPrev = h;
      }
      return area * LENGTH * AREA;
    };
    const coarse = trapezoid(2000);
    const fine = trapezoid(4000);
    const extrapolated = 2 * fine - coarse;
    // The loop is not exactly closed (the drive's small offset still decays): stored-energy change (H db = dW + p dt).
    const w = (t: number): number => model.storedEnergyDensity(bAt(t), bAt(t) / MU0 - hAt(t)) * LENGTH * AREA;
    const storedChange = w(0.06) - w(0.04);
    console.log(
      `cycle 3: audit hysteresis ${lastCycle.toFixed(7)} J; loop area x volume: trapezoid ${coarse.toFixed(7)} (2000 points), ` +
        `${fine.toFixed(7)} (4000), extrapolated ${extrapolated.toFixed(7)} J; stored change ${storedChange.toExponential(2)} J; ` +
        `audit relative error ${audit.relativeError.toExponential(2)}`,
    );
    expect(Math.abs(lastCycle - coarse) / lastCycle).toBeLessThan(1e-3);
    expect(Math.abs(lastCycle - (extrapolated - storedChange)) / lastCycle).toBeLessThan(1e-5);
    expect(audit.relativeError).toBeLessThan(1e-6);
  });

  it('gives a larger inrush on re-energisation at the worst angle than the first energisation', () => {
    // First: demagnetised core, closed at a rising voltage zero (phase 0). Second: opened at the flux peak
    // (45 ms, residual +Br), closed again at 100 ms, also a rising voltage zero, driving flux further up.
    const peak = (s: Scenario, from: number): number => {
      const { net, winding } = network(s);
      const r = simulate(net, { rtol: 1e-7, stopTime: s.stopTime, maxSteps: 500_000 });
      expect(r.status).toBe('success');
      const i = r.current(winding);
      let best = 0;
      r.time.forEach((t, k) => {
        if (t >= from) best = Math.max(best, i[k]!);
      });
      return best;
    };
    const first = peak({ phase: 0, schedule: [], stopTime: 0.02 }, 0);
    const second = peak({ phase: 0, schedule: [{ time: 0.045, closed: false }, { time: 0.1, closed: true }], stopTime: 0.12 }, 0.1);
    console.log(`inrush peaks: first ${first.toFixed(1)} A, re-energised with residual flux ${second.toFixed(1)} A`);
    expect(second).toBeGreaterThan(1.2 * first);
  });

  it("rejects a hysteretic tube whose flux rate nothing fixes with 'hysteretic-tube-needs-eddy', naming it and only it", () => {
    // Wound hysteretic leg; the return path splits into a hysteretic tube and a leakage reluctance in
    // parallel: only the MMF balance sets how the flux divides, so the return tube's db/dt has no equation.
    const build = (returnEddy: number | undefined) => {
      const net = createNetwork('parallel return');
      net.magneticNode('a');
      net.magneticNode('b');
      const law = { kind: 'hysteretic' as const, length: LENGTH / 2, area: AREA, material: JA };
      const leg = net.tube({ name: 'leg', from: 0, to: 1, law });
      net.tube({ name: 'return', from: 1, to: 0, ...(returnEddy !== undefined ? { eddyResistance: returnEddy } : {}), law });
      net.tube({ name: 'leak', from: 1, to: 0, law: { kind: 'reluctance', reluctance: 1e7 } });
      const line = net.node('line');
      net.voltageSource('supply', line, net.ground, sine({ amplitude: AMPLITUDE, frequency: 50, phase: Math.PI / 2 }));
      net.winding('coil', { tube: leg, turns: TURNS, resistance: R_WINDING, plus: line, minus: net.ground });
      return net;
    };
    let error: { code?: string; elements?: readonly string[]; message?: string } = {};
    try {
      simulate(build(undefined), { stopTime: 0.01 });
    } catch (e) {
      error = e as typeof error;
    }
    expect(error.code).toBe('hysteretic-tube-needs-eddy');
    expect(error.elements).toEqual(['return']);
    // Why and how large: 0.01 l k / (omega B_sat A) = 0.01 x 0.15 x 400 / (100 pi x 2.0106 x 1e-3) = 0.95 ohm.
    expect(error.message).toMatch(/"return"/);
    expect(error.message).toMatch(/index 2/);
    expect(error.message).toMatch(/at most 0\.95 ohm/);
    // With an eddy resistance on the return tube alone the same network runs.
    expect(simulate(build(0.01), { stopTime: 0.01 }).status).toBe('success');
  });

  it("names every tube when an eddy resistance on some of them would do (wound centre leg, two unwound outer legs)", () => {
    const net = createNetwork('three legs');
    net.magneticNode('top');
    net.magneticNode('bottom');
    const law = { kind: 'hysteretic' as const, length: LENGTH / 2, area: AREA, material: JA };
    const centre = net.tube({ name: 'centre', from: 0, to: 1, law });
    net.tube({ name: 'left', from: 1, to: 0, law });
    net.tube({ name: 'right', from: 1, to: 0, law });
    const line = net.node('line');
    net.voltageSource('supply', line, net.ground, sine({ amplitude: AMPLITUDE, frequency: 50 }));
    net.winding('coil', { tube: centre, turns: TURNS, resistance: R_WINDING, plus: line, minus: net.ground });
    let error: { code?: string; elements?: readonly string[]; message?: string } = {};
    try {
      simulate(net, { stopTime: 0.01 });
    } catch (e) {
      error = e as typeof error;
    }
    expect(error.code).toBe('hysteretic-tube-needs-eddy');
    expect(error.elements).toEqual(['centre', 'left', 'right']);
    expect(error.message).toMatch(/on some of them/);
  });

  it('tells the tubes from another index-2 structure: a current-source-fed winding needs one, an unrelated one does not', () => {
    const core = (feed: 'current' | 'voltage') => {
      const net = createNetwork(`fed by ${feed}`);
      net.magneticNode('a');
      net.magneticNode('b');
      const law = { kind: 'hysteretic' as const, length: LENGTH / 2, area: AREA, material: JA };
      const leg = net.tube({ name: 'leg', from: 0, to: 1, law });
      net.tube({ name: 'yoke', from: 1, to: 0, law });
      const p = net.node('p');
      if (feed === 'current') net.currentSource('source', net.ground, p, sine({ amplitude: 2, frequency: 50 }));
      else net.voltageSource('source', p, net.ground, sine({ amplitude: AMPLITUDE, frequency: 50, phase: Math.PI / 2 }));
      net.winding('coil', { tube: leg, turns: TURNS, resistance: R_WINDING, plus: p, minus: net.ground });
      // A current source feeding an inductor: an inductive cut-set (index 2) of its own, which the solver treats.
      const q = net.node('q');
      net.currentSource('bias', net.ground, q, sine({ amplitude: 1, frequency: 50 }));
      net.inductor('choke', q, net.ground, 1e-3);
      return net;
    };
    let error: { code?: string; elements?: readonly string[] } = {};
    try {
      simulate(core('current'), { stopTime: 0.005 });
    } catch (e) {
      error = e as typeof error;
    }
    // The current source fixes H, not db/dt: an eddy resistance on either tube of the loop would do.
    expect(error.code).toBe('hysteretic-tube-needs-eddy');
    expect(error.elements).toEqual(['leg', 'yoke']);
    expect(simulate(core('voltage'), { stopTime: 0.005 }).status).toBe('success');
  });

  it('runs alike with eddy resistances from 1e-6 of the suggested ceiling up to the ceiling (the sizes the error message names)', () => {
    // Ceiling 0.01 l k / (omega B_sat A) for these tubes (l = 0.15 m, A = 1e-3 m^2, k = 400 A/m).
    const ceiling = suggestedEddyCeiling({ kind: 'hysteretic', length: LENGTH / 2, area: AREA, material: JA });
    expect(ceiling).toBeCloseTo(0.95, 2);
    const runs = [1e-6, 1e-3, 1].map((fraction) => {
      const net = createNetwork('eddy size');
      net.magneticNode('a');
      net.magneticNode('b');
      const law = { kind: 'hysteretic' as const, length: LENGTH / 2, area: AREA, material: JA };
      const leg = net.tube({ name: 'leg', from: 0, to: 1, eddyResistance: fraction * ceiling, law });
      net.tube({ name: 'yoke', from: 1, to: 0, eddyResistance: fraction * ceiling, law });
      const line = net.node('line');
      const coil = net.node('coil');
      net.voltageSource('supply', line, net.ground, sine({ amplitude: AMPLITUDE, frequency: 50, phase: Math.PI / 2 }));
      net.switch('breaker', line, coil, { onResistance: ON, offResistance: OFF, closed: true, schedule: [{ time: 0.045, closed: false }] });
      net.resistor('discharge', coil, net.ground, R_DISCHARGE);
      net.winding('coil', { tube: leg, turns: TURNS, resistance: R_WINDING, plus: coil, minus: net.ground });
      const r = simulate(net, { stopTime: 0.07 });
      expect(r.status).toBe('success');
      const audit = r.energy();
      return { b: r.fluxDensity(leg).at(-1)!, eddy: audit.dissipated.eddy, hysteresis: audit.dissipated.hysteresis };
    });
    console.log(`eddy 1e-6 / 1e-3 / 1 x ceiling: residual ${runs.map((x) => x.b.toFixed(6)).join(' / ')} T, eddy/hysteresis loss ${runs.map((x) => (x.eddy / x.hysteresis).toExponential(1)).join(' / ')}`);
    for (const run of runs) expect(Math.abs(run.b - runs[0]!.b)).toBeLessThan(1e-5);
    // At the ceiling the eddy loss stays near 1 % of the loop loss (measured 1.3 %).
    expect(runs[2]!.eddy / runs[2]!.hysteresis).toBeLessThan(0.02);
  });

  it("reads no hysteresis from a tube of another kind: 'not-hysteretic'", () => {
    const net = createNetwork('plain');
    net.magneticNode('a');
    net.magneticNode('b');
    const linear = { kind: 'material' as const, length: 0.1, area: AREA, material: { kind: 'linear' as const, relativePermeability: 1000 } };
    const core = net.tube({ name: 'core', from: 0, to: 1, law: linear });
    net.tube({ name: 'back', from: 1, to: 0, law: linear });
    const line = net.node('line');
    net.voltageSource('supply', line, net.ground, sine({ amplitude: 1, frequency: 50 }));
    net.winding('coil', { tube: core, turns: 10, resistance: 1, plus: line, minus: net.ground });
    const r = simulate(net, { stopTime: 0.001 });
    expect(() => hystereticTubeReadings(r, core)).toThrow(/not a hysteretic tube/);
    try {
      hystereticTubeReadings(r, core);
    } catch (e) {
      expect((e as { code: string }).code).toBe('not-hysteretic');
    }
  });
});

describe('hysteretic tube as plain data', () => {
  it('survives describe -> JSON -> simulate(description) with the same result as the builder run', () => {
    const { net, leg } = network({ phase: Math.PI / 2, schedule: [], stopTime: 0.01 });
    const description = JSON.parse(JSON.stringify(net.describe()));
    const a = simulate(net, { stopTime: 0.01, sampling: { times: [0.01] } });
    const b = simulate(description, { stopTime: 0.01, sampling: { times: [0.01] } });
    expect(b.status).toBe('success');
    expect(b.fluxDensity(leg).at(-1)).toBe(a.fluxDensity(leg).at(-1));
  });
});

describe('energy conservation with hysteretic tubes (property)', () => {
  it('the audit balances and the hysteresis loss is positive for random drives, switch-off instants and eddy resistances', () => {
    // Conservation of energy: sources = dissipated (copper, resistors, eddy, hysteresis) + stored change.
    fc.assert(
      fc.property(
        fc.double({ min: 0.3, max: 1.8, noNaN: true }), // peak flux density of the drive, T
        fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), // source phase
        fc.double({ min: 0.012, max: 0.038, noNaN: true }), // switch-off instant, s
        fc.double({ min: 1e-3, max: 0.05, noNaN: true }), // eddy resistance of each tube, ohm
        (peak, phase, tOpen, eddy) => {
          const net = createNetwork('random drive');
          net.magneticNode('a');
          net.magneticNode('b');
          const law = { kind: 'hysteretic' as const, length: LENGTH / 2, area: AREA, material: JA };
          const leg = net.tube({ name: 'leg', from: 0, to: 1, eddyResistance: eddy, law });
          net.tube({ name: 'yoke', from: 1, to: 0, eddyResistance: eddy, law });
          const line = net.node('line');
          const coil = net.node('coil');
          net.voltageSource('supply', line, net.ground, sine({ amplitude: TURNS * AREA * OMEGA * peak, frequency: 50, phase }));
          net.switch('breaker', line, coil, { onResistance: ON, offResistance: OFF, closed: true, schedule: [{ time: tOpen, closed: false }] });
          net.resistor('discharge', coil, net.ground, R_DISCHARGE);
          net.winding('coil', { tube: leg, turns: TURNS, resistance: R_WINDING, plus: coil, minus: net.ground });
          // With the default flux-density tolerance (1e-7 T) small drives leave audits off by up to 2.6e-5
          // (measured; tolerance-bound: 1e-9 T brings the same case to 8e-8). Bound 1e-5 at these tolerances.
          const r = simulate(net, { stopTime: 0.05, rtol: 1e-8, atol: { fluxDensity: 1e-9, voltage: 1e-5, current: 1e-8 } });
          expect(r.status).toBe('success');
          const audit = r.energy();
          expect(audit.relativeError).toBeLessThan(1e-5);
          expect(audit.dissipated.hysteresis).toBeGreaterThan(0);
        },
      ),
      { numRuns: 6, seed: 20261204 },
    );
  });
});
