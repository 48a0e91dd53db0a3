// Runs test/soak/soak.ts in chunks, each in its own process, and stops a chunk whose current case
// makes no progress for --case-timeout seconds (a case that hangs past its wall-time budget is a
// finding: it is recorded by seed and the chunk resumes after it). Merges the chunk summaries.
//
//   nice npx tsx test/soak/soak-driver.ts [--count 10000] [--seed 1] [--chunk 250] [--case-timeout 120]
//                                         [--minutes 90] [--audit-every 1] [--out soak.json]
import { spawn } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { parseArgs } from 'node:util';

const { values } = parseArgs({
  options: {
    count: { type: 'string', default: '10000' },
    seed: { type: 'string', default: '1' },
    chunk: { type: 'string', default: '250' },
    'case-timeout': { type: 'string', default: '120' },
    minutes: { type: 'string', default: '90' },
    'audit-every': { type: 'string', default: '1' },
    out: { type: 'string', default: 'soak.json' },
  },
});
const end = Number(values.seed) + Number(values.count);
const deadline = Date.now() + Number(values.minutes) * 60_000;
const caseTimeoutMs = Number(values['case-timeout']) * 1000;
const script = new URL('./soak.ts', import.meta.url).pathname;
const tsx = new URL('../../node_modules/.bin/tsx', import.meta.url).pathname;

type Summary = Record<string, unknown> & { run: number; statuses: Record<string, number>; examples: unknown[] };
const total = {
  seed: Number(values.seed), requested: Number(values.count), run: 0, statuses: {} as Record<string, number>,
  threw: 0, nonFinite: 0, fluxImbalance: 0, energyImbalance: 0, successShort: 0, audited: 0,
  withEddy: 0, withSnubber: 0, withSwitch: 0, worstEnergyError: 0, hung: [] as number[], examples: [] as unknown[],
  elapsedS: 0, stoppedAtTimeCap: false,
};
const started = Date.now();
const COUNTERS = ['run', 'threw', 'nonFinite', 'fluxImbalance', 'energyImbalance', 'successShort', 'audited', 'withEddy', 'withSnubber', 'withSwitch'] as const;

function add(s: Summary): void {
  for (const k of COUNTERS) (total as Record<string, unknown>)[k] = (total[k] as number) + ((s[k] as number | undefined) ?? 0);
  for (const [k, v] of Object.entries(s.statuses)) total.statuses[k] = (total.statuses[k] ?? 0) + v;
  total.worstEnergyError = Math.max(total.worstEnergyError, (s.worstEnergyError as number | undefined) ?? 0);
  total.examples.push(...s.examples.slice(0, Math.max(0, 60 - total.examples.length)));
}

function runChunk(from: number, count: number, minutes: number): Promise<{ hungAt?: number }> {
  const out = join(tmpdir(), `fluxstate-soak-${process.pid}-${from}.json`);
  const progress = `${out}.progress`;
  return new Promise((resolve) => {
    const child = spawn(tsx, [script, '--seed', String(from), '--count', String(count), '--minutes', String(minutes),
      '--audit-every', String(values['audit-every']), '--out', out, '--progress', progress], { stdio: 'ignore' });
    let last = '';
    let lastChange = Date.now();
    let hungAt: number | undefined;
    const watch = setInterval(() => {
      const now = existsSync(progress) ? readFileSync(progress, 'utf8').trim() : '';
      if (now !== last) {
        last = now;
        lastChange = Date.now();
      } else if (Date.now() - lastChange > caseTimeoutMs && now !== '') {
        hungAt = Number(now);
        child.kill('SIGKILL');
      }
    }, 1000);
    child.on('exit', () => {
      clearInterval(watch);
      if (existsSync(out)) {
        const s = JSON.parse(readFileSync(out, 'utf8')) as Summary;
        // A killed chunk's summary was last saved at a multiple of 10 cases: count only what it saved.
        add(s);
        if (hungAt !== undefined) resolve({ hungAt: Math.max(hungAt, from + s.run) });
        else resolve({});
      } else {
        resolve(hungAt !== undefined ? { hungAt } : {});
      }
    });
  });
}

let seed = Number(values.seed);
while (seed < end) {
  const minutesLeft = (deadline - Date.now()) / 60_000;
  if (minutesLeft <= 0.2) {
    total.stoppedAtTimeCap = true;
    break;
  }
  const count = Math.min(Number(values.chunk), end - seed);
  const runBefore = total.run;
  const { hungAt } = await runChunk(seed, count, minutesLeft);
  if (hungAt !== undefined) {
    total.hung.push(hungAt);
    // The saved summary may lag the hung case: the cases between are not counted; resume after the hung one.
    seed = hungAt + 1;
  } else {
    seed += total.run - runBefore;
    if (total.run - runBefore < count) {
      total.stoppedAtTimeCap = true;
      break;
    }
  }
  total.elapsedS = (Date.now() - started) / 1000;
  writeFileSync(values.out, `${JSON.stringify(total, null, 2)}\n`);
}
total.elapsedS = (Date.now() - started) / 1000;
writeFileSync(values.out, `${JSON.stringify(total, null, 2)}\n`);
console.log(JSON.stringify(total, null, 2));
