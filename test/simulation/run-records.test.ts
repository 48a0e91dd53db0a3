/**
 * What a run records, stored as rows of numbers in one growing buffer
 * (Float64Rows, SampleRecord, StepRecord) instead of an object and a typed array per
 * sample and per step: the rows read back the solver's states bit for bit,
 * the memory they hold is bounded by the count of numbers recorded, and a
 * result taken from a live run does not change as the run goes on.
 */
import { describe, expect, it } from 'vitest';
import { constant, createNetwork, createStepper, MU0, simulate } from '../../src/index.js';
import { acceptNetwork } from '../../src/simulation/accept-network.js';
import { Float64Rows } from '../../src/simulation/float64-rows.js';
import { NetworkRun } from '../../src/simulation/network-run.js';
import { SampleRecord } from '../../src/simulation/sample-record.js';
import { StepBuffer, StepRecord } from '../../src/simulation/step-record.js';

// A winding on a linear core in series with its resistance, switched onto 10 V: an RL circuit with
// L = N^2 / R_m (magnetic circuit law, R_m = l / (mu0 mu_r A)); test values of our own. Its step response
// i(t) = (V/R)(1 - exp(-t R / L)) is the first-order RL solution of any circuits textbook (for instance
// Alexander and Sadiku, Fundamentals of Electric Circuits, sect. 7.6).
const N = 100;
const AREA = 1e-3;
const MUR = 2000;
const PATH = 0.3;
const L = (N * N) / (PATH / (MU0 * MUR * AREA));
const R = 2;
const V = 10;
const TAU = L / R;

function rl() {
  const net = createNetwork('rl step');
  const [top, bottom] = [net.magneticNode('top'), net.magneticNode('bottom')];
  const material = { kind: 'linear', relativePermeability: MUR } as const;
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: PATH / 2, area: AREA, material });
  net.fluxTube('yoke', { from: top, to: bottom, length: PATH / 2, area: AREA, material });
  const a = net.node('a');
  net.voltageSource('drive', a, net.ground, constant(V));
  const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: a, minus: net.ground });
  return { net, coil };
}

/** The RL circuit run by a NetworkRun directly, with the solver's state after every step captured. */
function recordedRun(stop: number, interpolants = true, steps = true) {
  const { net, coil } = rl();
  const { compiled } = acceptNetwork(net, 'test');
  const run = new NetworkRun(compiled, { t0: 0, horizon: stop, rtol: 1e-8, atol: 1e-8 });
  const solverStates: { t: number; y: Float64Array }[] = [];
  run.advanceTo(stop, { steps, interpolants, onStep: (t) => solverStates.push({ t, y: run.y }) });
  return { run, compiled, coil, solverStates };
}

describe('Float64Rows (rows of numbers in blocks that double)', () => {
  it('reads back every entry as the buffer grows, and truncation drops rows', () => {
    // Width 3, a first block of 8 numbers: blocks of 2, 4, 8, ... rows; 40 rows span five blocks.
    const rows = new Float64Rows(3, 8);
    expect(rows.firstRows).toBe(2);
    for (let k = 0; k < 40; k++) {
      const r = rows.pushZeros();
      for (let j = 0; j < 3; j++) rows.set(r, j, 10 * k + j);
    }
    expect(rows.length).toBe(40);
    expect([0, 1, 2, 5, 6, 13, 14, 29, 30, 39].map((k) => rows.blockIndex(k))).toEqual([0, 0, 1, 1, 2, 2, 3, 3, 4, 4]);
    for (let k = 0; k < 40; k++) for (let j = 0; j < 3; j++) expect(rows.get(k, j)).toBe(10 * k + j);
    rows.truncate(3);
    expect(rows.length).toBe(3);
    expect(rows.storedNumbers).toBe((2 + 4) * 3);
    // A row pushed after a truncation starts at zero, not at what the dropped row held.
    const r = rows.pushZeros();
    expect([rows.get(r, 0), rows.get(r, 1), rows.get(r, 2)]).toEqual([0, 0, 0]);
  });

  it('holds less than twice the numbers recorded plus its first block (memory by count of numbers)', () => {
    const width = 7;
    // Past 63 first blocks the blocks stop doubling (64 first blocks each): the bound holds there too.
    for (const count of [1, 10, 1000, 12345, 60000]) {
      const rows = new Float64Rows(width, 100);
      for (let k = 0; k < count; k++) rows.pushZeros();
      expect(rows.storedNumbers).toBeGreaterThanOrEqual(count * width);
      expect(rows.storedNumbers).toBeLessThan(2 * count * width + rows.firstRows * width);
      // Every row reads back as zero (nothing written).
      expect(rows.get(count - 1, width - 1)).toBe(0);
    }
  });

  it('keeps a snapshot unchanged while the table goes on, is truncated and written again', () => {
    // Blocks of 3, 6, 12... rows: the snapshot's five rows end inside the second block.
    const rows = new Float64Rows(2, 6);
    for (let k = 0; k < 5; k++) {
      const r = rows.pushZeros();
      rows.set(r, 0, k);
      rows.set(r, 1, -k);
    }
    const snap = rows.snapshot();
    rows.set(4, 1, 99); // a correction of the last row, which the snapshot holds
    rows.pushZeros(); // appended in a block the snapshot shares, past its rows
    rows.set(5, 0, 55);
    rows.truncate(2);
    for (let k = 0; k < 4; k++) rows.set(rows.pushZeros(), 0, 100 + k);
    expect(snap.length).toBe(5);
    for (let k = 0; k < 5; k++) expect([snap.get(k, 0), snap.get(k, 1)]).toEqual([k, -k]);
    expect([rows.get(1, 0), rows.get(4, 0), rows.get(5, 0)]).toEqual([1, 102, 103]);
  });
});

describe('SampleRecord.stateEquals (bit for bit)', () => {
  // IEEE 754-2019: +0 and -0 compare equal (sect. 5.11) but 1/+0 = +Infinity and 1/-0 = -Infinity
  // (sect. 7.3, division by zero), NaN is unequal to everything (sect. 5.11): a state is "the same"
  // only when every entry has the same bits, signed zeros told apart.
  const record = new SampleRecord(4);
  record.push(0, 0, Float64Array.of(0, -0, Infinity, 2.5e-300));
  it('holds for the same bits, zeros, signed zeros and infinities included', () => {
    expect(record.stateEquals(0, Float64Array.of(0, -0, Infinity, 2.5e-300))).toBe(true);
  });
  it('fails on a zero of the other sign, in either entry', () => {
    expect(record.stateEquals(0, Float64Array.of(-0, -0, Infinity, 2.5e-300))).toBe(false);
    expect(record.stateEquals(0, Float64Array.of(0, 0, Infinity, 2.5e-300))).toBe(false);
  });
  it('fails on another value, an infinity of the other sign, and NaN', () => {
    expect(record.stateEquals(0, Float64Array.of(0, -0, Infinity, 2.5000000000000003e-300))).toBe(false);
    expect(record.stateEquals(0, Float64Array.of(0, -0, -Infinity, 2.5e-300))).toBe(false);
    const withNaN = new SampleRecord(1);
    withNaN.push(0, 0, Float64Array.of(NaN));
    expect(withNaN.stateEquals(0, Float64Array.of(NaN))).toBe(false);
  });
});

describe('a run records its samples and steps as rows', () => {
  const stop = 5 * TAU;
  const { run, coil, compiled, solverStates } = recordedRun(stop);
  const samples = run.sampleRecord;

  it("reads back the solver's state at every step end, bit for bit", () => {
    // Steps recorded: the start sample, then one sample per step end (no breakpoints in a constant drive).
    expect(samples.length).toBe(solverStates.length + 1);
    const y = new Float64Array(samples.size);
    solverStates.forEach((s, k) => {
      expect(samples.time(k + 1)).toBe(s.t);
      expect(Array.from(samples.state(k + 1, y))).toEqual(Array.from(s.y));
    });
    expect(run.samples.map((x) => x.t)).toEqual(Array.from({ length: samples.length }, (_, k) => samples.time(k)));
  });

  it('follows the RL step response at the recorded samples', () => {
    const i = compiled.layout.branchCurrent[coil.index]!;
    for (let k = 0; k < samples.length; k++) {
      const t = samples.time(k);
      // At solver accuracy (rtol 1e-8): 1e-6 of the final current.
      expect(Math.abs(samples.value(k, i) - (V / R) * (1 - Math.exp(-t / TAU)))).toBeLessThan(1e-6 * (V / R));
    }
  });

  it('keeps every step: each starts where the last ended, its polynomial ends on the recorded state', () => {
    const steps = run.stepRecord;
    expect(steps.length).toBe(solverStates.length);
    const step = new StepBuffer(steps.size);
    for (let k = 0; k < steps.length; k++) {
      steps.load(k, step);
      expect(step.t).toBe(solverStates[k]!.t);
      if (k > 0) expect(step.tOld).toBe(steps.t(k - 1));
      // The collocation polynomial at s = 1 is the step's end (Radau IIA: the last stage is the end point).
      const n = steps.size;
      for (let j = 0; j < n; j++) {
        const end = step.yOld[j]! + step.q[j]! + step.q[n + j]! + step.q[2 * n + j]!;
        expect(Math.abs(end - solverStates[k]!.y[j]!)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(end)));
      }
    }
  });

  it('keeps a start state of its own for steps that start on no sample (a run keeping steps, not samples)', () => {
    const other = recordedRun(stop, true, false);
    const steps = other.run.stepRecord;
    expect(other.run.sampleRecord.length).toBe(0);
    expect(steps.length).toBe(other.solverStates.length);
    const step = new StepBuffer(steps.size);
    for (let k = 1; k < steps.length; k++) {
      // Bit for bit the solver's state at the previous step's end.
      expect(Array.from(steps.load(k, step).yOld)).toEqual(Array.from(other.solverStates[k - 1]!.y));
    }
  });

  it('holds memory in proportion to the numbers recorded, and one block of steps when streaming', () => {
    const n = samples.size;
    const sampleRows = new SampleRecord(n);
    const stepRows = new StepRecord(n, sampleRows);
    // Per sample its time, interval and state; per step its span, interval, flag, where its start state
    // is and 3n coefficients: less than twice those numbers plus the first block (16384 numbers). Every
    // step here starts on a kept sample (no breakpoints, no index-2 unknowns): no start state is copied.
    expect(samples.storedNumbers).toBeLessThan(2 * samples.length * (n + 2) + 16384);
    expect(run.stepRecord.storedNumbers).toBeLessThan(2 * run.stepRecord.length * (3 * n + 6) + 16384);
    // Nothing before the first row.
    expect(sampleRows.storedNumbers + stepRows.storedNumbers).toBe(0);
    const streamed = recordedRun(stop, false).run;
    expect(streamed.stepRecord.length).toBe(1);
    expect(streamed.stepRecord.storedNumbers).toBeLessThanOrEqual(16384);
  });
});

describe('a result taken from a live run', () => {
  it('does not change as the stepper goes on, or goes back to a snapshot and on again', () => {
    const { net, coil } = rl();
    const i = acceptNetwork(net, 'test').compiled.layout.branchCurrent[coil.index]!;
    const stepper = createStepper(net, { rtol: 1e-8, horizon: 4 * TAU });
    stepper.advanceTo(TAU);
    const back = stepper.snapshot();
    stepper.advanceTo(2 * TAU);
    const early = stepper.result();
    // Copies of what the early result holds now.
    const time = Array.from(early.time);
    const states = time.map((_, k) => Array.from(early.state(k)));
    // Back to TAU (the record past it is dropped: rows shared with the early result), then on to 3 TAU.
    stepper.restore(back);
    stepper.advanceTo(3 * TAU);
    const later = stepper.result();
    expect(Array.from(early.time)).toEqual(time);
    time.forEach((_, k) => expect(Array.from(early.state(k))).toEqual(states[k]));
    // First read of the current after the run went on: from the states as they were.
    const current = early.current(coil);
    time.forEach((_, k) => expect(current[k]).toBe(states[k]![i]));
    // Both follow the RL step response (Alexander and Sadiku, sect. 7.6).
    for (const r of [early, later]) {
      const c = r.current(coil);
      r.time.forEach((t, k) => expect(Math.abs(c[k]! - (V / R) * (1 - Math.exp(-t / TAU)))).toBeLessThan(1e-6 * (V / R)));
    }
    expect(later.time[later.length - 1]).toBe(3 * TAU);
    expect(early.time[early.length - 1]).toBe(2 * TAU);
  });
});
