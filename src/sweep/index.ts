/**
 * `fluxstate/sweep`: parameter sweeps from a plain-data job description, in
 * parallel on worker threads, in this thread, or split into shards for a
 * batch system. Separate from the core import so that simulating never
 * loads worker threads, zod or the progress bar.
 *
 * @example
 * ```ts
 * import { runSweep, terminalProgress, type SweepJob } from 'fluxstate/sweep';
 * const job: SweepJob = {
 *   network: net.describe(),
 *   simulate: { stopTime: 0.2, maxStep: 4e-4 },
 *   parameters: {
 *     axes: [{ name: 'angle', target: { element: 'mains', field: 'waveform.phase' } },
 *            { name: 'remanence', target: { tube: 'leg', field: 'initialFluxDensity' } }],
 *     grid: { angle: [0, Math.PI / 4, Math.PI / 2], remanence: [-0.8, 0, 0.8] },
 *   },
 *   outputs: [{ name: 'peak current', quantity: 'current', of: { element: 'primary' }, metric: 'peak' }],
 * };
 * const result = await runSweep(job, { onProgress: terminalProgress() });
 * ```
 *
 * @packageDocumentation
 * @module fluxstate/sweep
 */
export {
  SWEEP_JOB_FORMAT,
  type SweepJob,
  type SweepAxis,
  type SweepParameters,
  type SweepTarget,
  type SweepValue,
  type SweepOutputRequest,
  type SweepOutputTarget,
  type SweepQuantity,
  type SweepMetric,
  type SweepSampling,
  type SweepSimulateOptions,
} from './sweep-job.js';
export type { SweepResult, SweepCaseResult, SweepCaseStatus, SweepCounts, SweepProgress } from './sweep-result.js';
export { parseSweepJob } from './parse-sweep-job.js';
export { applySweepEdits, type SweepEdit } from './apply-sweep-edits.js';
export { sweepCase, sweepCaseCount, type SweepCase } from './sweep-cases.js';
export { networkFromDescription } from './network-from-description.js';
export { runSweepCase, resolveFunctionWaveforms, type RunSweepCaseOptions, type ResolveJobModulesOptions } from './run-sweep-case.js';
export { runSweep, type RunSweepOptions } from './run-sweep.js';
export { terminalProgress, type TerminalProgressOptions } from './terminal-progress.js';
export {
  shardSweepJob,
  mergeSweepResults,
  shardSweepReferences,
  jobOfShard,
  SWEEP_SHARD_FORMAT,
  type SweepShardReference,
} from './shard-sweep-job.js';
export { openSweepJournal, sweepJobDigest, SWEEP_JOURNAL_FORMAT, type SweepJournal } from './sweep-journal.js';
export {
  sweepResultToJson,
  sweepResultFromJson,
  sweepCaseResultToJson,
  sweepCaseResultFromJson,
  type SweepResultJson,
  type SweepCaseResultJson,
  type JsonNumber,
} from './sweep-result-json.js';
