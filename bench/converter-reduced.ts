/**
 * The demo flyback (examples/scenarios/flyback.ts, invented design) without
 * its RCD clamp (the clamp's leakage inductor and capacitor make M's
 * derivative terms act on combinations of unknowns, which the reduced
 * formulation refuses), run in the full and in the reduced formulation, in
 * one process, runs alternating so both meet the same load: the ratio of the
 * medians of CPU ms (reduced / full) and each side's counts. Two duties: 0.4
 * (continuous conduction: the diode commutates at the gate's edges, in the
 * settle) and 0.15 (discontinuous: the diode also turns off at a located
 * event each period).
 *
 * usage: tsx bench/converter-reduced.ts [rounds] [periods]
 */
import { simulate } from '../src/index.js';
import { FLYBACK, flybackConverter, idealFlybackOutput } from '../examples/scenarios/flyback.js';
import { alternateCpuMs, median } from './timing.js';

const rounds = Number(process.argv[2] ?? 20);
const periods = Number(process.argv[3] ?? 100);
const stopTime = periods / FLYBACK.frequency;

for (const duty of [0.4, 0.15]) {
  const { net, output } = flybackConverter({ clamp: false, duty, initialOutput: idealFlybackOutput(duty) });
  const run = (formulation: 'full' | 'reduced') => () => simulate(net, { stopTime, rtol: 1e-6, formulation });
  const [full, reduced] = [run('full')(), run('reduced')()]; // the first (cold) runs are not timed
  const v = [full.voltage(output), reduced.voltage(output)];
  const finalDifference = Math.abs(v[1]![v[1]!.length - 1]! - v[0]![v[0]!.length - 1]!);
  const ms = alternateCpuMs(rounds, run('reduced'), run('full'));
  console.log(JSON.stringify({
    duty, rounds, periods,
    reduced_cpu_ms: median(ms.here), full_cpu_ms: median(ms.there), ratio: median(ms.here) / median(ms.there),
    final_output_difference_V: finalDifference,
    reduced: reduced.stats, full: full.stats,
  }));
}
