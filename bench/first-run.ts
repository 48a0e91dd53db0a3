/**
 * Cold against warm cost of one Test Set problem, in a process of its own:
 * the first solveDae call (JIT included, module loading excluded), the
 * second, then the median CPU time of the calls after the first. usage: tsx bench/first-run.ts ROBER|VDPOL|HIRES|TRANSAMP|RINGMOD rtol
 * Prints one JSON line.
 */
import { createDaeIntegrator, solveDae } from '../src/index.js';
import { hires, maxRelativeError, ringModulator, robertsonOde, testSetAtol, transistorAmplifier, vanDerPol, type TestProblem } from './problems.js';

const make: Record<string, () => TestProblem> = {
  ROBER: () => robertsonOde(1e11),
  VDPOL: () => vanDerPol(),
  HIRES: () => hires(),
  TRANSAMP: () => transistorAmplifier(),
  RINGMOD: () => ringModulator(),
};

const [name = 'ROBER', rtolText = '1e-6'] = process.argv.slice(2);
const tp = make[name]!();
const rtol = Number(rtolText);
const atol = testSetAtol(name, rtol);
const cpu = (fn: () => unknown): number => {
  const c0 = process.cpuUsage();
  fn();
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1000;
};
let last: ReturnType<typeof solveDae> | undefined;
const first = cpu(() => (last = solveDae(tp.problem, { rtol, atol, denseOutput: false })));
const warm: number[] = [];
let spent = 0;
while (spent < 1500 || warm.length < 5) {
  const ms = cpu(() => (last = solveDae(tp.problem, { rtol, atol, denseOutput: false })));
  warm.push(ms);
  spent += ms;
  if (warm.length >= 5000) break;
}
const second = warm[0];
warm.sort((a, b) => a - b);
const sol = last!;
const y = sol.y[sol.y.length - 1]!;
console.log(JSON.stringify({
  problem: name, rtol, status: sol.status, steps: sol.stats.acceptedSteps,
  first_cpu_ms: first, second_cpu_ms: second, warm_cpu_ms: warm[warm.length >> 1], err: maxRelativeError(y, tp.reference, atol),
  // The solver's own first step, for a yardstick that should start from the same h.
  h0: createDaeIntegrator(tp.problem, { rtol, atol, denseOutput: false }).h,
}));
