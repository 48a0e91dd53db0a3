// fluxstate demo: four scenarios of our own (invented designs), each simulated in the time
// domain with flux as a state variable. Prints a table per scenario and writes an HTML report
// and CSV files per scenario to out/. Run: npm run demo
//
// Results are engineering estimates from a model and its inputs: verify against measurements;
// local codes, standards and licensed practice govern protection settings and safety decisions.
import { mkdirSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { writeReport } from '../src/report/index.js';
import { runFlyback } from './scenarios/flyback.js';
import { runMainsInrush } from './scenarios/mains-inrush.js';
import { runPushPullWalk } from './scenarios/push-pull-walk.js';
import { runThreeLegLoads } from './scenarios/three-leg-loads.js';
import { formatTable, type ScenarioOutcome, type ScenarioProgress } from './scenarios/scenario.js';

const outDir = resolve(process.argv[2] ?? 'out');
mkdirSync(outDir, { recursive: true });

/** A one-line progress indicator: redrawn in place on a terminal, a line every few seconds otherwise. */
function progressLine(name: string): { update: ScenarioProgress; done: () => void } {
  const tty = process.stderr.isTTY === true;
  let lastPrint = 0;
  const started = Date.now();
  return {
    update: (fraction, label) => {
      const now = Date.now();
      if (!tty && now - lastPrint < 3000) return;
      if (tty && now - lastPrint < 100) return;
      lastPrint = now;
      const width = 24;
      const filled = Math.round(Math.min(1, Math.max(0, fraction)) * width);
      const bar = `[${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${(fraction * 100).toFixed(0).padStart(3)}%  ${name}: ${label}`;
      if (tty) process.stderr.write(`\r${bar.slice(0, (process.stderr.columns ?? 100) - 1).padEnd((process.stderr.columns ?? 100) - 1)}`);
      else process.stderr.write(`${bar}\n`);
    },
    done: () => {
      const text = `${name}: done in ${((Date.now() - started) / 1000).toFixed(1)} s`;
      if (tty) process.stderr.write(`\r${text.padEnd((process.stderr.columns ?? 100) - 1)}\n`);
      else process.stderr.write(`${text}\n`);
    },
  };
}

const scenarios: { name: string; run: (p: ScenarioProgress) => ScenarioOutcome }[] = [
  { name: 'mains transformer energisation', run: runMainsInrush },
  { name: 'push-pull flux walk', run: runPushPullWalk },
  { name: 'three-leg core, unequal loads', run: runThreeLegLoads },
  { name: 'flyback converter', run: runFlyback },
];

console.log('fluxstate demo: magnetic networks with flux as a state variable (invented designs, demo data)\n');
const written: string[] = [];
for (const s of scenarios) {
  const progress = progressLine(s.name);
  const outcome = s.run(progress.update);
  progress.done();
  console.log(`\n== ${outcome.title}\n`);
  console.log(formatTable(outcome.table.head, outcome.table.rows));
  for (const note of outcome.notes) console.log(note);
  written.push(writeReport(resolve(outDir, `${outcome.slug}.html`), outcome.report));
  for (const [name, text] of Object.entries(outcome.csv)) {
    const path = resolve(outDir, `${name}.csv`);
    writeFileSync(path, text);
    written.push(path);
  }
}
console.log('\nWritten:');
for (const path of written) console.log(`  ${path}`);
console.log(
  '\nEngineering estimates: inrush, saturation and voltage figures come from a model and its inputs. Verify them against\n' +
    'measurements; local codes, standards and licensed practice govern protection settings and safety decisions.',
);
