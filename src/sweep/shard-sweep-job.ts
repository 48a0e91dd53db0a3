import { InputError } from '../errors.js';
import { parseSweepJob } from './parse-sweep-job.js';
import { sweepCaseCount } from './sweep-cases.js';
import { sweepJobDigest } from './sweep-journal.js';
import type { SweepJob } from './sweep-job.js';
import { emptyCounts, type SweepCaseResult, type SweepResult } from './sweep-result.js';

/**
 * Split a job into `shards` jobs over consecutive, near-equal ranges of its
 * cases (within its own `range`, if it has one), for a batch system or job
 * queue: each shard is a complete job file that any machine can run alone;
 * case indices in the shards' results are those of the whole job, so
 * {@link mergeSweepResults} puts them back together. Shards never overlap,
 * and together they cover every case; with more shards than cases the
 * extra shards are left out.
 *
 * @example
 * ```ts
 * shardSweepJob(job, 4).forEach((shard, k) => writeFileSync(`jobs/shard-${k}.json`, JSON.stringify(shard)));
 * ```
 */
export function shardSweepJob(job: SweepJob, shards: number): SweepJob[] {
  if (!(Number.isInteger(shards) && shards >= 1)) {
    throw new InputError('sweep-bad-option', `shard count ${String(shards)} must be an integer >= 1`, ['shards']);
  }
  const checked = parseSweepJob(job);
  const { start, end } = checked.range ?? { start: 0, end: sweepCaseCount(checked) };
  const n = end - start;
  const count = Math.max(1, Math.min(shards, n));
  return Array.from({ length: count }, (_, k) => ({
    ...checked,
    ...(checked.name !== undefined ? { name: `${checked.name} [shard ${k + 1}/${count}]` } : {}),
    range: { start: start + Math.floor((k * n) / count), end: start + Math.floor(((k + 1) * n) / count) },
  }));
}

/**
 * Put the results of a job's shards back together, ordered by case index.
 * Throws `InputError` `'sweep-bad-shards'` when the results come from
 * different jobs (other case counts, axes or outputs), when two shards hold
 * the same case, or when cases are missing (it names the missing ranges:
 * rerun those shards). The merged `elapsedMs` is the sum over the shards
 * (compute time, not wall time); `concurrency` is the largest used.
 *
 * @example
 * ```ts
 * const merged = mergeSweepResults(files.map((f) => sweepResultFromJson(JSON.parse(readFileSync(f, 'utf8')))));
 * ```
 */
export function mergeSweepResults(results: readonly SweepResult[]): SweepResult {
  const first = results[0];
  if (first === undefined) throw new InputError('sweep-bad-shards', 'no shard results to merge; give at least one', []);
  const same = (a: readonly string[], b: readonly string[]): boolean => a.length === b.length && a.every((x, i) => x === b[i]);
  results.forEach((r, k) => {
    if (r.total !== first.total || !same(r.axes, first.axes) || !same(r.outputs, first.outputs)) {
      throw new InputError(
        'sweep-bad-shards',
        `shard result ${k} is from another job (${r.total} cases, axes ${r.axes.join(', ')}) than shard 0 (${first.total} cases, axes ${first.axes.join(', ')})`,
        [`shard ${k}`],
      );
    }
  });
  const byIndex = new Map<number, SweepCaseResult>();
  for (const r of results) {
    for (const c of r.cases) {
      if (byIndex.has(c.index)) throw new InputError('sweep-bad-shards', `case ${c.index} is in more than one shard result; merge each shard once`, [`case ${c.index}`]);
      byIndex.set(c.index, c);
    }
  }
  const start = Math.min(...results.map((r) => r.range.start));
  const end = Math.max(...results.map((r) => r.range.end));
  const missing: string[] = [];
  for (let i = start; i < end; i++) {
    if (byIndex.has(i)) continue;
    let j = i;
    while (j + 1 < end && !byIndex.has(j + 1)) j++;
    missing.push(i === j ? `${i}` : `${i}-${j}`);
    i = j;
  }
  if (missing.length > 0) {
    throw new InputError('sweep-bad-shards', `cases ${missing.join(', ')} are in no shard result; run the shards that hold them and merge again`, missing);
  }
  const cases = [...byIndex.values()].sort((a, b) => a.index - b.index);
  const counts = emptyCounts();
  for (const c of cases) counts[c.status]++;
  return {
    status: counts.cancelled > 0 ? 'cancelled' : 'complete',
    ...(first.name !== undefined ? { name: first.name.replace(/ \[shard \d+\/\d+\]$/, '') } : {}),
    total: first.total,
    range: { start, end },
    axes: [...first.axes],
    outputs: [...first.outputs],
    cases,
    counts,
    mode: results.every((r) => r.mode === 'in-process') ? 'in-process' : 'workers',
    concurrency: Math.max(...results.map((r) => r.concurrency)),
    elapsedMs: results.reduce((s, r) => s + r.elapsedMs, 0),
  };
}

/**
 * Format tag of a shard file that references its job instead of copying it.
 *
 * @example
 * ```ts
 * const isReference = JSON.parse(text).format === SWEEP_SHARD_FORMAT;
 * ```
 */
export const SWEEP_SHARD_FORMAT = 'fluxstate-sweep-shard/1';

/**
 * A shard that references its job file instead of copying it: for a large
 * job (a long list of cases, a big network), each shard file stays a few
 * lines whatever the size of the job. The job file must travel with the
 * shards; its fingerprint ({@link sweepJobDigest}) is checked when the shard
 * runs, so a changed job file is refused instead of giving mixed results.
 *
 * @example
 * ```ts
 * const shard: SweepShardReference = { format: 'fluxstate-sweep-shard/1', job: '../inrush.json', digest, range: { start: 0, end: 250 } };
 * ```
 */
export interface SweepShardReference {
  readonly format: typeof SWEEP_SHARD_FORMAT;
  /** Path of the job file, relative to the folder of the shard file. */
  readonly job: string;
  /** Fingerprint of the checked job ({@link sweepJobDigest}). */
  readonly digest: string;
  /** The shard's cases: `start` inclusive, `end` exclusive. */
  readonly range: { readonly start: number; readonly end: number };
  readonly name?: string;
}

/**
 * Split a job into shards like {@link shardSweepJob}, as references to the
 * job file (`jobPath`, relative to where the shard files will be) rather
 * than copies of the job.
 *
 * @example
 * ```ts
 * shardSweepReferences(job, 16, '../inrush.json').forEach((s, k) => writeFileSync(`shards/inrush.shard-${k}.json`, JSON.stringify(s)));
 * ```
 */
export function shardSweepReferences(job: SweepJob, shards: number, jobPath: string): SweepShardReference[] {
  const copies = shardSweepJob(job, shards);
  const digest = sweepJobDigest(parseSweepJob(job));
  return copies.map((s) => ({
    format: SWEEP_SHARD_FORMAT, job: jobPath, digest, range: s.range!,
    ...(s.name !== undefined ? { name: s.name } : {}),
  }));
}

/**
 * The job a shard reference stands for: the referenced job, already read
 * and parsed by the caller, with the shard's range. Throws `InputError`
 * `'sweep-bad-job'` when its fingerprint differs from the shard's.
 *
 * @example
 * ```ts
 * const job = jobOfShard(shard, JSON.parse(readFileSync(join(dirname(file), shard.job), 'utf8')));
 * ```
 */
export function jobOfShard(shard: SweepShardReference, referenced: unknown): SweepJob {
  const job = parseSweepJob(referenced);
  if (sweepJobDigest(job) !== shard.digest) {
    throw new InputError('sweep-bad-job', `sweep shard: job: the job file "${shard.job}" is not the one this shard was cut from (its fingerprint differs); shard the job again`, ['job']);
  }
  return parseSweepJob({ ...job, range: shard.range });
}
