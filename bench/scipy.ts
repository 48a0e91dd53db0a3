/**
 * Cross-check against SciPy's solve_ivp (Radau and BDF) when a Python with
 * SciPy is available (`python3` on PATH, else /usr/bin/python3); skipped with
 * a message otherwise. SciPy has no mass matrix, so only the ODE problems.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { solveDae } from '../src/index.js';
import { hires, robertsonOde, vanDerPol, type TestProblem } from './problems.js';
import { printTable, timeMedian } from './timing.js';

interface ScipyRun {
  problem: string;
  method: string;
  status: number;
  steps: number;
  nfev: number;
  njev: number;
  nlu: number;
  ms: number;
}

function findPython(): string | undefined {
  for (const py of ['python3', '/usr/bin/python3']) {
    const r = spawnSync(py, ['-c', 'import scipy, numpy; print(scipy.__version__)'], { encoding: 'utf8' });
    if (r.status === 0) return py;
  }
  return undefined;
}

export function benchScipy(): void {
  console.log('\n## SciPy solve_ivp (Radau, BDF) vs ours, rtol = atol as listed');
  const py = findPython();
  if (!py) {
    console.log('skipped: no python3 with scipy found (tried python3 on PATH and /usr/bin/python3; Debian: apt-get install python3-scipy)');
    return;
  }
  const version = spawnSync(py, ['-c', 'import scipy; print(scipy.__version__)'], { encoding: 'utf8' }).stdout.trim();
  console.log(`using ${py} with SciPy ${version}`);
  const script = fileURLToPath(new URL('./scipy_compare.py', import.meta.url));
  const cases: { key: string; tp: TestProblem; rtol: number; atol: number }[] = [
    { key: 'ROBER', tp: robertsonOde(1e11), rtol: 1e-6, atol: 1e-12 },
    { key: 'VDPOL', tp: vanDerPol(), rtol: 1e-6, atol: 1e-6 },
    { key: 'HIRES', tp: hires(), rtol: 1e-6, atol: 1e-6 },
  ];
  const rows: (string | number)[][] = [];
  for (const c of cases) {
    const r = spawnSync(py, [script, String(c.rtol), String(c.atol), '3', c.key], { encoding: 'utf8', timeout: 120_000 });
    if (r.status !== 0) {
      console.log(`SciPy run for ${c.key} failed: ${r.stderr.split('\n').slice(-2).join(' ')}`);
      continue;
    }
    const runs = r.stdout.trim().split('\n').map((l) => JSON.parse(l) as ScipyRun);
    const ours = timeMedian(() => solveDae(c.tp.problem, { rtol: c.rtol, atol: c.atol, denseOutput: false }), 5);
    const oursSteps = ours.result.stats.acceptedSteps + ours.result.stats.rejectedSteps;
    for (const s of runs) {
      rows.push([`${c.key} rtol ${c.rtol}`, s.method, s.steps, s.nfev, s.ms, oursSteps, ours.result.stats.rhsEvaluations, ours.ms, (ours.ms / s.ms).toPrecision(3), (oursSteps / s.steps).toPrecision(3)]);
    }
  }
  printTable(['problem', 'SciPy', 'steps', 'nfev', 'ms', 'our steps', 'our f', 'our ms', 'time ours/SciPy', 'steps ours/SciPy'], rows);
  console.log('(SciPy counts accepted steps only; ours counts accepted + rejected. Different languages: the time ratio mixes method and runtime.)');
}
