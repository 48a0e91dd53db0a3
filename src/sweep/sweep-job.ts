import type { NetworkDescription } from '../network/description.js';
import type { SolverSettings } from '../simulation/solver-settings.js';

/**
 * The format tag of a sweep job file.
 *
 * @example
 * ```ts
 * const job: SweepJob = { format: SWEEP_JOB_FORMAT, network, simulate: { stopTime: 0.1 }, parameters, outputs };
 * ```
 */
export const SWEEP_JOB_FORMAT = 'fluxstate-sweep/1';

/**
 * A JSON value a sweep axis may take: usually a number, sometimes a string
 * (a function waveform's export name), a boolean (a switch's initial state),
 * an array or an object (a whole waveform or material spec). `null` removes
 * an optional field.
 *
 * @example
 * ```ts
 * const values: SweepValue[] = [0.5, 'softStart', true, { kind: 'constant', value: 5 }, null];
 * ```
 */
export type SweepValue = number | string | boolean | null | readonly SweepValue[] | { readonly [key: string]: SweepValue };

/**
 * The field of one network entry that a sweep axis sets, addressed by the
 * entry's name and the field's path inside the {@link NetworkDescription}
 * entry (dot-separated, array positions as numbers). Examples:
 * `initialFluxDensity`, `law.length`, `law.material.relativePermeability`,
 * `eddyResistance` on a tube; `resistance`, `turns`, `waveform.phase`,
 * `waveform.amplitude`, `waveform.export`, `initialCurrent` on an element.
 * Names, kinds and connections (`name`, `kind`, `from`, `to`, `plus`,
 * `minus`, `tube`) cannot be swept.
 *
 * @example
 * ```ts
 * const remanence: SweepTarget = { tube: 'leg', field: 'initialFluxDensity' };
 * const angle: SweepTarget = { element: 'mains', field: 'waveform.phase' };
 * ```
 */
export type SweepTarget =
  | { readonly tube: string; readonly field: string }
  | { readonly element: string; readonly field: string };

/**
 * One parameter of a sweep: a name (used in results and tables) and the
 * field or fields it sets. Several targets take the same value (for
 * example the phase of three sources shifted together).
 *
 * @example
 * ```ts
 * const axis: SweepAxis = { name: 'remanence', target: { tube: 'leg', field: 'initialFluxDensity' } };
 * ```
 */
export interface SweepAxis {
  readonly name: string;
  readonly target: SweepTarget | readonly SweepTarget[];
}

/**
 * The parameter sets of a sweep: named axes, and either a `grid` (values
 * per axis; every combination is a case, the first axis varying slowest)
 * or an explicit list of `cases` (one value per axis in each). Exactly one
 * of `grid` and `cases`.
 *
 * @example
 * ```ts
 * const grid: SweepParameters = {
 *   axes: [{ name: 'angle', target: { element: 'mains', field: 'waveform.phase' } },
 *          { name: 'remanence', target: { tube: 'leg', field: 'initialFluxDensity' } }],
 *   grid: { angle: [0, Math.PI / 2], remanence: [-0.8, 0, 0.8] }, // 6 cases
 * };
 * const list: SweepParameters = { axes: grid.axes, cases: [{ angle: 0, remanence: 0.8 }, { angle: 1.2, remanence: 0 }] };
 * ```
 */
export interface SweepParameters {
  readonly axes: readonly SweepAxis[];
  /** Values per axis name; the cases are the cartesian product, first axis slowest. */
  readonly grid?: Readonly<Record<string, readonly SweepValue[]>>;
  /** Explicit cases: a value for every axis in each. */
  readonly cases?: readonly Readonly<Record<string, SweepValue>>[];
}

/**
 * What a sweep output is read from: a tube, a two-terminal element or
 * winding, an electric node or a magnetic node, by name.
 *
 * @example
 * ```ts
 * const of: SweepOutputTarget = { element: 'primary' };
 * ```
 */
export type SweepOutputTarget =
  | { readonly tube: string }
  | { readonly element: string }
  | { readonly node: string }
  | { readonly magneticNode: string };

/**
 * Quantities a sweep output can read, named like the `SimulationResult`
 * accessors. Tubes: `flux`, `fluxDensity`, `fieldStrength`, `mmf`,
 * `eddyPower`; hysteretic tubes also `residualFluxDensity` (T, where b
 * settles if H relaxes to zero from each sample) and `hysteresisPower` (W;
 * its cycle mean x period is the loss per cycle); elements and windings: `current`, `voltage`, `power`;
 * windings only: `emf`, `fluxLinkage`; electric nodes: `potential`;
 * magnetic nodes: `magneticPotential`.
 *
 * @example
 * ```ts
 * const q: SweepQuantity = 'fluxDensity';
 * ```
 */
export type SweepQuantity =
  | 'flux' | 'fluxDensity' | 'fieldStrength' | 'mmf' | 'eddyPower' | 'residualFluxDensity' | 'hysteresisPower'
  | 'current' | 'voltage' | 'power'
  | 'emf' | 'fluxLinkage'
  | 'potential' | 'magneticPotential';

/**
 * What is computed from a quantity's samples:
 * - `peak`: largest |x| over the window (`from`, `to`); `peak-time`: its time, s;
 * - `max`, `min`: signed extremes over the window;
 * - `mean`, `rms`: time-weighted over the window (trapezoid on the samples);
 * - `final`: the last sample;
 * - `cycle-means`: the mean of every full cycle of `period` from `start`
 *   (the DC offset per cycle), an array;
 * - `series`: the whole series, an array aligned with the case's `time`.
 *
 * Metrics are computed on the samples, so choose the job's `sampling`
 * fine enough for the peak you want (see docs/analysis.md).
 *
 * @example
 * ```ts
 * const m: SweepMetric = 'cycle-means';
 * ```
 */
export type SweepMetric = 'peak' | 'peak-time' | 'max' | 'min' | 'mean' | 'rms' | 'final' | 'cycle-means' | 'series';

/**
 * One output of every case: a metric of a quantity of a named element.
 *
 * @example
 * ```ts
 * const outputs: SweepOutputRequest[] = [
 *   { name: 'peak inrush', quantity: 'current', of: { element: 'primary' }, metric: 'peak' },
 *   { name: 'peak B', quantity: 'fluxDensity', of: { tube: 'leg' }, metric: 'peak', from: 0.02 },
 *   { name: 'DC offset', quantity: 'fluxDensity', of: { tube: 'leg' }, metric: 'cycle-means', period: 0.02 },
 *   { quantity: 'current', of: { element: 'primary' }, metric: 'series' }, // named "series current primary"
 * ];
 * ```
 */
export interface SweepOutputRequest {
  /** Key of the output in each case's `outputs`. Default `"<metric> <quantity> <name>"`. Unique. */
  readonly name?: string;
  readonly quantity: SweepQuantity;
  readonly of: SweepOutputTarget;
  readonly metric: SweepMetric;
  /** Window start, s (window metrics). Default: the first sample. */
  readonly from?: number;
  /** Window end, s (window metrics). Default: the last sample. */
  readonly to?: number;
  /** Cycle length, s (`cycle-means`, required there). */
  readonly period?: number;
  /** Start of the first cycle, s (`cycle-means`). Default: the first sample. */
  readonly start?: number;
}

/**
 * Output sampling of a sweep's simulations: the plain-data forms of the
 * simulate option `sampling`.
 *
 * @example
 * ```ts
 * const s: SweepSampling = { interval: 1e-4, includeSteps: true };
 * ```
 */
export type SweepSampling =
  | 'steps'
  | { readonly interval: number; readonly includeSteps?: boolean }
  | { readonly times: readonly number[]; readonly includeSteps?: boolean };

/**
 * Simulate options of a sweep job: the plain-data part of
 * `SimulateOptions` (the shared `SolverSettings` without the signal, no
 * callbacks).
 *
 * @example
 * ```ts
 * const o: SweepSimulateOptions = { stopTime: 0.2, rtol: 1e-6, maxStep: 4e-4, sampling: { interval: 1e-4 } };
 * ```
 */
export interface SweepSimulateOptions extends Omit<SolverSettings, 'signal'> {
  readonly stopTime: number;
  readonly startTime?: number;
  readonly sampling?: SweepSampling;
  /** Wall-time budget per case, ms (a case over it ends `'incomplete'`). */
  readonly maxWallTimeMs?: number;
}

/**
 * A sweep job: plain data (JSON) that says which network to simulate, how,
 * over which parameter sets, and what to return from each case. The same
 * file drives an in-process run, a worker-thread run, and a shard on a
 * batch system (see docs/sweeps.md).
 *
 * @example
 * ```ts
 * const job: SweepJob = {
 *   format: 'fluxstate-sweep/1',
 *   network: net.describe(),
 *   simulate: { stopTime: 0.1, maxStep: 2e-4 },
 *   parameters: {
 *     axes: [{ name: 'angle', target: { element: 'mains', field: 'waveform.phase' } }],
 *     grid: { angle: [0, 0.5, 1, 1.5] },
 *   },
 *   outputs: [{ name: 'peak current', quantity: 'current', of: { element: 'primary' }, metric: 'peak' }],
 * };
 * ```
 */
export interface SweepJob {
  /** Format tag, `'fluxstate-sweep/1'` (optional). */
  readonly format?: typeof SWEEP_JOB_FORMAT;
  /** Name for messages and result files. */
  readonly name?: string;
  /** The base network; every case is this network with the case's values set. */
  readonly network: NetworkDescription;
  readonly simulate: SweepSimulateOptions;
  readonly parameters: SweepParameters;
  readonly outputs: readonly SweepOutputRequest[];
  /**
   * Run only cases `start` (inclusive) to `end` (exclusive) of the job's
   * case list; case indices in the result stay those of the whole job. This
   * is how a job is split into shards ({@link shardSweepJob}).
   */
  readonly range?: { readonly start: number; readonly end: number };
}
