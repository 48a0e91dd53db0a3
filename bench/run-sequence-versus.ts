/**
 * bench/run-sequence.ts for this checkout against another checkout (a base
 * commit), in fresh processes started alternately so both meet the same
 * load: per run index (0 cold, 1 the second run, ...) the median CPU ms of
 * each side over the processes, and their ratio (this / other).
 * usage: tsx bench/run-sequence-versus.ts <other checkout> [processes] [runs]
 */
import { execFileSync } from 'node:child_process';
import { resolve } from 'node:path';
import { alternate, median, printTable } from './timing.js';

const other = process.argv[2];
if (!other) throw new Error('usage: tsx bench/run-sequence-versus.ts <other checkout> [processes] [runs]');
const processes = Number(process.argv[3] ?? 6);
const runs = Number(process.argv[4] ?? 8);
const here = resolve(import.meta.dirname, '..');
const script = resolve(import.meta.dirname, 'run-sequence.ts');

/** One fresh process running the walk `runs` times with `root`'s code (this checkout's script, so both sides build the same network). */
function sequence(root: string): number[] {
  const out = execFileSync(process.execPath, ['--import', 'tsx', script, String(runs), root], { cwd: here, encoding: 'utf8' });
  return (JSON.parse(out.trim().split('\n').pop()!) as { cpu_ms: number[] }).cpu_ms;
}

const runsOf = alternate(processes, () => sequence(here), () => sequence(other));
const ms = { here: runsOf.here, other: runsOf.there };
const rows: (string | number)[][] = [];
for (let r = 0; r < runs; r++) {
  const h = median(ms.here.map((s) => s[r]!));
  const o = median(ms.other.map((s) => s[r]!));
  rows.push([`run ${r}`, h, o, h / o]);
}
const settled = (s: number[]): number => median(s.slice(3));
const hw = median(ms.here.map(settled));
const ow = median(ms.other.map(settled));
if (runs > 3) rows.push(['runs 3 on', hw, ow, hw / ow]);
console.log(`flux walk, CPU ms per run, medians of ${processes} processes each (alternated)`);
printTable(['', 'this', 'other', 'this/other'], rows);
