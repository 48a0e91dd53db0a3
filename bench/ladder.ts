/**
 * Cost against network size: a ladder of k transformers (n = 4k + 3
 * unknowns; stage j a closed saturating core of two tubes, a primary on
 * x_j, a 1:1 secondary on x_{j+1} loaded by 50 ohm, a 50 Hz sine behind
 * 1 ohm feeding x_0; invented values, the same network as
 * ../shared/bench-anchor/scaling.mts). Printed side by side in one run:
 * - through the public API (createStepper, which factors sparsely on the
 *   pattern recorded from the stamps from SPARSE_MIN_SIZE unknowns on): CPU
 *   ms of set-up and per step, and the growth exponent of the cost per step
 *   (least-squares slope of log ms/step against log n);
 * - a ladder of about 10,000 unknowns (k = 2500), once: set-up and per step;
 * - the same compiled network through createDaeIntegrator with the dense
 *   LU and with the sparse LU, at the sizes where the dense one finishes in
 *   seconds: the ratio of their costs per step.
 * CPU time (process.cpuUsage), the machine is shared. Run alone:
 * `npx tsx bench/ladder.ts [maxK] [hugeK]` (hugeK 0 skips the 10,000-unknown run).
 */
import { pathToFileURL } from 'node:url';
import { createDaeIntegrator, createStepper, type DaeProblem } from '../src/index.js';
import { transformerLadder } from '../test/support/transformer-ladder.js';
import { compileNetwork } from '../src/formulation/compile-network.js';
import { printTable } from './timing.js';

const cpuMs = (): number => {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1000;
};


interface Figures {
  readonly n: number;
  readonly setupMs: number;
  readonly msPerStep: number;
  readonly steps: number;
  readonly rssMb: number;
}

/** Set-up and STEPS steps through the public API (as the anchor's scaling script). */
function throughStepper(k: number, steps: number): Figures {
  const net = transformerLadder(k);
  const c0 = cpuMs();
  const st = createStepper(net, { horizon: 1, record: false, maxSteps: steps });
  const c1 = cpuMs();
  st.advanceTo(1);
  const c2 = cpuMs();
  const taken = st.stats.acceptedSteps + st.stats.rejectedSteps;
  if (!(taken > 0)) throw new Error(`ladder k = ${k}: no step taken (${st.status})`);
  return { n: 4 * k + 3, setupMs: c1 - c0, msPerStep: (c2 - c1) / taken, steps: taken, rssMb: process.memoryUsage().rss / 2 ** 20 };
}

/** CPU ms per step of `steps` steps of the compiled ladder with the dense or the sparse LU. */
function throughIntegrator(k: number, steps: number, linearAlgebra: 'flat' | 'sparse'): number {
  const c = compileNetwork(transformerLadder(k).describe());
  c.inputs.setInterval(0, 1);
  const problem: DaeProblem = {
    size: c.layout.size, y0: c.y0, t0: 0, tEnd: 1, rhs: c.rhs, jacobian: c.jacobian, index2: c.index2,
    // The sparse run as network runs do it: M by its non-zeros, J stamped entry by entry onto the pattern.
    ...(linearAlgebra === 'sparse'
      ? { massEntries: c.massEntries, jacobianPattern: c.jacobianPattern!, jacobianEntries: (t, y, target) => c.stampJacobian(t, y, c.inputs, target) }
      : { mass: c.mass }),
  };
  const integ = createDaeIntegrator(problem, { rtol: 1e-6, atol: 1e-9, linearAlgebra });
  const c0 = cpuMs();
  for (let s = 0; s < steps && integ.status === 'running'; s++) integ.step();
  const taken = integ.stats.acceptedSteps + integ.stats.rejectedSteps;
  if (!(taken > 0)) throw new Error(`ladder k = ${k}: no step taken (${integ.status})`);
  return (cpuMs() - c0) / taken;
}

/** Least-squares slope of log y against log x. */
function slope(x: number[], y: number[]): number {
  const lx = x.map(Math.log);
  const ly = y.map(Math.log);
  const mx = lx.reduce((a, b) => a + b, 0) / lx.length;
  const my = ly.reduce((a, b) => a + b, 0) / ly.length;
  let num = 0;
  let den = 0;
  for (let i = 0; i < lx.length; i++) {
    num += (lx[i]! - mx) * (ly[i]! - my);
    den += (lx[i]! - mx) ** 2;
  }
  return num / den;
}

export function benchLadder(maxK = 749, hugeK = 2500): void {
  console.log('\n## Transformer ladder (n = 4k + 3): CPU ms through the public API, sparse LU on the stamps\' pattern; medians of 3');
  // Warm-up on a ladder above the switch-over, so that the sparse path is compiled by the JIT too.
  for (let w = 0; w < 5; w++) throughStepper(10, 100);
  const rows: (string | number)[][] = [];
  const figures: Figures[] = [];
  for (const k of [24, 74, 249, 749].filter((k) => k <= maxK)) {
    const runs = [0, 1, 2].map(() => throughStepper(k, 30));
    const med = (f: (r: Figures) => number): number => runs.map(f).sort((a, b) => a - b)[1]!;
    const fig: Figures = { n: runs[0]!.n, setupMs: med((r) => r.setupMs), msPerStep: med((r) => r.msPerStep), steps: runs[0]!.steps, rssMb: Math.max(...runs.map((r) => r.rssMb)) };
    figures.push(fig);
    rows.push([fig.n, fig.setupMs, fig.msPerStep, fig.steps, Math.round(fig.rssMb)]);
  }
  printTable(['n', 'set-up ms', 'ms per step', 'steps', 'rss MB'], rows);
  if (figures.length >= 2) {
    const e = slope(figures.map((f) => f.n), figures.map((f) => f.msPerStep));
    console.log(`cost per step grows as n^${e.toFixed(2)} from n = ${figures[0]!.n} to ${figures[figures.length - 1]!.n} (target: at most n^1.3)`);
  }
  const at1000 = figures.find((f) => f.n === 999);
  if (at1000) console.log(`n = 999: ${at1000.msPerStep.toFixed(2)} ms per step (target < 5), set-up ${at1000.setupMs.toFixed(0)} ms (target < 1000)`);
  if (hugeK > 0) {
    // One run (the largest size; its set-up takes about a second).
    const huge = throughStepper(hugeK, 30);
    console.log(`n = ${huge.n}: set-up ${huge.setupMs.toFixed(0)} ms, ${huge.msPerStep.toFixed(2)} ms per step over ${huge.steps} steps, rss ${Math.round(huge.rssMb)} MB (one run)`);
    const last = figures[figures.length - 1];
    if (last) console.log(`per step, n = ${huge.n} over n = ${last.n}: ${(huge.msPerStep / last.msPerStep).toFixed(2)} (n ratio ${(huge.n / last.n).toFixed(2)})`);
  }

  const side: (string | number)[][] = [];
  for (const k of [2, 4, 6, 8, 24, 74]) {
    const dense = [0, 1, 2].map(() => throughIntegrator(k, 20, 'flat')).sort((a, b) => a - b)[1]!;
    const sparse = [0, 1, 2].map(() => throughIntegrator(k, 20, 'sparse')).sort((a, b) => a - b)[1]!;
    side.push([4 * k + 3, dense, sparse, dense / sparse]);
  }
  console.log('\nThe same compiled ladder through createDaeIntegrator, dense LU against sparse LU (forced), CPU ms per step, medians of 3:');
  printTable(['n', 'dense LU ms/step', 'sparse LU ms/step', 'dense/sparse'], side);
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) benchLadder(Number(process.argv[2] ?? '749'), Number(process.argv[3] ?? '2500'));
