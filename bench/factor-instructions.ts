/**
 * Machine instructions per factorisation of the iteration matrix, counted
 * by valgrind's callgrind: a measure the machine's load does not move (the
 * CPU-time ratios of the other benches spread by 5 to 30 % on a shared
 * 2-core VM, which hides changes of a few per cent).
 *
 * Rows, each at n = 3, 8 and 15 on one random matrix (the shift 1e3 on the
 * diagonal, as `(gamma/h) I - J` forms it):
 * - the solver's real LU, `factorShifted` (forming, equilibration,
 *   elimination);
 * - the same with the elimination left out (forming and equilibration
 *   alone);
 * - a textbook LU with partial pivoting on a plain array (Golub and Van
 *   Loan, Matrix Computations, Algorithm 3.4.1), no equilibration: a floor
 *   for what the elimination itself costs in this engine.
 *
 * Each count is the difference of two runs (N and 3N factorisations) over
 * 2N, so start-up, loading and compilation cancel. V8 runs single-threaded
 * (compilation on the main thread, the same optimisation points every run)
 * and one buffer is detached first, as under tsx (docs/solver.md, "Sixth
 * pass", on the detach check). Needs valgrind; prints a note and stops
 * without it. Not part of `npm run bench` (about three minutes per size).
 * usage: tsx bench/factor-instructions.ts
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { DenseLu } from '../src/solver/dense-lu.js';
import { packedDoubles } from '../src/solver/packed-doubles.js';
import { printTable } from './timing.js';

type Variant = 'solver' | 'forming' | 'textbook';
const VARIANTS: readonly Variant[] = ['solver', 'forming', 'textbook'];
const SIZES = [3, 8, 15] as const;
const SHIFT = 1e3;

/** A reproducible matrix with entries over six decades (a Jacobian's mixed scales). */
function randomJacobian(n: number): Float64Array {
  let s = 1;
  const rnd = (): number => (s = (s * 16807) % 2147483647) / 2147483647;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) a[i] = (rnd() - 0.5) * 10 ** (6 * rnd() - 3);
  return a;
}

/** Textbook LU with partial pivoting in place (Golub and Van Loan, Algorithm 3.4.1). */
function textbookFactor(a: number[], jac: Float64Array, n: number, shift: number): void {
  for (let k = 0; k < n * n; k++) a[k] = -jac[k]!;
  for (let i = 0; i < n; i++) a[i * n + i] = a[i * n + i]! + shift;
  for (let k = 0; k < n; k++) {
    let p = k;
    let pmax = Math.abs(a[k * n + k]!);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(a[i * n + k]!);
      if (v > pmax) {
        pmax = v;
        p = i;
      }
    }
    const rk = k * n;
    if (p !== k) {
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        const t = a[rp + j]!;
        a[rp + j] = a[rk + j]!;
        a[rk + j] = t;
      }
    }
    const pivot = a[rk + k]!;
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const l = a[ri + k]! / pivot;
      a[ri + k] = l;
      if (l !== 0) for (let j = k + 1; j < n; j++) a[ri + j] = a[ri + j]! - l * a[rk + j]!;
    }
  }
}

/** The child: `count` factorisations of one variant. */
function runChild(variant: Variant, n: number, count: number): void {
  const detached = new ArrayBuffer(8);
  structuredClone(detached, { transfer: [detached] });
  const jac = randomJacobian(n);
  if (variant === 'textbook') {
    const a = packedDoubles(n * n);
    for (let k = 0; k < count; k++) textbookFactor(a, jac, n, SHIFT + k * 1e-9);
    return;
  }
  if (variant === 'forming') {
    // The elimination replaced by a no-op: what remains is the forming and the scales. Checked first,
    // so that a renamed method fails here instead of counting the whole factorisation as the forming.
    const proto = DenseLu.prototype as unknown as { scaleAndEliminate?: () => number };
    if (typeof proto.scaleAndEliminate !== 'function') throw new Error('DenseLu has no scaleAndEliminate: update bench/factor-instructions.ts');
    proto.scaleAndEliminate = () => -1;
  }
  const lu = new DenseLu(n);
  for (let k = 0; k < count; k++) lu.factorShifted(jac, SHIFT + k * 1e-9, undefined);
}

/** Instructions of one child run under callgrind, or undefined when valgrind fails. */
function instructions(variant: Variant, n: number, count: number): number | undefined {
  const self = fileURLToPath(import.meta.url);
  const run = spawnSync(
    'valgrind',
    ['--tool=callgrind', '--callgrind-out-file=/dev/null', process.execPath, '--single-threaded', '--import', 'tsx', self, 'child', variant, String(n), String(count)],
    { encoding: 'utf8' },
  );
  const m = /Collected\s*:\s*(\d+)/.exec(run.stderr ?? '');
  // A child that failed (a throw above) is no count, whatever valgrind collected before it ended.
  return m && run.status === 0 ? Number(m[1]) : undefined;
}

function main(): void {
  if (spawnSync('valgrind', ['--version']).status !== 0) {
    console.log('valgrind is not installed: nothing measured (apt-get install valgrind).');
    return;
  }
  const N = 5000;
  const rows: (string | number)[][] = [];
  for (const n of SIZES) {
    const per: Record<string, number> = {};
    for (const v of VARIANTS) {
      const a = instructions(v, n, N);
      const b = instructions(v, n, 3 * N);
      per[v] = a !== undefined && b !== undefined ? Math.round((b - a) / (2 * N)) : NaN;
    }
    rows.push([n, per.solver!, per.forming!, per.forming! / per.solver!, per.textbook!, per.solver! / per.textbook!]);
  }
  console.log('\n## Instructions per real factorisation of the iteration matrix (callgrind, single-threaded V8)');
  printTable(['n', 'solver', 'forming + scales', 'share', 'textbook LU', 'solver / textbook'], rows);
}

if (process.argv[2] === 'child') runChild(process.argv[3] as Variant, Number(process.argv[4]), Number(process.argv[5]));
else main();
