// Core geometry example: effective parameters (IEC 60205 method) of a ring
// core and of an E core, and the E core's layout as a magnetic network.
// All dimensions are invented for the example. Run: npx tsx examples/geometry.ts
import { eCoreLayout, MU0, mm, pathReluctance, toroidConstants, type CoreConstants } from '../src/index.js';

function show(title: string, k: CoreConstants | undefined): void {
  if (k === undefined) return;
  console.log(title);
  console.log(`  C1 = ${(k.c1 * 1e-3).toFixed(5)} mm^-1   C2 = ${(k.c2 * 1e-9).toExponential(5)} mm^-3`);
  console.log(`  le = ${(k.effectiveLength * 1e3).toFixed(3)} mm   Ae = ${(k.effectiveArea * 1e6).toFixed(3)} mm^2   Ve = ${(k.effectiveVolume * 1e9).toFixed(1)} mm^3`);
}

// A ring core: r1 = 10 mm, r2 = 20 mm, h = 10 mm.
show('Ring core 20/10 x 10 mm', toroidConstants({ innerRadius: mm(10), outerRadius: mm(20), height: mm(10) }));

// An E core pair with a 0.5 mm gap in the centre leg (McLyman fringing) and
// two concentric windings on the centre leg.
const layout = eCoreLayout({
  centreLegWidth: mm(10),
  outerLegWidth: mm(5),
  yokeHeight: mm(6),
  depth: mm(10),
  windowWidth: mm(7.5),
  windowHeight: mm(20),
  gaps: { centre: { length: mm(0.5) } },
  windings: { centre: { innerBuild: mm(2), outerBuild: mm(2.5), spacing: mm(0.5), clearance: mm(0.5) } },
});
show(`\nE core (${layout.meanPath} corners), core constants with the gap ignored`, layout.constants);

console.log('\nE core layout: nodes');
console.log(`  ${layout.nodes.join(', ')}`);
const mur = 2000;
console.log(`\nE core layout: paths (linear reluctance at mu_r = ${mur})`);
for (const p of layout.paths) {
  const geometry =
    p.kind === 'leakage' || p.kind === 'tank'
      ? p.kind
      : `l = ${(p.length * 1e3).toFixed(3).padStart(7)} mm  A = ${(p.area * 1e6).toFixed(2).padStart(7)} mm^2` +
        (p.kind === 'gap' ? `  (fringing ${p.fringing}, F = ${p.fringingFactor.toFixed(4)})` : '');
  console.log(`  ${p.name.padEnd(18)} ${p.from.padEnd(13)} -> ${p.to.padEnd(13)} ${geometry.padEnd(40)} R = ${pathReluctance(p, mur).toExponential(4)} A/Wb`);
}

// Inductance of a 40-turn inner winding (on 'leg-centre'), outer winding
// open, by series/parallel reduction: the inner leg and gap in series with the
// leakage path in parallel with the rest of the core (foot, head, and the two
// outer loops in parallel).
const r = (name: string): number => {
  const p = layout.paths.find((x) => x.name === name);
  if (p === undefined) throw new Error(`no path ${name}`);
  return pathReluctance(p, mur);
};
const parallel = (a: number, b: number): number => (a * b) / (a + b);
const rest = r('leg-centre-foot') + r('leg-centre-head') + (r('leg-left') + r('yoke-top-left') + r('yoke-bottom-left')) / 2;
const turns = 40;
const total = r('leg-centre') + r('gap-centre') + parallel(r('leakage-centre'), rest);
console.log(`\nInner winding, ${turns} turns, outer winding open: L = ${((turns ** 2 / total) * 1e6).toFixed(2)} uH`);
console.log(`Leakage inductance between the windings, referred to ${turns} turns: ${((turns ** 2 / r('leakage-centre')) * 1e6).toFixed(3)} uH`);
console.log(`(mu0 = ${MU0} H/m, CODATA 2018)`);
