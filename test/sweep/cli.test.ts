import { execFile } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runSweep, sweepResultFromJson, type SweepJob, type SweepResult } from '../../src/sweep/index.js';
import { buildJs } from './build-js.js';
import { angleJob, F, rlPeak } from './rl-network.js';

// The command line, run from a plain-JavaScript build of src/ (laid out like dist/)
// with plain node: the launch path of the published package, workers included.

function cli(root: string, args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [join(root, 'dist', 'sweep', 'cli.js'), ...args], { cwd: root, maxBuffer: 64 << 20 }, (error, stdout, stderr) => {
      resolve({ code: error ? Number(error.code ?? 1) : 0, stdout, stderr });
    });
  });
}

let root = '';
let job: SweepJob;
/** The same job run in process from the TypeScript sources. */
let reference: SweepResult;

beforeAll(async () => {
  root = buildJs();
  mkdirSync(join(root, 'jobs'));
  // A drive function as plain JavaScript beside the job, referenced by module path.
  writeFileSync(join(root, 'jobs', 'drives.mjs'), 'export function mainsSine(t) { return 100 * Math.sin(2 * Math.PI * 50 * t); }\n');
  const base = angleJob([0, 0.5, 1, 1.5, 2]);
  job = {
    ...base,
    network: {
      ...base.network,
      elements: base.network.elements.map((e) =>
        e.kind === 'voltage-source' ? { ...e, waveform: { kind: 'function' as const, module: './drives.mjs', export: 'mainsSine' } } : e,
      ),
    },
    // The angle now scales nothing the function reads: sweep the winding resistance instead.
    parameters: { axes: [{ name: 'resistance', target: { element: 'coil', field: 'resistance' } }], grid: { resistance: [2.1, 1, 3, 5, 8] } },
  };
  writeFileSync(join(root, 'jobs', 'job.json'), JSON.stringify(job));
  reference = await runSweep(job, { inProcess: true, baseUrl: pathToFileURL(join(root, 'jobs/')) });
}, 60_000);

// The node_modules inside is a symbolic link: rmSync removes the link, not its target.
afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('sweep CLI (built JavaScript, plain node)', () => {
  it('runs a job file on worker threads and prints the result JSON, equal bit for bit to an in-process run from the sources', async () => {
    // toEqual compares numbers with Object.is: +0 and -0 differ, so equality here is bit for bit.
    const { code, stdout, stderr } = await cli(root, ['run', 'jobs/job.json', '--concurrency', '2', '--base', 'jobs']);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const result = sweepResultFromJson(JSON.parse(stdout));
    expect(result.mode).toBe('workers');
    expect(result.counts.success).toBe(5);
    expect(result.cases).toEqual(reference.cases);
    // The first case is the RL winding of rl-network.ts switched at theta = 0 (closed form).
    expect(Math.abs((result.cases[0]!.outputs['peak current'] as number) / rlPeak(0, 2 / F) - 1)).toBeLessThan(1e-3);
  });

  it('splits a job into shard files whose results merge into the whole run', async () => {
    const shards = await cli(root, ['shard', 'jobs/job.json', '--shards', '2', '--out-dir', 'jobs/shards']);
    expect(shards.code).toBe(0);
    const files = shards.stdout.trim().split('\n');
    expect(files).toEqual(['jobs/shards/job.shard-0.json', 'jobs/shards/job.shard-1.json']);
    const outs: string[] = [];
    for (const [k, file] of files.entries()) {
      const out = `jobs/shards/result-${k}.json`;
      const r = await cli(root, ['run', file, '--in-process', '--base', 'jobs', '--out', out]);
      expect(r.code).toBe(0);
      outs.push(out);
    }
    const merged = await cli(root, ['merge', ...outs.reverse()]);
    expect(merged.code).toBe(0);
    const first = sweepResultFromJson(JSON.parse(readFileSync(join(root, 'jobs', 'shards', 'result-0.json'), 'utf8')));
    expect(first.range).toEqual({ start: 0, end: 2 });
    const all = sweepResultFromJson(JSON.parse(merged.stdout));
    expect(all.range).toEqual({ start: 0, end: 5 });
    expect(all.cases).toEqual(reference.cases);
  });

  it('exits 1 when a case fails, 2 with the error on stderr for an invalid job or bad usage', async () => {
    writeFileSync(join(root, 'jobs', 'failing.json'), JSON.stringify({ ...job, parameters: { ...job.parameters, grid: { resistance: [2, -1] } } }));
    const failing = await cli(root, ['run', 'jobs/failing.json', '--in-process', '--base', 'jobs']);
    expect(failing.code).toBe(1);
    expect(JSON.parse(failing.stdout).counts).toMatchObject({ success: 1, error: 1 });
    writeFileSync(join(root, 'jobs', 'invalid.json'), JSON.stringify({ ...job, simulate: { stopTime: 'soon' } }));
    const invalid = await cli(root, ['run', 'jobs/invalid.json']);
    expect(invalid.code).toBe(2);
    expect(invalid.stderr).toMatch(/InputError \[sweep-bad-job\]: sweep job: simulate\.stopTime/);
    const usage = await cli(root, ['launch']);
    expect(usage.code).toBe(2);
    expect(usage.stderr).toMatch(/unknown command "launch"[\s\S]*usage:/);
  });

  it('prints the usage on stdout and exits 0 for --help (asking for help is not an error)', async () => {
    for (const args of [['--help'], ['-h'], ['help'], ['run', '--help']]) {
      const help = await cli(root, args);
      expect(help.code).toBe(0);
      expect(help.stdout).toMatch(/^usage:\n {2}fluxstate-sweep run <job\.json/);
      expect(help.stderr).toBe('');
    }
    const none = await cli(root, []);
    expect(none.code).toBe(2);
    expect(none.stderr).toMatch(/no command/);
  });
});
