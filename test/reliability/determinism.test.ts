/**
 * Inputs are never mutated, and a network simulated many times gives the
 * same numbers bit for bit. Every input (material and waveform specs, switch
 * schedules, layout, options, sampling times) is deep-frozen before it is
 * handed over, so any write into it would throw (strict mode), and a JSON
 * snapshot taken before is compared after. Repeatability is a property of our
 * own code (no outside reference): same inputs, same floating-point operations.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import {
  addCoreLayout,
  bipolarSquare,
  createNetwork,
  demoMaterials,
  eCoreLayout,
  mm,
  piecewiseLinear,
  pulse,
  simulate,
  sine,
  userFunction,
  type SimulateOptions,
  type SimulationResult,
} from '../../src/index.js';
import { bits, deepFreeze, expectSameBits } from './bits.js';

/** A network that uses every element kind, saturating materials, eddy resistance, a layout and every waveform kind. */
function everything() {
  const inputs = deepFreeze({
    ferrite: { ...demoMaterials.ferrite },
    table: { kind: 'table', name: 'lab table', fluxDensity: [0.2, 0.6, 1.0, 1.3], fieldStrength: [20, 60, 150, 900], saturationFluxDensity: 1.35 } as const,
    layout: eCoreLayout({
      centreLegWidth: mm(12), outerLegWidth: mm(6), yokeHeight: mm(6), depth: mm(12), windowWidth: mm(9), windowHeight: mm(22),
      windings: { centre: { innerBuild: mm(3), outerBuild: mm(3), spacing: mm(0.5), clearance: mm(1) } },
      gaps: { centre: { length: mm(0.2) } },
    }),
    layoutOptions: { material: demoMaterials.ferrite, eddyResistance: { left: 50 } },
    drive: bipolarSquare({ amplitude: 12, period: 1e-4, deadTime: 2e-6, mismatch: 1e-7 }),
    aux: sine({ amplitude: 2, frequency: 2e4, phase: 0.3 }),
    gate: pulse({ high: 0.5, period: 5e-5, duty: 0.3, rise: 2e-6, fall: 3e-6 }),
    ramp: piecewiseLinear({ times: [0, 2.5e-5, 5e-5], values: [0, 1, 0], period: 5e-5 }),
    soft: userFunction({ name: 'soft start', fn: (t: number) => 3 * (1 - Math.exp(-t / 5e-5)) }),
    schedule: [{ time: 2e-5, closed: true }, { time: 4.5e-5, closed: false }],
  });
  const snapshot = JSON.stringify(inputs);
  const net = createNetwork('everything');
  const core = addCoreLayout(net, inputs.layout, inputs.layoutOptions);
  // A side core of the table material with a remanent flux and a leakage reluctance with an area.
  const s1 = net.magneticNode('s1');
  const s2 = net.magneticNode('s2');
  const side = net.fluxTube('side', { from: s1, to: s2, length: 0.05, area: 2e-5, material: inputs.table, initialFluxDensity: 0.3, eddyResistance: 20 });
  const back = net.fluxTube('back', { from: s2, to: s1, length: 0.05, area: 2e-5, material: inputs.ferrite, initialFluxDensity: 0.3 });
  const leak = net.reluctance('leak', { from: s1, to: s2, reluctance: 5e7, area: 2e-5 });
  const gap = net.airGap('gap', { from: s2, to: s1, length: 1e-4, area: 2e-5, fringingFactor: 1.2 });
  const a = net.node('a');
  const b = net.node('b');
  const c = net.node('c');
  const d = net.node('d');
  const bridge = net.voltageSource('bridge', a, net.ground, inputs.drive);
  const primary = net.winding('primary', { tube: core.windingTube('centre'), turns: 6, resistance: 0.02, plus: a, minus: net.ground });
  const secondary = net.winding('secondary', { tube: core.outerWindingTube('centre'), turns: 3, resistance: 0.01, plus: b, minus: net.ground, orientation: -1 });
  const load = net.resistor('load', b, c, 2);
  const cap = net.capacitor('cap', c, net.ground, 1e-6, { initialVoltage: 0.5 });
  const sw = net.switch('sw', c, net.ground, { onResistance: 0.5, offResistance: 1e5, schedule: inputs.schedule });
  const auxSource = net.voltageSource('aux', d, net.ground, inputs.aux);
  const choke = net.inductor('choke', d, b, 1e-3, { initialCurrent: 0.01 });
  const sideCoil = net.winding('side coil', { tube: side, turns: 20, resistance: 0.5, plus: c, minus: net.ground });
  const bias = net.currentSource('bias', c, net.ground, inputs.gate);
  const e = net.node('e');
  const rampSource = net.currentSource('ramp', e, net.ground, inputs.ramp);
  const damp = net.resistor('damp', e, net.ground, 10);
  const f = net.node('f');
  const softSource = net.voltageSource('soft', f, net.ground, inputs.soft);
  const backCoil = net.winding('back coil', { tube: back, turns: 10, resistance: 1, plus: f, minus: net.ground });
  return {
    net, inputs, snapshot,
    tubes: [...core.tubes.values(), side, back, leak, gap],
    nodes: [a, b, c, d, e, f],
    magneticNodes: [...core.nodes.values(), s1, s2],
    elements: [bridge, primary, secondary, load, cap, sw, auxSource, choke, sideCoil, bias, rampSource, damp, softSource, backCoil],
    windings: [primary, secondary, sideCoil, backCoil],
  };
}

type Model = ReturnType<typeof everything>;

/** Every series the result offers, keyed by a readable name, read in the given order. */
function allSeries(m: Model, r: SimulationResult, reverse = false): Map<string, Float64Array> {
  const reads: [string, () => Float64Array][] = [['time', () => r.time]];
  for (const t of m.tubes) {
    reads.push([`flux ${t.name}`, () => r.flux(t)], [`mmf ${t.name}`, () => r.mmf(t)], [`eddy ${t.name}`, () => r.eddyPower(t)]);
    const law = r.network.tubes[t.index]!.law;
    if (law.kind !== 'reluctance' || law.area !== undefined) reads.push([`B ${t.name}`, () => r.fluxDensity(t)]);
    if (law.kind !== 'reluctance') reads.push([`H ${t.name}`, () => r.fieldStrength(t)]);
  }
  for (const n of m.magneticNodes) reads.push([`U ${n.name}`, () => r.magneticPotential(n)]);
  for (const n of m.nodes) reads.push([`v ${n.name}`, () => r.potential(n)]);
  for (const e of m.elements) reads.push([`u ${e.name}`, () => r.voltage(e)], [`i ${e.name}`, () => r.current(e)], [`p ${e.name}`, () => r.power(e)]);
  for (const w of m.windings) reads.push([`emf ${w.name}`, () => r.emf(w)], [`linkage ${w.name}`, () => r.fluxLinkage(w)]);
  if (reverse) reads.reverse();
  return new Map(reads.map(([k, read]) => [k, read()]));
}

function expectSameResult(m: Model, x: SimulationResult, y: SimulationResult, reverse = false): void {
  expect(y.status).toBe(x.status);
  expect(y.stats).toEqual(x.stats);
  const sx = allSeries(m, x);
  const sy = allSeries(m, y, reverse);
  expect([...sy.keys()].sort()).toEqual([...sx.keys()].sort());
  for (const [k, s] of sx) expectSameBits(sy.get(k)!, s, k);
  const ex = x.energy();
  const ey = y.energy();
  expect(bits(Float64Array.of(ey.sourceEnergy, ey.imbalance, ey.storedEnd, ey.dissipated.total))).toEqual(
    bits(Float64Array.of(ex.sourceEnergy, ex.imbalance, ex.storedEnd, ex.dissipated.total)),
  );
  expect(y.toCSV()).toBe(x.toCSV());
}

const options = (): SimulateOptions =>
  deepFreeze({
    stopTime: 6e-5,
    rtol: 1e-5,
    atol: { voltage: 1e-6, current: 1e-7, fluxDensity: 1e-7 },
    sampling: { times: [0, 1e-5, 3e-5, 3e-5, 6e-5], includeSteps: true },
    maxSteps: 200_000,
  });

describe('simulate: inputs are never mutated and runs repeat bit for bit', () => {
  // One model and its first run, shared by the two tests below (the run is the expensive part).
  let m: Model;
  let first: SimulationResult;
  let opts: SimulateOptions;
  let optsSnapshot: string;
  let before: ReturnType<Model['net']['describe']>;
  beforeAll(() => {
    m = everything();
    before = m.net.describe();
    opts = options();
    optsSnapshot = JSON.stringify(opts);
    first = simulate(m.net, opts);
  });

  it('runs on deep-frozen inputs and leaves them (and the description) as they were', () => {
    expect(first.status).toBe('success');
    expect(first.time.length).toBeGreaterThan(30);
    expect(JSON.stringify(m.inputs)).toBe(m.snapshot);
    expect(JSON.stringify(opts)).toBe(optsSnapshot);
    expect(m.net.describe()).toEqual(before);
    // Reading every series and the audit does not write into the inputs either.
    allSeries(m, first);
    first.energy();
    first.toJSON();
    expect(JSON.stringify(m.inputs)).toBe(m.snapshot);
    expect(m.inputs.soft.fn!(1e-4)).toBe(3 * (1 - Math.exp(-2)));
  });

  it('gives bit-identical series, statistics, audit and CSV on a repeated run, with another run in between, from the builder or its description', () => {
    // Another network simulated in between shares no state with this one.
    const other = everything();
    expect(simulate(other.net, { stopTime: 2e-5 }).status).toBe('success');
    const again = simulate(m.net, options());
    // Read the repeated run's series in the reverse order: results do not depend on reading order.
    expectSameResult(m, first, again, true);
    // The frozen description gives the same run (its result accepts no builder handles, so compare raw states).
    const fromDescription = simulate(m.net.describe(), options());
    expectSameBits(fromDescription.time, first.time, 'time (description)');
    for (let k = 0; k < first.length; k++) expectSameBits(fromDescription.state(k), first.state(k), `state ${k} (description)`);
  });
});
