/**
 * Every runnable script of the project runs, so that none rots:
 *
 * - every file in examples/ (the demo scenarios in examples/scenarios/ run
 *   through examples/demo.ts) as a child process, with its exit code and a
 *   line of its output checked;
 * - the TypeScript code blocks of the user guide (docs/guide/*.md): the
 *   blocks of a page, joined in order, are one script; each page's script is
 *   type-checked with the project's compiler settings and run;
 * - README.md's builder example and the getting-started page are the same
 *   code as examples/readme.ts and examples/getting-started.ts;
 * - the output a guide page shows (text blocks marked `<!-- output -->`) is
 *   what its script prints.
 *
 * Scripts run in parallel, each in a fresh temporary working folder, so the
 * files they write (out/...) go there. `node --import tsx` runs TypeScript.
 */
import { spawn } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { basename, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { codeBlocks, mapPackageImports, outputBlocks, withoutLeadingComments } from './code-blocks.js';

const ROOT = resolve(fileURLToPath(new URL('../..', import.meta.url)));
const TSX_LOADER = pathToFileURL(join(ROOT, 'node_modules', 'tsx', 'dist', 'loader.mjs')).href;
const TSC = join(ROOT, 'node_modules', 'typescript', 'bin', 'tsc');
const TIMEOUT_MS = 180_000;

const scratch = mkdtempSync(join(tmpdir(), 'fluxstate-examples-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

interface Run {
  readonly code: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

// At most one child process per core: more only makes each script slower (the demo alone takes
// about 6 s of CPU).
const slots = { free: Math.max(1, availableParallelism()), waiting: [] as (() => void)[] };
async function withSlot<T>(task: () => Promise<T>): Promise<T> {
  if (slots.free > 0) slots.free--;
  else await new Promise<void>((wake) => slots.waiting.push(wake));
  try {
    return await task();
  } finally {
    const next = slots.waiting.shift();
    if (next) next();
    else slots.free++;
  }
}

/** Run a node process in `cwd` and collect its output. */
function runNode(args: readonly string[], cwd: string): Promise<Run> {
  return withSlot(() => spawnNode(args, cwd));
}

function spawnNode(args: readonly string[], cwd: string): Promise<Run> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, args, { cwd, env: { ...process.env, NO_COLOR: '1' }, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (s: string) => (stdout += s));
    child.stderr.setEncoding('utf8').on('data', (s: string) => (stderr += s));
    const timer = setTimeout(() => child.kill('SIGKILL'), TIMEOUT_MS - 5_000);
    child.on('error', fail);
    child.on('close', (code) => {
      clearTimeout(timer);
      done({ code, stdout, stderr });
    });
  });
}

/** Run a TypeScript file with tsx in a fresh working folder. */
function runScript(file: string, args: readonly string[] = []): Promise<Run> {
  const cwd = mkdtempSync(join(scratch, `${basename(file, '.ts')}-`));
  return runNode(['--import', TSX_LOADER, file, ...args], cwd);
}

function expectSuccess(run: Run): void {
  if (run.code !== 0) throw new Error(`exit code ${String(run.code)}\n--- stderr ---\n${run.stderr}\n--- stdout ---\n${run.stdout}`);
}

/** What each example must print (one regular expression per expected line), and its arguments. */
interface Expectation {
  readonly args?: (dir: string) => string[];
  readonly lines: readonly RegExp[];
  /** A further check of the output. */
  readonly check?: (stdout: string) => void;
}
const EXAMPLES: Readonly<Record<string, Expectation>> = {
  'core-loss.ts': { lines: [/^total core loss: iGSE \d/m, /^Caution: engineering estimates/m] },
  'current-transformer.ts': { lines: [/^aiding the offset +0\.9\d{2} T +\d+\.\d{2} ms +\d+\.\d{2} ms$/m, /^Caution: engineering estimates/m] },
  'demo.ts': {
    args: (dir) => [dir],
    lines: [/^== Energising a 230 V mains transformer/m, /^== Flux walk in a push-pull transformer/m, /^== Three-leg core/m, /^== Flyback converter with leakage and an RCD clamp/m, /three-leg-loads\.html$/m, /flyback\.html$/m, /^Engineering estimates/m],
  },
  'flux-state.ts': {
    args: (dir) => [dir],
    lines: [/^flux state, phi\(0\) = B_r A +\d/m, /^current state from i\(0\) = 0 +\d/m, /dc-flux-comparison\.svg$/m],
    check: (stdout) => expectPageOutput(readFileSync(join(ROOT, 'docs', 'guide', 'formulation.md'), 'utf8'), stdout, 'examples/flux-state.ts'),
  },
  'flyback-converter.ts': { lines: [/^CCM output \(periodic steady state\): 7\.4\d{2} V; ideal relation n D Vin\/\(1 - D\) - Vf = 7\.500 V$/m, /^  energy audit: relative error \d\.\de-\d+$/m, /^Caution: engineering estimates/m] },
  'forward-converter.ts': { lines: [/^D = 0\.4: reset time 3\.88\d us, closed form D T Vin\/\(Vin \+ Vf\) = 3\.887 us/m, /^         switch voltage during reset 48\.\d{2} V \(2 Vin \+ Vf = 48\.70 V\)/m, /^  the core passes 0\.85 B_sat \(0\.399 T\) at \d+\.\d{2} us/m, /^Caution: engineering estimates/m] },
  'full-bridge-closed-loop.ts': { lines: [/^closed loop at \d\.\d{2} ms: Vout 1(1\.9[5-9]|2\.0[0-4])\d V \(set point 12 V\)/m, /^Caution: engineering estimate/m] },
  'flux-balance-controller.ts': { lines: [/^closed loop .*correction -(99\.[5-9]|100\.[0-4]) ns$/m, /^Engineering estimate/m] },
  'gapped-inductor.ts': { lines: [/simulated \/ McLyman = 0\.9\d+/, /^ +5\.0 +\d+\.\d/m, /^Caution/m] },
  'geometry.ts': { lines: [/^Inner winding, 40 turns, outer winding open: L = \d/m] },
  'getting-started.ts': {
    lines: [/^status: success/m, /^report: .*report\.html$/m],
    check: (stdout) => expectPageOutput(readFileSync(join(ROOT, 'docs', 'guide', 'getting-started.md'), 'utf8'), stdout),
  },
  'half-wave-rectifier.ts': { lines: [/^output peak 11\.2\d+ V/m, /^ripple 1\.\d+ V peak to peak/m, /^energy audit: relative imbalance \d\.\de-(\d\d|[6-9])/m, /^Caution: model estimates/m] },
  'harmonics.ts': { lines: [/^ +0 A +\d+\.\d+ +\d/m, /^ +1 A +\d+\.\d+/m, /^Caution: model estimates/m] },
  'inductance-matrix.ts': { lines: [/^  coupling factor k = 0\.99\d+$/m, /^ +12 A +\d+\.\d+ uH/m, /^Caution: model estimates/m] },
  'inrush-study.ts': { lines: [/^12 cases in /m, /^CAUTION: engineering estimates/m] },
  'materials.ts': { lines: [/^fit of the brauer law/m] },
  'readme.ts': {
    lines: [/^success: peak B \d/m],
    check: (stdout) => expectPageOutput(readFileSync(join(ROOT, 'README.md'), 'utf8'), stdout, 'examples/readme.ts'),
  },
  'report.ts': { lines: [/^report: .*report\.html$/m] },
  'rectifier-energisation.ts': { lines: [/^at a voltage zero, remanence \+0\.8 T +\d+\.\d A at +\d+\.\d{2} ms +\d+\.\d A at/m, /^CAUTION: engineering estimates/m] },
  'residual-flux.ts': { lines: [/^ +45\.0 ms( +0\.9\d{3}){4}$/m, /^ +0 deg +\d+\.\d A +\d+\.\d A$/m, /^Caution: engineering estimates/m] },
  'solver-robertson.ts': { lines: [/^DAE form: success/m] },
  'solver-sparse-ladder.ts': { lines: [/^dense: success, (\d+) steps; sparse: success, \1 steps$/m, /^largest difference between the two: (0\.0e\+0|\d\.\de-1[0-9]) V$/m, /^J entry by entry: success, \d+ steps, largest difference from the sparse run (0\.0e\+0|\d\.\de-1[0-9]) V$/m, /^square drive, 20 edges: success, \d+ steps, \d+ Jacobian evaluations/m] },
  'solver-transamp.ts': { lines: [/^status: success/m, /largest relative deviation from the Test Set reference/] },
  'long-run-samples.ts': { lines: [/^streamed: status success, \d+ solver steps, \d+ samples kept$/m, /^samples identical to keeping every step: true; energy audit/m] },
  'sanity-checks.ts': { lines: [/^unit slip: status success, peak \|B\| \d\.\d+e-\d T$/m, /^  warning: tube "wound leg": magnetic path length 150 m/m, /^as meant: 0 warnings$/m, /^after the run: tube "wound leg": \|B\| reaches \d+\.\d+ T/m] },
  'reduced-formulation.ts': {
    lines: [/^full +0\.\d{4} +\d+\.\d{4} +\d+ +\d\.\d{2}$/m, /^reduced +0\.\d{4} +\d+\.\d{4} +\d+ +\d\.\d{2}$/m, /^rectifier, reduced: output at the crest 9\.\d{4} V/m, /^refused \(not-reducible\): .*diode "D1" enters the potential of node "a" other than affinely/m, /^Caution/m],
  },
  'stepper-set-points.ts': {
    lines: [/^supply energy from the record (0\.5487[0-9]{2}) J, closed form \1 J$/m, /^Engineering estimate/m],
  },
  'sweep.ts': { lines: [/^Rated peak current \d/m, /^Engineering estimate/m] },
  'transformer-ladder.ts': { lines: [/^40 stages, 163 unknowns \(sparse LU from 32\)$/m, /^status: success, \d+ steps, \d+ LU factorisations$/m, /^peak voltage at stage 40 over the third cycle: \d+\.\d\d V$/m] },
  'three-phase-core.ts': { lines: [/^load star point to neutral: \d/m, /^energy audit over 5 cycles/m] },
  'worst-case.ts': { lines: [/^largest inrush peak: \d+\.\d A at -?\d+\.\d deg, remanence -?0\.80 T/m, /^smallest margin to B_sat/m, /^CAUTION/m] },
  'waveforms.ts': { lines: [/^net volt-seconds per period:/m] },
};

const exampleFiles = readdirSync(join(ROOT, 'examples')).filter((f) => f.endsWith('.ts')).sort();

describe('examples/: every script runs and prints what it should', () => {
  it('has an expectation for every script in examples/', () => {
    expect(exampleFiles.filter((f) => !(f in EXAMPLES))).toEqual([]);
    expect(Object.keys(EXAMPLES).filter((f) => !exampleFiles.includes(f))).toEqual([]);
  });

  for (const file of exampleFiles) {
    const expectation = EXAMPLES[file];
    if (expectation === undefined) continue;
    it.concurrent(`npx tsx examples/${file} exits with 0 and prints its result`, async () => {
      const out = mkdtempSync(join(scratch, 'out-'));
      const run = await runScript(join(ROOT, 'examples', file), expectation.args?.(out) ?? []);
      expectSuccess(run);
      for (const line of expectation.lines) expect(run.stdout).toMatch(line);
      expectation.check?.(run.stdout);
    }, TIMEOUT_MS);
  }
});

/** A page's TypeScript blocks joined into one script, with the package imports pointing at `paths`. */
function pageScript(markdown: string, paths: { index: string; report: string }): string {
  return mapPackageImports(codeBlocks(markdown).join('\n'), paths);
}

const guideDir = join(ROOT, 'docs', 'guide');
const guidePages = readdirSync(guideDir).filter((f) => f.endsWith('.md')).sort();
const pagesWithCode = guidePages.filter((f) => codeBlocks(readFileSync(join(guideDir, f), 'utf8')).length > 0);

describe('docs/guide: the code blocks of every page run as written', () => {
  // The page scripts sit in a folder of out/ (ignored by git) so that they import the sources by a
  // relative path and compile with the project's tsconfig.
  const checkDir = join(ROOT, 'out', 'guide-check', `${process.pid}`);
  const sourcePaths = { index: '../../../src/index.js', report: '../../../src/report/index.js' };
  mkdirSync(checkDir, { recursive: true });
  for (const page of pagesWithCode) {
    writeFileSync(join(checkDir, page.replace(/\.md$/, '.ts')), pageScript(readFileSync(join(guideDir, page), 'utf8'), sourcePaths));
  }
  writeFileSync(
    join(checkDir, 'tsconfig.json'),
    JSON.stringify({ extends: '../../../tsconfig.json', compilerOptions: { noEmit: true }, include: ['*.ts'] }),
  );
  afterAll(() => rmSync(checkDir, { recursive: true, force: true }));

  it('has guide pages with code', () => {
    expect(pagesWithCode).toContain('getting-started.md');
  });

  it.concurrent('type-checks every page script with the project settings (tsc --noEmit)', async () => {
    const run = await runNode([TSC, '--noEmit', '-p', checkDir], ROOT);
    expectSuccess(run);
  }, TIMEOUT_MS);

  // getting-started.md is examples/getting-started.ts (checked below), which runs above.
  for (const page of pagesWithCode.filter((p) => p !== 'getting-started.md')) {
    it.concurrent(`runs the code of docs/guide/${page}`, async () => {
      const run = await runScript(join(checkDir, page.replace(/\.md$/, '.ts')));
      expectSuccess(run);
      expectPageOutput(readFileSync(join(guideDir, page), 'utf8'), run.stdout);
    }, TIMEOUT_MS);
  }
});

/**
 * The output a page shows (text blocks marked `<!-- output -->`, or
 * `<!-- output of examples/x.ts -->` for an example's output) is what the
 * script prints: each block's lines appear in the output, consecutively and
 * in order. The text must agree; each number within 5 % (integers such as
 * step counts within 25 %; values below 1e-6 in magnitude, which are
 * round-off or error levels, only need to stay below 1e-6). Lines that
 * start with `report:` (absolute paths) are not compared.
 */
function expectPageOutput(markdown: string, stdout: string, of?: string): void {
  const number = /-?\d+(?:\.\d+)?(?:e[-+]?\d+)?/gi;
  const shape = (line: string) => line.replace(number, '#');
  const printed = stdout.trimEnd().split('\n');
  const blocks = outputBlocks(markdown, of);
  if (of !== undefined) expect(blocks.length, `a block marked <!-- output of ${of} -->`).toBeGreaterThan(0);
  for (const block of blocks) {
    const shown = block.trimEnd().split('\n');
    const first = printed.findIndex((line) => shape(line) === shape(shown[0]!));
    expect(first, `the output should contain the line "${shown[0]}"`).toBeGreaterThanOrEqual(0);
    shown.forEach((doc, k) => {
      const got = printed[first + k] ?? '';
      if (doc.startsWith('report:')) return;
      expect(shape(got)).toBe(shape(doc));
      const have = got.match(number) ?? [];
      (doc.match(number) ?? []).forEach((w, j) => {
        const a = Number(w);
        const b = Number(have[j]);
        const where = `"${doc}": ${w} printed as ${have[j]}`;
        if (Math.abs(a) < 1e-6) expect(Math.abs(b), where).toBeLessThan(1e-6);
        else if (/^-?\d+$/.test(w)) expect(Math.abs(b - a), where).toBeLessThanOrEqual(0.25 * Math.abs(a));
        else expect(Math.abs(b - a), where).toBeLessThanOrEqual(0.05 * Math.abs(a));
      });
    });
  }
}

describe('README and getting-started stay the code of their examples', () => {
  const exampleCode = (file: string) =>
    withoutLeadingComments(readFileSync(join(ROOT, 'examples', file), 'utf8'));
  const toExamplePaths = { index: '../src/index.js', report: '../src/report/index.js' };

  it("README.md's first TypeScript block is examples/readme.ts", () => {
    const first = codeBlocks(readFileSync(join(ROOT, 'README.md'), 'utf8'))[0];
    expect(first).toBeDefined();
    expect(mapPackageImports(first!, toExamplePaths)).toBe(exampleCode('readme.ts'));
  });

  it('docs/guide/getting-started.md, its blocks joined, is examples/getting-started.ts', () => {
    const md = readFileSync(join(guideDir, 'getting-started.md'), 'utf8');
    expect(pageScript(md, toExamplePaths)).toBe(exampleCode('getting-started.ts'));
  });
});
