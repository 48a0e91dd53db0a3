/**
 * The flux walk (bench/flux-walk.ts) simulated several times in one fresh
 * process, each run timed on its own: run 0 is cold (JIT included, module
 * loading excluded), run 1 is the second run a sweep or a script pays, and
 * the later ones show when the code has settled. Prints one JSON line with
 * the CPU and wall ms of every run.
 * usage: tsx bench/run-sequence.ts [runs] [checkout]   (checkout: another
 * copy of the project to load instead of this one)
 */
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { fluxWalk } from './flux-walk.js';

type Api = typeof import('../src/index.js');

const runs = Number(process.argv[2] ?? 8);
const root = process.argv[3] ?? resolve(import.meta.dirname, '..');
const api = (await import(pathToFileURL(resolve(root, 'src/index.ts')).href)) as Api;
const { net, stopTime } = fluxWalk(1000, api);
const cpu: number[] = [];
const wall: number[] = [];
let steps = 0;
for (let k = 0; k < runs; k++) {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  steps = api.simulate(net, { stopTime, rtol: 1e-6 }).stats.acceptedSteps;
  wall.push(performance.now() - t0);
  const c = process.cpuUsage(c0);
  cpu.push((c.user + c.system) / 1000);
}
console.log(JSON.stringify({ steps, cpu_ms: cpu, wall_ms: wall }));
