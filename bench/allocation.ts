/**
 * Bytes of V8 heap allocated per warm solve (issue 14): ROBER, VDPOL and
 * HIRES through solveDae (rtol 1e-6, atol = rtol, ROBER's atol rtol * 1e-6,
 * no dense output) and the flux walk through simulate (bench/flux-walk.ts).
 * Each case runs in a process of its own with --single-threaded (no
 * concurrent compilation, so the same code is optimised the same way in
 * every run, and the count repeats to the byte) and a 64 MB young
 * generation; the figure is V8's new-space use after a solve minus before
 * it, the median over 15 warm solves (one during which a scavenge ran shows
 * a drop and is left out), less the same for an empty call (reading the
 * statistics allocates).
 *
 * usage: tsx bench/allocation.ts [checkout...]   (default: this one)
 *        tsx bench/allocation.ts CASE checkout     (one case, one JSON line)
 */
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import v8 from 'node:v8';
import { median, printTable } from './timing.js';

type Api = typeof import('../src/index.js');
type Problems = typeof import('./problems.js');
type Walk = typeof import('./flux-walk.js');

const CASES = ['ROBER', 'VDPOL', 'HIRES', 'FLUXWALK'] as const;

async function solver(name: string, checkout: string): Promise<() => unknown> {
  const load = (file: string): Promise<unknown> => import(pathToFileURL(resolve(checkout, file)).href);
  const api = (await load('src/index.ts')) as Api;
  const problems = (await load('bench/problems.ts')) as Problems;
  const rtol = 1e-6;
  if (name === 'FLUXWALK') {
    const { fluxWalk } = (await load('bench/flux-walk.ts')) as Walk;
    const { net, stopTime } = fluxWalk();
    return () => api.simulate(net, { stopTime, rtol });
  }
  const p = name === 'ROBER' ? problems.robertsonOde(1e11).problem : name === 'VDPOL' ? problems.vanDerPol().problem : problems.hires().problem;
  const options = { rtol, atol: name === 'ROBER' ? rtol * 1e-6 : rtol, denseOutput: false };
  return () => api.solveDae(p, options);
}

/** New-space bytes in use (index 1 of V8's spaces, checked by name). */
function newSpaceUsed(): number {
  const s = v8.getHeapSpaceStatistics()[1]!;
  if (s.space_name !== 'new_space') throw new Error(`V8 space 1 is ${s.space_name}`);
  return s.space_used_size;
}

/** Median bytes allocated per call of fn over `calls` calls, calls spanning a scavenge left out. */
function bytesPerCall(fn: () => unknown, calls: number): number {
  const d: number[] = [];
  for (let k = 0; k < calls; k++) {
    const before = newSpaceUsed();
    fn();
    d.push(newSpaceUsed() - before);
  }
  return median(d.filter((x) => x >= 0));
}

async function oneCase(name: string, checkout: string): Promise<void> {
  const empty = (): number => 0;
  for (let w = 0; w < 50; w++) bytesPerCall(empty, 1);
  const overhead = bytesPerCall(empty, 15);
  const run = await solver(name, checkout);
  for (let w = 0; w < (name === 'FLUXWALK' ? 40 : 60); w++) run(); // warm: the JIT settles
  console.log(JSON.stringify({ case: name, checkout, bytes_per_solve: bytesPerCall(run, 15) - overhead }));
}

function measure(name: string, checkout: string): number {
  const self = fileURLToPath(import.meta.url);
  const flags = ['--single-threaded', '--min-semi-space-size=64', '--max-semi-space-size=64', '--import', 'tsx'];
  const r = spawnSync(process.execPath, [...flags, self, name, checkout], { encoding: 'utf8', cwd: resolve(import.meta.dirname, '..') });
  if (r.status !== 0) throw new Error(`allocation.ts ${name} ${checkout} failed:\n${r.stderr}`);
  return (JSON.parse(r.stdout.trim().split('\n').pop()!) as { bytes_per_solve: number }).bytes_per_solve;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const args = process.argv.slice(2);
  if (args.length === 2 && (CASES as readonly string[]).includes(args[0]!)) {
    await oneCase(args[0]!, resolve(args[1]!));
  } else {
    const checkouts = args.length ? args.map((a) => resolve(a)) : [resolve(import.meta.dirname, '..')];
    const rows = CASES.map((name) => [name, ...checkouts.map((c) => String(measure(name, c)))]);
    printTable(['case (bytes per warm solve)', ...checkouts], rows);
  }
}
