/**
 * Why flux as the state keeps the DC flux: one winding on a closed two-leg
 * core with remanence, switched on at a voltage zero, computed two ways.
 *
 *  1. fluxstate: the flux is the state. Faraday's law N dphi/dt = v - R i is
 *     integrated; the remanent flux is the initial condition phi(0) = B_r A.
 *  2. The same circuit with the winding current as the state and the flux a
 *     function of it through the magnetic circuit (Hopkinson's law with the
 *     material's B(H): phi = A B(N i / l)); the voltage equation is then
 *     v = R i + N (dphi/di) di/dt, integrated with solveDae. Before the
 *     switch closes the current is zero, so the flux starts at phi(0) = 0:
 *     the remanence has no place in this state.
 *
 * Both are exact statements of the same physics; what differs is what the
 * state can hold. The script prints the peaks and writes the figure used in
 * docs/guide/formulation.md:
 *
 *     npx tsx examples/flux-state.ts [output folder, default out/flux-state]
 *
 * Invented values. Caution: inrush figures are engineering estimates; local
 * codes, standards and licensed practice govern.
 */
import { writeFileSync, mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { MU0, compileMaterial, createNetwork, simulate, sine, solveDae, type FrohlichKennellySpec } from '../src/index.js';
import { renderSvgPlot, type PlotGroup } from '../src/report/index.js';

const outDir = resolve(process.argv[2] ?? 'out/flux-state');

// Core: a wound leg and the rest of the core, same section, one material (invented values).
const AREA = 2e-3; // m^2
const LEG = 0.2; // m
const REST = 0.3; // m
const LENGTH = LEG + REST;
const TURNS = 560;
const RESISTANCE = 0.5; // ohm
const U_PEAK = 230 * Math.SQRT2; // V
const F = 50; // Hz
const W = 2 * Math.PI * F;
const B_REMANENT = 0.8; // T
const CYCLES = 6;
const material: FrohlichKennellySpec = {
  kind: 'frohlich-kennelly', name: 'invented steel-like law', initialRelativePermeability: 20000,
  saturationPolarisation: 1.8, saturationFluxDensity: 1.8,
};

// Frohlich-Kennelly law in its B(H) form (docs/materials.md): B = mu0 H + J_s H / (H_a + |H|).
const js = material.saturationPolarisation;
const ha = js / (MU0 * (material.initialRelativePermeability - 1));
const fluxDensityOf = (h: number): number => MU0 * h + (js * h) / (ha + Math.abs(h));
const slopeOf = (h: number): number => MU0 + (js * ha) / (ha + Math.abs(h)) ** 2;

// 1. fluxstate, flux as the state.
const net = createNetwork('two-leg core');
const bottom = net.magneticNode('bottom');
const top = net.magneticNode('top');
const leg = net.fluxTube('wound leg', { from: bottom, to: top, length: LEG, area: AREA, material, initialFluxDensity: B_REMANENT });
net.fluxTube('rest of core', { from: top, to: bottom, length: REST, area: AREA, material, initialFluxDensity: B_REMANENT });
const a = net.node('a');
net.voltageSource('supply', a, net.ground, sine({ amplitude: U_PEAK, frequency: F })); // switched at a voltage zero
const coil = net.winding('coil', { tube: leg, turns: TURNS, resistance: RESISTANCE, plus: a, minus: net.ground });
const sampling = { interval: 1 / (F * 400) };
const result = simulate(net, { stopTime: CYCLES / F, rtol: 1e-8, sampling });
if (result.status !== 'success') throw new Error(result.message);
const bFluxState = result.fluxDensity(leg);
const iFluxState = result.current(coil);

// 2. Current as the state: di/dt = (v - R i) / (N dphi/di), phi(i) = A B(N i / l).
function currentStateRun(i0: number) {
  const sol = solveDae(
    {
      size: 1, y0: [i0], t0: 0, tEnd: CYCLES / F,
      rhs: (t, y, out) => {
        const i = y[0]!;
        const dPhiDi = (AREA * slopeOf((TURNS * i) / LENGTH) * TURNS) / LENGTH;
        out[0] = (U_PEAK * Math.sin(W * t) - RESISTANCE * i) / (TURNS * dPhiDi);
      },
    },
    { rtol: 1e-8, atol: 1e-9, outputTimes: Array.from(result.time) },
  );
  if (sol.status !== 'success') throw new Error(sol.message);
  const i = Float64Array.from(sol.output.y, (y) => y[0]!);
  return { i, b: i.map((x) => fluxDensityOf((TURNS * x) / LENGTH)) };
}
// At the switching instant the breaker has carried no current: i(0) = 0, hence phi(0) = 0.
const fromRest = currentStateRun(0);
// The current that the single-valued law assigns to the remanent flux, H(B_r) l / N: with it the current
// state reproduces the flux state, so the two formulations agree when their initial states agree.
const law = compileMaterial(material);
const hRemanent = law.fieldStrength(B_REMANENT);
const matched = currentStateRun((hRemanent * LENGTH) / TURNS);

const peakAbs = (x: ArrayLike<number>): number => Array.from(x).reduce((m, v) => Math.max(m, Math.abs(v)), 0);
const maxDiff = (x: ArrayLike<number>, y: ArrayLike<number>): number => Array.from(x).reduce((m, v, k) => Math.max(m, Math.abs(v - y[k]!)), 0);
const bN = U_PEAK / (TURNS * W * AREA);
console.log(`Two-leg core, ${TURNS} turns, ${U_PEAK.toFixed(0)} V peak at ${F} Hz switched at a voltage zero; steady peak B_N = ${bN.toFixed(3)} T`);
console.log(`remanence B_r = ${B_REMANENT} T; saturation polarisation ${js} T\n`);
console.log('                                          peak |B| T   peak |i| A');
console.log(`flux state, phi(0) = B_r A                ${peakAbs(bFluxState).toFixed(3).padStart(10)}   ${peakAbs(iFluxState).toFixed(1).padStart(10)}`);
console.log(`current state from i(0) = 0               ${peakAbs(fromRest.b).toFixed(3).padStart(10)}   ${peakAbs(fromRest.i).toFixed(1).padStart(10)}`);
console.log(`current state from i(0) = H(B_r) l / N    ${peakAbs(matched.b).toFixed(3).padStart(10)}   ${peakAbs(matched.i).toFixed(1).padStart(10)}`);
console.log(`\nflux state vs current state with matched start: largest |delta B| ${maxDiff(bFluxState, matched.b).toExponential(1)} T`);
console.log(`the single-valued law puts H(B_r) l / N = ${((hRemanent * LENGTH) / TURNS * 1e3).toFixed(2)} mA in the winding at t = 0 for B_r = ${B_REMANENT} T`);
console.log(`(a real core holds its remanence at zero current by hysteresis, which neither model here has)`);

// A DC flux density costs only a tiny DC magnetising current below the knee: conditioning in numbers.
for (const bDc of [0.5, 1.0]) {
  const h = law.fieldStrength(bDc);
  console.log(`DC flux density ${bDc} T <-> DC magnetising current ${((h * LENGTH) / TURNS * 1e3).toFixed(2)} mA in this winding`);
}

// The figure: flux density in the wound leg, both ways, and the zero-mean steady-state flux.
const steady = result.time.map((t) => -bN * Math.cos(W * t));
const group: PlotGroup = {
  title: 'Switched on at a voltage zero with remanence 0.8 T',
  series: [
    { label: 'flux state (integrated voltage, phi(0) = B_r A)', quantity: 'Flux density', unit: 'T', t: result.time, values: bFluxState },
    { label: 'current state from i = 0 (remanence lost)', quantity: 'Flux density', unit: 'T', t: result.time, values: fromRest.b },
    { label: 'steady state (no DC flux)', quantity: 'Flux density', unit: 'T', t: result.time, values: steady },
  ],
  references: [{ label: 'J_s', value: js, unit: 'T' }],
};
const currents: PlotGroup = {
  title: 'Winding current',
  series: [
    { label: 'flux state', quantity: 'Current', unit: 'A', t: result.time, values: iFluxState },
    { label: 'current state from i = 0', quantity: 'Current', unit: 'A', t: result.time, values: fromRest.i },
  ],
};
mkdirSync(outDir, { recursive: true });
const fluxFile = join(outDir, 'dc-flux-comparison.svg');
const currentFile = join(outDir, 'dc-flux-current.svg');
writeFileSync(fluxFile, renderSvgPlot(group, { width: 760, height: 400, idPrefix: 'dcflux' }));
writeFileSync(currentFile, renderSvgPlot(currents, { width: 760, height: 320, idPrefix: 'dccurrent' }));
console.log(`\nWritten:\n  ${fluxFile}\n  ${currentFile}`);
console.log('\nCaution: inrush figures are engineering estimates from a model; local codes, standards and licensed practice govern.');
