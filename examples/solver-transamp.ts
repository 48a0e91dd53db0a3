/**
 * Example: the stiff DAE solver on its own, on a transistor amplifier circuit, the TRANSAMP
 * problem of the Mazzia-Magherini test set (index 1, 8 unknowns, a
 * non-diagonal singular mass matrix of capacitances, exponential diode laws).
 * Run with `npx tsx examples/solver-transamp.ts`.
 */
import { solveDae } from '../src/index.js';
import { transistorAmplifier } from '../test/solver/fixtures/test-set.js';

const { problem, reference } = transistorAmplifier();
// The last period of the input, every 0.5 ms.
const outputTimes = Array.from({ length: 21 }, (_, k) => 0.19 + k * 0.0005);

const started = performance.now();
const sol = solveDae(problem, { rtol: 1e-8, atol: 1e-8, outputTimes });
const ms = performance.now() - started;

console.log('Transistor amplifier (TRANSAMP), t in [0, 0.2] s, input 0.1 V at 100 Hz');
console.log(`status: ${sol.status} (${sol.message}) in ${ms.toFixed(0)} ms`);
console.log('\nlast period of the input:\n   t (ms)   input Ue (V)   output U8 (V)');
sol.output.t.forEach((t, k) => {
  const ue = 0.1 * Math.sin(200 * Math.PI * t);
  console.log(`${(t * 1e3).toFixed(1).padStart(9)}   ${ue.toFixed(4).padStart(12)}   ${sol.output.y[k]![7]!.toFixed(4).padStart(13)}`);
});

// Output swing over the last period (10 ms) against the 0.2 V peak-to-peak input.
let lo = Infinity;
let hi = -Infinity;
for (let t = 0.19; t <= 0.2; t += 1e-5) {
  const u8 = sol.at(Math.min(t, 0.2))[7]!;
  lo = Math.min(lo, u8);
  hi = Math.max(hi, u8);
}
console.log(`\noutput swing over the last period: ${(hi - lo).toFixed(3)} V peak-to-peak for 0.2 V in (voltage gain about ${((hi - lo) / 0.2).toFixed(1)})`);

const y = sol.y[sol.y.length - 1]!;
const worst = Math.max(...reference.map((r, i) => Math.abs(y[i]! - r) / Math.abs(r)));
console.log(`largest relative deviation from the Test Set reference y(0.2): ${worst.toExponential(2)}`);
const s = sol.stats;
console.log(
  `work: ${s.acceptedSteps} accepted + ${s.rejectedSteps} rejected steps, ${s.rhsEvaluations} f evaluations, ` +
    `${s.jacobianEvaluations} Jacobians, ${s.luFactorizations} LU factorisations, ${s.newtonIterations} Newton iterations`,
);
