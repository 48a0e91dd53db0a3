#!/usr/bin/env node
// The sweep command line: run one job file and print its result as JSON, split a
// job into shard files, merge shard results. Small on purpose: it is what a batch
// system or job queue calls on each machine (docs/sweeps.md).
//
//   fluxstate-sweep run job.json [--concurrency N] [--in-process] [--base DIR] [--allow-modules DIR]...
//                                [--case-time-limit MS] [--worker-memory MB] [--journal FILE] [--out result.json]
//   fluxstate-sweep shard job.json --shards N [--out-dir DIR] [--reference]
//   fluxstate-sweep merge result-0.json result-1.json ... [--out merged.json]
//   fluxstate-sweep --help
// (the package's bin; in a clone, node dist/sweep/cli.js after npm run build)
//
// Exit codes: 0 every case succeeded; 1 the sweep ran but some cases did not
// succeed (the JSON says which); 2 bad usage or an invalid job / result file
// (one line on stderr naming the field, never a stack trace); 3 cancelled by
// SIGINT or SIGTERM (the JSON holds the cases finished so far); 4 an internal
// error (a bug: please report it with the job).
import { mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, relative, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { FluxstateError, InputError } from '../errors.js';
import { parseSweepJob } from './parse-sweep-job.js';
import { runSweep } from './run-sweep.js';
import { jobOfShard, mergeSweepResults, shardSweepJob, shardSweepReferences, SWEEP_SHARD_FORMAT, type SweepShardReference } from './shard-sweep-job.js';
import { openSweepJournal } from './sweep-journal.js';
import { sweepResultFromJson, sweepResultToJson } from './sweep-result-json.js';
import type { SweepJob } from './sweep-job.js';
import type { SweepResult } from './sweep-result.js';
import { terminalProgress } from './terminal-progress.js';

const USAGE = `usage:
  fluxstate-sweep run <job.json | shard.json> [--concurrency N] [--in-process] [--base DIR] [--allow-modules DIR]...
                      [--case-time-limit MS] [--worker-memory MB] [--journal FILE] [--out FILE]
  fluxstate-sweep shard <job.json> --shards N [--out-dir DIR] [--reference]
  fluxstate-sweep merge <result.json>... [--out FILE]`;

/** Job files larger than this are sharded by reference even without --reference. */
const REFERENCE_ABOVE_BYTES = 1 << 20;

class UsageError extends Error {}

function readJson(file: string): unknown {
  try {
    return JSON.parse(readFileSync(file, 'utf8'));
  } catch (e) {
    throw new UsageError(`cannot read JSON from ${file}: ${e instanceof Error ? e.message : String(e)}`);
  }
}

/** Write to a file, or to stdout (letting it drain before the process ends). */
function emit(text: string, out: string | undefined): void {
  if (out !== undefined) writeFileSync(out, text);
  else process.stdout.write(text);
}

function exitCodeOf(result: SweepResult): number {
  if (result.status === 'cancelled') return 3;
  return result.counts.success === result.cases.length ? 0 : 1;
}

/** A positive number option, or a usage error naming it. */
function positiveOption(value: string | undefined, flag: string): number | undefined {
  if (value === undefined) return undefined;
  const x = Number(value);
  if (!(Number.isFinite(x) && x > 0)) throw new UsageError(`${flag} ${value}: give a number > 0`);
  return x;
}

/** A shard reference file's fields, checked. */
function asShardReference(raw: Record<string, unknown>, file: string): SweepShardReference {
  const range = raw.range as { start?: unknown; end?: unknown } | undefined;
  const ok = typeof raw.job === 'string' && typeof raw.digest === 'string' && range !== undefined && range !== null &&
    Number.isInteger(range.start) && Number.isInteger(range.end);
  if (!ok) throw new InputError('sweep-bad-job', `sweep shard ${file}: needs "job" (a path), "digest" and "range" { start, end }`, ['job']);
  if (/^[a-z][a-z0-9+.-]*:/i.test(raw.job as string) && !/^[a-z]:[\\/]/i.test(raw.job as string)) {
    throw new InputError('sweep-bad-job', `sweep shard ${file}: job: "${String(raw.job)}" must be a path to the job file, not a URL`, ['job']);
  }
  return raw as unknown as SweepShardReference;
}

/** The job of a file: a job, or a shard that references one (resolved against the shard file's folder). */
function loadJob(file: string): SweepJob {
  const raw = readJson(file);
  if (raw !== null && typeof raw === 'object' && (raw as { format?: unknown }).format === SWEEP_SHARD_FORMAT) {
    const shard = asShardReference(raw as Record<string, unknown>, file);
    return jobOfShard(shard, readJson(resolve(dirname(file), shard.job)));
  }
  return parseSweepJob(raw);
}

async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      concurrency: { type: 'string' },
      'in-process': { type: 'boolean' },
      base: { type: 'string' },
      'allow-modules': { type: 'string', multiple: true },
      'case-time-limit': { type: 'string' },
      'worker-memory': { type: 'string' },
      journal: { type: 'string' },
      out: { type: 'string' },
    },
  });
  const file = positionals[0];
  if (file === undefined || positionals.length > 1) throw new UsageError('run takes one job file');
  const caseTimeLimitMs = positiveOption(values['case-time-limit'], '--case-time-limit');
  const workerMemoryLimitMb = positiveOption(values['worker-memory'], '--worker-memory');
  const job = loadJob(file);
  const journal = values.journal !== undefined ? openSweepJournal(values.journal, job) : undefined;
  const inProcess = values['in-process'] ?? false;
  const controller = new AbortController();
  const cancel = (): void => controller.abort();
  // On workers the main thread stays free: a signal cancels the sweep cleanly (exit 3, the JSON of the
  // finished cases). In process a case runs synchronously and no handler could run before it ends, so
  // there is none: a signal takes its default action and ends the process at once (exit 128 + signal);
  // the journal, written as each case ends, keeps the finished cases.
  const signals = inProcess ? [] : (['SIGINT', 'SIGTERM'] as const);
  for (const s of signals) process.once(s, cancel);
  const result = await runSweep(job, {
    ...(values.concurrency !== undefined ? { concurrency: Number(values.concurrency) } : {}),
    ...(inProcess ? { inProcess: true } : {}),
    ...(values.base !== undefined ? { baseUrl: values.base } : {}),
    ...(values['allow-modules'] !== undefined ? { allowModuleFolders: values['allow-modules'] } : {}),
    ...(caseTimeLimitMs !== undefined ? { caseTimeLimitMs } : {}),
    ...(workerMemoryLimitMb !== undefined ? { workerMemoryLimitMb } : {}),
    ...(journal ? { previous: journal.previous } : {}),
    ...(journal ? { onCase: journal.append } : {}),
    signal: controller.signal,
    onProgress: terminalProgress({ label: basename(file) }),
  });
  for (const s of signals) process.off(s, cancel);
  journal?.finish(result);
  emit(`${JSON.stringify(sweepResultToJson(result))}\n`, values.out);
  return exitCodeOf(result);
}

function shard(args: string[]): number {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: { shards: { type: 'string' }, 'out-dir': { type: 'string' }, reference: { type: 'boolean' } },
  });
  const file = positionals[0];
  if (file === undefined || positionals.length > 1 || values.shards === undefined) throw new UsageError('shard takes one job file and --shards N');
  const dir = values['out-dir'] ?? '.';
  mkdirSync(dir, { recursive: true });
  const stem = basename(file).replace(/\.json$/i, '');
  const job = readJson(file) as SweepJob;
  const byReference = values.reference === true || statSync(file).size > REFERENCE_ABOVE_BYTES;
  const shards = byReference
    ? shardSweepReferences(job, Number(values.shards), relative(resolve(dir), resolve(file)))
    : shardSweepJob(job, Number(values.shards));
  for (const [k, s] of shards.entries()) {
    const path = join(dir, `${stem}.shard-${k}.json`);
    writeFileSync(path, `${JSON.stringify(s)}\n`);
    process.stdout.write(`${path}\n`);
  }
  return 0;
}

function merge(args: string[]): number {
  const { values, positionals } = parseArgs({ args, allowPositionals: true, options: { out: { type: 'string' } } });
  if (positionals.length === 0) throw new UsageError('merge takes one or more result files');
  const merged = mergeSweepResults(positionals.map((f) => sweepResultFromJson(readJson(f))));
  emit(`${JSON.stringify(sweepResultToJson(merged))}\n`, values.out);
  return exitCodeOf(merged);
}

async function main(argv: string[]): Promise<number> {
  const [command, ...rest] = argv;
  // Asking for help is not a mistake: usage on stdout, exit 0.
  if (command === undefined || command === '--help' || command === '-h' || command === 'help' || rest.includes('--help') || rest.includes('-h')) {
    if (command === undefined) {
      process.stderr.write(`no command\n${USAGE}\n`);
      return 2;
    }
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  try {
    if (command === 'run') return await run(rest);
    if (command === 'shard') return shard(rest);
    if (command === 'merge') return merge(rest);
    throw new UsageError(command === undefined ? 'no command' : `unknown command "${command}"`);
  } catch (e) {
    if (e instanceof UsageError) {
      process.stderr.write(`${e.message}\n${USAGE}\n`);
      return 2;
    }
    if (e instanceof FluxstateError) {
      process.stderr.write(`${e.name} [${e.code}]: ${e.message}\n`);
      return 2;
    }
    if (e instanceof TypeError && 'code' in e && String(e.code).startsWith('ERR_PARSE_ARGS')) {
      process.stderr.write(`${e.message}\n${USAGE}\n`);
      return 2;
    }
    // Not the input's fault as far as we can tell: say so in one line (the stack only on request).
    const text = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
    process.stderr.write(`internal error: ${text}; please report it with the job file (FLUXSTATE_DEBUG=1 prints the stack)\n`);
    if (process.env.FLUXSTATE_DEBUG && e instanceof Error) process.stderr.write(`${e.stack ?? ''}\n`);
    return 4;
  }
}

process.exitCode = await main(process.argv.slice(2));
