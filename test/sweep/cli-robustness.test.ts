/**
 * The sweep command line under hostile or interrupted conditions, run from
 * the plain-JavaScript build with plain node: module references outside the
 * base folder (and the --allow-modules flag), job-shape errors (exit 2, one
 * line naming the field, no stack trace), a journal that keeps finished cases
 * across a SIGTERM and resumes, a signal during an in-process case, shards
 * that reference the job instead of copying it. Waiting is on events (lines
 * in the journal), never on a timer.
 */
import { execFile, spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sweepResultFromJson, type SweepJob } from '../../src/sweep/index.js';
import { buildJs } from './build-js.js';
import { angleJob } from './rl-network.js';

function cli(root: string, args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [join(root, 'dist', 'sweep', 'cli.js'), ...args], { cwd: root, maxBuffer: 64 << 20 }, (error, stdout, stderr) => {
      resolve({ code: error ? Number(error.code ?? 1) : 0, stdout, stderr });
    });
  });
}

/** Journal lines of type `case`. */
function journalCases(file: string): number[] {
  if (!existsSync(file)) return [];
  return readFileSync(file, 'utf8').split('\n').filter((l) => l.startsWith('{"type":"case"')).map((l) => (JSON.parse(l) as { case: { index: number } }).case.index);
}

/** Start the CLI, wait (polling the journal, no deadline of its own) until it holds `cases` finished cases, send `signal`, and collect the outcome. */
function interrupt(root: string, args: string[], journal: string, cases: number, signal: NodeJS.Signals) {
  return new Promise<{ code: number | null; signal: NodeJS.Signals | null; stdout: string }>((resolve) => {
    const child = spawn(process.execPath, [join(root, 'dist', 'sweep', 'cli.js'), ...args], { cwd: root });
    let stdout = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    const poll = setInterval(() => {
      if (journalCases(join(root, journal)).length >= cases) {
        clearInterval(poll);
        child.kill(signal);
      }
    }, 20);
    child.on('exit', (code, sig) => {
      clearInterval(poll);
      resolve({ code, signal: sig, stdout });
    });
  });
}

let root = '';

/** The RL job with its source from a module; axis: the export name. */
function exportsJob(module: string, exports: readonly string[]): SweepJob {
  const base = angleJob([0]);
  return {
    ...base,
    network: {
      ...base.network,
      elements: base.network.elements.map((e) =>
        e.kind === 'voltage-source' ? { ...e, waveform: { kind: 'function' as const, module, export: 'mainsSine' } } : e,
      ),
    },
    parameters: { axes: [{ name: 'drive', target: { element: 'mains', field: 'waveform.export' } }], grid: { drive: [...exports] } },
  };
}

beforeAll(() => {
  root = buildJs();
  for (const d of ['jobs', 'trusted', 'out']) mkdirSync(join(root, d));
  const drives = `export function mainsSine(t) { return 100 * Math.sin(2 * Math.PI * 50 * t); }
export function slowSine(t) { const end = Date.now() + 1; while (Date.now() < end) {} return mainsSine(t); }
export function spin(t) { if (t > 1e-3) for (;;) {} return mainsSine(t); }
`;
  writeFileSync(join(root, 'jobs', 'drives.mjs'), drives);
  writeFileSync(join(root, 'trusted', 'drives.mjs'), drives);
}, 60_000);

afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('sweep CLI robustness (built JavaScript, plain node)', () => {
  it('refuses a module outside the base folder (exit 2, the field on stderr) unless --allow-modules names its folder', async () => {
    writeFileSync(join(root, 'jobs', 'outside.json'), JSON.stringify(exportsJob('../trusted/drives.mjs', ['mainsSine'])));
    const refused = await cli(root, ['run', 'jobs/outside.json', '--in-process', '--base', 'jobs']);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toMatch(/\[sweep-bad-job\]: sweep job: network\.elements\[0\] \(voltage-source "mains"\)\.waveform\.module: module "\.\.\/trusted\/drives\.mjs" is refused/);
    expect(refused.stderr).not.toMatch(/\n\s+at /);
    const allowed = await cli(root, ['run', 'jobs/outside.json', '--in-process', '--base', 'jobs', '--allow-modules', 'trusted']);
    expect(allowed.code).toBe(0);
    expect(sweepResultFromJson(JSON.parse(allowed.stdout)).counts.success).toBe(1);
  });

  it('exits 2 with the field path, no stack trace, for an axis named __proto__, a deeply nested file and a job of too many cases', async () => {
    const job = angleJob([0]);
    const proto = JSON.stringify({ ...job, parameters: { axes: [{ name: '__proto__', target: { element: 'mains', field: 'waveform.phase' } }], grid: { x: [0] } } })
      .replace('"grid":{"x":[0]}', '"grid":{"__proto__":[0, 1]}');
    writeFileSync(join(root, 'jobs', 'proto.json'), proto);
    writeFileSync(join(root, 'jobs', 'deep.json'), JSON.stringify({ ...job, name: 'deep' }).replace('"name":"deep"', `"name":${'['.repeat(200_000)}${']'.repeat(200_000)}`));
    // Four axes of 100, 100, 100 and 1001 values: 1.001e9 cases, over the limit of 1e7.
    const fields = [['coil', 'resistance'], ['mains', 'waveform.amplitude'], ['mains', 'waveform.frequency'], ['mains', 'waveform.phase']] as const;
    const counts = [100, 100, 100, 1001];
    writeFileSync(join(root, 'jobs', 'many.json'), JSON.stringify({
      ...job,
      parameters: {
        axes: fields.map(([element, field], k) => ({ name: `a${k}`, target: { element, field } })),
        grid: Object.fromEntries(counts.map((n, k) => [`a${k}`, Array.from({ length: n }, () => 1)])),
      },
    }));
    const expectations: [string, RegExp][] = [
      ['jobs/proto.json', /\[sweep-bad-job\]: sweep job: parameters\.grid\.__proto__: "__proto__" cannot be used/],
      ['jobs/deep.json', /\[sweep-bad-job\]: sweep job: name\[0\]\[0\]\[0\]\[0\]\[0\]\[0\]\[0\]: nested more than 64 levels deep/],
      ['jobs/many.json', /\[sweep-bad-job\]: sweep job: parameters\.grid: 1\.001e\+9 cases/],
    ];
    for (const [file, message] of expectations) {
      const r = await cli(root, ['run', file, '--in-process']);
      expect(r.stderr, file).toMatch(message);
      expect(r.code, file).toBe(2);
      expect(r.stderr.trim().split('\n'), file).toHaveLength(1);
    }
  });

  it('streams finished cases to the journal; after a SIGTERM (exit 3) a rerun with the journal runs only the rest', async () => {
    const job = exportsJob('./drives.mjs', Array.from({ length: 8 }, () => 'slowSine'));
    writeFileSync(join(root, 'jobs', 'journal.json'), JSON.stringify(job));
    const args = ['run', 'jobs/journal.json', '--in-process', '--base', 'jobs', '--journal', 'out/journal.jsonl'];
    const first = await interrupt(root, ['run', 'jobs/journal.json', '--concurrency', '1', '--base', 'jobs', '--journal', 'out/journal.jsonl'], 'out/journal.jsonl', 2, 'SIGTERM');
    expect(first.code).toBe(3);
    const cancelled = sweepResultFromJson(JSON.parse(first.stdout));
    expect(cancelled.status).toBe('cancelled');
    const kept = journalCases(join(root, 'out', 'journal.jsonl'));
    expect(kept.length).toBeGreaterThanOrEqual(2);
    expect(kept.length).toBeLessThan(8);
    const second = await cli(root, args);
    expect(second.code).toBe(0);
    const all = journalCases(join(root, 'out', 'journal.jsonl'));
    // Every case exactly once across both runs: the second run skipped the kept ones.
    expect([...all].sort((a, b) => a - b)).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
    const result = sweepResultFromJson(JSON.parse(second.stdout));
    expect(result.counts.success).toBe(8);
    const lines = readFileSync(join(root, 'out', 'journal.jsonl'), 'utf8').trim().split('\n');
    expect(JSON.parse(lines[lines.length - 1]!).type).toBe('result');
    // A journal of another job is refused.
    writeFileSync(join(root, 'jobs', 'other.json'), JSON.stringify(angleJob([0])));
    const other = await cli(root, ['run', 'jobs/other.json', '--in-process', '--journal', 'out/journal.jsonl']);
    expect(other.code).toBe(2);
    expect(other.stderr).toMatch(/\[sweep-bad-journal\]/);
  });

  it('in process, a signal ends the process at once, even during a case; the journal keeps the finished cases', async () => {
    writeFileSync(join(root, 'jobs', 'stuck.json'), JSON.stringify(exportsJob('./drives.mjs', ['mainsSine', 'spin', 'mainsSine'])));
    const r = await interrupt(root, ['run', 'jobs/stuck.json', '--in-process', '--base', 'jobs', '--journal', 'out/stuck.jsonl'], 'out/stuck.jsonl', 1, 'SIGINT');
    expect(r.signal).toBe('SIGINT');
    expect(journalCases(join(root, 'out', 'stuck.jsonl'))).toEqual([0]);
  });

  it('ends a stuck case at --case-time-limit on workers and goes on', async () => {
    const r = await cli(root, ['run', 'jobs/stuck.json', '--concurrency', '1', '--base', 'jobs', '--case-time-limit', '5000']);
    expect(r.code).toBe(1);
    const result = sweepResultFromJson(JSON.parse(r.stdout));
    expect(result.cases.map((c) => c.status)).toEqual(['success', 'error', 'success']);
    expect(result.cases[1]!.error?.code).toBe('sweep-case-time-limit');
  });

  it('shards by reference: shard files name the job file and its fingerprint, run alone, and merge into the whole run', async () => {
    writeFileSync(join(root, 'jobs', 'ref.json'), JSON.stringify(angleJob([0, 0.5, 1, 1.5])));
    const shards = await cli(root, ['shard', 'jobs/ref.json', '--shards', '2', '--out-dir', 'jobs/refshards', '--reference']);
    expect(shards.code).toBe(0);
    const files = shards.stdout.trim().split('\n');
    const shard = JSON.parse(readFileSync(join(root, files[0]!), 'utf8')) as Record<string, unknown>;
    expect(shard).toMatchObject({ format: 'fluxstate-sweep-shard/1', job: '../ref.json', range: { start: 0, end: 2 } });
    expect(JSON.stringify(shard).length).toBeLessThan(400);
    const outs: string[] = [];
    for (const [k, f] of files.entries()) {
      const out = `out/ref-${k}.json`;
      expect((await cli(root, ['run', f, '--in-process', '--out', out])).code).toBe(0);
      outs.push(out);
    }
    const merged = await cli(root, ['merge', ...outs]);
    expect(merged.code).toBe(0);
    expect(sweepResultFromJson(JSON.parse(merged.stdout)).counts.success).toBe(4);
    // The job file changed after sharding: the shard refuses it.
    writeFileSync(join(root, 'jobs', 'ref.json'), JSON.stringify(angleJob([0, 0.5, 1, 2])));
    const changed = await cli(root, ['run', files[0]!, '--in-process']);
    expect(changed.code).toBe(2);
    expect(changed.stderr).toMatch(/fingerprint differs/);
  });
});
