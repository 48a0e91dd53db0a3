/**
 * The solver on a larger network: an RC ladder of 150 nodes (our own values),
 * solved with the dense LU and with the sparse LU on its declared Jacobian
 * pattern (and with the Jacobian given entry by entry), then driven by a square wave with a restart at every edge (the
 * integrator keeps its Jacobian, factorisations and step size there).
 * Run with `npx tsx examples/solver-sparse-ladder.ts`.
 */
import { analyseBand, createDaeIntegrator, solveDae, sparsePattern, type DaeProblem } from '../src/index.js';

const n = 150;
const R = 100; // ohm between neighbouring nodes
const R0 = 10; // ohm from the source
const C = 1e-6; // farad to ground at four nodes of five; the fifth is algebraic
let drive = 10; // volt, changed by the caller between advances

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
const mass = new Float64Array(n * n);
for (let k = 0; k < n; k++) mass[k * n + k] = k % 5 === 4 ? 0 : C;

const ladder = (withPattern: boolean): DaeProblem => ({
  size: n,
  y0: new Array(n).fill(0),
  t0: 0,
  tEnd: 0.01,
  mass,
  rhs: (_t, v, out) => {
    for (let k = 0; k < n; k++) {
      let i = 0;
      if (k > 0) i += (v[k - 1]! - v[k]!) / R;
      if (k < n - 1) i += (v[k + 1]! - v[k]!) / R;
      if (k === 0) i += (drive - v[0]!) / R0;
      out[k] = i;
    }
  },
  jacobian: (_t, _v, J) => {
    for (let k = 0; k < n; k++) {
      let d = 0;
      if (k > 0) (J[k * n + k - 1] = 1 / R), (d -= 1 / R);
      if (k < n - 1) (J[k * n + k + 1] = 1 / R), (d -= 1 / R);
      if (k === 0) d -= 1 / R0;
      J[k * n + k] = d;
    }
  },
  ...(withPattern ? { jacobianPattern: { rows, cols } } : {}),
});

// The same Jacobian entry by entry: the sparse path then holds J on the pattern alone (no n x n array).
const byEntries = (): DaeProblem => ({
  ...ladder(true),
  jacobianEntries: (_t, _v, J) => {
    for (let k = 0; k < n; k++) {
      if (k > 0) J.add(k, k - 1, 1 / R), J.add(k, k, -1 / R);
      if (k < n - 1) J.add(k, k + 1, 1 / R), J.add(k, k, -1 / R);
      if (k === 0) J.add(k, k, -1 / R0);
    }
  },
});

const band = analyseBand(sparsePattern(n, rows, cols));
console.log(`pattern: ${rows.length} entries, bandwidths after reordering ${band.lower} (lower) and ${band.upper} (upper)`);

// Same method, same steps: only the linear algebra differs (speed: `npm run bench`, "dense against sparse LU").
const dense = solveDae(ladder(false), { rtol: 1e-8, atol: 1e-10, denseOutput: false });
const sparse = solveDae(ladder(true), { rtol: 1e-8, atol: 1e-10, denseOutput: false });
const a = dense.y[dense.y.length - 1]!;
const b = sparse.y[sparse.y.length - 1]!;
let diff = 0;
for (let i = 0; i < n; i++) diff = Math.max(diff, Math.abs(a[i]! - b[i]!));
console.log(`dense: ${dense.status}, ${dense.stats.acceptedSteps} steps; sparse: ${sparse.status}, ${sparse.stats.acceptedSteps} steps`);
console.log(`largest difference between the two: ${diff.toExponential(1)} V`);
const entries = solveDae(byEntries(), { rtol: 1e-8, atol: 1e-10, denseOutput: false });
const e = entries.y[entries.y.length - 1]!;
let diffEntries = 0;
for (let i = 0; i < n; i++) diffEntries = Math.max(diffEntries, Math.abs(b[i]! - e[i]!));
console.log(`J entry by entry: ${entries.status}, ${entries.stats.acceptedSteps} steps, largest difference from the sparse run ${diffEntries.toExponential(1)} V`);

// A square drive: restart at every edge. The restarts keep the Jacobian (the ladder is linear); radau5's
// rule still refreshes it after a rejected step, which the first step after an edge often is.
const integ = createDaeIntegrator(ladder(true), { rtol: 1e-8, atol: 1e-10 });
for (let k = 1; k <= 20; k++) {
  integ.advanceTo(k * 5e-4);
  drive = -drive;
  integ.restart(undefined, { capStepByEstimate: true });
}
console.log(`square drive, 20 edges: ${integ.status}, ${integ.stats.acceptedSteps} steps, ${integ.stats.jacobianEvaluations} Jacobian evaluations, v(node 0) = ${integ.y[0]!.toFixed(4)} V`);
