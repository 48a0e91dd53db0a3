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
import { compileMaterial, createNetwork, demoMaterials, simulate, sine } from '../src/index.js';
import { Solver } from '../test/support/odex.js';
import { alternateCpuMs, median, printTable } from './timing.js';

const steelSpec = demoMaterials.grainOrientedSteel;
const steel = compileMaterial(steelSpec);
const [N, R, area, lLeg, lRest, Vm, fHz] = [462, 3, 1.6e-3, 0.2, 0.3, 325, 50];
const stopTime = 0.1;
const times = Array.from({ length: 1000 }, (_, k) => ((k + 1) * stopTime) / 1000);
const currentOf = (phi: number): number => ((lLeg + lRest) * steel.fieldStrength(phi / area)) / N;

/** The winding current at `times` from odex. */
function reference(): number[] {
  const odex = new Solver(1);
  odex.absoluteTolerance = 1e-16;
  odex.relativeTolerance = 1e-12;
  const f = (t: number, y: number[]): number[] => [(Vm * Math.sin(2 * Math.PI * fHz * t) - R * currentOf(y[0]!)) / N];
  const out: number[] = [];
  let phi = 0;
  let t0 = 0;
  for (const t of times) {
    phi = odex.solve(f, t0, [phi], t).y[0]!;
    out.push(currentOf(phi));
    t0 = t;
  }
  return out;
}

/** One run of the energisation; returns the winding current at `times` and the run's counts. */
function energise(formulation: 'full' | 'reduced', rtol: number): { current: Float64Array; steps: number; f: number } {
  const net = createNetwork('energisation at a voltage zero');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: lLeg, area, material: steelSpec });
  net.fluxTube('rest', { from: m2, to: m1, length: lRest, area, material: steelSpec });
  const a = net.node('a');
  net.voltageSource('mains', a, net.ground, sine({ amplitude: Vm, frequency: fHz }));
  const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: a, minus: net.ground });
  const r = simulate(net, { stopTime, rtol, formulation, sampling: { times } });
  if (r.status !== 'success') throw new Error(`${formulation} at rtol ${rtol}: ${r.status} ${r.message}`);
  return { current: Float64Array.from(r.current(coil)), steps: r.stats.acceptedSteps, f: r.stats.rhsEvaluations };
}

/** Prints, per rtol, each formulation's error against odex, its counts and its CPU time. */
export function benchFormulationAccuracy(rounds = 9): void {
  const ref = reference();
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
