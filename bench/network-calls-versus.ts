/**
 * The network layer's f and Jacobian alone, without the solver: the flux
 * walk's network (bench/flux-walk.ts) compiled by this checkout and by
 * another (a base commit), in one process, each side making as many f and
 * J calls per round as one flux-walk run makes (38292 f, 3802 J at rtol
 * 1e-6), at states spread over the core's B-H curve and times over a drive
 * period. Rounds alternate which side goes first, so both meet the same
 * load. Prints the medians of CPU ms per round, their ratio (this / other)
 * and a checksum of each side's outputs (equal when both compute the same
 * f and J bit for bit).
 * usage: tsx bench/network-calls-versus.ts <other checkout> [rounds]
 */
import { createHash } from 'node:crypto';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { fluxWalk } from './flux-walk.js';
import { alternateCpuMs, median } from './timing.js';

type Api = typeof import('../src/index.js');
type Compile = typeof import('../src/formulation/compile-network.js');

const other = process.argv[2];
if (!other) throw new Error('usage: tsx bench/network-calls-versus.ts <other checkout> [rounds]');
const rounds = Number(process.argv[3] ?? 60);

/** f and J calls of one flux-walk run (its solver stats at rtol 1e-6). */
const F_CALLS = 38292;
const J_CALLS = 3802;
/** Distinct states the calls cycle through. */
const STATES = 997;

async function load(root: string): Promise<{ api: Api; compile: Compile }> {
  const api = (await import(pathToFileURL(resolve(root, 'src/index.ts')).href)) as Api;
  const compile = (await import(pathToFileURL(resolve(root, 'src/formulation/compile-network.ts')).href)) as Compile;
  return { api, compile };
}

/** One side: its compiled walk network and a round of calls that returns a checksum of the outputs. */
function side({ api, compile }: { api: Api; compile: Compile }): () => number {
  const { net } = fluxWalk(1000, api);
  const compiled = compile.compileNetwork(net.describe());
  const n = compiled.layout.size;
  // States: drive at +/-12 V, currents of a few amperes, loop flux over +/-1.5 B_sat A (the law's knee is at 0.04 T scale).
  const ys: Float64Array[] = [];
  for (let k = 0; k < STATES; k++) {
    const y = new Float64Array(n);
    const s = Math.sin((2 * Math.PI * k) / STATES);
    for (let i = 0; i < n; i++) y[i] = (i + 1) * 0.7 * Math.cos((k + 3 * i) / 7);
    y[n - 1] = 1.5 * 0.3 * 1e-4 * s;
    ys.push(y);
  }
  const out = new Float64Array(n);
  const J = new Float64Array(n * n);
  return () => {
    let sum = 0;
    for (let c = 0; c < F_CALLS; c++) {
      const t = ((c % 100) / 100) * 1e-5;
      compiled.rhs(t, ys[c % STATES]!, out);
      sum += out[c % n]!;
    }
    for (let c = 0; c < J_CALLS; c++) {
      J.fill(0);
      compiled.jacobian(((c % 100) / 100) * 1e-5, ys[c % STATES]!, J);
      sum += J[(c * 5) % (n * n)]!;
    }
    return sum;
  };
}

const runs = { here: side(await load(resolve(import.meta.dirname, '..'))), there: side(await load(resolve(other))) };
const digest = (x: number): string => createHash('sha256').update(Float64Array.of(x)).digest('hex').slice(0, 16);
const check = { here: digest(runs.here()), there: digest(runs.there()) }; // the first (cold) rounds are not timed
const ms = alternateCpuMs(rounds, runs.here, runs.there);
console.log(
  JSON.stringify({ rounds, here_cpu_ms: median(ms.here), other_cpu_ms: median(ms.there), ratio: median(ms.here) / median(ms.there), check }),
);
