/**
 * `npm run bench`: our Radau IIA (solveDae) against odex 2.0.4 (Hairer's
 * non-stiff extrapolation code) on the stiff test set at the same
 * tolerances, the linear-algebra kernels, the kernels inside the solver, and,
 * when SciPy is importable, SciPy's solve_ivp (Radau, BDF), and the sweep
 * speedup on worker threads (bench/sweep.ts), first-run against warm cost,
 * memory against steps (bench/memory.ts), the commutations of a flyback with
 * ideal against exponential diodes (bench/flyback-commutation.ts), the ratios to compiled RADAU5
 * when the bench-anchor yardstick is at hand (bench/anchor.ts), a small solve's kernels against the
 * rest of the solver (bench/kernel-share.ts), and the flux walk taken apart
 * (network layer, differential-algebraic form, solver; bench/flux-walk-anatomy.ts), and the
 * flux walk in the full against the reduced formulation (bench/flux-walk-reduced.ts), and both
 * formulations' work against accuracy on an energisation (bench/formulation-accuracy.ts). Prints tables;
 * wall times are medians of a few repeats. Total run time about a minute.
 */
import { solveDae, type DaeProblem, type SolveDaeOptions } from '../src/index.js';
import { Solver } from '../test/support/odex.js';
import { benchAgainstRadau5, benchColdWarm } from './anchor.js';
import { benchLinearAlgebra } from './linear-algebra.js';
import { benchMemory } from './memory.js';
import { hires, maxRelativeError, rcLadder, ringModulator, robertsonDae, robertsonOde, transistorAmplifier, vanDerPol, type TestProblem } from './problems.js';
import { benchScipy } from './scipy.js';
import { benchFlybackCommutation } from './flyback-commutation.js';
import { benchPeriodicSteadyState } from './pss.js';
import { benchRestarts, benchSparseSwitch } from './solver-paths.js';
import { benchSweep } from './sweep.js';
import { benchDevices } from './devices.js';
import { benchLadder } from './ladder.js';
import { benchKernelShare } from './kernel-share.js';
import { benchLoaderCost } from './loader-cost.js';
import { benchFluxWalkAnatomy } from './flux-walk-anatomy.js';
import { benchFluxWalkReduced } from './flux-walk-reduced.js';
import { benchFormulationAccuracy } from './formulation-accuracy.js';
import { printTable, timeMedian } from './timing.js';

/** odex step budget: beyond this it is reported as exceeded (it is not built for stiff problems). */
const ODEX_MAX_STEPS = 50_000;

interface Run {
  readonly status: string;
  readonly steps: number;
  readonly rhs: number;
  readonly ms: number;
  readonly err: number;
}

function runOurs(problem: DaeProblem, reference: readonly number[], options: SolveDaeOptions, repeats: number): Run {
  const { ms, result } = timeMedian(() => solveDae(problem, { ...options, denseOutput: false }), repeats);
  const y = result.y[result.y.length - 1]!;
  return {
    status: result.status,
    steps: result.stats.acceptedSteps + result.stats.rejectedSteps,
    rhs: result.stats.rhsEvaluations,
    ms,
    err: reference.length ? maxRelativeError(y, reference, Number(options.atol ?? 0)) : NaN,
  };
}

function runOdex(tp: TestProblem, tEnd: number, reference: readonly number[], rtol: number, atol: number, repeats: number): Run {
  const f = tp.odexRhs!;
  let evals = 0;
  let reached = tp.problem.t0;
  const counted = (t: number, y: number[]): number[] => {
    evals++;
    return f(t, y);
  };
  const once = () => {
    const s = new Solver(tp.problem.size);
    s.relativeTolerance = rtol;
    s.absoluteTolerance = atol;
    s.maxSteps = ODEX_MAX_STEPS;
    evals = 0;
    return s.solve(counted, tp.problem.t0, Array.from(tp.problem.y0), tEnd, (_n, _xOld, x) => {
      reached = x;
    });
  };
  const first = timeMedian(once, 1);
  const exceeded = first.result.outcome !== 0;
  const { ms, result } = exceeded ? first : timeMedian(once, repeats);
  return {
    status: exceeded ? `exceeded ${ODEX_MAX_STEPS} steps at t=${reached.toPrecision(3)}` : 'success',
    steps: result.nStep,
    rhs: evals,
    ms,
    err: !exceeded && reference.length ? maxRelativeError(result.y, reference, atol) : NaN,
  };
}

function ratio(a: number, b: number): string {
  return Number.isFinite(a / b) ? (a / b).toPrecision(3) : '-';
}

function benchAgainstOdex(): void {
  console.log('\n## Stiff problems: ours (Radau IIA, analytic Jacobian) vs odex, same rtol/atol');
  console.log('err: max relative error vs the Test Set reference at tEnd (absolute below atol); odex budget ' + ODEX_MAX_STEPS + ' steps');
  const cases: { tp: TestProblem; tEnd?: number; rtol: number; atol: number }[] = [
    { tp: robertsonOde(1e11), rtol: 1e-6, atol: 1e-12 },
    { tp: robertsonOde(40), rtol: 1e-6, atol: 1e-12 },
    { tp: vanDerPol(), rtol: 1e-6, atol: 1e-6 },
    { tp: vanDerPol(), tEnd: 2, rtol: 1e-6, atol: 1e-6 },
    { tp: hires(), rtol: 1e-6, atol: 1e-6 },
    { tp: hires(), rtol: 1e-10, atol: 1e-10 },
    { tp: ringModulator(), rtol: 1e-6, atol: 1e-6 },
    { tp: transistorAmplifier(), rtol: 1e-6, atol: 1e-6 },
    { tp: transistorAmplifier(), rtol: 1e-10, atol: 1e-10 },
    { tp: robertsonDae(1e11), rtol: 1e-6, atol: 1e-12 },
  ];
  const rows: (string | number)[][] = [];
  for (const c of cases) {
    const tEnd = c.tEnd ?? c.tp.problem.tEnd;
    const reference = tEnd === c.tp.problem.tEnd ? c.tp.reference : [];
    const problem = { ...c.tp.problem, tEnd };
    const heavy = c.tp.name === 'RINGMOD';
    const ours = runOurs(problem, reference, { rtol: c.rtol, atol: c.atol }, heavy ? 1 : 5);
    const odex = c.tp.odexRhs ? runOdex(c.tp, tEnd, reference, c.rtol, c.atol, 3) : undefined;
    const name = `${c.tp.name.replace(/ t=.*/, '')} [0, ${tEnd}] rtol ${c.rtol}`;
    rows.push([
      name,
      ours.steps,
      ours.rhs,
      ours.ms,
      Number.isNaN(ours.err) ? '-' : ours.err,
      odex ? odex.steps : 'n/a (DAE)',
      odex ? odex.rhs : '-',
      odex ? odex.ms : '-',
      odex ? (Number.isNaN(odex.err) ? '-' : odex.err) : '-',
      odex ? ratio(odex.rhs, ours.rhs) : '-',
      odex ? ratio(odex.ms, ours.ms) : '-',
      odex && odex.status !== 'success' ? odex.status : ours.status !== 'success' ? `ours: ${ours.status}` : '',
    ]);
  }
  printTable(['problem', 'steps', 'f evals', 'ms', 'err', 'odex steps', 'odex f', 'odex ms', 'odex err', 'f odex/ours', 'time odex/ours', 'note'], rows);
}

function benchKernelsInSolver(): void {
  console.log("\n## Kernels inside the solver: linearAlgebra 'flat' vs 'ml-matrix' (median ms)");
  const rows: (string | number)[][] = [];
  const cases: { name: string; problem: DaeProblem; rtol: number; repeats: number }[] = [
    { name: 'TRANSAMP (n = 8)', problem: transistorAmplifier().problem, rtol: 1e-6, repeats: 5 },
    { name: 'HIRES (n = 8)', problem: hires().problem, rtol: 1e-6, repeats: 5 },
    { name: 'RC ladder (n = 50)', problem: rcLadder(50), rtol: 1e-6, repeats: 3 },
    { name: 'RC ladder (n = 150)', problem: rcLadder(150), rtol: 1e-6, repeats: 1 },
  ];
  for (const c of cases) {
    const flat = timeMedian(() => solveDae(c.problem, { rtol: c.rtol, atol: c.rtol, denseOutput: false }), c.repeats);
    const ml = timeMedian(() => solveDae(c.problem, { rtol: c.rtol, atol: c.rtol, denseOutput: false, linearAlgebra: 'ml-matrix' }), c.repeats);
    rows.push([c.name, flat.result.stats.acceptedSteps, flat.result.stats.luFactorizations, flat.ms, ml.ms, ratio(ml.ms, flat.ms)]);
  }
  printTable(['problem', 'steps', 'LU', 'flat ms', 'ml-matrix ms', 'ml/flat'], rows);
}

const started = performance.now();
console.log(`# fluxstate solver benchmark (node ${process.version}, ${new Date().toISOString()})`);
benchLinearAlgebra();
benchKernelsInSolver();
benchSparseSwitch();
benchLadder();
benchRestarts();
benchAgainstOdex();
benchScipy();
benchPeriodicSteadyState();
benchDevices();
benchFlybackCommutation();
await benchSweep();
benchColdWarm();
benchMemory();
benchAgainstRadau5();
benchLoaderCost();
benchKernelShare();
benchFluxWalkAnatomy();
benchFluxWalkReduced();
benchFormulationAccuracy();
console.log(`\nTotal bench time ${((performance.now() - started) / 1000).toFixed(1)} s`);
