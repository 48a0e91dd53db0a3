/**
 * Security probes of sweep job files: a module named by a job runs with the
 * user's rights, so a job may only name a relative path to a file inside its
 * base folder or a folder the caller allows explicitly. Each probe below is a
 * hostile reference; the module it names would write a marker file when
 * imported, and the test checks both the refusal (`sweep-bad-job` naming the
 * field) and that the marker was never written (nothing was imported).
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { InputError } from '../../src/index.js';
import { resolveFunctionWaveforms, runSweep, type SweepJob } from '../../src/sweep/index.js';
import { angleJob } from './rl-network.js';

let root = '';
let jobs = '';
let marker = '';

const SINE = 'export function mainsSine(t) { return 100 * Math.sin(2 * Math.PI * 50 * t); }\n';

beforeAll(() => {
  root = mkdtempSync(join(tmpdir(), 'fluxstate-job-modules-'));
  jobs = join(root, 'jobs');
  marker = join(root, 'imported.txt');
  for (const d of ['jobs', 'outside', 'trusted', 'jobs/sub']) mkdirSync(join(root, d));
  const evil = `import { writeFileSync } from 'node:fs';\nwriteFileSync(${JSON.stringify(marker)}, 'ran');\n${SINE}`;
  writeFileSync(join(root, 'outside', 'evil.mjs'), evil);
  writeFileSync(join(root, 'jobs', 'drives.mjs'), SINE);
  writeFileSync(join(root, 'trusted', 'drives.mjs'), SINE);
  symlinkSync(join(root, 'outside', 'evil.mjs'), join(jobs, 'link.mjs'));
  symlinkSync(join(root, 'outside'), join(jobs, 'linkdir'));
});

afterAll(() => rmSync(root, { recursive: true, force: true }));

/** The RL job with its source given by module reference. */
function jobNaming(module: string): SweepJob {
  const base = angleJob([0, 1]);
  return {
    ...base,
    network: {
      ...base.network,
      elements: base.network.elements.map((e) =>
        e.kind === 'voltage-source' ? { ...e, waveform: { kind: 'function' as const, module, export: 'mainsSine' } } : e,
      ),
    },
    parameters: { axes: [{ name: 'resistance', target: { element: 'coil', field: 'resistance' } }], grid: { resistance: [2.1, 3] } },
  };
}

const FIELD = 'network.elements[0] (voltage-source "mains").waveform.module';

const probes = (): [string, string][] => [
  ['a data: URL', `data:text/javascript,import{writeFileSync}from'node:fs';writeFileSync(${JSON.stringify(marker)},'ran');export function mainsSine(){return 0}`],
  ['a file: URL outside the base folder', pathToFileURL(join(root, 'outside', 'evil.mjs')).href],
  ['a file: URL even inside the base folder', pathToFileURL(join(jobs, 'drives.mjs')).href],
  ['an absolute path', join(root, 'outside', 'evil.mjs')],
  ['a ../ path out of the base folder', '../outside/evil.mjs'],
  ['a path that leaves through a subfolder', './sub/../../outside/evil.mjs'],
  ['a symbolic link to a file outside', './link.mjs'],
  ['a path through a symbolic link to a folder outside', './linkdir/evil.mjs'],
  ['a built-in module', 'node:fs'],
  ['a package name', 'vitest'],
  ['an http: URL', 'http://127.0.0.1:9/evil.mjs'],
  ['a Windows drive path', 'C:\\outside\\evil.mjs'],
  ['a path with a NUL byte', './drives.mjs\0.txt'],
];

async function refusal(p: Promise<unknown>): Promise<InputError> {
  const e = await p.then(() => undefined, (x: unknown) => x);
  expect(e).toBeInstanceOf(InputError);
  return e as InputError;
}

describe('module references in sweep job files', () => {
  it.each(probes().map(([what]) => [what]))('refuses %s with sweep-bad-job naming the field, importing nothing', async (what) => {
    const module = probes().find(([w]) => w === what)![1];
    const e = await refusal(runSweep(jobNaming(module), { inProcess: true, baseUrl: jobs }));
    expect(e.code).toBe('sweep-bad-job');
    expect(e.elements[0]).toBe(FIELD);
    expect(e.message).toContain(FIELD);
    expect(e.message).toMatch(/is refused/);
    // The public resolver applies the same rule.
    const direct = await refusal(resolveFunctionWaveforms(jobNaming(module).network, { baseUrl: jobs }));
    expect(direct.code).toBe('sweep-bad-job');
    expect(existsSync(marker)).toBe(false);
  });

  it('runs a module given by a relative path inside the base folder', async () => {
    const r = await runSweep(jobNaming('./drives.mjs'), { inProcess: true, baseUrl: jobs });
    expect(r.counts.success).toBe(2);
  });

  it('accepts a folder outside the base only when the caller allows it in code', async () => {
    const e = await refusal(runSweep(jobNaming('../trusted/drives.mjs'), { inProcess: true, baseUrl: jobs }));
    expect(e.code).toBe('sweep-bad-job');
    const r = await runSweep(jobNaming('../trusted/drives.mjs'), { inProcess: true, baseUrl: jobs, allowModuleFolders: [join(root, 'trusted')] });
    expect(r.counts.success).toBe(2);
    // Allowing one folder does not open another.
    const other = await refusal(runSweep(jobNaming('../outside/evil.mjs'), { inProcess: true, baseUrl: jobs, allowModuleFolders: [join(root, 'trusted')] }));
    expect(other.code).toBe('sweep-bad-job');
    expect(existsSync(marker)).toBe(false);
  });

  it('refuses a hostile module set by a sweep axis in the case that sets it (worker threads), and runs the others', async () => {
    const job: SweepJob = {
      ...jobNaming('./drives.mjs'),
      parameters: { axes: [{ name: 'drive', target: { element: 'mains', field: 'waveform.module' } }], grid: { drive: ['./drives.mjs', '../outside/evil.mjs', './link.mjs'] } },
    };
    const r = await runSweep(job, { concurrency: 2, baseUrl: jobs });
    expect(r.cases.map((c) => c.status)).toEqual(['success', 'error', 'error']);
    for (const c of r.cases.slice(1)) {
      expect(c.error?.code).toBe('sweep-bad-job');
      expect(c.error?.elements?.[0]).toBe(FIELD);
    }
    expect(existsSync(marker)).toBe(false);
  });

  it('refuses a base folder that is not on this machine', async () => {
    const e = await refusal(runSweep(jobNaming('./drives.mjs'), { inProcess: true, baseUrl: 'http://127.0.0.1:9/jobs/' }));
    expect(e.code).toBe('sweep-bad-option');
  });
});
