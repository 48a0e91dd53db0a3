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
 *   for what the elimination itself costs in this engine;
 * - the complex LU's `factorShifted` (shift 1e3 + 4e2 i), whole and with
 *   the elimination left out;
 * - the forming and scales alone with a singular diagonal M (a DAE's:
 *   every third diagonal entry zero), real and complex.
 *
 * Each count is the difference of two runs (N and 3N factorisations) over
 * 2N, so start-up, loading and compilation cancel. V8 runs single-threaded
 * (compilation on the main thread, the same optimisation points every run)
 * and one buffer is detached first, as under tsx (docs/solver.md, "Sixth
 * pass", on the detach check). Needs valgrind; prints a note and stops
 * without it. Not part of `npm run bench` (about two minutes per variant and
 * size). FACTOR_SIZES (e.g. `3,8`) and FACTOR_VARIANTS (e.g.
 * `forming,complex-forming`) pick a part; the first three variants by default.
 * usage: tsx bench/factor-instructions.ts
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { ComplexLu } from '../src/solver/complex-lu.js';
import { DenseLu } from '../src/solver/dense-lu.js';
import { packedDoubles } from '../src/solver/packed-doubles.js';
import { sparseMassOfDense, type SparseMass } from '../src/solver/sparse-mass.js';
import { printTable } from './timing.js';

const ALL_VARIANTS = ['solver', 'forming', 'textbook', 'complex', 'complex-forming', 'mass-forming', 'complex-mass-forming'] as const;
type Variant = (typeof ALL_VARIANTS)[number];
const DEFAULT_VARIANTS: readonly Variant[] = ['solver', 'forming', 'textbook'];
const DEFAULT_SIZES: readonly number[] = [3, 8, 15];
const SHIFT = 1e3;
const SHIFT_IM = 4e2;

/** A list from an environment variable (comma-separated), or the default. */
function listFromEnv<T>(name: string, parse: (s: string) => T, fallback: readonly T[]): readonly T[] {
  const raw = process.env[name];
  return raw ? raw.split(',').map((s) => parse(s.trim())) : fallback;
}

/** A DAE's mass matrix: the identity with every third diagonal entry zero. */
function daeMass(n: number): SparseMass {
  const m = new Float64Array(n * n);
  for (let i = 0; i < n; i++) m[i * n + i] = i % 3 === 2 ? 0 : 1;
  return sparseMassOfDense(m, n);
}

/** The elimination of `cls` replaced by a no-op, so that only the forming and the scales are counted. */
function leaveOutElimination(cls: { prototype: unknown }, name: string): void {
  // Checked first, so that a renamed method fails here instead of counting the whole factorisation as the forming.
  const proto = cls.prototype as { scaleAndEliminate?: () => number };
  if (typeof proto.scaleAndEliminate !== 'function') throw new Error(`${name} has no scaleAndEliminate: update bench/factor-instructions.ts`);
  proto.scaleAndEliminate = () => -1;
}

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
  const mass = variant === 'mass-forming' || variant === 'complex-mass-forming' ? daeMass(n) : undefined;
  if (variant === 'forming' || variant === 'mass-forming') leaveOutElimination(DenseLu, 'DenseLu');
  if (variant === 'complex-forming' || variant === 'complex-mass-forming') leaveOutElimination(ComplexLu, 'ComplexLu');
  if (variant === 'complex' || variant === 'complex-forming' || variant === 'complex-mass-forming') {
    const lu = new ComplexLu(n);
    for (let k = 0; k < count; k++) lu.factorShifted(jac, SHIFT + k * 1e-9, SHIFT_IM, mass);
    return;
  }
  const lu = new DenseLu(n);
  for (let k = 0; k < count; k++) lu.factorShifted(jac, SHIFT + k * 1e-9, mass);
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
  const sizes = listFromEnv('FACTOR_SIZES', Number, DEFAULT_SIZES);
  const variants = listFromEnv('FACTOR_VARIANTS', (s) => s as Variant, DEFAULT_VARIANTS);
  for (const v of variants) if (!ALL_VARIANTS.includes(v)) throw new Error(`unknown variant ${v}: one of ${ALL_VARIANTS.join(', ')}`);
  const N = 5000;
  const rows: (string | number)[][] = [];
  for (const n of sizes) {
    const per: Record<string, number> = {};
    for (const v of variants) {
      const a = instructions(v, n, N);
      const b = instructions(v, n, 3 * N);
      per[v] = a !== undefined && b !== undefined ? Math.round((b - a) / (2 * N)) : NaN;
    }
    rows.push([n, ...variants.map((v) => per[v]!)]);
    if (per.solver !== undefined && per.forming !== undefined && per.textbook !== undefined) {
      console.log(`n = ${n}: forming share ${(per.forming / per.solver).toFixed(2)}, solver / textbook ${(per.solver / per.textbook).toFixed(2)}`);
    }
  }
  console.log('\n## Instructions per factorisation of the iteration matrix (callgrind, single-threaded V8)');
  printTable(['n', ...variants], rows);
}

if (process.argv[2] === 'child') runChild(process.argv[3] as Variant, Number(process.argv[4]), Number(process.argv[5]));
else main();
