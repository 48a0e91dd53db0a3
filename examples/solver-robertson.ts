/**
 * Robertson's chemical kinetics (Test Set problem ROBER) in both forms: as a
 * stiff ODE and as a DAE with the conservation law y1 + y2 + y3 = 1 as an
 * algebraic equation (M = diag(1, 1, 0)), integrated to t = 1e11, plus the
 * stepping interface. Run with `npx tsx examples/solver-robertson.ts`.
 */
import { createDaeIntegrator, solveDae, type DaeProblem } from '../src/index.js';

const k1 = 0.04;
const k2 = 3e7;
const k3 = 1e4;

const dae: DaeProblem = {
  size: 3,
  y0: [1, 0, 0],
  t0: 0,
  tEnd: 1e11,
  mass: [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 0],
  ],
  rhs: (_t, y, out) => {
    out[0] = -k1 * y[0]! + k3 * y[1]! * y[2]!;
    out[1] = k1 * y[0]! - k3 * y[1]! * y[2]! - k2 * y[1]! ** 2;
    out[2] = y[0]! + y[1]! + y[2]! - 1;
  },
  jacobian: (_t, y, J) => {
    J.set([-k1, k3 * y[2]!, k3 * y[1]!, k1, -k3 * y[2]! - 2 * k2 * y[1]!, -k3 * y[1]!, 1, 1, 1]);
  },
};

// y2 falls to 1e-13 and y3 = 1 - y1 - y2 is algebraic: per-component absolute tolerances.
const sol = solveDae(dae, { rtol: 1e-10, atol: [1e-16, 1e-22, 1e-14], outputTimes: [0.4, 40, 4e5, 4e10] });
console.log(`DAE form: ${sol.status}, ${sol.stats.acceptedSteps} steps, ${sol.stats.rhsEvaluations} f evaluations`);
sol.output.t.forEach((t, k) => console.log(`  t = ${t.toExponential(1)}: y = ${Array.from(sol.output.y[k]!, (v) => v.toExponential(6)).join(', ')}`));
console.log(`  t = 1e11: y = ${Array.from(sol.y[sol.y.length - 1]!, (v) => v.toExponential(10)).join(', ')}`);
console.log('  Test Set reference at 1e11: 2.0833401497e-8, 8.3333607703e-14, 9.9999997917e-1');

// The stepping interface: advance decade by decade, reading the state at each stop.
const integ = createDaeIntegrator({ ...dae, mass: undefined, rhs: (t, y, out) => {
  out[0] = -k1 * y[0]! + k3 * y[1]! * y[2]!;
  out[1] = k1 * y[0]! - k3 * y[1]! * y[2]! - k2 * y[1]! ** 2;
  out[2] = k2 * y[1]! ** 2;
}, jacobian: undefined }, { rtol: 1e-8, atol: 1e-20 });
console.log('\nODE form, stepping decade by decade (finite-difference Jacobian):');
for (let e = -5; e <= 11; e += 2) {
  integ.advanceTo(10 ** e);
  console.log(`  t = 1e${e}: y2 = ${integ.y[1]!.toExponential(4)}, steps so far ${integ.stats.acceptedSteps}`);
}
