#!/usr/bin/env node
// The sweep command line: run one job file and print its result as JSON, split a
// job into shard files, merge shard results. Small on purpose: it is what a batch
// system or job queue calls on each machine (docs/sweeps.md).
//
//   fluxstate-sweep run job.json [--concurrency N] [--in-process] [--base DIR] [--out result.json]
//   fluxstate-sweep shard job.json --shards N [--out-dir DIR]
//   fluxstate-sweep merge result-0.json result-1.json ... [--out merged.json]
//   fluxstate-sweep --help
// (the package's bin; in a clone, node dist/sweep/cli.js after npm run build)
//
// Exit codes: 0 every case succeeded; 1 the sweep ran but some cases did not
// succeed (the JSON says which); 2 bad usage or an invalid job / result file;
// 3 cancelled by SIGINT or SIGTERM (the JSON holds the cases finished so far).
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { parseArgs } from 'node:util';
import { FluxstateError } from '../errors.js';
import { runSweep } from './run-sweep.js';
import { mergeSweepResults, shardSweepJob } from './shard-sweep-job.js';
import { sweepResultFromJson, sweepResultToJson } from './sweep-result-json.js';
import type { SweepJob } from './sweep-job.js';
import type { SweepResult } from './sweep-result.js';
import { terminalProgress } from './terminal-progress.js';

const USAGE = `usage:
  fluxstate-sweep run <job.json> [--concurrency N] [--in-process] [--base DIR] [--out FILE]
  fluxstate-sweep shard <job.json> --shards N [--out-dir DIR]
  fluxstate-sweep merge <result.json>... [--out FILE]`;

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

async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      concurrency: { type: 'string' },
      'in-process': { type: 'boolean' },
      base: { type: 'string' },
      out: { type: 'string' },
    },
  });
  const file = positionals[0];
  if (file === undefined || positionals.length > 1) throw new UsageError('run takes one job file');
  const controller = new AbortController();
  const cancel = (): void => controller.abort();
  process.once('SIGINT', cancel);
  process.once('SIGTERM', cancel);
  const result = await runSweep(readJson(file) as SweepJob, { // checked by runSweep
    ...(values.concurrency !== undefined ? { concurrency: Number(values.concurrency) } : {}),
    ...(values['in-process'] ? { inProcess: true } : {}),
    ...(values.base !== undefined ? { baseUrl: values.base } : {}),
    signal: controller.signal,
    onProgress: terminalProgress({ label: basename(file) }),
  });
  process.off('SIGINT', cancel);
  process.off('SIGTERM', cancel);
  emit(`${JSON.stringify(sweepResultToJson(result))}\n`, values.out);
  return exitCodeOf(result);
}

function shard(args: string[]): number {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: { shards: { type: 'string' }, 'out-dir': { type: 'string' } },
  });
  const file = positionals[0];
  if (file === undefined || positionals.length > 1 || values.shards === undefined) throw new UsageError('shard takes one job file and --shards N');
  const dir = values['out-dir'] ?? '.';
  mkdirSync(dir, { recursive: true });
  const stem = basename(file).replace(/\.json$/i, '');
  const jobs = shardSweepJob(readJson(file) as SweepJob, Number(values.shards));
  for (const [k, job] of jobs.entries()) {
    const path = join(dir, `${stem}.shard-${k}.json`);
    writeFileSync(path, `${JSON.stringify(job)}\n`);
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
    throw e;
  }
}

process.exitCode = await main(process.argv.slice(2));
