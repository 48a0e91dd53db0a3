import { InputError } from './errors.js';
import { checkedInitialState } from './simulation/checked-initial-state.js';
import { acceptNetwork, type NetworkInput } from './simulation/accept-network.js';
import { finitenessCheck } from './simulation/finiteness-check.js';
import { NetworkRun, timeTolerance } from './simulation/network-run.js';
import { checkSolverSettings, resolveSolverSettings, type SolverSettings } from './simulation/solver-settings.js';
import { resultFromRun, type SimulationResult } from './result/simulation-result.js';
import { sanityWarnings } from './analysis/sanity-warnings.js';

export type { AbsoluteTolerances, SolverSettings } from './simulation/solver-settings.js';
export type { NetworkInput } from './simulation/accept-network.js';

/**
 * How the result is sampled in time. Grid samples are evaluated on the
 * collocation polynomial of the step that contains them (third-order
 * interpolation between steps, cheap) unless `exact` is true, which makes
 * the solver stop at every sample (full solver accuracy at the samples, more
 * steps when the grid is finer than the steps the solver would take).
 */
export type Sampling =
  /** The solver's accepted steps (default): non-uniform, at full solver accuracy. */
  | 'steps'
  /** A uniform grid, optionally merged with the solver's steps. */
  | { readonly interval: number; readonly includeSteps?: boolean; readonly exact?: boolean }
  /** Given times, optionally merged with the solver's steps. */
  | { readonly times: ArrayLike<number>; readonly includeSteps?: boolean; readonly exact?: boolean };

/** Progress of a simulation, passed to {@link SimulateOptions.onProgress}. */
export interface SimulationProgress {
  /** Simulated time reached, s. */
  readonly time: number;
  readonly stopTime: number;
  /** Fraction done, 0..1. */
  readonly fraction: number;
  /** Accepted solver steps so far. */
  readonly steps: number;
}

/**
 * Options of {@link simulate}: the shared {@link SolverSettings} (rtol
 * default 1e-6, maxSteps default 1e6) plus the span, the sampling and
 * progress reports.
 *
 * @example
 * ```ts
 * const options: SimulateOptions = { stopTime: 0.1, rtol: 1e-7, sampling: { interval: 1e-4 } };
 * ```
 */
export interface SimulateOptions extends SolverSettings {
  /** End of the simulated interval, s. */
  readonly stopTime: number;
  /** Start, s. Default 0. */
  readonly startTime?: number;
  /** Output sampling. Default `'steps'`. */
  readonly sampling?: Sampling;
  /** Progress callback, called at most every `progressIntervalMs`. */
  readonly onProgress?: (progress: SimulationProgress) => void;
  /** Minimum wall time between progress calls, ms. Default 200. */
  readonly progressIntervalMs?: number;
  /**
   * Raw state vector to start from instead of the network's initial
   * conditions (for example the end state of an earlier run, or a periodic
   * steady state); its algebraic part is made consistent.
   */
  readonly initialState?: ArrayLike<number>;
  /**
   * Keep every solver step's polynomial (default true): the result can then
   * be evaluated at any time (`evaluator`) and audited (`energy`). With
   * false only the samples are kept, computed as the run goes from the step
   * that contains them, so memory follows the sampling grid instead of the
   * number of steps (a long run on a coarse grid); `energy` and `evaluator`
   * then refuse with `steps-not-kept`.
   */
  readonly keepSteps?: boolean;
}

/**
 * Simulate a network in the time domain.
 *
 * Never throws for numerical trouble: the result's `status` says whether the
 * run reached `stopTime`, and it holds everything computed up to the last
 * accepted step. Throws `InputError` / `TopologyError` for a model or option
 * that cannot be simulated, naming the elements and the fix.
 *
 * @example
 * ```ts
 * const result = simulate(net, { stopTime: 0.1, sampling: { interval: 1e-4 } });
 * if (result.status !== 'success') console.warn(result.message);
 * const b = result.fluxDensity(leg); // Float64Array, T
 * ```
 */
export function simulate(network: NetworkInput, options: SimulateOptions): SimulationResult {
  if (network === null || typeof network !== 'object') {
    throw new InputError('bad-option', `simulate: the first argument must be a network (builder or description), got ${String(network)}`, ['network']);
  }
  if (options === null || typeof options !== 'object') {
    throw new InputError('bad-option', `simulate: options must be an object with at least stopTime, got ${String(options)}`, ['options']);
  }
  const t0 = options.startTime ?? 0;
  const tEnd = options.stopTime;
  checkOptions(options, t0, tEnd);
  const { compiled, networkId } = acceptNetwork(network, 'simulate');
  const sampleTimes = samplingTimes(options.sampling, t0, tEnd);
  let lastProgress = -Infinity;
  const run = new NetworkRun(compiled, {
    t0,
    horizon: tEnd,
    ...resolveSolverSettings(compiled, options, { rtol: 1e-6, maxSteps: 1e6 }),
    check: finitenessCheck(compiled),
    ...(options.initialState ? { initialState: checkedInitialState(compiled, options.initialState, 'simulate options') } : {}),
  });
  const progress = (t: number): void => {
    if (!options.onProgress) return;
    const now = Date.now();
    if (now - lastProgress < (options.progressIntervalMs ?? 200)) return;
    lastProgress = now;
    options.onProgress({ time: t, stopTime: tEnd, fraction: (t - t0) / (tEnd - t0), steps: run.stats.acceptedSteps });
  };
  run.advanceTo(tEnd, {
    steps: includeSteps(options.sampling),
    sampleTimes,
    exact: exactSampling(options.sampling),
    interpolants: options.keepSteps ?? true,
    onStep: progress,
  });
  if (options.onProgress) {
    options.onProgress({ time: run.t, stopTime: tEnd, fraction: (run.t - t0) / (tEnd - t0), steps: run.stats.acceptedSteps });
  }
  // Values far outside practical ranges (a core given in metres where millimetres were meant) run, but say so.
  const sanity = sanityWarnings(compiled.description).map((w) => w.message);
  return resultFromRun(compiled, networkId, run, `reached t = ${tEnd} s`, sanity);
}

function checkOptions(o: SimulateOptions, t0: number, tEnd: number): void {
  const bad = (code: string, text: string): never => {
    throw new InputError(code, `simulate options: ${text}`, ['options']);
  };
  if (!Number.isFinite(t0)) bad('bad-option', `startTime ${t0} is not finite`);
  if (!Number.isFinite(tEnd) || tEnd <= t0) bad('bad-time-span', `stopTime ${tEnd} s must be a finite time after startTime ${t0} s`);
  checkSolverSettings(o, 'simulate options');
  if (o.onProgress !== undefined && typeof o.onProgress !== 'function') bad('bad-option', `onProgress must be a function, got ${typeof o.onProgress}`);
  if (o.progressIntervalMs !== undefined && !(o.progressIntervalMs >= 0)) bad('bad-option', `progressIntervalMs ${o.progressIntervalMs} must be >= 0`);
  if (o.keepSteps !== undefined && typeof o.keepSteps !== 'boolean') bad('bad-option', `keepSteps must be true or false, got ${String(o.keepSteps)}`);
  const s = o.sampling;
  if (s !== undefined && s !== 'steps' && (typeof s !== 'object' || s === null || (!('interval' in s) && !('times' in s)))) {
    bad('bad-option', `sampling must be 'steps', { interval } or { times }, got ${JSON.stringify(s)}`);
  }
}

/** Most samples a grid may ask for (a finer grid is almost surely a unit mistake). */
const MAX_GRID_SAMPLES = 1e7;

function samplingTimes(s: Sampling | undefined, t0: number, tEnd: number): number[] {
  if (s === undefined || s === 'steps') return [];
  if ('interval' in s) {
    if (!(s.interval > 0) || !Number.isFinite(s.interval)) {
      throw new InputError('bad-option', `simulate options: sampling interval ${s.interval} s must be a positive number`, ['options']);
    }
    const count = Math.floor((tEnd - t0) / s.interval + 1e-9);
    if (!(count < MAX_GRID_SAMPLES)) {
      throw new InputError(
        'bad-option',
        `simulate options: sampling interval ${s.interval} s over ${tEnd - t0} s asks for ${count.toExponential(2)} samples (more than ${MAX_GRID_SAMPLES}); check the units or sample the solver's steps`,
        ['options'],
      );
    }
    const times = Array.from({ length: count + 1 }, (_, k) => t0 + k * s.interval);
    if (times[times.length - 1]! < tEnd - 1e-12 * Math.abs(tEnd)) times.push(tEnd);
    return times;
  }
  return sortedSampleTimes(s.times, t0, tEnd);
}

function includeSteps(s: Sampling | undefined): boolean {
  if (s === undefined || s === 'steps') return true;
  return s.includeSteps ?? false;
}

function exactSampling(s: Sampling | undefined): boolean {
  return s !== undefined && s !== 'steps' && (s.exact ?? false);
}

/**
 * Given sampling times, sorted and without repeats (a repeated time, natural
 * when grids of half-periods share end points, is one sample); a time
 * outside [t0, tEnd] or not a finite number is refused, never dropped.
 * Times within round-off of each other (see `timeTolerance`) count as one
 * instant: the first is kept.
 */
function sortedSampleTimes(given: ArrayLike<number>, t0: number, tEnd: number): number[] {
  if (given === null || typeof given !== 'object' || typeof given.length !== 'number') {
    throw new InputError('bad-option', `simulate options: sampling times must be an array of numbers, got ${String(given)}`, ['options']);
  }
  const times = Array.from(given);
  times.forEach((t, k) => {
    if (typeof t !== 'number' || !Number.isFinite(t)) {
      throw new InputError('bad-option', `simulate options: sampling times[${k}] = ${String(t)} is not a finite number; sampling times must lie in [${t0}, ${tEnd}] s`, ['options']);
    }
    if (t < t0 || t > tEnd) {
      throw new InputError('bad-option', `simulate options: sampling times[${k}] = ${t} s lies outside the simulated span; sampling times must lie in [${t0}, ${tEnd}] s`, ['options']);
    }
  });
  times.sort((a, b) => a - b);
  const out: number[] = [];
  for (const t of times) {
    const last = out[out.length - 1];
    if (last === undefined || t - last > timeTolerance(t)) out.push(t);
  }
  return out;
}
