/**
 * Work against accuracy of the two formulations (`formulation: 'full'` and
 * `'reduced'`) on an energisation through saturation: one winding of 462
 * turns (3 ohm) on a closed core of the demo grain-oriented steel (0.5 m of
 * path, 1.6e-3 m^2), 325 V at 50 Hz switched on at a voltage zero, 0.1 s.
 * The reference is odex (Hairer's extrapolation code, an outside
 * integrator) on the one-unknown ODE N phi' = v(t) - R i(phi),
 * N i = l H(phi / A), at rtol 1e-12; the error is the winding current's
 * largest deviation over 1000 samples, over its peak. CPU ms are medians of
 * alternated runs in one process. Scenario of our own (demo data).
 * usage: tsx bench/formulation-accuracy.ts [rounds]
 */
import { energisationReference, energise as energiseOnce } from '../test/support/energisation.js';
import { alternateCpuMs, median, printTable } from './timing.js';

/** One run of the energisation (test/support/energisation.ts); throws on a failed run. */
function energise(formulation: 'full' | 'reduced', rtol: number): ReturnType<typeof energiseOnce> {
  const run = energiseOnce(formulation, rtol);
  if (run.status !== 'success') throw new Error(`${formulation} at rtol ${rtol}: ${run.status}`);
  return run;
}

/** Prints, per rtol, each formulation's error against odex, its counts and its CPU time. */
export function benchFormulationAccuracy(rounds = 9): void {
  const ref = energisationReference();
  const peak = Math.max(...ref.map(Math.abs));
  const rows: (string | number)[][] = [];
  // Warm-up at every tolerance first, so the first one timed does not carry the compilation.
  for (let k = 0; k < 3; k++) for (const rtol of [1e-4, 1e-6, 1e-8]) for (const form of ['full', 'reduced'] as const) energise(form, rtol);
  for (const rtol of [1e-4, 1e-6, 1e-8]) {
    const error = (i: Float64Array): number => {
      let worst = 0;
      for (let k = 0; k < ref.length; k++) worst = Math.max(worst, Math.abs(i[k]! - ref[k]!));
      return worst / peak;
    };
    const full = energise('full', rtol);
    const reduced = energise('reduced', rtol);
    const ms = alternateCpuMs(rounds, () => energise('reduced', rtol), () => energise('full', rtol));
    const [mReduced, mFull] = [median(ms.here), median(ms.there)];
    rows.push([rtol, 'full', error(full.current), full.steps, full.f, mFull, 1]);
    rows.push([rtol, 'reduced', error(reduced.current), reduced.steps, reduced.f, mReduced, mReduced / mFull]);
  }
  console.log(`\n## Formulations, work against accuracy: energisation through saturation against odex (peak ${peak.toFixed(1)} A, ${rounds} alternated rounds)`);
  printTable(['rtol', 'formulation', 'max |i - i_ref| / peak', 'steps', 'f', 'CPU ms', '/ full'], rows);
}

if (import.meta.url === `file://${process.argv[1]}`) benchFormulationAccuracy(Number(process.argv[2] ?? 9));
