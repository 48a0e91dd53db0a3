/**
 * A converter with a switch, diodes, a capacitor, an inductor and two
 * windings on one core (the demo flyback with 1 uH leakage and an RCD clamp,
 * examples/scenarios/flyback.ts, invented design) run by this checkout and
 * by another (a base commit), in one process, runs alternating so both meet
 * the same load: the ratio of the medians of CPU ms (this / other), and each
 * side's counts. Its mass matrix has dependent rows (the two windings), its
 * diodes change state at located events, its gate at breakpoints.
 *
 * usage: tsx bench/converter-versus.ts <other checkout> [rounds] [periods]
 *        tsx bench/converter-versus.ts cold <checkout> [periods]
 * The second form runs one checkout's converter twice in a fresh process and
 * prints the CPU ms of the first run (JIT included, module loading excluded)
 * and of the second: run it for each checkout in turn, process after process.
 */
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { alternateCpuMs, cpuMs, median } from './timing.js';

type Api = typeof import('../src/index.js');
type Scenario = typeof import('../examples/scenarios/flyback.js');

/** One checkout's converter run: its own API and its own copy of the scenario. */
async function converter(root: string, periods: number): Promise<() => ReturnType<Api['simulate']>> {
  const api = (await import(pathToFileURL(resolve(root, 'src/index.ts')).href)) as Api;
  const scenario = (await import(pathToFileURL(resolve(root, 'examples/scenarios/flyback.ts')).href)) as Scenario;
  const { net } = scenario.flybackConverter({ initialOutput: scenario.idealFlybackOutput() });
  const stopTime = periods / scenario.FLYBACK.frequency;
  return () => api.simulate(net, { stopTime, rtol: 1e-6 });
}

const [first, second, third] = process.argv.slice(2);
if (!first) throw new Error('usage: tsx bench/converter-versus.ts <other checkout> [rounds] [periods] | cold <checkout> [periods]');

if (first === 'cold') {
  if (!second) throw new Error('usage: tsx bench/converter-versus.ts cold <checkout> [periods]');
  const run = await converter(second, Number(third ?? 100));
  let steps = 0;
  const firstMs = cpuMs(() => (steps = run().stats.acceptedSteps));
  const secondMs = cpuMs(run);
  console.log(JSON.stringify({ checkout: resolve(second), steps, first_cpu_ms: firstMs, second_cpu_ms: secondMs }));
} else {
  const rounds = Number(second ?? 30);
  const periods = Number(third ?? 100);
  const here = await converter(resolve(import.meta.dirname, '..'), periods);
  const there = await converter(first, periods);
  const stats = { here: here().stats, there: there().stats }; // the first (cold) runs are not timed
  const ms = alternateCpuMs(rounds, here, there);
  console.log(JSON.stringify({ rounds, periods, here_cpu_ms: median(ms.here), other_cpu_ms: median(ms.there), ratio: median(ms.here) / median(ms.there), here: stats.here, other: stats.there }));
}
