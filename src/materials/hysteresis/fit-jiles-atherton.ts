import { InputError } from '../../errors.js';
import { MU0 } from '../../constants.js';
import { levenbergMarquardt, type LevenbergMarquardtStatus } from '../levenberg-marquardt.js';
import { inverseJilesAtherton, type HystereticMaterial, type JilesAthertonSpec } from './inverse-jiles-atherton.js';
import { advanceAlongPath, traceFluxDensityPath, type PathState } from './flux-density-path.js';
import { hysteresisLoopFeatures } from './hysteresis-loop-features.js';

/**
 * The five Jiles-Atherton parameters without the spec's kind and name.
 *
 * @example
 * ```ts
 * const start: JilesAthertonParameters = {
 *   saturationMagnetisation: 1.5e6, anhystereticShape: 800, pinning: 300, reversibility: 0.3, interdomainCoupling: 1e-3,
 * };
 * ```
 */
export type JilesAthertonParameters = Pick<
  JilesAthertonSpec,
  'saturationMagnetisation' | 'anhystereticShape' | 'pinning' | 'reversibility' | 'interdomainCoupling'
>;

/**
 * A measured descending branch of a symmetric major loop: samples (b_i, H_i)
 * from the positive tip down to the negative tip. The largest |b| is taken
 * as the loop's peak flux density.
 *
 * @example
 * ```ts
 * const branch: MeasuredLoopBranch = { fluxDensity: [1.5, 1.2, 0.6, 0, -0.6, -1.5], fieldStrength: [2700, 600, 40, -310, -390, -2700] };
 * ```
 */
export interface MeasuredLoopBranch {
  readonly fluxDensity: readonly number[];
  readonly fieldStrength: readonly number[];
  /** Name given to the fitted material. */
  readonly name?: string;
}

/**
 * Published or measured features of a symmetric major loop.
 *
 * @example
 * ```ts
 * const features: LoopFeatureData = {
 *   peakFluxDensity: 1.5, peakFieldStrength: 2742, coerciveField: 314, remanence: 0.624, saturationPolarisation: 2.01,
 * };
 * ```
 */
export interface LoopFeatureData {
  /** Peak flux density of the loop, T. */
  readonly peakFluxDensity: number;
  /** Field strength at the peak, A/m. */
  readonly peakFieldStrength: number;
  /** Coercive field, A/m. */
  readonly coerciveField: number;
  /** Remanent flux density, T. */
  readonly remanence: number;
  /** Saturation polarisation J_s = mu0 M_s, T (fixes M_s). */
  readonly saturationPolarisation: number;
  /** Name given to the fitted material. */
  readonly name?: string;
}

/**
 * Outcome of a Jiles-Atherton fit.
 *
 * @example
 * ```ts
 * const fit: JilesAthertonFit = fitLoopFeatures(features, { initial });
 * if (fit.converged) inverseJilesAtherton(fit.spec);
 * ```
 */
export interface JilesAthertonFit {
  readonly spec: JilesAthertonSpec;
  /** Largest relative residual (H error over the branch's largest |H|, or feature error over the feature). */
  readonly maxRelativeError: number;
  /** Root mean square of the relative residuals. */
  readonly rmsRelativeError: number;
  readonly iterations: number;
  readonly status: LevenbergMarquardtStatus;
  readonly converged: boolean;
}

/**
 * Options of the Jiles-Atherton fits.
 *
 * @example
 * ```ts
 * const options: JilesAthertonFitOptions = { initial: start, maxIterations: 100, stepsPerSegment: 800 };
 * ```
 */
export interface JilesAthertonFitOptions {
  /** Starting parameters (all positive; reversibility in (0, 1)). */
  readonly initial: JilesAthertonParameters;
  /** Levenberg-Marquardt iteration budget. Default 200. */
  readonly maxIterations?: number;
  /** Runge-Kutta steps per loop segment while fitting. Default 800. */
  readonly stepsPerSegment?: number;
}

/**
 * Fits all five Jiles-Atherton parameters to a measured descending branch
 * of a symmetric major loop: minimises the squared errors in H at the
 * measured flux densities (relative to the branch's largest |H|) of the
 * settled model loop between -b_peak and +b_peak. Parameters are fitted as
 * logarithms (reversibility as a logit) so they stay in their domain; the
 * solver is the project's Levenberg-Marquardt (src/materials/levenberg-marquardt.ts).
 *
 * @example
 * ```ts
 * const fit = fitHysteresisLoop(branch, { initial: start });
 * const model = inverseJilesAtherton(fit.spec);
 * ```
 */
export function fitHysteresisLoop(branch: MeasuredLoopBranch, options: JilesAthertonFitOptions): JilesAthertonFit {
  const bs = branch.fluxDensity;
  const hs = branch.fieldStrength;
  if (bs.length !== hs.length || bs.length < 5 || ![...bs, ...hs].every(Number.isFinite)) {
    throw new InputError(
      'bad-loop-data',
      `loop data '${branch.name ?? 'measured loop'}': give at least 5 finite (b, H) pairs of equal length`,
      [branch.name ?? 'measured loop'],
    );
  }
  for (let i = 1; i < bs.length; i++) {
    if (!(bs[i]! < bs[i - 1]!)) {
      throw new InputError(
        'bad-loop-data',
        `loop data '${branch.name ?? 'measured loop'}': flux densities must fall strictly along the descending branch (sample ${i})`,
        [branch.name ?? 'measured loop'],
      );
    }
  }
  const peak = Math.max(Math.abs(bs[0]!), Math.abs(bs[bs.length - 1]!));
  const scale = Math.max(...hs.map(Math.abs));
  const steps = options.stepsPerSegment ?? 800;
  const residuals = (q: Float64Array): Float64Array => {
    const model = modelOrUndefined(fromFitParameters(q), branch.name);
    if (model === undefined) return new Float64Array(bs.length).fill(Number.NaN);
    const h = descendingBranch(model, peak, bs, steps);
    return Float64Array.from(h, (v, i) => (v - hs[i]!) / scale);
  };
  return runFit(residuals, toFitParameters(options.initial), options, (q) => ({
    ...fromFitParameters(q),
    ...(branch.name !== undefined ? { name: branch.name } : {}),
  }));
}

/**
 * Fits the Jiles-Atherton parameters to loop features: M_s from the
 * saturation polarisation, alpha kept at its starting value, and (a, k, c)
 * so that the settled loop at the given peak flux density has the given
 * coercive field, remanence and peak field strength (three equations, three
 * unknowns; residuals relative to each feature).
 *
 * @example
 * ```ts
 * const fit = fitLoopFeatures(
 *   { peakFluxDensity: 1.5, peakFieldStrength: 2742, coerciveField: 314, remanence: 0.624, saturationPolarisation: 2.01 },
 *   { initial: start },
 * );
 * ```
 */
export function fitLoopFeatures(features: LoopFeatureData, options: JilesAthertonFitOptions): JilesAthertonFit {
  const label = features.name ?? 'loop features';
  for (const key of ['peakFluxDensity', 'peakFieldStrength', 'coerciveField', 'remanence', 'saturationPolarisation'] as const) {
    const v = features[key];
    if (!(v > 0) || !Number.isFinite(v)) {
      throw new InputError('bad-loop-data', `loop features '${label}': ${key} must be a finite number > 0 (got ${v})`, [label]);
    }
  }
  if (!(features.peakFluxDensity < features.saturationPolarisation + MU0 * features.peakFieldStrength)) {
    throw new InputError(
      'bad-loop-data',
      `loop features '${label}': the peak flux density exceeds J_s + mu0 H_peak; check the saturation polarisation`,
      [label],
    );
  }
  const ms = features.saturationPolarisation / MU0;
  const alpha = options.initial.interdomainCoupling;
  const steps = options.stepsPerSegment ?? 800;
  const full = (q: Float64Array): JilesAthertonParameters => ({
    saturationMagnetisation: ms,
    anhystereticShape: Math.exp(q[0]!),
    pinning: Math.exp(q[1]!),
    reversibility: 1 / (1 + Math.exp(-q[2]!)),
    interdomainCoupling: alpha,
  });
  const residuals = (q: Float64Array): Float64Array => {
    const model = modelOrUndefined(full(q), label);
    if (model === undefined) return Float64Array.of(Number.NaN, Number.NaN, Number.NaN);
    try {
      const f = hysteresisLoopFeatures(model, features.peakFluxDensity, { stepsPerSegment: steps });
      return Float64Array.of(
        f.coerciveField / features.coerciveField - 1,
        f.remanence / features.remanence - 1,
        f.peakFieldStrength / features.peakFieldStrength - 1,
      );
    } catch {
      return Float64Array.of(Number.NaN, Number.NaN, Number.NaN);
    }
  };
  const start = toFitParameters(options.initial);
  return runFit(residuals, [start[1]!, start[2]!, start[3]!], options, (q) => ({
    ...full(q),
    ...(features.name !== undefined ? { name: features.name } : {}),
  }));
}

function runFit(
  residuals: (q: Float64Array) => Float64Array,
  start: readonly number[],
  options: JilesAthertonFitOptions,
  toSpec: (q: Float64Array) => Omit<JilesAthertonSpec, 'kind'>,
): JilesAthertonFit {
  const result = levenbergMarquardt(
    { residuals, initial: start },
    { maxIterations: options.maxIterations ?? 200, stepTolerance: 1e-10, gradientTolerance: 1e-10, differenceStep: 1e-5 },
  );
  const r = result.residuals;
  let worst = 0;
  let sum = 0;
  for (const v of r) {
    worst = Math.max(worst, Math.abs(v));
    sum += v * v;
  }
  return {
    spec: { kind: 'jiles-atherton', ...toSpec(result.parameters) },
    maxRelativeError: worst,
    rmsRelativeError: Math.sqrt(sum / r.length),
    iterations: result.iterations,
    status: result.status,
    converged: result.converged,
  };
}

function toFitParameters(p: JilesAthertonParameters): number[] {
  const c = Math.min(Math.max(p.reversibility, 1e-6), 1 - 1e-6);
  return [
    Math.log(p.saturationMagnetisation),
    Math.log(p.anhystereticShape),
    Math.log(p.pinning),
    Math.log(c / (1 - c)),
    Math.log(Math.max(p.interdomainCoupling, 1e-9)),
  ];
}

function fromFitParameters(q: Float64Array): JilesAthertonParameters {
  return {
    saturationMagnetisation: Math.exp(q[0]!),
    anhystereticShape: Math.exp(q[1]!),
    pinning: Math.exp(q[2]!),
    reversibility: 1 / (1 + Math.exp(-q[3]!)),
    interdomainCoupling: Math.exp(q[4]!),
  };
}

function modelOrUndefined(p: JilesAthertonParameters, name: string | undefined): HystereticMaterial | undefined {
  try {
    return inverseJilesAtherton({ kind: 'jiles-atherton', ...p, ...(name !== undefined ? { name } : {}) });
  } catch {
    return undefined;
  }
}

/** H of the settled model loop on its descending branch at the given (falling) flux densities. */
function descendingBranch(model: HystereticMaterial, peak: number, bs: readonly number[], steps: number): Float64Array {
  const settle = traceFluxDensityPath(model, [0, peak, -peak, peak], { stepsPerSegment: steps });
  const last = settle.fluxDensity.length - 1;
  let state: PathState = { b: peak, m: settle.magnetisation[last]!, work: 0, loss: 0 };
  const maxStep = (2 * peak) / steps;
  const out = new Float64Array(bs.length);
  bs.forEach((target, i) => {
    const pieces = Math.max(1, Math.ceil(Math.abs(state.b - target) / maxStep));
    const from = state.b;
    for (let j = 1; j <= pieces; j++) state = advanceAlongPath(model, state, from + ((target - from) * j) / pieces);
    out[i] = model.fieldStrength(state.b, state.m);
  });
  return out;
}
