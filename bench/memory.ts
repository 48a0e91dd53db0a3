/**
 * Memory against the number of steps (issue 14): the flux walk (bench/flux-walk.ts)
 * run long enough for a given number of solver steps, sampled on a grid of
 * 2,001 points, once streaming (keepSteps: false: only the samples are kept)
 * and once keeping every step (the default, for dense output afterwards).
 * Each case runs in a process of its own; the figure is that process's peak
 * resident set (process.resourceUsage().maxRSS) and its resident set at the
 * end (process.memoryUsage().rss), in MB.
 *
 * usage: tsx bench/memory.ts [steps]            both cases, side by side
 *        tsx bench/memory.ts stream|keep steps  one case (prints one JSON line)
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { simulate } from '../src/index.js';
import { fluxWalk } from './flux-walk.js';
import { printTable } from './timing.js';

/** Accepted steps per drive period of the flux walk at rtol 1e-6 (measured: 3798 in 1000 periods). */
const STEPS_PER_PERIOD = 3.8;

function oneCase(mode: 'stream' | 'keep', steps: number): void {
  const periods = Math.ceil(steps / STEPS_PER_PERIOD);
  const { net, coil, stopTime } = fluxWalk(periods);
  const rss0 = process.memoryUsage().rss;
  const c0 = process.cpuUsage();
  const r = simulate(net, {
    stopTime,
    rtol: 1e-6,
    maxSteps: 3 * steps,
    sampling: { interval: stopTime / 2000 },
    keepSteps: mode === 'keep',
  });
  const c = process.cpuUsage(c0);
  const i = r.current(coil);
  console.log(JSON.stringify({
    mode,
    status: r.status,
    steps: r.stats.acceptedSteps,
    samples: r.length,
    finite: i.every(Number.isFinite),
    cpu_s: (c.user + c.system) / 1e6,
    rss_start_mb: rss0 / 2 ** 20,
    rss_end_mb: process.memoryUsage().rss / 2 ** 20,
    peak_rss_mb: process.resourceUsage().maxRSS / 1024,
  }));
}

/** Run one case in a fresh process and parse its line. */
function measure(mode: 'stream' | 'keep', steps: number): Record<string, number | string | boolean> {
  const self = fileURLToPath(import.meta.url);
  const out = spawnSync(process.execPath, ['--import', 'tsx', self, mode, String(steps)], { encoding: 'utf8', maxBuffer: 1 << 20 });
  const line = out.stdout.trim().split('\n').pop() ?? '';
  try {
    return JSON.parse(line) as Record<string, number | string | boolean>;
  } catch {
    return { mode, status: `failed: ${out.stderr.trim().split('\n').pop() ?? out.status}` };
  }
}

/** The side-by-side table (also called from bench/run.ts). */
export function benchMemory(steps = 2_000_000, keepSteps = 200_000): void {
  console.log(`\n## Memory: flux walk sampled on 2,001 points, peak resident MB (each case in its own process)`);
  const rows: (string | number)[][] = [];
  for (const [mode, n] of [['stream', steps], ['keep', keepSteps]] as const) {
    const m = measure(mode, n);
    const perStep = typeof m.peak_rss_mb === 'number' && typeof m.rss_start_mb === 'number' && typeof m.steps === 'number'
      ? ((m.peak_rss_mb - m.rss_start_mb) * 2 ** 20) / m.steps
      : NaN;
    rows.push([
      mode === 'stream' ? 'keepSteps: false (samples only)' : 'keepSteps: true (every step)',
      String(m.status), Number(m.steps ?? NaN), Number(m.samples ?? NaN), Number(m.cpu_s ?? NaN),
      Number(m.peak_rss_mb ?? NaN), Number(m.rss_end_mb ?? NaN), Number.isFinite(perStep) ? Math.round(perStep) : '-',
    ]);
  }
  printTable(['case', 'status', 'steps', 'samples', 'cpu s', 'peak rss MB', 'end rss MB', 'bytes/step'], rows);
  console.log('target (issue 14): 2 million steps on a 2,001-point grid under 300 MB resident (keepSteps: false)');
}

const [mode, n] = process.argv.slice(2);
if (import.meta.url === `file://${process.argv[1]}`) {
  if (mode === 'stream' || mode === 'keep') oneCase(mode, Number(n));
  else benchMemory(mode ? Number(mode) : undefined);
}
