/**
 * Where a small solve's time goes: the linear-algebra kernels and the
 * problem's own calls against the rest of the solver, each beside compiled
 * RADAU5's whole solve of the same problem.
 *
 * For each Test Set problem at rtol 1e-6: the CPU time of a whole
 * `solveDae` (median of warm solves), and the kernels' time as each
 * kernel's CPU per call times the number of calls the solve makes (its
 * stats): f, J, the real and the complex factorisation (one of each per
 * `luFactorizations`) and the real and the complex solve (one of each per
 * Newton iteration). The per-call costs are taken in tight loops over
 * states spread along the solution (the solves with their right-hand side
 * filled afresh), so the kernels' share is a lower bound: in the solve they
 * run between other code, with colder caches and branch history. The error
 * estimate's solves (one real solve a step) are left in the rest. Rounds alternate the kernels and the whole solves so
 * that both see the same load. RADAU5 is the bench-anchor's driver (built
 * with gfortran when the anchor is beside the checkout) with the same
 * tolerances and initial step; its columns are NaN otherwise.
 *
 * Each problem runs in a process of its own, as the bench-anchor runs them.
 *
 * usage: tsx bench/kernel-share.ts [rounds]
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { createDaeIntegrator, solveDae, type DaeProblem, type SolveDaeOptions } from '../src/index.js';
import { ComplexLu } from '../src/solver/complex-lu.js';
import { DenseLu } from '../src/solver/dense-lu.js';
import { MU_COMPLEX_IM, MU_COMPLEX_RE, MU_REAL } from '../src/solver/radau-tableau.js';
import { normalizeDae } from '../src/solver/normalize-problem.js';
import type { SparseMass } from '../src/solver/sparse-mass.js';
import { hires, robertsonOde, testSetAtol, transistorAmplifier, vanDerPol, type TestProblem } from './problems.js';
import { buildRadau5, radau5DriverCpuMs } from './radau5-build.js';
import { cpuMs, median, printTable } from './timing.js';

/** The bench-anchor driver's problem numbers. */
const PROBLEMS: readonly (readonly [string, number, () => TestProblem])[] = [
  ['ROBER', 1, () => robertsonOde(1e11)],
  ['VDPOL', 2, () => vanDerPol()],
  ['HIRES', 3, () => hires()],
  ['TRANSAMP', 5, () => transistorAmplifier()],
];
/** Calls per timed block of one kernel. */
const CALLS = 20000;
/** States along the solution the kernels are called at. */
const STATES = 16;

/** Microseconds per call of each kernel, one timed block each. */
type KernelTimes = { f: number; jacobian: number; realFactor: number; complexFactor: number; realSolve: number; complexSolve: number };

/** One timed block of each kernel on states along `states` (the step size sets the shifts). */
function kernelBlock(problem: DaeProblem, states: readonly Float64Array[], h: number, mass: SparseMass | undefined): KernelTimes {
  const n = problem.size;
  const rhs = problem.rhs;
  const jacobian = problem.jacobian!;
  const out = new Float64Array(n);
  const jac = new Float64Array(n * n);
  const jacs = states.map((y) => {
    const j = new Float64Array(n * n);
    jacobian(0, y, j);
    return j;
  });
  const real = new DenseLu(n);
  const complex = new ComplexLu(n);
  const b = new Float64Array(n);
  const bi = new Float64Array(n);
  const per = (ms: number): number => (1000 * ms) / CALLS;
  return {
    f: per(cpuMs(() => {
      for (let k = 0; k < CALLS; k++) rhs(0, states[k % STATES]!, out);
    })),
    jacobian: per(cpuMs(() => {
      for (let k = 0; k < CALLS; k++) jacobian(0, states[k % STATES]!, jac);
    })),
    realFactor: per(cpuMs(() => {
      for (let k = 0; k < CALLS; k++) real.factorShifted(jacs[k % STATES]!, MU_REAL / h, mass);
    })),
    complexFactor: per(cpuMs(() => {
      for (let k = 0; k < CALLS; k++) complex.factorShifted(jacs[k % STATES]!, MU_COMPLEX_RE / h, MU_COMPLEX_IM / h, mass);
    })),
    // The right-hand sides filled afresh for each solve (a solve in place, repeated, would drift to
    // subnormal or overflowing entries, whose arithmetic is not the solve's usual cost).
    realSolve: per(cpuMs(() => {
      for (let k = 0; k < CALLS; k++) {
        for (let i = 0; i < n; i++) b[i] = 1 + ((i + k) % 7);
        real.solve(b);
      }
    })),
    complexSolve: per(cpuMs(() => {
      for (let k = 0; k < CALLS; k++) {
        for (let i = 0; i < n; i++) {
          b[i] = 1 + ((i + k) % 7);
          bi[i] = 1;
        }
        complex.solve(b, bi);
      }
    })),
  };
}

/** One problem's figures (ms per solve), measured in this process. */
interface Share {
  name: string;
  n: number;
  steps: number;
  whole: number;
  fj: number;
  factor: number;
  solves: number;
  h0: number;
  status: string;
}

/** Measure one problem in this process: warm-up, then `rounds` alternations of the kernel blocks and whole solves. */
function measureProblem(name: string, rounds: number): Share {
  const make = PROBLEMS.find((p) => p[0] === name)![2];
  const { problem } = make();
  const rtol = 1e-6;
  const options: SolveDaeOptions = { rtol, atol: testSetAtol(name, rtol), denseOutput: false };
  // Warm-up as the bench-anchor's: 1.5 s of CPU or 200 solves, whichever comes first.
  let sol = solveDae(problem, options);
  for (let k = 0, spent = 0; spent < 1500 && k < 200; k++) spent += cpuMs(() => (sol = solveDae(problem, options)));
  const h0 = createDaeIntegrator(problem, options).h;
  const stats = sol.stats;
  const base = { name, n: problem.size, steps: stats.acceptedSteps, h0, status: sol.status };
  if (sol.status !== 'success') return { ...base, whole: NaN, fj: NaN, factor: NaN, solves: NaN };
  const rowsOfY = sol.y;
  const states = Array.from({ length: STATES }, (_, k) => Float64Array.from(rowsOfY[Math.floor((k * (rowsOfY.length - 1)) / (STATES - 1))]!));
  const h = (sol.tReached - problem.t0) / stats.acceptedSteps;
  // The mass matrix as the solver factors with it (an identity dropped, dependent rows recombined).
  const mass = normalizeDae(problem, options).mass;
  const blocks: KernelTimes[] = [];
  const wholes: number[] = [];
  for (let r = 0; r < rounds; r++) {
    blocks.push(kernelBlock(problem, states, h, mass));
    const solves: number[] = [];
    for (let q = 0; q < 20; q++) solves.push(cpuMs(() => solveDae(problem, options)));
    wholes.push(median(solves));
  }
  const us = (key: keyof KernelTimes): number => median(blocks.map((b) => b[key]));
  return {
    ...base,
    whole: median(wholes),
    fj: (stats.rhsEvaluations * us('f') + stats.jacobianEvaluations * us('jacobian')) / 1000,
    factor: (stats.luFactorizations * (us('realFactor') + us('complexFactor'))) / 1000,
    solves: (stats.newtonIterations * (us('realSolve') + us('complexSolve'))) / 1000,
  };
}

/** Each problem in a process of its own (as the bench-anchor runs them: one problem's code is not made polymorphic by another's). */
export function benchKernelShare(rounds = 9): void {
  console.log('\n## Where a small solve goes: kernels (f, J, the two factorisations, the two solves) against the rest, beside RADAU5 (CPU ms per solve, rtol 1e-6)');
  const built = buildRadau5();
  const rows: (string | number)[][] = [];
  try {
    for (const [name, id] of PROBLEMS) {
      const run = spawnSync(process.execPath, ['--import', 'tsx', fileURLToPath(import.meta.url), 'one', name, String(rounds)], { encoding: 'utf8', maxBuffer: 1 << 20 });
      let s: Share;
      try {
        s = JSON.parse(run.stdout.trim().split('\n').pop() ?? '') as Share;
      } catch {
        rows.push([name, `failed: ${run.stderr.trim().split('\n').pop() ?? String(run.status)}`]);
        continue;
      }
      if (s.status !== 'success') {
        rows.push([name, `failed: ${s.status}`]);
        continue;
      }
      const rtol = 1e-6;
      const r5 = radau5DriverCpuMs(built?.driver, id, rtol, testSetAtol(name, rtol), s.h0);
      const kernels = s.fj + s.factor + s.solves;
      rows.push([name, s.n, s.steps, s.whole, s.fj, s.factor, s.solves, kernels / s.whole, r5, s.whole / r5, kernels / r5, (s.whole - kernels) / r5]);
    }
  } finally {
    built?.remove();
  }
  printTable(['problem', 'n', 'steps', 'whole ms', 'f+J ms', 'factor ms', 'solves ms', 'kernels / whole', 'RADAU5 ms', 'whole / RADAU5', 'kernels / RADAU5', 'rest / RADAU5'], rows);
  console.log('(bench/kernel-share.ts; the kernels timed in tight loops, so their share is a lower bound; RADAU5 columns NaN without the bench-anchor or gfortran)');
}

if (import.meta.url === `file://${process.argv[1]}`) {
  if (process.argv[2] === 'one') console.log(JSON.stringify(measureProblem(process.argv[3]!, Number(process.argv[4] ?? 9))));
  else benchKernelShare(Number(process.argv[2] ?? 9));
}
