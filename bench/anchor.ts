/**
 * Issue 14's figures in `npm run bench`: first-run (cold) against warm CPU
 * time of the flux walk and of Test Set problems, each in a process of its
 * own, and, when the bench-anchor yardstick is at hand (a folder beside the
 * checkout, outside the package: ../shared/bench-anchor or
 * ../../shared/bench-anchor, or FLUXSTATE_BENCH_ANCHOR=<its run script>),
 * its ratios of our CPU time over compiled RADAU5 on the same problems,
 * measured side by side in the same run. FLUXSTATE_BENCH_ANCHOR_MODE=full
 * runs its full set (default: quick).
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { printTable } from './timing.js';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '..');

function child(script: string, args: string[]): Record<string, unknown> {
  const out = spawnSync(process.execPath, ['--import', 'tsx', resolve(here, script), ...args], { cwd: root, encoding: 'utf8', maxBuffer: 1 << 20 });
  const line = out.stdout.trim().split('\n').pop() ?? '';
  try {
    return JSON.parse(line) as Record<string, unknown>;
  } catch {
    return { status: `failed: ${out.stderr.trim().split('\n').pop() ?? String(out.status)}` };
  }
}

/** Cold (first call) against warm CPU ms, each workload in a fresh process. */
export function benchColdWarm(): void {
  console.log('\n## First run (cold, JIT included) against warm, CPU ms, each in a fresh process');
  const rows: (string | number)[][] = [];
  const walk = child('flux-walk.ts', ['15']);
  rows.push(['flux walk, 1000 periods, rtol 1e-6', String(walk.status ?? 'success'), Number(walk.steps ?? NaN), Number(walk.first_cpu_ms ?? NaN), Number(walk.second_cpu_ms ?? NaN), Number(walk.warm_cpu_ms ?? NaN)]);
  for (const [name, rtol] of [['ROBER', '1e-6'], ['VDPOL', '1e-6'], ['HIRES', '1e-6'], ['HIRES', '1e-10'], ['TRANSAMP', '1e-6']] as const) {
    const r = child('first-run.ts', [name, rtol]);
    rows.push([`${name} rtol ${rtol}`, String(r.status), Number(r.steps ?? NaN), Number(r.first_cpu_ms ?? NaN), Number(r.second_cpu_ms ?? NaN), Number(r.warm_cpu_ms ?? NaN)]);
  }
  printTable(['workload', 'status', 'steps', 'first run ms', 'second run ms', 'warm ms'], rows);
}

/** The bench-anchor script, when present: our CPU time over RADAU5's, per problem, in this run. */
export function benchAgainstRadau5(): void {
  const candidates = [process.env.FLUXSTATE_BENCH_ANCHOR, resolve(root, '../shared/bench-anchor/run'), resolve(root, '../../shared/bench-anchor/run')];
  const script = candidates.find((c): c is string => c !== undefined && existsSync(c));
  console.log('\n## Against compiled RADAU5 (bench-anchor: CPU time ratios, same problems, same run)');
  if (!script) {
    console.log('bench-anchor not found beside the checkout (set FLUXSTATE_BENCH_ANCHOR to its run script); skipped');
    return;
  }
  const mode = process.env.FLUXSTATE_BENCH_ANCHOR_MODE === 'full' ? 'full' : 'quick';
  const out = spawnSync(script, [mode], { cwd: root, encoding: 'utf8', maxBuffer: 1 << 22 });
  process.stdout.write(out.stdout);
  if (out.status !== 0) console.log(`bench-anchor exited with ${out.status}: ${out.stderr.trim().split('\n').pop() ?? ''}`);
  console.log('targets (issue 14): test set at most 2.5x RADAU5 per problem; flux walk at most 10x and under 30 ms warm');
}

if (import.meta.url === `file://${process.argv[1]}`) {
  benchColdWarm();
  benchAgainstRadau5();
}
