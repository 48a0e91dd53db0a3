/**
 * The flux walk of the performance work (issue 14), through the public API:
 * 20 turns, 0.5 ohm, +/-12 V square at 100 kHz, duty 0.52, on a core of two
 * tubes of 25 mm x 1 cm^2 with the saturating law
 * H(B) = B/(mu0 2000) + 2 sinh(B/0.04) (invented values, the same physics as
 * the bench-anchor yardstick), 1000 periods at rtol 1e-6. Every edge is a
 * restart, so this measures restarts as much as steps.
 *
 * Run as a script it prints one JSON line: the first (cold: module load
 * excluded, JIT included) run's CPU ms, the second's, then the median CPU ms
 * of the runs after the first.
 * usage: tsx bench/flux-walk.ts [warmRuns]
 */
import { createNetwork, MU0, pulse, simulate, type MaterialLaw } from '../src/index.js';
import { cpuMs } from './timing.js';

/** The walk's saturating law (invented). */
export const walkLaw: MaterialLaw = {
  name: 'B/(mu0 2000) + 2 sinh(B/0.04)',
  fieldStrength: (b) => b / (MU0 * 2000) + 2 * Math.sinh(b / 0.04),
  fieldSlope: (b) => 1 / (MU0 * 2000) + (2 / 0.04) * Math.cosh(b / 0.04),
  energyDensity: (b) => (b * b) / (2 * MU0 * 2000) + 2 * 0.04 * (Math.cosh(b / 0.04) - 1),
};

/** The network builders the walk needs: this checkout's by default, another checkout's to compare (bench/flux-walk-versus.ts). */
export type WalkApi = Pick<typeof import('../src/index.js'), 'createNetwork' | 'pulse'>;

/** The flux-walk network and its stop time for `periods` periods of the drive. */
export function fluxWalk(periods = 1000, api: WalkApi = { createNetwork, pulse }) {
  const net = api.createNetwork('flux walk, 100 kHz');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.025, area: 1e-4, material: walkLaw });
  net.fluxTube('rest', { from: m2, to: m1, length: 0.025, area: 1e-4, material: walkLaw });
  const d = net.node('drive');
  net.voltageSource('drive', d, net.ground, api.pulse({ low: -12, high: 12, period: 1e-5, duty: 0.52 }));
  const coil = net.winding('coil', { tube: leg, turns: 20, resistance: 0.5, plus: d, minus: net.ground });
  return { net, leg, coil, stopTime: periods * 1e-5 };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const warmRuns = Number(process.argv[2] ?? 15);
  const { net, stopTime } = fluxWalk();
  let steps = 0;
  const run = (): void => {
    steps = simulate(net, { stopTime, rtol: 1e-6 }).stats.acceptedSteps;
  };
  const first = cpuMs(run);
  const warm: number[] = [];
  for (let k = 0; k < warmRuns; k++) warm.push(cpuMs(run));
  const second = warm[0];
  warm.sort((a, b) => a - b);
  console.log(JSON.stringify({ steps, first_cpu_ms: first, second_cpu_ms: second, warm_cpu_ms: warm[warm.length >> 1], warm_min_cpu_ms: warm[0] }));
}
