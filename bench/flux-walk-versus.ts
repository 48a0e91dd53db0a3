/**
 * The flux walk (bench/flux-walk.ts) of this checkout against the same
 * network run by another checkout of the project (a base commit), in one
 * process, runs alternating so both meet the same load: the ratio of the
 * medians of CPU ms (this / other), and each side's counts.
 * usage: tsx bench/flux-walk-versus.ts <other checkout> [rounds]
 */
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { fluxWalk } from './flux-walk.js';
import { alternateCpuMs, median } from './timing.js';

type Api = typeof import('../src/index.js');

const other = process.argv[2];
if (!other) throw new Error('usage: tsx bench/flux-walk-versus.ts <other checkout> [rounds]');
const rounds = Number(process.argv[3] ?? 40);
const here = (await import(pathToFileURL(resolve(import.meta.dirname, '../src/index.ts')).href)) as Api;
const there = (await import(pathToFileURL(resolve(other, 'src/index.ts')).href)) as Api;

/** The walk of bench/flux-walk.ts built with one checkout's API (its own classes). */
function walk(api: Api) {
  const { net, stopTime } = fluxWalk(1000, api);
  return () => api.simulate(net, { stopTime, rtol: 1e-6 });
}

const runs = { here: walk(here), there: walk(there) };
const stats = { here: runs.here().stats, there: runs.there().stats }; // the first (cold) runs are not timed
const ms = alternateCpuMs(rounds, runs.here, runs.there);
console.log(JSON.stringify({ rounds, here_cpu_ms: median(ms.here), other_cpu_ms: median(ms.there), ratio: median(ms.here) / median(ms.there), here: stats.here, other: stats.there }));
