/**
 * Side-by-side ratios for the solver's own choices, measured in one run:
 * - dense against sparse LU (kernels and the whole solver on an RC ladder
 *   with its Jacobian pattern): where the sparse LU starts to pay
 *   (SPARSE_MIN_SIZE);
 * - cheap against full restarts at input jumps (the integrator restarted at
 *   every edge of a square drive, once keeping what is valid, once with the
 *   full re-initialisation forced by passing the state).
 * CPU time (process.cpuUsage: the machine is shared), medians.
 */
import { createDaeIntegrator, createDenseLu, createSparseLu, MU0, solveDae, sparsePattern, type DaeProblem } from '../src/index.js';
import { rcLadder } from './problems.js';
import { printTable } from './timing.js';

/** Median CPU ms of `repeats` runs after one warm-up, and the last result. */
function cpuMedian<T>(fn: () => T, repeats: number): { ms: number; result: T } {
  fn();
  const times: number[] = [];
  let result: T | undefined;
  for (let r = 0; r < repeats; r++) {
    const c0 = process.cpuUsage();
    result = fn();
    const c = process.cpuUsage(c0);
    times.push((c.user + c.system) / 1000);
  }
  times.sort((a, b) => a - b);
  return { ms: times[Math.floor(times.length / 2)]!, result: result as T };
}

/** CPU medians of two functions run alternately (after one warm-up each), and their last results. */
function interleavedCpuMedians<A, B>(a: () => A, b: () => B, repeats: number): [{ ms: number; result: A }, { ms: number; result: B }] {
  let ra = a();
  let rb = b();
  const ta: number[] = [];
  const tb: number[] = [];
  for (let r = 0; r < repeats; r++) {
    let c0 = process.cpuUsage();
    ra = a();
    let c = process.cpuUsage(c0);
    ta.push((c.user + c.system) / 1000);
    c0 = process.cpuUsage();
    rb = b();
    c = process.cpuUsage(c0);
    tb.push((c.user + c.system) / 1000);
  }
  const med = (x: number[]) => x.sort((p, q) => p - q)[Math.floor(x.length / 2)]!;
  return [
    { ms: med(ta), result: ra },
    { ms: med(tb), result: rb },
  ];
}

/** Median CPU microseconds per call of fn, each sample a loop of at least 20 ms. */
function perCall(fn: () => void): number {
  let reps = 1;
  for (;;) {
    const c0 = process.cpuUsage();
    for (let r = 0; r < reps; r++) fn();
    const c = process.cpuUsage(c0);
    if (c.user + c.system >= 20000) break;
    reps *= 2;
  }
  const samples: number[] = [];
  for (let k = 0; k < 5; k++) {
    const c0 = process.cpuUsage();
    for (let r = 0; r < reps; r++) fn();
    const c = process.cpuUsage(c0);
    samples.push((c.user + c.system) / reps);
  }
  samples.sort((x, y) => x - y);
  return samples[2]!;
}

function ladderPattern(n: number): { rows: number[]; cols: number[] } {
  const rows: number[] = [];
  const cols: number[] = [];
  for (let k = 0; k < n; k++) {
    for (const j of [k - 1, k, k + 1]) {
      if (j >= 0 && j < n) {
        rows.push(k);
        cols.push(j);
      }
    }
  }
  return { rows, cols };
}

export function benchSparseSwitch(): void {
  console.log('\n## Dense against sparse LU (reverse Cuthill-McKee + band LU): kernels in CPU microseconds per factor + solve, the solver in CPU ms; medians');
  const kernelRows: (string | number)[][] = [];
  for (const n of [10, 20, 40, 80, 160, 320]) {
    const { rows, cols } = ladderPattern(n);
    const a = new Float64Array(n * n);
    for (let k = 0; k < rows.length; k++) a[rows[k]! * n + cols[k]!] = rows[k] === cols[k] ? 4 : -1 - 0.01 * k;
    const dense = createDenseLu(n);
    const sparse = createSparseLu(sparsePattern(n, rows, cols));
    const b = new Float64Array(n).fill(1);
    const d = perCall(() => {
      dense.factor(a);
      dense.solve(b);
    });
    const s = perCall(() => {
      sparse.factor(a);
      sparse.solve(b);
    });
    kernelRows.push([n, d, s, d / s]);
  }
  printTable(['n (tridiagonal)', 'dense us', 'sparse us', 'dense/sparse'], kernelRows);

  const solverRows: (string | number)[][] = [];
  for (const n of [20, 40, 80, 160]) {
    const base = rcLadder(n);
    const withPattern: DaeProblem = { ...base, jacobianPattern: ladderPattern(n) };
    // Interleaved, 9 of each: the machine is shared and single runs of a few ms vary several-fold.
    const dense = () => solveDae(base, { rtol: 1e-6, atol: 1e-6, denseOutput: false });
    const sparse = () => solveDae(withPattern, { rtol: 1e-6, atol: 1e-6, denseOutput: false, linearAlgebra: 'sparse' });
    const [d, s] = interleavedCpuMedians(dense, sparse, 9);
    solverRows.push([`RC ladder n = ${n}`, d.result.stats.acceptedSteps, s.result.stats.acceptedSteps, d.result.stats.luFactorizations, d.ms, s.ms, d.ms / s.ms]);
  }
  printTable(['problem', 'dense steps', 'sparse steps', 'LU', 'dense ms', 'sparse ms', 'dense/sparse'], solverRows);
  console.log('(the whole run includes the set-up: a dense SVD of M and the first y\' solve, O(n^3) on either path)');
}

/**
 * A winding on a saturating core driven by a +/-12 V square (the flux walk's
 * physics, our own values) as a 2-unknown DAE: N phi' = v - R i,
 * 0 = N i - l H(phi/A), with the drive switched by the caller at each edge
 * and the integrator restarted there.
 */
function squareDrivenCore(): { problem: DaeProblem; setDrive: (v: number) => void } {
  const N = 20;
  const R = 0.5;
  const l = 0.05;
  const A = 1e-4;
  const H = (b: number): number => b / (MU0 * 2000) + 2 * Math.sinh(b / 0.04);
  const dH = (b: number): number => 1 / (MU0 * 2000) + (2 / 0.04) * Math.cosh(b / 0.04);
  let drive = 12;
  return {
    problem: {
      size: 2,
      y0: [0, 0],
      t0: 0,
      tEnd: 1,
      mass: [
        [N, 0],
        [0, 0],
      ],
      rhs: (_t, y, out) => {
        out[0] = drive - R * y[1]!;
        out[1] = N * y[1]! - l * H(y[0]! / A);
      },
      jacobian: (_t, y, J) => {
        J[1] = -R;
        J[2] = (-l * dH(y[0]! / A)) / A;
        J[3] = N;
      },
    },
    setDrive: (v) => {
      drive = v;
    },
  };
}

function restartRun(full: boolean, periods: number): { jacobians: number; steps: number; phi: number } {
  const { problem, setDrive } = squareDrivenCore();
  const integ = createDaeIntegrator(problem, { rtol: 1e-6, atol: 1e-11 });
  const T = 1e-5;
  for (let k = 0; k < periods; k++) {
    for (const [end, v] of [
      [k * T + 0.52 * T, -12],
      [(k + 1) * T, 12],
    ] as const) {
      integ.advanceTo(end);
      setDrive(v);
      integ.restart(full ? integ.y : undefined, { capStepByEstimate: true });
    }
  }
  const s = integ.stats;
  return { jacobians: s.jacobianEvaluations, steps: s.acceptedSteps + s.rejectedSteps, phi: integ.y[0]! };
}

export function benchRestarts(): void {
  console.log('\n## Restart at every input edge: kept Jacobian/LU/h (cheap) against full re-initialisation; 1000 periods, CPU ms, medians');
  const periods = 1000;
  const [cheap, full] = interleavedCpuMedians(() => restartRun(false, periods), () => restartRun(true, periods), 7);
  printTable(
    ['restart', 'steps', 'Jacobians', 'CPU ms', 'phi end (Wb)'],
    [
      ['cheap', cheap.result.steps, cheap.result.jacobians, cheap.ms, cheap.result.phi.toExponential(6)],
      ['full', full.result.steps, full.result.jacobians, full.ms, full.result.phi.toExponential(6)],
    ],
  );
  console.log(`full/cheap CPU: ${(full.ms / cheap.ms).toFixed(2)}`);
}
