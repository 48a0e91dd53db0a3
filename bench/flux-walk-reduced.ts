/**
 * The flux walk (bench/flux-walk.ts: 1000 periods, rtol 1e-6) through
 * `simulate` in the full formulation (the DAE, four unknowns) and in the
 * reduced one (`formulation: 'reduced'`: the potential and the two currents
 * eliminated inside f, the loop flux alone left to the integrator),
 * alternating within each round in one process, and against compiled
 * RADAU5 on the one-unknown ODE when the bench-anchor is at hand (see
 * bench/flux-walk-anatomy.ts). CPU ms, medians.
 * usage: tsx bench/flux-walk-reduced.ts [rounds]
 */
import { simulate, type SimulationResult } from '../src/index.js';
import { runRadau5 } from './flux-walk-anatomy.js';
import { fluxWalk } from './flux-walk.js';
import { alternateCpuMs, median, printTable } from './timing.js';

/** Prints the table: full against reduced, alternated, and against RADAU5 when at hand. */
export function benchFluxWalkReduced(rounds = 15): void {
  const { net, leg, stopTime } = fluxWalk(1000);
  let full: SimulationResult | undefined;
  let reduced: SimulationResult | undefined;
  const runFull = (): void => {
    full = simulate(net, { stopTime, rtol: 1e-6 });
  };
  const runReduced = (): void => {
    reduced = simulate(net, { stopTime, rtol: 1e-6, formulation: 'reduced' });
  };
  runFull(); // cold runs, not timed
  runReduced();
  const ms = alternateCpuMs(rounds, runReduced, runFull);
  const radau5 = runRadau5();
  const mReduced = median(ms.here);
  const mFull = median(ms.there);
  const row = (name: string, r: SimulationResult, m: number): (string | number)[] => {
    const s = r.stats;
    const flux = r.flux(leg);
    return [name, s.acceptedSteps, s.rejectedSteps, s.newtonIterations / s.acceptedSteps, s.rhsEvaluations, s.jacobianEvaluations, flux[flux.length - 1]!, m, m / (radau5?.cpuMs ?? NaN)];
  };
  console.log(`\n## The flux walk, full against reduced formulation (1000 periods, rtol 1e-6, ${rounds} alternated rounds), CPU ms`);
  const rows = [row('full (default)', full!, mFull), row('reduced', reduced!, mReduced)];
  if (radau5) rows.push(['RADAU5 on the ODE', radau5.steps, 0, radau5.newtonPerStep, radau5.f, radau5.jacobians, radau5.flux, radau5.cpuMs, 1]);
  printTable(['form', 'steps', 'rejected', 'Newton/step', 'f', 'J', 'flux at end Wb', 'CPU ms', '/ RADAU5'], rows);
  console.log(`full / reduced ${(mFull / mReduced).toFixed(2)}${radau5 ? '' : ' (RADAU5 not at hand)'}`);
}

if (import.meta.url === `file://${process.argv[1]}`) benchFluxWalkReduced(Number(process.argv[2] ?? 15));
