/**
 * A gapped inductor on an E core of the demo ferrite, with the gap in the
 * centre leg (eCoreLayout + addCoreLayout):
 *
 *  A. driven by a bipolar square voltage: the inductance from the current
 *     ripple, L = V * t_on / delta_i, against McLyman's gapped-inductor
 *     formula as a sanity check;
 *  B. fed by a current source, DC bias plus a small sine ripple (the
 *     winding's current is forced: an index-2 structure, handled by the
 *     solver): the small-signal inductance falls as the bias drives the
 *     ferrite towards saturation.
 *
 *     npx tsx examples/gapped-inductor.ts
 *
 * All dimensions and the material are invented. Caution: saturation margins
 * are engineering estimates from a model; verify them against measurements
 * of the actual part.
 */
import {
  MU0,
  addCoreLayout,
  bipolarSquare,
  createNetwork,
  demoMaterials,
  eCoreLayout,
  fluxDensityMargin,
  mm,
  seriesPeak,
  simulate,
  sine,
} from '../src/index.js';

const ferrite = demoMaterials.ferrite;
const TURNS = 40;
const RESISTANCE = 0.05; // ohm

// An E core with a 0.6 mm gap in the centre leg; McLyman's fringing factor is the layout's default.
const layout = eCoreLayout({
  centreLegWidth: mm(12), outerLegWidth: mm(6), yokeHeight: mm(6), depth: mm(12),
  windowWidth: mm(9), windowHeight: mm(22),
  gaps: { centre: { length: mm(0.6) } },
});

/** A fresh network with the core and a winding on the centre leg, between node `a` and ground. */
function inductor() {
  const net = createNetwork('gapped inductor');
  const core = addCoreLayout(net, layout, { material: ferrite });
  const a = net.node('a');
  const coil = net.winding('coil', { tube: core.windingTube('centre'), turns: TURNS, resistance: RESISTANCE, plus: a, minus: net.ground });
  return { net, core, a, coil };
}

// McLyman's formula, L = mu0 N^2 A_c F / (l_g + l_core / mu_r), with the core's IEC 60205 effective
// length and area (gap ignored) and the initial permeability of the ferrite (W. T. McLyman,
// Transformer and Inductor Design Handbook, inductor design chapter; see docs/geometry.md, section 3).
const gap = layout.paths.find((p) => p.kind === 'gap');
if (gap?.kind !== 'gap' || layout.constants === undefined) throw new Error('expected a gapped E core layout');
const { effectiveLength, effectiveArea } = layout.constants;
const mur = ferrite.initialRelativePermeability;
const lMcLyman = (MU0 * TURNS ** 2 * effectiveArea * gap.fringingFactor) / (gap.length + effectiveLength / mur);
console.log('Gapped E core (invented dimensions, demo ferrite)');
console.log(`  effective length ${(effectiveLength * 1e3).toFixed(2)} mm, effective area ${(effectiveArea * 1e6).toFixed(1)} mm^2`);
console.log(`  gap ${(gap.length * 1e3).toFixed(2)} mm, McLyman fringing factor F = ${gap.fringingFactor.toFixed(4)}`);
// The network puts F on the gap only (the gap's effective area is F A_c), so its linear inductance is
// mu0 N^2 A_c F / (l_g + F l_core / mu_r) (docs/geometry.md, section 3).
const lNetwork = (MU0 * TURNS ** 2 * effectiveArea * gap.fringingFactor) / (gap.length + (gap.fringingFactor * effectiveLength) / mur);
console.log(`  McLyman: L = mu0 N^2 A_c F / (l_g + l_core/mu_r) = ${(lMcLyman * 1e6).toFixed(1)} uH for N = ${TURNS}, mu_r = ${mur}`);
console.log(`  F on the gap only: L = mu0 N^2 A_c F / (l_g + F l_core/mu_r) = ${(lNetwork * 1e6).toFixed(1)} uH`);

// A. Bipolar square voltage, 12 V at 100 kHz: the current is a triangle of peak-to-peak V t_on / L.
{
  const amplitude = 12;
  const period = 10e-6;
  const { net, a, coil } = inductor();
  net.voltageSource('drive', a, net.ground, bipolarSquare({ amplitude, period }));
  const result = simulate(net, { stopTime: 6 * period });
  if (result.status !== 'success') throw new Error(result.message);
  // The solver lands on every switching instant, so the sampled current has its corners exactly.
  const lastCycle = { from: 5 * period, to: 6 * period };
  const peak = seriesPeak(result.time, result.current(coil), lastCycle);
  const ripple = peak.max - peak.min;
  // Each half period the winding sees V minus a small resistive drop for t_on = T/2.
  const lRipple = (amplitude * (period / 2)) / ripple;
  console.log(`\nA. ${amplitude} V bipolar square at ${1e-3 / period} kHz`);
  console.log(`  current ripple ${(ripple * 1e3).toFixed(1)} mA peak-to-peak -> L = V t_on / delta_i = ${(lRipple * 1e6).toFixed(1)} uH`);
  console.log(`  simulated / McLyman = ${(lRipple / lMcLyman).toFixed(4)}; simulated / (F on the gap only) = ${(lRipple / lNetwork).toFixed(4)}`);
  console.log('  (McLyman applies F to the whole path; the ferrite is also slightly nonlinear at this flux density)');
}

// B. DC bias from a current source plus a 0.2 A sine ripple at 20 kHz.
{
  const frequency = 20e3;
  const ripple = 0.2;
  const saturation = ferrite.saturationFluxDensity ?? 0.47;
  console.log(`\nB. DC bias plus a ${ripple} A ripple at ${frequency / 1e3} kHz (current source)`);
  console.log('  bias A   L small-signal uH   L / McLyman   peak |B| T   margin to B_sat T');
  for (const bias of [0.5, 2, 3.5, 5]) {
    const { net, core, a, coil } = inductor();
    net.currentSource('bias', a, net.ground, sine({ amplitude: ripple, frequency, offset: bias }));
    const period = 1 / frequency;
    // maxStep: the forced current makes the solver take long steps; keep the samples between them accurate.
    const result = simulate(net, { stopTime: 2 * period, maxStep: period / 100, sampling: { interval: period / 400 } });
    if (result.status !== 'success') throw new Error(result.message);
    // Small-signal inductance from the flux-linkage swing over the current swing of one period.
    const window = { from: period, to: 2 * period };
    const linkage = seriesPeak(result.time, result.fluxLinkage(coil), window);
    const current = seriesPeak(result.time, result.current(coil), window);
    const lSmall = (linkage.max - linkage.min) / (current.max - current.min);
    const margin = fluxDensityMargin(result.time, result.fluxDensity(core.windingTube('centre')), { saturation });
    console.log(
      `  ${bias.toFixed(1).padStart(6)}   ${(lSmall * 1e6).toFixed(1).padStart(17)}   ${(lSmall / lMcLyman).toFixed(3).padStart(11)}` +
        `   ${margin.peak.toFixed(3).padStart(10)}   ${margin.margin.toFixed(3).padStart(17)}`,
    );
  }
  console.log('  The inductance falls as the bias moves the ferrite towards its knee (demo ferrite B_sat 0.47 T).');
}
console.log('\nCaution: engineering estimates from a model; verify saturation margins against measurements of the part.');
