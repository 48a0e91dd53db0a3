/**
 * Inductance matrix of a two-winding ferrite transformer and the ripple
 * inductance of a gapped choke against its DC current, straight from the
 * magnetic network (no time-domain open- and short-circuit runs needed).
 *
 *     npx tsx examples/inductance-matrix.ts
 *
 * Invented designs on the demo ferrite; they describe no real product.
 * Caution: inductances are estimates from a model and its inputs (material
 * curve, geometry, gap fringing); measure the part before relying on them.
 */
import { addCoreLayout, createNetwork, demoMaterials, eCoreLayout, incrementalInductance, inductanceMatrix, mm } from '../src/index.js';

// A transformer: E core, primary (inner) and secondary (outer) concentric on the centre leg, a 0.2 mm gap.
const layout = eCoreLayout({
  centreLegWidth: mm(10), outerLegWidth: mm(5), yokeHeight: mm(6), depth: mm(10), windowWidth: mm(7.5), windowHeight: mm(20),
  gaps: { centre: { length: mm(0.2) } },
  windings: { centre: { innerBuild: mm(2), outerBuild: mm(2.5), spacing: mm(0.5), clearance: mm(0.5) } },
});
const net = createNetwork('flyback-style transformer');
const core = addCoreLayout(net, layout, { material: demoMaterials.ferrite });
const primary = net.winding('primary', { tube: core.windingTube('centre'), turns: 40, resistance: 0.1, plus: net.node('drain'), minus: net.ground });
const secondary = net.winding('secondary', { tube: core.outerWindingTube('centre'), turns: 10, resistance: 0.02, plus: net.node('out'), minus: net.ground });

const m = inductanceMatrix(net, [primary, secondary]);
const uH = (h: number) => `${(h * 1e6).toFixed(2)} uH`;
console.log('Transformer, unbiased:');
console.log(`  L(primary) ${uH(m.inductance[0]![0]!)}, L(secondary) ${uH(m.inductance[1]![1]!)}, M ${uH(m.inductance[0]![1]!)}`);
console.log(`  coupling factor k = ${m.coupling[0]![1]!.toFixed(5)}`);
console.log(`  short-circuit (leakage) inductance at the primary, secondary shorted: ${uH(m.shortCircuit[0]![1]!)}`);
console.log(`  short-circuit inductance at the secondary, primary shorted: ${uH(m.shortCircuit[1]![0]!)}`);

// The same transformer with 1.5 A DC in the primary (a flyback at the end of its on-time): the core is partly saturated.
const biased = inductanceMatrix(net, [primary, secondary], { bias: [1.5, 0] });
const centre = biased.tubes.find((t) => t.name === 'leg-centre')!;
console.log(`\nWith 1.5 A DC in the primary: centre leg at ${centre.fluxDensity.toFixed(3)} T, L(primary) ${uH(biased.inductance[0]![0]!)}, k = ${biased.coupling[0]![1]!.toFixed(5)}`);

// A choke: the same core with one winding and a 0.5 mm gap; its ripple inductance against DC current.
const chokeLayout = eCoreLayout({
  centreLegWidth: mm(10), outerLegWidth: mm(5), yokeHeight: mm(6), depth: mm(10), windowWidth: mm(7.5), windowHeight: mm(20),
  gaps: { centre: { length: mm(0.5) } },
});
const choke = createNetwork('output choke');
const chokeCore = addCoreLayout(choke, chokeLayout, { material: demoMaterials.ferrite });
choke.winding('choke', { tube: chokeCore.windingTube('centre'), turns: 30, resistance: 0.05, plus: choke.node('a'), minus: choke.ground });
const currents = [0, 2, 4, 6, 8, 10, 12];
const curve = incrementalInductance(choke, 'choke', currents);
console.log('\nChoke (30 turns, 0.5 mm gap): inductance against DC current');
console.log('   I_dc    incremental   secant (lambda / I)');
currents.forEach((i, k) => console.log(`${`${i} A`.padStart(7)}  ${uH(curve.incremental[k]!).padStart(12)}  ${uH(curve.secant[k]!).padStart(12)}`));
console.log('\nCaution: model estimates from invented data; measure the part before relying on them.');
