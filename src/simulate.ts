import { InputError } from './errors.js';
import { compileNetwork, type CompiledNetwork } from './formulation/compile-network.js';
import { validateDescription } from './network/validate-description.js';
import type { NetworkBuilder } from './network/network-builder.js';
import type { NetworkDescription } from './network/description.js';
import { NetworkRun } from './simulation/network-run.js';
import { resultFromRun, type SimulationResult } from './result/simulation-result.js';

/** Absolute tolerances per kind of unknown. */
export interface AbsoluteTolerances {
  /** Node potentials and voltages, V. Default 1e-6. */
  readonly voltage?: number;
  /** Branch currents, A. Default 1e-6. */
  readonly current?: number;
  /**
   * Flux density, T: each loop flux gets this times the smallest area of
   * its tubes (1e-4 m^2 assumed for tubes without an area). Default 1e-7.
   */
  readonly fluxDensity?: number;
}

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

/** Options of {@link simulate}. */
export interface SimulateOptions {
  /** End of the simulated interval, s. */
  readonly stopTime: number;
  /** Start, s. Default 0. */
  readonly startTime?: number;
  /** Relative tolerance. Default 1e-6. */
  readonly rtol?: number;
  /** Absolute tolerances: one number for every unknown, or per kind. */
  readonly atol?: number | AbsoluteTolerances;
  /** Largest solver step, s. Default: no limit beyond the interval. */
  readonly maxStep?: number;
  /** First step to try, s. */
  readonly initialStep?: number;
  /** Output sampling. Default `'steps'`. */
  readonly sampling?: Sampling;
  /** Budget of solver steps (accepted + rejected). Default 1e6. */
  readonly maxSteps?: number;
  /** Wall-time budget, ms. */
  readonly maxWallTimeMs?: number;
  /** Cancels the run; the result keeps what was computed (status `'aborted'`). */
  readonly signal?: AbortSignal;
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
export function simulate(network: NetworkBuilder | NetworkDescription, options: SimulateOptions): SimulationResult {
  if (network === null || typeof network !== 'object') {
    throw new InputError('bad-option', `simulate: the first argument must be a network (builder or description), got ${String(network)}`, ['network']);
  }
  if (options === null || typeof options !== 'object') {
    throw new InputError('bad-option', `simulate: options must be an object with at least stopTime, got ${String(options)}`, ['options']);
  }
  // A description that did not come from a builder here (JSON, a worker) gets the builder's checks.
  const description = 'describe' in network ? network.describe() : validateDescription(network);
  const networkId = 'describe' in network ? network.id : undefined;
  const t0 = options.startTime ?? 0;
  const tEnd = options.stopTime;
  checkOptions(options, t0, tEnd);
  const compiled = compileNetwork(description);
  const sampleTimes = samplingTimes(options.sampling, t0, tEnd);
  let lastProgress = -Infinity;
  const run = new NetworkRun(compiled, {
    t0,
    horizon: tEnd,
    rtol: options.rtol ?? 1e-6,
    atol: absoluteTolerances(compiled, options.atol),
    ...(options.maxStep !== undefined ? { maxStep: options.maxStep } : {}),
    ...(options.initialStep !== undefined ? { initialStep: options.initialStep } : {}),
    maxSteps: options.maxSteps ?? 1e6,
    ...(options.maxWallTimeMs !== undefined ? { maxWallTimeMs: options.maxWallTimeMs } : {}),
    ...(options.signal ? { signal: options.signal } : {}),
    ...(options.initialState ? { initialState: checkedInitialState(compiled, options.initialState) } : {}),
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
    interpolants: true,
    onStep: progress,
  });
  if (options.onProgress) {
    options.onProgress({ time: run.t, stopTime: tEnd, fraction: (run.t - t0) / (tEnd - t0), steps: run.stats.acceptedSteps });
  }
  return resultFromRun(compiled, networkId, run, `reached t = ${tEnd} s`);
}

function checkedInitialState(c: CompiledNetwork, y: ArrayLike<number>): Float64Array {
  if (y.length !== c.layout.size) {
    throw new InputError('bad-initial-state', `simulate options: initialState has ${y.length} entries; this network has ${c.layout.size} unknowns`, ['options']);
  }
  const out = Float64Array.from(y);
  out.forEach((v, i) => {
    if (!Number.isFinite(v)) {
      throw new InputError('bad-initial-state', `simulate options: initialState[${i}] (${c.layout.labels[i]}) is ${v}; give finite values`, ['options']);
    }
  });
  return out;
}

function checkOptions(o: SimulateOptions, t0: number, tEnd: number): void {
  const bad = (code: string, text: string): never => {
    throw new InputError(code, `simulate options: ${text}`, ['options']);
  };
  if (!Number.isFinite(t0)) bad('bad-option', `startTime ${t0} is not finite`);
  if (!Number.isFinite(tEnd) || tEnd <= t0) bad('bad-time-span', `stopTime ${tEnd} s must be a finite time after startTime ${t0} s`);
  if (o.rtol !== undefined && !(o.rtol > 0 && o.rtol < 1)) bad('bad-tolerance', `rtol ${o.rtol} must be in (0, 1)`);
  if (typeof o.atol === 'number' && !(o.atol > 0)) bad('bad-tolerance', `atol ${o.atol} must be > 0`);
  if (typeof o.atol === 'object') {
    for (const [k, v] of Object.entries(o.atol)) if (v !== undefined && !(typeof v === 'number' && v > 0)) bad('bad-tolerance', `atol.${k} ${String(v)} must be > 0`);
  }
  if (o.maxStep !== undefined && !(o.maxStep > 0)) bad('bad-option', `maxStep ${o.maxStep} must be > 0`);
  if (o.initialStep !== undefined && !(o.initialStep > 0)) bad('bad-option', `initialStep ${o.initialStep} must be > 0`);
  if (o.maxSteps !== undefined && !(o.maxSteps >= 1)) bad('bad-option', `maxSteps ${o.maxSteps} must be >= 1`);
  if (o.maxWallTimeMs !== undefined && !(o.maxWallTimeMs > 0)) bad('bad-option', `maxWallTimeMs ${o.maxWallTimeMs} must be > 0`);
  for (const [name, v] of [['atol', o.atol], ['maxStep', o.maxStep], ['maxSteps', o.maxSteps], ['maxWallTimeMs', o.maxWallTimeMs], ['initialStep', o.initialStep]] as const) {
    if (typeof v === 'number' && !Number.isFinite(v)) bad(name === 'atol' ? 'bad-tolerance' : 'bad-option', `${name} ${v} must be finite`);
  }
  if (o.onProgress !== undefined && typeof o.onProgress !== 'function') bad('bad-option', `onProgress must be a function, got ${typeof o.onProgress}`);
  if (o.progressIntervalMs !== undefined && !(o.progressIntervalMs >= 0)) bad('bad-option', `progressIntervalMs ${o.progressIntervalMs} must be >= 0`);
  const s = o.sampling;
  if (s !== undefined && s !== 'steps' && (typeof s !== 'object' || s === null || (!('interval' in s) && !('times' in s)))) {
    bad('bad-option', `sampling must be 'steps', { interval } or { times }, got ${JSON.stringify(s)}`);
  }
}

/** Most samples a grid may ask for (a finer grid is almost surely a unit mistake). */
const MAX_GRID_SAMPLES = 1e7;

/** Per-unknown absolute tolerances from the options (internal; shared with the stepper). */
export function absoluteTolerances(c: CompiledNetwork, atol: SimulateOptions['atol']): Float64Array | number {
  if (typeof atol === 'number') return atol;
  const voltage = atol?.voltage ?? 1e-6;
  const current = atol?.current ?? 1e-6;
  const fluxDensity = atol?.fluxDensity ?? 1e-7;
  // Internal states of tubes scale with the flux-density tolerance (a hysteretic tube: m per tesla, db/dt per tesla).
  const stateTolerance = new Map<number, number>();
  for (const tube of c.tubes) {
    tube.stateScales?.forEach((scale, k) => stateTolerance.set(tube.stateOffset! + k, fluxDensity * scale));
  }
  return Float64Array.from(c.layout.kinds, (kind, i) => {
    if (kind === 'potential') return voltage;
    if (kind === 'current') return current;
    if (kind === 'internal-state') return stateTolerance.get(i) ?? current;
    const entries = c.loops.loops[i - c.layout.loopOffset]!;
    const area = Math.min(...entries.map((en) => {
      const a = c.tubes[en.tube]!.area;
      return Number.isFinite(a) ? a : 1e-4;
    }));
    return fluxDensity * area;
  });
}

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
  const times = Array.from(s.times).filter((t) => t >= t0 && t <= tEnd).sort((a, b) => a - b);
  if (times.length !== s.times.length) {
    throw new InputError('bad-option', `simulate options: sampling times must lie in [${t0}, ${tEnd}] s`, ['options']);
  }
  return times;
}

function includeSteps(s: Sampling | undefined): boolean {
  if (s === undefined || s === 'steps') return true;
  return s.includeSteps ?? false;
}

function exactSampling(s: Sampling | undefined): boolean {
  return s !== undefined && s !== 'steps' && (s.exact ?? false);
}
