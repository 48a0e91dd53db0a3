import { describe, expect, it } from 'vitest';
import {
  addCoreLayout,
  compileMaterial,
  eCoreLayout,
  mm,
  createNetwork,
  demoMaterials,
  demoHystereticMaterials,
  harmonics,
  incrementalInductance,
  inductanceMatrix,
  InputError,
  MU0,
  simulate,
  sine,
  constant,
} from '../../../src/index.js';

// References:
// - Reluctance hand calculation (magnetic Ohm's law; e.g. any magnetics handbook, "magnetic circuit"
//   chapter; derived here): three tubes P, sigma, S in parallel between two magnetic nodes, windings N1 on
//   P and N2 on S. L11 = N1^2 / (Rp + Rs || Rsig), L22 = N2^2 / (Rs + Rp || Rsig),
//   |L12| = N1 N2 Rsig / (Rp Rs + Rp Rsig + Rs Rsig); with S shorted its flux is zero, so the primary's
//   flux returns through sigma alone: L1sc = N1^2 / (Rp + Rsig) (the standard short-circuit test).
// - Open- and short-circuit tests run in the time domain with simulate: a sine current into the primary,
//   the fundamental of the primary voltage (harmonics) gives Z = R1 + j w L.
// - Ring core of one material (derived): N I = l H(B), lambda = N A B, L_inc = N^2 A / (l dH/dB).

const N1 = 200;
const N2 = 50;
const area = 4e-4;
const muR = 2000;
const lengthP = 0.1;
const gap = 0.5e-3;
const fringing = 1.1;
const rSigma = 2e6;
const rP = lengthP / (MU0 * muR * area);
const rS = gap / (MU0 * area * fringing);
const par = (a: number, b: number) => (a * b) / (a + b);

/** Three parallel tubes between two magnetic nodes; the secondary wound against the tube direction so M > 0. */
function threeTubes(secondaryLoad: number, drive: 'current' | 'none' = 'current') {
  const net = createNetwork('three tubes');
  const a = net.magneticNode('a');
  const b = net.magneticNode('b');
  const core = net.fluxTube('core leg', { from: a, to: b, length: lengthP, area, material: { kind: 'linear', relativePermeability: muR } });
  net.reluctance('leakage', { from: a, to: b, reluctance: rSigma });
  const gapped = net.airGap('gapped leg', { from: a, to: b, length: gap, area, fringingFactor: fringing });
  const line = net.node('line');
  const out = net.node('out');
  if (drive === 'current') net.currentSource('drive', line, net.ground, sine({ amplitude: 2, frequency: 50 }));
  const primary = net.winding('primary', { tube: core, turns: N1, resistance: 0.5, plus: line, minus: net.ground });
  const secondary = net.winding('secondary', { tube: gapped, turns: N2, resistance: 0, plus: out, minus: net.ground, orientation: -1 });
  net.resistor('secondary load', out, net.ground, secondaryLoad);
  return { net, primary, secondary };
}

/** Inductance from the fundamental phasors of a winding's voltage and current over the last cycle. */
function fundamentalInductance(t: Float64Array, v: Float64Array, i: Float64Array, f: number, resistance: number): number {
  const hv = harmonics(t, v, { fundamental: f, cycles: 1, count: 1 });
  const hi = harmonics(t, i, { fundamental: f, cycles: 1, count: 1 });
  const z = hv.amplitude[1]! / hi.amplitude[1]!;
  const dp = hv.phase[1]! - hi.phase[1]!;
  expect(z * Math.cos(dp)).toBeCloseTo(resistance, 2); // the real part is the winding resistance
  return (z * Math.sin(dp)) / (2 * Math.PI * f);
}

describe('inductanceMatrix', () => {
  it('agrees with the reluctance hand calculation (linear tubes)', () => {
    const { net, primary, secondary } = threeTubes(1e9);
    const m = inductanceMatrix(net, [primary, secondary]);
    const l11 = (N1 * N1) / (rP + par(rS, rSigma));
    const l22 = (N2 * N2) / (rS + par(rP, rSigma));
    const l12 = (N1 * N2 * rSigma) / (rP * rS + rP * rSigma + rS * rSigma);
    expect(m.windings).toEqual(['primary', 'secondary']);
    expect(m.inductance[0]![0]).toBeCloseTo(l11, 12);
    expect(m.inductance[1]![1]! / l22).toBeCloseTo(1, 12);
    expect(m.inductance[0]![1]! / l12).toBeCloseTo(1, 12);
    expect(m.inductance[1]![0]).toBe(m.inductance[0]![1]);
    expect(m.coupling[0]![1]).toBeCloseTo(l12 / Math.sqrt(l11 * l22), 12);
    expect(m.shortCircuit[0]![1]! / ((N1 * N1) / (rP + rSigma))).toBeCloseTo(1, 12);
    expect(m.shortCircuit[1]![0]! / ((N2 * N2) / (rS + rSigma))).toBeCloseTo(1, 12);
    expect(Number.isNaN(m.shortCircuit[0]![0]!)).toBe(true);
    // Names work as well as handles, and on the plain description.
    const byName = inductanceMatrix(net.describe(), ['secondary', 'primary']);
    expect(byName.inductance[1]![1]).toBeCloseTo(l11, 12);
  });

  it('agrees with the open-circuit and short-circuit tests run in the time domain', () => {
    const f = 50;
    const run = (load: number) => {
      const { net, primary } = threeTubes(load);
      const r = simulate(net, { stopTime: 2 / f, rtol: 1e-8, sampling: { interval: 1e-5, includeSteps: true } });
      expect(r.status).toBe('success');
      return fundamentalInductance(r.time, r.voltage(primary), r.current(primary), f, 0.5);
    };
    const { net, primary, secondary } = threeTubes(1e9);
    const m = inductanceMatrix(net, [primary, secondary]);
    const open = run(1e9); // secondary open (1 GOhm)
    const shorted = run(1e-9); // secondary shorted (1 nOhm: L22 / R = 1e5 s, no decay in 40 ms)
    expect(open / m.inductance[0]![0]!).toBeCloseTo(1, 4);
    expect(shorted / m.shortCircuit[0]![1]!).toBeCloseTo(1, 4);
  });

  it('linearises at a DC bias: a saturating ring core against N I = l H(B) and against simulate', () => {
    const steel = demoMaterials.grainOrientedSteel;
    const law = compileMaterial(steel);
    const [length, a, n] = [0.3, 1e-3, 100];
    const net = createNetwork('ring');
    const top = net.magneticNode('top');
    const bottom = net.magneticNode('bottom');
    const ring = net.fluxTube('ring', { from: top, to: bottom, length, area: a, material: steel });
    net.fluxTube('ring return', { from: bottom, to: top, length: 1e-9, area: a, material: steel }); // closes the ring
    const line = net.node('line');
    const dc = 8; // A: N I / l = 2667 A/m, well into the knee of the demo steel
    net.currentSource('bias', line, net.ground, constant(dc));
    const coil = net.winding('coil', { tube: ring, turns: n, plus: line, minus: net.ground });

    // Hand calculation: B from l H(B) = N I by bisection, then L_inc = N^2 A / (l H'(B)).
    const h = (n * dc) / length;
    let [lo, hi] = [0, 3];
    for (let k = 0; k < 200; k++) {
      const mid = 0.5 * (lo + hi);
      if (law.fieldStrength(mid) < h) lo = mid;
      else hi = mid;
    }
    const b = 0.5 * (lo + hi);
    const lHand = (n * n * a) / (length * law.fieldSlope(b));
    const m = inductanceMatrix(net, [coil], { bias: [dc] });
    expect(m.fluxLinkage[0]! / (n * a * b)).toBeCloseTo(1, 6); // the tiny return tube takes ~3e-9 of the MMF
    expect(m.inductance[0]![0]! / lHand).toBeCloseTo(1, 5);
    expect(m.tubes.find((t) => t.name === 'ring')!.fluxDensity).toBeCloseTo(b, 6);

    // Time domain: the flux linkage a DC current source sets up in simulate.
    const r = simulate(net, { stopTime: 1e-3 });
    expect(r.status).toBe('success');
    const lambda = r.fluxLinkage(coil);
    expect(lambda[lambda.length - 1]! / m.fluxLinkage[0]!).toBeCloseTo(1, 6);

    // The curve: incremental against a central difference of its own flux linkage (derived), falling with bias.
    const di = 1e-3;
    const curve = incrementalInductance(net, coil, [dc - di, dc, dc + di, 0, 1, 20]);
    const fd = (curve.fluxLinkage[2]! - curve.fluxLinkage[0]!) / (2 * di);
    expect(curve.incremental[1]! / fd).toBeCloseTo(1, 5);
    expect(curve.incremental[1]!).toBeCloseTo(m.inductance[0]![0]!, 12);
    expect(curve.incremental[5]!).toBeLessThan(curve.incremental[4]!);
    expect(curve.secant[3]).toBe(curve.incremental[3]);
    expect(curve.secant[2]!).toBeGreaterThan(curve.incremental[2]!); // past the knee the secant exceeds the slope
  });

  it('property: with linear tubes, the stored energy at a bias i is i^T L i / 2 (energy conservation, derived)', () => {
    const { net, primary, secondary } = threeTubes(1e9);
    const reluctances = [rP, rSigma, rS];
    for (const bias of [[1, 0], [0, 3], [2.5, -4], [-0.3, 0.7]]) {
      const m = inductanceMatrix(net, [primary, secondary], { bias });
      const stored = m.tubes.reduce((e, t, k) => e + 0.5 * reluctances[k]! * t.flux * t.flux, 0);
      let quadratic = 0;
      for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) quadratic += 0.5 * bias[i]! * m.inductance[i]![j]! * bias[j]!;
      expect(stored / quadratic).toBeCloseTo(1, 12);
      // Flux linkage = L i for a linear network.
      expect(m.fluxLinkage[0]! / (m.inductance[0]![0]! * bias[0]! + m.inductance[0]![1]! * bias[1]!)).toBeCloseTo(1, 12);
      // Flux is conserved at both nodes: the three parallel tubes' fluxes sum to zero.
      expect(Math.abs(m.tubes[0]!.flux + m.tubes[1]!.flux + m.tubes[2]!.flux)).toBeLessThan(1e-15);
    }
  });

  it('converges on a three-loop E core from no bias to deep saturation; L matches a central difference of lambda', () => {
    const layout = eCoreLayout({
      centreLegWidth: mm(10), outerLegWidth: mm(5), yokeHeight: mm(6), depth: mm(10), windowWidth: mm(7.5), windowHeight: mm(20),
      gaps: { centre: { length: mm(0.2) } },
      windings: { centre: { innerBuild: mm(2), outerBuild: mm(2.5), spacing: mm(0.5), clearance: mm(0.5) } },
    });
    const net = createNetwork('e core');
    const core = addCoreLayout(net, layout, { material: demoMaterials.ferrite });
    net.winding('primary', { tube: core.windingTube('centre'), turns: 40, plus: net.node('a'), minus: net.ground });
    net.winding('secondary', { tube: core.outerWindingTube('centre'), turns: 10, plus: net.node('b'), minus: net.ground, orientation: -1 });
    for (const [i1, i2] of [[0.3, 0], [1.5, -2], [4, 1], [20, 0], [-60, 30], [400, 0]] as const) {
      const m = inductanceMatrix(net, ['primary', 'secondary'], { bias: [i1, i2] });
      const h = 1e-5 * Math.max(1, Math.abs(i1), Math.abs(i2));
      for (const j of [0, 1]) {
        const up = inductanceMatrix(net, ['primary', 'secondary'], { bias: j === 0 ? [i1 + h, i2] : [i1, i2 + h] });
        const down = inductanceMatrix(net, ['primary', 'secondary'], { bias: j === 0 ? [i1 - h, i2] : [i1, i2 - h] });
        for (const i of [0, 1]) {
          const fd = (up.fluxLinkage[i]! - down.fluxLinkage[i]!) / (2 * h);
          expect(Math.abs(fd - m.inductance[i]![j]!)).toBeLessThan(1e-5 * Math.abs(m.inductance[i]![i]!));
        }
      }
      expect(m.inductance[0]![0]! * m.inductance[1]![1]! - m.inductance[0]![1]! ** 2).toBeGreaterThan(0); // positive definite
    }
  });

  it("ends with 'no-operating-point' when no operating point can be computed (a bias of 1e200 A overflows)", () => {
    const { net, primary } = threeTubes(1e9);
    const ring = createNetwork('ring');
    const top = ring.magneticNode('top');
    const bottom = ring.magneticNode('bottom');
    const leg = ring.fluxTube('leg', { from: top, to: bottom, length: 0.3, area: 1e-3, material: demoMaterials.grainOrientedSteel });
    ring.fluxTube('return', { from: bottom, to: top, length: 0.1, area: 1e-3, material: demoMaterials.grainOrientedSteel });
    const coil = ring.winding('coil', { tube: leg, turns: 100, plus: ring.node('x'), minus: ring.ground });
    expect(() => inductanceMatrix(ring, [coil], { bias: [1e200] })).toThrow(expect.objectContaining({ code: 'no-operating-point' }));
    expect(inductanceMatrix(net, [primary], { bias: [1e6] }).inductance[0]![0]).toBeGreaterThan(0); // linear: any sane bias
  });

  it('refuses a tube of a material with memory: it has no single B-H curve to linearise', () => {
    const net = createNetwork('hysteretic ring');
    const a = net.magneticNode('a');
    const b = net.magneticNode('b');
    const law = { kind: 'hysteretic' as const, length: 0.15, area: 1e-3, material: demoHystereticMaterials.steel };
    const leg = net.tube({ name: 'leg', from: a.index, to: b.index, eddyResistance: 0.01, law });
    net.tube({ name: 'yoke', from: b.index, to: a.index, eddyResistance: 0.01, law });
    const coil = net.winding('coil', { tube: leg, turns: 100, plus: net.node('x'), minus: net.ground });
    expect(() => inductanceMatrix(net, [coil])).toThrow(expect.objectContaining({ code: 'tube-with-memory', elements: ['leg'] }));
  });

  it('refuses unknown windings, handles of another network and a bias of the wrong length', () => {
    const { net, primary } = threeTubes(1e9);
    const other = threeTubes(1e9);
    expect(() => inductanceMatrix(net, ['tertiary'])).toThrow(/no winding "tertiary"; its windings are "primary", "secondary"/);
    expect(() => inductanceMatrix(net, [other.primary])).toThrow(/another network/);
    expect(() => inductanceMatrix(net, [primary], { bias: [1, 2] })).toThrow(InputError);
    expect(() => inductanceMatrix(net, [primary, primary])).toThrow(/listed twice/);
    expect(() => inductanceMatrix(net, [])).toThrow(/non-empty/);
    try {
      inductanceMatrix(net, ['tertiary']);
    } catch (e) {
      expect((e as InputError).code).toBe('unknown-winding');
    }
  });

  it('refuses a winding on a tube outside every closed path', () => {
    const net = createNetwork('bridge');
    const a = net.magneticNode('a');
    const b = net.magneticNode('b');
    const c = net.magneticNode('c');
    net.fluxTube('ring 1', { from: a, to: b, length: 0.1, area, material: { kind: 'linear', relativePermeability: 1000 } });
    net.fluxTube('ring 2', { from: b, to: a, length: 0.1, area, material: { kind: 'linear', relativePermeability: 1000 } });
    const bridge = net.fluxTube('bridge', { from: b, to: c, length: 0.1, area, material: { kind: 'linear', relativePermeability: 1000 } });
    net.fluxTube('stub', { from: c, to: a, length: 0.1, area, material: { kind: 'linear', relativePermeability: 1000 } });
    const coil = net.winding('coil', { tube: bridge, turns: 10, plus: net.node('x'), minus: net.ground });
    expect(() => inductanceMatrix(net, [coil])).not.toThrow(); // c-a closes a loop through the bridge
    const net2 = createNetwork('open');
    const p = net2.magneticNode('p');
    const q = net2.magneticNode('q');
    const r = net2.magneticNode('r');
    net2.fluxTube('loop 1', { from: p, to: q, length: 0.1, area, material: { kind: 'linear', relativePermeability: 1000 } });
    net2.fluxTube('loop 2', { from: q, to: p, length: 0.1, area, material: { kind: 'linear', relativePermeability: 1000 } });
    const dangling = net2.fluxTube('dangling', { from: q, to: r, length: 0.1, area, material: { kind: 'linear', relativePermeability: 1000 } });
    const w = net2.winding('w', { tube: dangling, turns: 10, plus: net2.node('x'), minus: net2.ground });
    expect(() => inductanceMatrix(net2, [w])).toThrow(/winding-on-open-path|not part of any closed magnetic path/);
  });
});
