/**
 * Core loss of an invented ferrite transformer driven by a 100 kHz bridge
 * with dead time: winding voltage -> flux -> flux density per flux tube ->
 * iGSE loss, compared with the sinusoidal Steinmetz estimate. Also prints
 * the volt-seconds per half-cycle and the saturation margin.
 * Run with `npx tsx examples/core-loss.ts`. All values are invented.
 */
import {
  bipolarSquare,
  compileWaveform,
  coreLoss,
  cumulativeIntegral,
  fluxDensityMargins,
  igseCoefficient,
  seriesMean,
  voltSecondsPerHalfCycle,
} from '../src/index.js';

const period = 10e-6; // 100 kHz
const drive = bipolarSquare({ amplitude: 48, period, deadTime: 0.5e-6 });
const v = compileWaveform(drive, 'Vbridge');
const turns = 8;
const legArea = 80e-6; // m^2
const yokeArea = 100e-6; // m^2
const coefficients = { k: 1.5, alpha: 1.4, beta: 2.6 }; // invented, SI: W/m^3 with f in Hz, B in T

// Sample one period as a solver would: every switching instant, both sides of each jump.
const t: number[] = [0];
const u: number[] = [v.value(0)];
for (const e of v.breakpoints(1e-12, period)) {
  t.push(e, e);
  u.push(v.value(e - 1e-12), v.value(e));
}

// Flux linkage is the integral of the winding voltage (resistance neglected); in steady state
// the flux is centred, so remove its mean over the period.
const linkage = cumulativeIntegral(t, u);
const phi = linkage.map((l) => l / turns);
const phiMean = seriesMean(t, phi);
const bLeg = phi.map((p) => (p - phiMean) / legArea);
const bYoke = phi.map((p) => (p - phiMean) / yokeArea);

const vs = voltSecondsPerHalfCycle(t, u, { period });
console.log(`volt-seconds: +${(vs.positive[0] ?? 0) * 1e6} uVs / ${(vs.negative[0] ?? 0) * 1e6} uVs per half-cycle`);

const tubes = [
  { name: 'legs', b: bLeg, volume: 2 * legArea * 0.02 },
  { name: 'yokes', b: bYoke, volume: 2 * yokeArea * 0.015 },
];
const igse = coreLoss(t, tubes, { period, coefficients });
const sine = coreLoss(t, tubes, { period, coefficients, method: 'steinmetz' });
console.log(`k_i / k = ${igseCoefficient({ ...coefficients, k: 1 }).toFixed(10)}`);
for (const [k, tube] of igse.tubes.entries()) {
  console.log(
    `${tube.name}: dB_pp ${tube.peakToPeak.toFixed(4)} T, iGSE ${(tube.lossDensity / 1e3).toFixed(2)} kW/m^3 -> ${tube.loss.toFixed(4)} W` +
      ` (sinusoidal Steinmetz at the same dB_pp: ${(sine.tubes[k]?.loss ?? 0).toFixed(4)} W)`,
  );
}
console.log(`total core loss: iGSE ${igse.total.toFixed(4)} W, sinusoidal estimate ${sine.total.toFixed(4)} W`);

for (const m of fluxDensityMargins(t, [
  { name: 'legs', b: bLeg, saturation: 0.38 },
  { name: 'yokes', b: bYoke, saturation: 0.38 },
])) {
  console.log(`${m.name}: peak |B| ${m.peak.toFixed(4)} T at ${(m.peakTime * 1e6).toFixed(2)} us, margin ${m.margin.toFixed(4)} T (${(100 * m.ratio).toFixed(1)} % of B_sat)`);
}
console.log('Caution: engineering estimates from a model; local codes, standards and licensed practice govern.');
