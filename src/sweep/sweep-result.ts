import type { DaeStatus, SolverStats } from '../solver/types.js';
import type { SweepValue } from './sweep-job.js';

/**
 * Outcome of one case:
 * - `'success'`: simulated to the stop time, every output computed;
 * - `'incomplete'`: the simulation stopped early (its `simulation.status`
 *   says why: step-size underflow, budget, a user function that failed...);
 *   outputs are computed on the data up to there, NaN (or empty) where they
 *   cannot be;
 * - `'error'`: the case could not be built or run (an invalid value, a
 *   topology error, a function module that does not import, a worker that
 *   died); `message` and `error` say why;
 * - `'cancelled'`: not run, or interrupted, because the sweep was aborted.
 *
 * @example
 * ```ts
 * const failed = result.cases.filter((c) => c.status !== 'success');
 * ```
 */
export type SweepCaseStatus = 'success' | 'incomplete' | 'error' | 'cancelled';

/**
 * The result of one case: plain data (numbers and Float64Arrays), the same
 * whether the case ran in this thread or in a worker.
 *
 * @example
 * ```ts
 * for (const c of result.cases) console.log(c.index, c.parameters.angle, c.status, c.outputs['peak current']);
 * ```
 */
export interface SweepCaseResult {
  /** Position of the case in the whole job's case list. */
  readonly index: number;
  /** The value of every axis in this case, by axis name. */
  readonly parameters: Readonly<Record<string, SweepValue>>;
  readonly status: SweepCaseStatus;
  /** One line on the outcome. */
  readonly message: string;
  /** Outputs by name: numbers for scalar metrics, Float64Array for `cycle-means` and `series`. */
  readonly outputs: Readonly<Record<string, number | Float64Array>>;
  /** Sample times, s, present when an output is a `series`. */
  readonly time?: Float64Array;
  /** The simulation's own outcome, when it ran. */
  readonly simulation?: {
    readonly status: DaeStatus;
    /** Last time reached, s. */
    readonly reachedTime: number;
    readonly stats: Readonly<SolverStats>;
  };
  /** For status `'error'`: the error's class name, its stable code and the elements it names, when it has them. */
  readonly error?: { readonly name: string; readonly code?: string; readonly elements?: readonly string[] };
}

/**
 * Count of cases per status.
 *
 * @example
 * ```ts
 * if (result.counts.error > 0) console.warn(`${result.counts.error} cases failed`);
 * ```
 */
export type SweepCounts = Readonly<Record<SweepCaseStatus, number>>;

/**
 * The result of {@link runSweep}: every case of the run, in the job's case
 * order whatever order they finished in.
 *
 * @example
 * ```ts
 * const result = await runSweep(job);
 * if (result.status === 'cancelled') console.warn(`${result.counts.cancelled} cases not run`);
 * ```
 */
export interface SweepResult {
  /** `'complete'` when every case ran (whatever its status); `'cancelled'` when the sweep was aborted. */
  readonly status: 'complete' | 'cancelled';
  /** Name of the job, if it has one. */
  readonly name?: string;
  /** Number of cases in the whole job (all shards). */
  readonly total: number;
  /** The cases this run covered: `start` inclusive, `end` exclusive. */
  readonly range: { readonly start: number; readonly end: number };
  /** Axis names, in the job's order. */
  readonly axes: readonly string[];
  /** Output names, in the job's order. */
  readonly outputs: readonly string[];
  /** One result per case of the range, ordered by case index. */
  readonly cases: readonly SweepCaseResult[];
  readonly counts: SweepCounts;
  /** How the cases ran. */
  readonly mode: 'workers' | 'in-process';
  /** Worker threads used (1 in process). */
  readonly concurrency: number;
  /** Wall time of the run, ms. */
  readonly elapsedMs: number;
}

/**
 * A progress report of {@link runSweep}: `'start'` once before the first
 * case, `'case'` after each case (in the order they finish), `'end'` once
 * at the end (also after a cancellation).
 *
 * @example
 * ```ts
 * await runSweep(job, { onProgress: (p) => p.phase === 'case' && console.log(`${p.done}/${p.total} case ${p.case?.index}: ${p.case?.status}`) });
 * ```
 */
export interface SweepProgress {
  readonly phase: 'start' | 'case' | 'end';
  /** Cases finished so far (any status). */
  readonly done: number;
  /** Cases in this run. */
  readonly total: number;
  readonly counts: SweepCounts;
  /** The case that just finished (phase `'case'`). */
  readonly case?: {
    readonly index: number;
    readonly status: SweepCaseStatus;
    readonly message: string;
    readonly parameters: Readonly<Record<string, SweepValue>>;
  };
}

/** Zero counts. @internal */
export function emptyCounts(): Record<SweepCaseStatus, number> {
  return { success: 0, incomplete: 0, error: 0, cancelled: 0 };
}
