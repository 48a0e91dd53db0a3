/**
 * Factor + solve timings of the linear-algebra kernels behind the solver's
 * interface: flat real LU vs ml-matrix LuDecomposition (real system), flat
 * complex LU vs ml-matrix on the real 2n x 2n embedding (complex system).
 */
import { createComplexLu, createDenseLu, createEmbeddedComplexLu, createMlMatrixLu } from '../src/index.js';
import { printTable, timeMedian } from './timing.js';

function randomMatrix(n: number, seed: number): Float64Array {
  let s = seed;
  const rnd = (): number => {
    s = (s * 1103515245 + 12345) % 2147483648;
    return s / 2147483648 - 0.5;
  };
  const a = Float64Array.from({ length: n * n }, rnd);
  for (let i = 0; i < n; i++) a[i * n + i] = a[i * n + i]! + n;
  return a;
}

export function benchLinearAlgebra(): void {
  console.log('\n## Linear algebra: one factorisation + 4 solves (median, microseconds)');
  const rows: (string | number)[][] = [];
  for (const n of [8, 30, 100, 200]) {
    const a = randomMatrix(n, n);
    const im = randomMatrix(n, n + 1);
    const b = Float64Array.from({ length: n }, (_, i) => i + 1);
    const reps = n <= 30 ? 400 : n <= 100 ? 40 : 10;
    const inner = n <= 30 ? 20 : 1;
    const realRun = (lu: ReturnType<typeof createDenseLu>) => () => {
      for (let k = 0; k < inner; k++) {
        lu.factor(a);
        for (let s = 0; s < 4; s++) lu.solve(Float64Array.from(b));
      }
    };
    const complexRun = (lu: ReturnType<typeof createComplexLu>) => () => {
      for (let k = 0; k < inner; k++) {
        lu.factor(a, im);
        for (let s = 0; s < 4; s++) lu.solve(Float64Array.from(b), Float64Array.from(b));
      }
    };
    const flatR = timeMedian(realRun(createDenseLu(n)), reps, 5).ms / inner;
    const mlR = timeMedian(realRun(createMlMatrixLu(n)), reps, 5).ms / inner;
    const flatC = timeMedian(complexRun(createComplexLu(n)), reps, 5).ms / inner;
    const mlC = timeMedian(complexRun(createEmbeddedComplexLu(n)), Math.max(3, Math.floor(reps / 4)), 2).ms / inner;
    rows.push([`n = ${n}`, flatR * 1e3, mlR * 1e3, mlR / flatR, flatC * 1e3, mlC * 1e3, mlC / flatC]);
  }
  printTable(['size', 'real flat', 'real ml-matrix', 'ml/flat', 'complex flat', 'complex ml 2n', 'ml/flat'], rows);
}
