/**
 * Commutations on a flyback (issue 12): 300 periods at 100 kHz of the demo
 * flyback with 1 uH leakage and an RCD clamp (examples/scenarios/flyback.ts,
 * invented design), every diode an ideal switch whose state changes are
 * located as events, against the same run with every diode a smooth
 * exponential junction (no capacitance, 1e-9 S off-conductance). Prints
 * events, steps, knee crossings, CPU time of each and the ratio, measured
 * side by side (interleaved) in this run. Target: the ideal-diode run under
 * 2 s on the project's bench machine.
 *
 * The smooth run crosses each output-diode knee (about Is / |di/dt| = 1e-16 s, next to the
 * round-off limit of t) with the knee jump of src/simulation/device-knee-jump.ts; it stopped at
 * 267.4 periods until the first step after a jump was scaled to the jump. Should it stop again,
 * the table says where and the ratio is not printed (a truncated run is no measurement).
 *
 * Run alone: `npx tsx bench/flyback-commutation.ts`.
 */
import { simulate, type SimulationResult } from '../src/index.js';
import { compileNetwork } from '../src/formulation/compile-network.js';
import { NetworkRun } from '../src/simulation/network-run.js';
import { resolveSolverSettings } from '../src/simulation/solver-settings.js';
import { flybackConverter, FLYBACK } from '../examples/scenarios/flyback.js';
import { median, printTable } from './timing.js';

const PERIODS = 300;
type Junction = 'ideal' | 'exponential';

/** CPU time of fn, ms (user + system: the shared machine's other processes do not count). */
function cpuMs<T>(fn: () => T): { ms: number; result: T } {
  const c0 = process.cpuUsage();
  const result = fn();
  const c = process.cpuUsage(c0);
  return { ms: (c.user + c.system) / 1e3, result };
}

function run(junction: Junction, periods: number): SimulationResult {
  return simulate(flybackConverter({ junction }).net, { stopTime: periods / FLYBACK.frequency, rtol: 1e-6 });
}

/**
 * The same run on the run object simulate uses, without recording: the
 * diode state changes and the device events located by the solver (the
 * result does not carry them).
 */
function countEvents(junction: Junction, periods: number): { changes: number; events: number; crossings: number; status: string; t: number } {
  const compiled = compileNetwork(flybackConverter({ junction }).net.describe());
  const stopTime = periods / FLYBACK.frequency;
  const r = new NetworkRun(compiled, { t0: 0, horizon: stopTime, ...resolveSolverSettings(compiled, { rtol: 1e-6 }, { rtol: 1e-6, maxSteps: 1e6 }) });
  r.advanceTo(stopTime, { steps: false, interpolants: false });
  return { changes: r.deviceChanges.length, events: r.deviceEvents, crossings: r.kneeCrossings, status: r.status, t: r.t };
}

/** Interleaved rounds (the first warms up the JIT): median CPU ms per junction and the last results. */
function measure(periods: number, repeats: number): Record<Junction, { ms: number; result: SimulationResult }> {
  const times: Record<Junction, number[]> = { ideal: [], exponential: [] };
  const last = {} as Record<Junction, SimulationResult>;
  for (let r = 0; r <= repeats; r++) {
    for (const junction of ['ideal', 'exponential'] as const) {
      const { ms, result } = cpuMs(() => run(junction, r === 0 ? Math.min(periods, 20) : periods));
      if (r > 0) times[junction].push(ms);
      last[junction] = result;
    }
  }
  return {
    ideal: { ms: median(times.ideal), result: last.ideal },
    exponential: { ms: median(times.exponential), result: last.exponential },
  };
}

function rows(periods: number, m: Record<Junction, { ms: number; result: SimulationResult }>): (string | number)[][] {
  return (['ideal', 'exponential'] as const).map((junction) => {
    const { ms, result } = m[junction];
    const s = result.stats;
    const counted = countEvents(junction, periods);
    const reached = (counted.t * FLYBACK.frequency).toFixed(1);
    return [
      `${junction}, ${periods} periods`, result.status === 'success' ? 'success' : `${result.status} at ${reached} periods`,
      counted.events, counted.changes, counted.crossings, s.acceptedSteps, s.rejectedSteps, s.newtonFailures, ms, result.energy().relativeError.toExponential(1),
    ];
  });
}

export function benchFlybackCommutation(repeats = 3): void {
  console.log(`\n## Flyback commutations: ${FLYBACK.frequency / 1e3} kHz, 1 uH leakage, RCD clamp, ideal against exponential diodes (median CPU ms of ${repeats}, interleaved)`);
  const head = ['diodes', 'status', 'device events', 'state changes', 'knee jumps', 'steps', 'rejected', 'Newton failures', 'CPU ms', 'audit'];
  const full = measure(PERIODS, repeats);
  printTable(head, rows(PERIODS, full));
  const ok = (m: typeof full, j: Junction): boolean => m[j].result.status === 'success';
  if (!ok(full, 'ideal')) {
    console.log(`NOT MEASURED: the ideal run stopped (${full.ideal.result.message.slice(0, 160)})`);
    return;
  }
  console.log(`ideal run ${(full.ideal.ms / 1000).toFixed(2)} s CPU for ${PERIODS} periods (target < 2 s)`);
  if (!ok(full, 'exponential')) {
    console.log(`NOT MEASURED: the exponential run stopped (${full.exponential.result.message.slice(0, 400)})`);
    return;
  }
  console.log(`exponential / ideal CPU time over ${PERIODS} periods: ${(full.exponential.ms / full.ideal.ms).toFixed(1)}`);
}

if (import.meta.url === `file://${process.argv[1]}`) benchFlybackCommutation(Number(process.argv[2] ?? 3));
