/**
 * bench/setup-cost.ts for this checkout and another (a base commit),
 * process by process, alternating which goes first from round to round:
 * per problem and mode the median over processes of each process's median
 * microseconds per call, and the ratio (this / other).
 * usage: tsx bench/setup-cost-versus.ts <other checkout> [processes per side, default 7]
 */
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { median, printTable } from './timing.js';

const other = process.argv[2];
if (!other) throw new Error('usage: tsx bench/setup-cost-versus.ts <other checkout> [processes per side]');
const rounds = Number(process.argv[3] ?? 7);
const here = resolve(import.meta.dirname, '..');
const script = resolve(import.meta.dirname, 'setup-cost.ts');

/** Microseconds per call from one process of bench/setup-cost.ts. */
function measure(problem: string, mode: string, checkout: string): number {
  const r = spawnSync(process.execPath, ['--import', 'tsx', script, problem, mode, checkout], { cwd: here, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`setup-cost.ts ${problem} ${mode} ${checkout} failed:\n${r.stderr}`);
  return (JSON.parse(r.stdout.trim().split('\n').pop()!) as { us_per_call: number }).us_per_call;
}

const rows: (string | number)[][] = [];
for (const problem of ['HIRES', 'ROBER', 'VDPOL']) {
  for (const mode of ['solve', 'create', 'tiny']) {
    const us = { here: [] as number[], other: [] as number[] };
    for (let k = 0; k < rounds; k++) {
      if (k % 2 === 0) {
        us.here.push(measure(problem, mode, here));
        us.other.push(measure(problem, mode, other));
      } else {
        us.other.push(measure(problem, mode, other));
        us.here.push(measure(problem, mode, here));
      }
    }
    const h = median(us.here);
    const o = median(us.other);
    rows.push([problem, mode, o, h, h / o]);
    console.error(JSON.stringify({ problem, mode, here: us.here, other: us.other }));
  }
}
printTable(['problem', 'mode', 'other us', 'this us', 'this/other'], rows);
