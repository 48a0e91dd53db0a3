/**
 * What the TypeScript loader costs: the same Test Set solves run from the
 * sources through tsx (as the bench-anchor yardstick and `npm run bench` run
 * them) and from the JavaScript that TypeScript emits for them (what a user
 * of the built package runs), alternated process by process in this run,
 * and the emitted JavaScript once more in a process where one ArrayBuffer
 * was detached first (what tsx does while loading, and many applications
 * do: V8 then checks every typed-array access for detachment; see
 * docs/solver.md, "Typed arrays and the detach check"), warm CPU time per solve (median of each process's median). When the
 * bench-anchor's RADAU5 sources are beside the checkout and gfortran is at
 * hand, compiled RADAU5 is run on the same problems from the same first step
 * and both are printed as ratios to it.
 *
 * usage: tsx bench/loader-cost.ts [rounds]
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';
import { testSetAtol } from './problems.js';
import { buildRadau5, radau5DriverCpuMs } from './radau5-build.js';
import { median, printTable } from './timing.js';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '..');

/** Every .ts file under `dir` (relative to the root), test files and declarations left out. */
function sources(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(join(root, dir))) {
    const rel = join(dir, name);
    if (statSync(join(root, rel)).isDirectory()) out.push(...sources(rel));
    else if (name.endsWith('.ts') && !name.endsWith('.d.ts') && !name.includes('.test')) out.push(rel);
  }
  return out;
}

/**
 * The emitted JavaScript of the library, the Test Set fixtures and the
 * first-run script, laid out as in the checkout (relative imports keep
 * working), with the project's compiler options (ES modules: a file-by-file
 * transpile cannot read the package's module type). Returns the folder.
 */
function emitJavaScript(): string {
  const out = mkdtempSync(join(tmpdir(), 'fluxstate-emitted-'));
  const config = ts.readConfigFile(join(root, 'tsconfig.json'), (f) => ts.sys.readFile(f));
  const options = ts.convertCompilerOptionsFromJson(config.config.compilerOptions, root).options;
  const files = [...sources('src'), 'test/solver/fixtures/test-set.ts', 'bench/problems.ts', 'bench/first-run.ts'];
  for (const rel of files) {
    const js = ts.transpileModule(readFileSync(join(root, rel), 'utf8'), { compilerOptions: { ...options, module: ts.ModuleKind.ESNext, noEmit: false, sourceMap: false }, fileName: rel }).outputText;
    const target = join(out, rel.replace(/\.ts$/, '.js'));
    mkdirSync(dirname(target), { recursive: true });
    writeFileSync(target, js);
  }
  writeFileSync(join(out, 'package.json'), JSON.stringify({ type: 'module' }));
  // Preloaded by the third variant: detaching one buffer is enough to switch V8's check on for the process.
  writeFileSync(join(out, 'detach-one-buffer.js'), 'const b = new ArrayBuffer(8);\nstructuredClone(b, { transfer: [b] });\n');
  symlinkSync(join(root, 'node_modules'), join(out, 'node_modules'));
  return out;
}

interface Run {
  warm_cpu_ms: number;
  steps: number;
  h0: number;
  status: string;
}

function runOnce(args: string[], cwd: string): Run | undefined {
  const r = spawnSync(process.execPath, args, { cwd, encoding: 'utf8', maxBuffer: 1 << 20 });
  try {
    return JSON.parse(r.stdout.trim().split('\n').pop() ?? '') as Run;
  } catch {
    return undefined;
  }
}

// The bench-anchor driver's problem numbers.
const problems = [['ROBER', 1], ['VDPOL', 2], ['HIRES', 3], ['TRANSAMP', 5]] as const;

export function benchLoaderCost(rounds = 3): void {
  console.log('\n## The TypeScript loader against emitted JavaScript (same solves, alternated processes, warm CPU ms per solve)');
  const emitted = emitJavaScript();
  const built = buildRadau5();
  const driver = built?.driver;
  const rows: (string | number)[][] = [];
  try {
    for (const [name, id] of problems) {
      const rtol = 1e-6;
      const viaTsx: number[] = [];
      const emittedJs: number[] = [];
      const detached: number[] = [];
      let last: Run | undefined;
      for (let k = 0; k < rounds; k++) {
        const a = runOnce(['--import', 'tsx', join(root, 'bench', 'first-run.ts'), name, String(rtol)], root);
        const b = runOnce([join(emitted, 'bench', 'first-run.js'), name, String(rtol)], emitted);
        const c = runOnce(['--import', join(emitted, 'detach-one-buffer.js'), join(emitted, 'bench', 'first-run.js'), name, String(rtol)], emitted);
        if (a) viaTsx.push(a.warm_cpu_ms);
        if (b) emittedJs.push(b.warm_cpu_ms);
        if (c) detached.push(c.warm_cpu_ms);
        last = b ?? a;
      }
      const radau5 = last ? radau5DriverCpuMs(driver, id, rtol, testSetAtol(name, rtol), last.h0) : NaN;
      const t = median(viaTsx);
      const e = median(emittedJs);
      const d = median(detached);
      rows.push([`${name} rtol ${rtol}`, last?.steps ?? NaN, t, e, t / e, d / e, radau5, t / radau5, e / radau5]);
    }
  } finally {
    rmSync(emitted, { recursive: true, force: true });
    built?.remove();
  }
  printTable(['problem', 'steps', 'via tsx ms', 'emitted JS ms', 'tsx / JS', 'JS detached / JS', 'RADAU5 ms', 'tsx / RADAU5', 'JS / RADAU5'], rows);
  console.log(`(${relative(root, here)}/loader-cost.ts; RADAU5 columns are NaN when the bench-anchor or gfortran is not at hand)`);
}

if (import.meta.url === `file://${process.argv[1]}`) benchLoaderCost(Number(process.argv[2] ?? 3));
