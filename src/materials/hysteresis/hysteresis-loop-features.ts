import { InputError } from '../../errors.js';
import type { HystereticMaterial } from './inverse-jiles-atherton.js';
import { advanceAlongPath, traceFluxDensityPath, type FluxDensityTrace, type PathState } from './flux-density-path.js';

/**
 * Features of a symmetric loop between -peak and +peak flux density, taken
 * from its last cycle (the model is started demagnetised and driven through
 * two full cycles first, so the loop has settled).
 *
 * @example
 * ```ts
 * const f: HysteresisLoopFeatures = hysteresisLoopFeatures(model, 1.5);
 * console.log(`Hc ${f.coerciveField.toFixed(1)} A/m, Br ${f.remanence.toFixed(4)} T`);
 * ```
 */
export interface HysteresisLoopFeatures {
  /** Peak flux density of the loop, T. */
  readonly peakFluxDensity: number;
  /** Field strength at the positive tip, A/m. */
  readonly peakFieldStrength: number;
  /** |H| where the descending branch crosses b = 0, A/m. */
  readonly coerciveField: number;
  /** b where the descending branch crosses H = 0, T. */
  readonly remanence: number;
  /** Loop area, the integral of H db over the last cycle, J/m^3. */
  readonly loopArea: number;
  /** Hysteresis loss density integrated over the last cycle, J/m^3 (equals the area). */
  readonly lossPerCycle: number;
  /** The whole trace (virgin curve, two settling cycles, last cycle). */
  readonly trace: FluxDensityTrace;
  /** Sample index where the last cycle starts (positive tip). */
  readonly lastCycleStart: number;
}

/**
 * Drives the material from the demagnetised state (b = 0, m = 0) to +peak,
 * then twice round -peak/+peak, and measures coercive field, remanence, tip
 * field, loop area and loss on the last cycle. Crossings are located to
 * round-off by bisection on a Runge-Kutta step from the nearest sample.
 *
 * @example
 * ```ts
 * const f = hysteresisLoopFeatures(model, 1.5, { stepsPerSegment: 4000 });
 * f.loopArea; // J/m^3 per cycle
 * ```
 */
export function hysteresisLoopFeatures(
  model: HystereticMaterial,
  peakFluxDensity: number,
  options: { readonly stepsPerSegment?: number } = {},
): HysteresisLoopFeatures {
  if (!(peakFluxDensity > 0) || !Number.isFinite(peakFluxDensity)) {
    throw new InputError(
      'bad-path',
      `loop of '${model.name}': peak flux density must be a finite number > 0 (got ${peakFluxDensity})`,
      [model.name],
    );
  }
  const bp = peakFluxDensity;
  const trace = traceFluxDensityPath(model, [0, bp, -bp, bp, -bp, bp], options);
  const start = trace.turningIndices[3]!;
  const bottom = trace.turningIndices[4]!;
  const end = trace.turningIndices[5]!;
  const stateAt = (i: number): PathState => ({
    b: trace.fluxDensity[i]!,
    m: trace.magnetisation[i]!,
    work: trace.work[i]!,
    loss: trace.loss[i]!,
  });
  // Descending branch: b falls from +bp (start) to -bp (bottom).
  const coerciveField = Math.abs(crossing(model, trace, start, bottom, (s) => s.b, stateAt));
  const remanenceState = crossingState(model, trace, start, bottom, (s) => model.fieldStrength(s.b, s.m), stateAt);
  return {
    peakFluxDensity: bp,
    peakFieldStrength: trace.fieldStrength[end]!,
    coerciveField,
    remanence: remanenceState.b,
    loopArea: trace.work[end]! - trace.work[start]!,
    lossPerCycle: trace.loss[end]! - trace.loss[start]!,
    trace,
    lastCycleStart: start,
  };
}

/** H at the point of the branch [from, to] where `level` changes sign. */
function crossing(
  model: HystereticMaterial,
  trace: FluxDensityTrace,
  from: number,
  to: number,
  level: (s: PathState) => number,
  stateAt: (i: number) => PathState,
): number {
  const s = crossingState(model, trace, from, to, level, stateAt);
  return model.fieldStrength(s.b, s.m);
}

/** The state where `level` changes sign along samples from..to, refined by bisection in b. */
function crossingState(
  model: HystereticMaterial,
  trace: FluxDensityTrace,
  from: number,
  to: number,
  level: (s: PathState) => number,
  stateAt: (i: number) => PathState,
): PathState {
  for (let i = from; i < to; i++) {
    const s0 = stateAt(i);
    const l0 = level(s0);
    if (l0 === 0) return s0;
    const s1 = stateAt(i + 1);
    if (Math.sign(level(s1)) !== Math.sign(l0)) {
      let lo = s0.b;
      let hi = s1.b;
      let best = s0;
      for (let it = 0; it < 200 && lo !== hi; it++) {
        const mid = 0.5 * (lo + hi);
        if (mid === lo || mid === hi) break;
        best = advanceAlongPath(model, s0, mid);
        if (Math.sign(level(best)) === Math.sign(l0)) lo = mid;
        else hi = mid;
      }
      return best;
    }
  }
  // Unreachable: the branch runs from +peak to -peak, where both b and H change sign.
  throw new Error(`loop of '${model.name}': internal error, no crossing on the descending branch`);
}
