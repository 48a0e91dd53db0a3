// Soak run over random valid networks (test/reliability/random-network.ts: ladders, leakage paths,
// saturating materials, air gaps, eddy resistances, RC snubbers, switches). Not part of `npm test`.
//
//   nice npx tsx test/soak/soak.ts [--count 10000] [--seed 1] [--minutes 90] [--audit-every 1] [--out soak.json]
//
// Each case k is fc.sample(networkPlanArb, { seed: seed + k }), so one case replays alone with
// --seed <seed + k> --count 1. Counted per case: the final status; a thrown exception; any
// non-finite value in any series of the result (flux, flux density, MMF, eddy power, magnetic and
// electric potentials, currents, voltages) or in the energy audit; a flux imbalance at a magnetic
// node above 1e-12 of the largest flux (Kirchhoff's flux law); and, on success, an energy audit
// error above 5e-3 (conservation of energy: source energy = losses + change of stored energy; the
// tolerance of test/reliability/random-networks.test.ts) or a run that does not end at the stop
// time. The summary is rewritten every 10 cases, so a run stopped at its time cap keeps its counts.
// The energy audit costs about ten simulations (measured: 337 ms against 26 ms per case, mean of
// 30 cases); --audit-every n audits one case in n (the others are checked for status, finite
// series and flux balance only), and the summary says how many were audited.
import { writeFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import fc from 'fast-check';
import { simulate, type SimulationResult } from '../../src/index.js';
import { maxFluxImbalance } from '../helpers/conservation.js';
import { buildNetwork, networkPlanArb, type BuiltNetwork } from '../reliability/random-network.js';

const { values } = parseArgs({
  options: {
    count: { type: 'string', default: '10000' },
    seed: { type: 'string', default: '1' },
    minutes: { type: 'string', default: '90' },
    out: { type: 'string', default: 'soak.json' },
    'audit-every': { type: 'string', default: '1' },
    progress: { type: 'string' },
  },
});
const count = Number(values.count);
const seed = Number(values.seed);
const deadline = Date.now() + Number(values.minutes) * 60_000;
const auditEvery = Math.max(1, Math.floor(Number(values['audit-every'])));

const ENERGY_TOLERANCE = 5e-3;
const FLUX_TOLERANCE = 1e-12;

function everySeries(b: BuiltNetwork, r: SimulationResult): [string, Float64Array][] {
  return [
    ['time', r.time],
    ...b.tubes.flatMap((t): [string, Float64Array][] => [[`flux ${t.name}`, r.flux(t)], [`mmf ${t.name}`, r.mmf(t)], [`eddyPower ${t.name}`, r.eddyPower(t)]]),
    ...b.tubesWithArea.map((t): [string, Float64Array] => [`fluxDensity ${t.name}`, r.fluxDensity(t)]),
    ...b.magneticNodes.map((m): [string, Float64Array] => [`magneticPotential ${m.name}`, r.magneticPotential(m)]),
    ...b.elements.flatMap((e): [string, Float64Array][] => [[`current ${e.name}`, r.current(e)], [`voltage ${e.name}`, r.voltage(e)]]),
    ...b.nodes.map((n): [string, Float64Array] => [`potential ${n.name}`, r.potential(n)]),
  ];
}

const summary = {
  seed, requested: count, run: 0,
  statuses: {} as Record<string, number>,
  threw: 0,
  nonFinite: 0,
  fluxImbalance: 0,
  energyImbalance: 0,
  successShort: 0,
  audited: 0,
  withEddy: 0, withSnubber: 0, withSwitch: 0,
  worstEnergyError: 0,
  examples: [] as { seed: number; problem: string }[],
  elapsedS: 0,
  stoppedAtTimeCap: false,
};
const started = Date.now();
const note = (caseSeed: number, problem: string): void => {
  if (summary.examples.length < 40) summary.examples.push({ seed: caseSeed, problem });
};
const save = (): void => {
  summary.elapsedS = (Date.now() - started) / 1000;
  writeFileSync(values.out, `${JSON.stringify(summary, null, 2)}\n`);
};

for (let k = 0; k < count; k++) {
  if (Date.now() > deadline) {
    summary.stoppedAtTimeCap = true;
    break;
  }
  const caseSeed = seed + k;
  // The case about to run, so that a driver can tell which one hangs (test/soak/soak-driver.ts).
  if (values.progress !== undefined) writeFileSync(values.progress, `${caseSeed}\n`);
  const plan = fc.sample(networkPlanArb, { seed: caseSeed, numRuns: 1 })[0]!;
  summary.run++;
  if (plan.tubes.some((t) => t.eddy > 0 && t.material.kind !== 'gap')) summary.withEddy++;
  if (plan.windings.some((w) => w.snubber)) summary.withSnubber++;
  if (plan.windings.some((w) => w.switch)) summary.withSwitch++;
  try {
    const b = buildNetwork(plan);
    const r = simulate(b.net, { stopTime: b.stopTime, maxStep: b.shortestPeriod / 20, maxSteps: 20_000, maxWallTimeMs: 5_000 });
    summary.statuses[r.status] = (summary.statuses[r.status] ?? 0) + 1;
    const bad = everySeries(b, r).find(([, s]) => !s.every(Number.isFinite));
    const audit = k % auditEvery === 0 ? r.energy() : undefined;
    if (audit) summary.audited++;
    const auditFinite = !audit || [audit.sourceEnergy, audit.dissipated.total, audit.storedStart, audit.storedEnd, audit.relativeError].every(Number.isFinite);
    if (bad || !auditFinite) {
      summary.nonFinite++;
      note(caseSeed, `${r.status}: non-finite ${bad ? bad[0] : 'energy audit'}`);
    }
    if (maxFluxImbalance(r, b.tubes) > FLUX_TOLERANCE) {
      summary.fluxImbalance++;
      note(caseSeed, 'flux imbalance');
    }
    if (r.status === 'success') {
      if (r.time[r.time.length - 1] !== b.stopTime) {
        summary.successShort++;
        note(caseSeed, `success ending at ${r.time[r.time.length - 1]} s, stop time ${b.stopTime} s`);
      }
      if (audit && auditFinite) summary.worstEnergyError = Math.max(summary.worstEnergyError, audit.relativeError);
      if (audit && !(audit.relativeError <= ENERGY_TOLERANCE)) {
        summary.energyImbalance++;
        note(caseSeed, `energy audit error ${audit.relativeError}`);
      }
    } else {
      note(caseSeed, `${r.status}: ${r.message}`);
    }
  } catch (e) {
    summary.threw++;
    note(caseSeed, `threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`);
  }
  if (summary.run % 10 === 0) save();
}
save();
console.log(JSON.stringify(summary, null, 2));
