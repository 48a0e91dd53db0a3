/**
 * Sweep speedup: one energisation sweep of the mains transformer of
 * examples/scenarios/mains-inrush.ts (switching angle x remanence, 32 cases of
 * 200 cycles, long enough to follow the DC offset's decay to steady state) run in process and on worker threads, wall time side by side.
 *
 * The sweep runs from a plain-JavaScript build of src/ (made here, laid out
 * like dist/), as a user of the published package runs it: workers load .js
 * files. One more row runs the same sweep from the TypeScript sources, where
 * every worker first loads the sources through tsx (about a second each on
 * this kind of machine): that is the cost of `tsx script.ts` and of the tests,
 * not of the package.
 *
 * A fresh worker is a fresh V8 isolate: its first cases run before the JIT has
 * warmed up (several times slower than later ones), so workers pay off when
 * the sweep is long against that start-up, which the last line measures on its
 * own. Each sweep is timed once (about ten seconds in process).
 */
import { rmSync } from 'node:fs';
import { availableParallelism, cpus, loadavg } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { mainsTransformer } from '../examples/scenarios/mains-inrush.js';
import * as fromSources from '../src/sweep/index.js';
import type { SweepJob, SweepResult } from '../src/sweep/index.js';
import { buildJs } from '../test/sweep/build-js.js';
import { printTable } from './timing.js';

const PERIOD = 0.02;
type SweepModule = typeof fromSources;

function inrushJob(): SweepJob {
  const angles = [0, 22.5, 45, 67.5, 90, 112.5, 135, 157.5].map((d) => (d * Math.PI) / 180);
  return {
    name: 'mains inrush: angle x remanence',
    network: mainsTransformer({ switchingAngleDeg: 0, remanence: 0 }).net.describe(),
    simulate: { stopTime: 200 * PERIOD, rtol: 1e-6, maxStep: PERIOD / 50 },
    parameters: {
      axes: [
        { name: 'angle', target: { element: 'mains', field: 'waveform.phase' } },
        { name: 'remanence', target: { tube: 'leg-left', field: 'initialFluxDensity' } },
      ],
      grid: { angle: angles, remanence: [-0.8, -0.4, 0.4, 0.8] },
    },
    outputs: [
      { name: 'peak inrush', quantity: 'current', of: { element: 'primary' }, metric: 'peak' },
      { name: 'peak B', quantity: 'fluxDensity', of: { tube: 'leg-left' }, metric: 'peak' },
      { name: 'dc offset', quantity: 'fluxDensity', of: { tube: 'leg-left' }, metric: 'cycle-means', period: PERIOD },
    ],
  };
}

/** Median wall time of `repeats` sweeps, the CPU time of that run (all threads of this process), and the last result. */
async function timeSweep(run: () => Promise<SweepResult>, repeats: number): Promise<{ ms: number; cpuMs: number; result: SweepResult }> {
  const runs: { ms: number; cpuMs: number }[] = [];
  let result: SweepResult | undefined;
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    result = await run();
    const c = process.cpuUsage(c0);
    runs.push({ ms: performance.now() - t0, cpuMs: (c.user + c.system) / 1000 });
  }
  runs.sort((a, b) => a.ms - b.ms);
  return { ...runs[Math.floor(runs.length / 2)]!, result: result! };
}

export async function benchSweep(): Promise<void> {
  const cores = availableParallelism();
  const job = inrushJob();
  const root = buildJs();
  const built = (await import(pathToFileURL(join(root, 'dist', 'sweep', 'index.js')).href)) as SweepModule;
  console.log(`\n## Sweep: 32 energisations of the mains transformer (8 angles x 4 remanences, 200 cycles each)`);
  console.log(`${cores} cores (${cpus()[0]?.model ?? 'unknown cpu'}), load average before: ${loadavg().map((x) => x.toFixed(1)).join(' ')}; built JavaScript unless marked`);
  // Warm the JIT (in process) and the OS file cache (workers), untimed.
  await built.runSweep({ ...job, range: { start: 0, end: 2 } }, { inProcess: true });
  await built.runSweep({ ...job, range: { start: 0, end: 2 } }, { concurrency: 2 });

  const serial = await timeSweep(() => built.runSweep(job, { inProcess: true }), 1);
  const same = (r: SweepResult): boolean => JSON.stringify(built.sweepResultToJson(r).cases) === JSON.stringify(built.sweepResultToJson(serial.result).cases);
  // CPU time / wall time: how many cores the run actually got (the machine may be shared).
  const row = (mode: string, threads: number, t: { ms: number; cpuMs: number; result: SweepResult }, identical: string): (string | number)[] =>
    [mode, threads, t.ms, (serial.ms / t.ms).toFixed(2), (t.cpuMs / t.ms).toFixed(2), t.result.counts.success, identical];
  const rows: (string | number)[][] = [row('in process', 1, serial, 'reference')];
  for (const c of [...new Set([1, 2, cores])].sort((a, b) => a - b)) {
    const w = await timeSweep(() => built.runSweep(job, { concurrency: c }), 1);
    rows.push(row('workers', c, w, same(w.result) ? 'yes' : 'NO'));
  }
  const ts = await timeSweep(() => fromSources.runSweep(job, { concurrency: cores }), 1);
  rows.push(row('workers, TS sources (tsx)', cores, ts, same(ts.result) ? 'yes' : 'NO'));
  printTable(['mode', 'threads', 'wall ms', 'speedup vs in process', 'cores used (cpu/wall)', 'cases ok', 'results identical'], rows);
  const oneCase = await timeSweep(() => built.runSweep({ ...job, range: { start: 0, end: 1 } }, { inProcess: true }), 3);
  const oneOnWorker = await timeSweep(() => built.runSweep({ ...job, range: { start: 0, end: 1 } }, { concurrency: 1 }), 3);
  console.log(
    `one case (median of 3): ${oneCase.ms.toFixed(0)} ms in process (warm JIT), ${oneOnWorker.ms.toFixed(0)} ms on a fresh worker ` +
      `(so a worker's start, module loading and cold JIT cost about ${(oneOnWorker.ms - oneCase.ms).toFixed(0)} ms); ` +
      `load average after: ${loadavg().map((x) => x.toFixed(1)).join(' ')}`,
  );
  rmSync(root, { recursive: true, force: true }); // the node_modules inside is a link: only the link goes
  const worst = serial.result.cases.reduce((a, b) => ((b.outputs['peak inrush'] as number) > (a.outputs['peak inrush'] as number) ? b : a));
  console.log(
    `worst case: angle ${(((worst.parameters.angle as number) * 180) / Math.PI).toFixed(1)} deg, remanence ${String(worst.parameters.remanence)} T, ` +
      `peak inrush ${(worst.outputs['peak inrush'] as number).toFixed(1)} A (engineering estimate of an invented design; local codes, standards and licensed practice govern protection settings)`,
  );
}
