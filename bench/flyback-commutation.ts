/**
 * Commutations on a flyback (issue 12): 300 periods at 100 kHz of the demo
 * flyback with 1 uH leakage and an RCD clamp (examples/scenarios/flyback.ts,
 * invented design), every diode an ideal switch whose state changes are
 * located as events, against the same run with every diode a smooth
 * exponential junction. Prints events, steps and wall time of each, and
 * the ratio, measured side by side in this run. Target: the ideal-diode run
 * under 2 s on the project's bench machine.
 *
 * Run alone: `npx tsx bench/flyback-commutation.ts`.
 */
import { simulate, type SimulationResult } from '../src/index.js';
import { compileNetwork } from '../src/formulation/compile-network.js';
import { NetworkRun } from '../src/simulation/network-run.js';
import { resolveSolverSettings } from '../src/simulation/solver-settings.js';
import { flybackConverter, FLYBACK } from '../examples/scenarios/flyback.js';
import { printTable } from './timing.js';

const PERIODS = 300;

/**
 * The same run on the run object simulate uses, without recording: the
 * diode state changes and the device events located by the solver (the
 * result does not carry them).
 */
function countEvents(junction: 'ideal' | 'exponential'): { changes: number; events: number; status: string } {
  const compiled = compileNetwork(flybackConverter({ junction }).net.describe());
  const stopTime = PERIODS / FLYBACK.frequency;
  const run = new NetworkRun(compiled, { t0: 0, horizon: stopTime, ...resolveSolverSettings(compiled, { rtol: 1e-6 }, { rtol: 1e-6, maxSteps: 1e6 }) });
  run.advanceTo(stopTime, { steps: false, interpolants: false });
  return { changes: run.deviceChanges.length, events: run.deviceEvents, status: run.status };
}

export function benchFlybackCommutation(repeats = 3): void {
  console.log(`\n## Flyback commutations: ${PERIODS} periods at ${FLYBACK.frequency / 1e3} kHz, 1 uH leakage, RCD clamp (median of ${repeats}, ms)`);
  const stopTime = PERIODS / FLYBACK.frequency;
  const rows: (string | number)[][] = [];
  const runs: Record<string, { ms: number; result: SimulationResult }> = {};
  // Interleaved so that the shared machine's load falls on both alike.
  const times: Record<string, number[]> = { ideal: [], exponential: [] };
  let last: Record<string, SimulationResult> = {};
  for (let r = 0; r <= repeats; r++) {
    for (const junction of ['ideal', 'exponential'] as const) {
      const model = flybackConverter({ junction });
      const t0 = performance.now();
      const result = simulate(model.net, { stopTime, rtol: 1e-6 });
      const ms = performance.now() - t0;
      if (r > 0) times[junction]!.push(ms); // the first round warms up the JIT
      last = { ...last, [junction]: result };
    }
  }
  for (const junction of ['ideal', 'exponential'] as const) {
    const sorted = [...times[junction]!].sort((a, b) => a - b);
    runs[junction] = { ms: sorted[Math.floor(sorted.length / 2)]!, result: last[junction]! };
  }
  for (const junction of ['ideal', 'exponential'] as const) {
    const { ms, result } = runs[junction]!;
    const s = result.stats;
    const counted = countEvents(junction);
    rows.push([
      junction, result.status, counted.events, counted.changes, s.acceptedSteps, s.rejectedSteps, s.luFactorizations, ms,
      result.energy().relativeError.toExponential(1),
    ]);
  }
  printTable(['diodes', 'status', 'device events', 'state changes', 'steps', 'rejected', 'LU', 'wall ms', 'audit'], rows);
  const failed = (['ideal', 'exponential'] as const).filter((j) => runs[j]!.result.status !== 'success');
  if (failed.length > 0) {
    console.log(`NOT MEASURED: the ${failed.join(' and ')} run stopped (${failed.map((j) => runs[j]!.result.message.slice(0, 120)).join('; ')}); its time is not comparable`);
  }
  const ratio = runs['exponential']!.ms / runs['ideal']!.ms;
  const ratioText = failed.length > 0 ? 'not measured (a run stopped)' : ratio.toFixed(2);
  const idealText = runs['ideal']!.result.status === 'success' ? `${(runs['ideal']!.ms / 1000).toFixed(2)} s` : 'did not finish';
  console.log(`exponential / ideal wall time: ${ratioText}; ideal run ${idealText} (target < 2 s)`);
}

if (import.meta.url === `file://${process.argv[1]}`) benchFlybackCommutation();
