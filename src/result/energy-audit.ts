import type { LossCategory, RateReader } from '../elements/element-kind.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import type { InputsInForce } from '../formulation/network-inputs.js';
import { evaluateRecordedStep, type RecordedStep } from '../simulation/recorded-step.js';
import { StepBuffer, type StepRecord } from '../simulation/step-record.js';

/** What the audit integrates: the run's steps, the inputs in force over each of its input intervals and its end states. */
export interface AuditInput {
  readonly steps: StepRecord;
  readonly intervals: readonly InputsInForce[];
  readonly start: Float64Array | undefined;
  readonly end: Float64Array | undefined;
  /** Projects an interpolated state onto the algebraic equations (absent: use the interpolant as is). */
  readonly project?: (t: number, y: Float64Array) => void;
}

/**
 * Energy balance of a run: what the sources delivered must equal what was
 * dissipated plus the change of stored energy (conservation of energy; for
 * the magnetic part, stored energy = volume * integral of H dB).
 * All energies in J.
 */
export interface EnergyAudit {
  /** Energy delivered by all sources. */
  readonly sourceEnergy: number;
  /** Energy dissipated, by kind. */
  readonly dissipated: {
    readonly total: number;
    /** Resistors and switches. */
    readonly resistors: number;
    /** Winding (copper) resistance. */
    readonly windings: number;
    /** Eddy-current resistance of tubes. */
    readonly eddy: number;
    /** Hysteresis loss inside hysteretic tubes (loop area x volume per cycle). */
    readonly hysteresis: number;
  };
  /** Stored energy (magnetic + capacitors + inductors) at the start and end. */
  readonly storedStart: number;
  readonly storedEnd: number;
  /** sourceEnergy - dissipated.total - (storedEnd - storedStart). */
  readonly imbalance: number;
  /**
   * Energy exchanged with the sources: integral of |source power| dt. The
   * scale of the audit when the net source energy is near zero (a lossless
   * run over whole cycles).
   */
  readonly throughput: number;
  /** |imbalance| / max(throughput, dissipated.total, storedStart, storedEnd). */
  readonly relativeError: number;
  /**
   * Eddy and hysteresis loss of every tube that has either, J (the same
   * quadrature as the totals; their sums are `dissipated.eddy` and
   * `dissipated.hysteresis`).
   */
  readonly byTube: readonly TubeLosses[];
}

/**
 * Losses of one flux tube over a run, J.
 *
 * @example
 * ```ts
 * const core: TubeLosses | undefined = result.energy().byTube.find((t) => t.tube === 'core');
 * ```
 */
export interface TubeLosses {
  /** The tube's name. */
  readonly tube: string;
  /** Eddy-current loss (R_e dphi/dt squared, integrated). */
  readonly eddy: number;
  /** Hysteresis loss (the tube's loss rate, integrated; loop area x volume per cycle). */
  readonly hysteresis: number;
}

// 4-point Gauss-Legendre nodes and weights on [0, 1] (Abramowitz and Stegun, Handbook of
// Mathematical Functions, table 25.4; mapped from [-1, 1]).
const G4_X = [0.3399810435848563, 0.8611363115940526];
const G4_W = [0.6521451548625461, 0.3478548451374538];
const NODES = [0.5 - G4_X[1]! / 2, 0.5 - G4_X[0]! / 2, 0.5 + G4_X[0]! / 2, 0.5 + G4_X[1]! / 2];
const WEIGHTS = [G4_W[1]! / 2, G4_W[0]! / 2, G4_W[0]! / 2, G4_W[1]! / 2];
/** Relative agreement of the halves with the whole that ends the subdivision of a step. */
const AUDIT_TOLERANCE = 1e-10;
/** Deepest subdivision of one step (2^8 panels). */
const MAX_DEPTH = 8;

/**
 * Integrate source power and losses over every accepted step with adaptive
 * 4-point Gauss-Legendre quadrature on the solver's dense output (panels
 * halved until they agree to 1e-10), the algebraic unknowns at each point
 * solved from the algebraic equations (projection), and compare with the
 * stored energy at both ends.
 *
 * @example
 * ```ts
 * const audit = computeEnergyAudit(compiled, { steps, intervals, start, end }, dphi, reader);
 * ```
 */
export function computeEnergyAudit(
  c: CompiledNetwork,
  run: AuditInput,
  fluxDerivative: (tube: number, y: Float64Array, t: number) => number,
  rates: RateReader,
): EnergyAudit {
  const inputs = c.inputs;
  const eddyTubes = c.tubes.flatMap((t, b) => (t.eddyResistance > 0 ? [b] : []));
  const sources = c.elements.filter((e) => e.sourcePower !== undefined);
  const lossy = c.elements.filter((e) => e.loss !== undefined);
  const storing = c.elements.filter((e) => e.storedEnergy !== undefined);
  const hysteretic = c.tubes.flatMap((t, b) => (t.lossPower !== undefined ? [b] : []));
  const slot: Record<LossCategory, number> = { resistors: 1, windings: 2, eddy: 3 };
  // Per-tube entries follow the six totals: eddy then hysteresis of each lossy tube (not in the
  // subdivision test, so the totals are integrated exactly as before).
  const lossyTubes = c.tubes.flatMap((t, b) => (t.eddyResistance > 0 || t.lossPower !== undefined ? [b] : []));
  const tubeSlot = new Map(lossyTubes.map((b, k) => [b, 6 + 2 * k]));
  const width = 6 + 2 * lossyTubes.length;

  /** [source, resistors, windings, eddy, |source|, hysteresis, per-tube eddy and hysteresis...] power at (t, y), W. */
  const powers = (t: number, y: Float64Array): number[] => {
    const p = new Array<number>(width).fill(0);
    for (const e of sources) {
      const w = e.sourcePower!(t, y, inputs, rates);
      p[0]! += w;
      p[4]! += Math.abs(w);
    }
    for (const e of lossy) p[slot[e.loss!.category]]! += e.loss!.power(t, y, inputs);
    for (const b of eddyTubes) {
      const dphi = fluxDerivative(b, y, t);
      const w = c.tubes[b]!.eddyResistance * dphi * dphi;
      p[3]! += w;
      p[tubeSlot.get(b)!]! += w;
    }
    for (const b of hysteretic) {
      const w = c.tubes[b]!.lossPower!(c.tubeFlux(y, b), y);
      p[5]! += w;
      p[tubeSlot.get(b)! + 1]! += w;
    }
    return p;
  };

  const stored = (y: Float64Array): number => {
    let w = 0;
    for (let b = 0; b < c.tubes.length; b++) w += c.tubeEnergy(b, c.tubeFlux(y, b), y);
    for (const e of storing) w += e.storedEnergy!(y);
    return w;
  };

  const sum = new Array<number>(width).fill(0);
  const y = new Float64Array(c.layout.size);
  /** 4-point Gauss-Legendre of the six power integrands over [a, b] of a step. */
  const gauss = (step: RecordedStep, a: number, b: number): number[] => {
    const out = new Array<number>(width).fill(0);
    const h = b - a;
    for (let g = 0; g < 4; g++) {
      const t = a + NODES[g]! * h;
      evaluateRecordedStep(step, t, c.index2, y);
      run.project?.(t, y);
      const pw = powers(t, y);
      for (let q = 0; q < width; q++) out[q]! += WEIGHTS[g]! * h * pw[q]!;
    }
    return out;
  };
  // Adaptive: a step's integrand (say the copper loss of a saturating winding over a long step) need
  // not be polynomial; halve until the halves agree with the whole to AUDIT_TOLERANCE of its energy.
  const adaptive = (step: RecordedStep, a: number, b: number, whole: number[], depth: number): number[] => {
    const m = 0.5 * (a + b);
    const left = gauss(step, a, m);
    const right = gauss(step, m, b);
    const halves = left.map((x, q) => x + right[q]!);
    const totals = halves.slice(0, 6);
    const size = Math.max(...totals.map(Math.abs), Number.MIN_VALUE);
    const change = Math.max(...totals.map((x, q) => Math.abs(x - whole[q]!)));
    panels += 2;
    // Stop on agreement, at the depth limit, when the work budget is spent, or on non-finite values
    // (a run that failed towards overflow: no subdivision makes those agree).
    if (depth >= MAX_DEPTH || panels > budget || !(change > AUDIT_TOLERANCE * size)) return halves;
    const l = adaptive(step, a, m, left, depth + 1);
    const r = adaptive(step, m, b, right, depth + 1);
    return l.map((x, q) => x + r[q]!);
  };
  // At most 64 panels per step on average over the run.
  const budget = 64 * run.steps.length;
  let panels = 0;
  // One buffer the steps are loaded into in turn (the audit holds one step at a time).
  const step = new StepBuffer(c.layout.size);
  for (let k = 0; k < run.steps.length; k++) {
    run.steps.load(k, step);
    if (step.t - step.tOld <= 0) continue;
    // The inputs recorded for the step's interval, for this step only (a live run keeps its own).
    const part = c.inputs.during(run.intervals[step.interval]!, () => adaptive(step, step.tOld, step.t, gauss(step, step.tOld, step.t), 0));
    for (let q = 0; q < width; q++) sum[q]! += part[q]!;
  }
  const storedStart = run.start ? stored(run.start) : 0;
  const storedEnd = run.end ? stored(run.end) : 0;
  const [sourceEnergy, resistors, windings, eddy, throughput, hysteresis] = sum as [number, number, number, number, number, number];
  const byTube = lossyTubes.map((b, k) => ({ tube: c.tubes[b]!.name, eddy: sum[6 + 2 * k]!, hysteresis: sum[7 + 2 * k]! }));
  const total = resistors + windings + eddy + hysteresis;
  const imbalance = sourceEnergy - total - (storedEnd - storedStart);
  const scale = Math.max(throughput, total, Math.abs(storedStart), Math.abs(storedEnd), Number.MIN_VALUE);
  return {
    sourceEnergy,
    dissipated: { total, resistors, windings, eddy, hysteresis },
    storedStart,
    storedEnd,
    imbalance,
    throughput,
    relativeError: Math.abs(imbalance) / scale,
    byTube,
  };
}
