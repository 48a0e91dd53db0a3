/**
 * What a small Test Set solve costs besides its steps, in a process of its
 * own: warm CPU microseconds per call (median of batches) of one of
 * - `solve`: solveDae over the whole span, as bench/first-run.ts times it,
 * - `create`: createDaeIntegrator alone (validation, set-up, consistent
 *   start, first step size),
 * - `tiny`: solveDae to a tEnd 1e-9 after t0 (the set-up, one step and the
 *   solution object),
 * at rtol 1e-6, denseOutput false, with the checkout given (default: this one).
 * usage: tsx bench/setup-cost.ts ROBER|VDPOL|HIRES solve|create|tiny [checkout]
 * Prints one JSON line. bench/setup-cost-versus.ts alternates two checkouts
 * process by process.
 */
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { DaeProblem } from '../src/index.js';
import { cpuMs, median } from './timing.js';

type Api = typeof import('../src/index.js');
type Problems = typeof import('./problems.js');

const [name = 'HIRES', mode = 'solve', checkout = resolve(import.meta.dirname, '..')] = process.argv.slice(2);
const api = (await import(pathToFileURL(resolve(checkout, 'src/index.ts')).href)) as Api;
const problems = (await import(pathToFileURL(resolve(checkout, 'bench/problems.ts')).href)) as Problems;
const make: Record<string, () => DaeProblem> = {
  ROBER: () => problems.robertsonOde(1e11).problem,
  VDPOL: () => problems.vanDerPol().problem,
  HIRES: () => problems.hires().problem,
};
const whole = make[name]!();
const rtol = 1e-6;
// The Test Set's tolerances, as in bench/first-run.ts: ROBER's atol six orders below rtol.
const atol = name === 'ROBER' ? rtol * 1e-6 : rtol;
const options = { rtol, atol, denseOutput: false };
const problem = mode === 'tiny' ? { ...whole, tEnd: whole.t0 + 1e-9 } : whole;
const call: Record<string, () => unknown> = {
  solve: () => api.solveDae(problem, options),
  create: () => api.createDaeIntegrator(problem, options),
  tiny: () => api.solveDae(problem, options),
};
const run = call[mode]!;
// Calls per timed batch: about a millisecond or more each (process.cpuUsage's resolution is a microsecond).
const batch = mode === 'solve' ? 4 : 50;
const timeBatch = (): number =>
  cpuMs(() => {
    for (let k = 0; k < batch; k++) run();
  });
for (let w = 0; w < 20; w++) timeBatch(); // JIT warm-up, not timed
const perCallUs: number[] = [];
let spent = 0;
while (spent < 1500 || perCallUs.length < 20) {
  const ms = timeBatch();
  perCallUs.push((1000 * ms) / batch);
  spent += ms;
}
console.log(JSON.stringify({ problem: name, mode, checkout, batches: perCallUs.length, batch, us_per_call: median(perCallUs) }));
