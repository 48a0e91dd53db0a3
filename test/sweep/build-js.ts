// Compile the sweep's part of src/ to plain JavaScript in a temporary directory
// laid out like the package's dist/ (dist/sweep/cli.js, dist/sweep/sweep-worker.js,
// dist/simulate.js...), so tests and the bench run the sweep the way the built
// package runs it: plain node, workers started from .js files, no tsx. Only the
// modules reachable from the sweep entry points are compiled, each with
// TypeScript's transpileModule at the build's target with ESM output (type
// checking is `npm test`'s tsc step).
import { mkdirSync, mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const SRC = join(ROOT, 'src');
const ENTRIES = ['sweep/index.ts', 'sweep/cli.ts', 'sweep/sweep-worker.ts'];

/** Relative imports of a source file (static and dynamic), as .ts paths. */
function localImports(file: string, text: string): string[] {
  const specifiers = [...text.matchAll(/(?:from|import)\s*\(?\s*['"](\.{1,2}\/[^'"]+)['"]/g)].map((m) => m[1]!);
  return specifiers.map((s) => resolve(dirname(file), s).replace(/\.js$/, '.ts'));
}

/** Build once; returns the package root (it holds dist/, package.json and a node_modules link). */
export function buildJs(): string {
  const root = mkdtempSync(join(tmpdir(), 'fluxstate-dist-'));
  const seen = new Set<string>();
  const queue = ENTRIES.map((e) => join(SRC, e));
  while (queue.length > 0) {
    const file = queue.pop()!;
    if (seen.has(file)) continue;
    seen.add(file);
    const text = readFileSync(file, 'utf8');
    queue.push(...localImports(file, text));
    const { outputText } = ts.transpileModule(text, {
      fileName: file,
      compilerOptions: { module: ts.ModuleKind.ESNext, target: ts.ScriptTarget.ES2022, verbatimModuleSyntax: true },
    });
    const out = join(root, 'dist', relative(SRC, file)).replace(/\.ts$/, '.js');
    mkdirSync(dirname(out), { recursive: true });
    writeFileSync(out, outputText);
  }
  writeFileSync(join(root, 'package.json'), JSON.stringify({ name: 'fluxstate', type: 'module' }));
  symlinkSync(join(ROOT, 'node_modules'), join(root, 'node_modules'), 'dir');
  return root;
}
