// Embedding example: a push-pull converter transformer (our own invented design) whose bridge
// has a timing fault: the positive on-time is 100 ns longer than the negative one. Open loop,
// the DC voltage this makes walks the flux into saturation. Closed loop, a controller sampled
// once per switching period measures the mean flux density over the last period and trims the
// on-time mismatch (proportional-integral action) to hold the DC flux offset near zero.
// Run: npx tsx examples/flux-balance-controller.ts
// Results are an engineering estimate: verify against measurements before relying on them.
import { bipolarSquare, createNetwork, createStepper, demoMaterials, type NetworkStepper } from '../src/index.js';

const T = 2e-5; // 50 kHz
const AMPLITUDE = 24; // V
const DEAD_TIME = 0.3e-6; // s
const FAULT = 100e-9; // s: positive on-time longer than the negative one
const PERIODS = 600;

function converter() {
  const net = createNetwork('push-pull converter');
  const top = net.magneticNode('top');
  const bottom = net.magneticNode('bottom');
  const material = demoMaterials.ferrite;
  const leg = net.fluxTube('centre leg', { from: bottom, to: top, length: 0.025, area: 1.2e-4, material });
  net.fluxTube('return path', { from: top, to: bottom, length: 0.045, area: 1.2e-4, material });
  const drive = net.node('drive');
  const out = net.node('out');
  const bridge = net.voltageSource('bridge', drive, net.ground,
    bipolarSquare({ amplitude: AMPLITUDE, period: T, deadTime: DEAD_TIME, mismatch: FAULT }));
  net.winding('primary', { tube: leg, turns: 6, resistance: 0.02, plus: drive, minus: net.ground });
  net.winding('secondary', { tube: leg, turns: 3, resistance: 0.01, plus: out, minus: net.ground });
  net.resistor('load', out, net.ground, 1.5);
  return { net, leg, bridge };
}

/**
 * Runs the converter; with `control` a per-period PI controller trims the mismatch.
 * The plant integrates: one period with a mismatch d changes the mean flux density by about
 * A d / (N Ae) = 24 V * d / (6 * 1.2e-4 m^2), i.e. 3.3 mT per 100 ns, hence the gains below.
 */
export const FAULT_NS = FAULT * 1e9;

export function runConverter(control: boolean, periods = PERIODS): { meanB: number[]; peakB: number; correction: number } {
  const { net, leg, bridge } = converter();
  const stepper = createStepper(net, { horizon: periods * T, rtol: 1e-6, record: false });
  const meanB: number[] = [];
  let sum = 0;
  let count = 0;
  let peakB = 0;
  let correction = 0; // s, added to the faulty mismatch
  let integral = 0; // sum of the per-period means, T
  const kp = 1.5e-5; // s per T: removes about half of an offset per period
  const ki = 1.5e-6; // s per T per period: removes the remaining steady error
  // Sample B 40 times per period (a digital controller's ADC), average over each period.
  stepper.every(T / 40, (s: NetworkStepper) => {
    const b = s.fluxDensity(leg);
    sum += b;
    count++;
    peakB = Math.max(peakB, Math.abs(b));
  });
  stepper.every(T, (s: NetworkStepper) => {
    const mean = sum / count;
    meanB.push(mean);
    sum = 0;
    count = 0;
    if (control) {
      // A positive offset shortens the positive on-time.
      integral += mean;
      const limit = 0.5e-6;
      correction = Math.max(-limit, Math.min(limit, -(kp * mean + ki * integral)));
      s.setWaveform(bridge, bipolarSquare({ amplitude: AMPLITUDE, period: T, deadTime: DEAD_TIME, mismatch: FAULT + correction }));
    }
  });
  stepper.advanceTo(periods * T);
  if (stepper.status !== 'running' && stepper.status !== 'success') throw new Error(`the run stopped: ${stepper.message}`);
  return { meanB, peakB, correction };
}

const isMain = import.meta.url === `file://${process.argv[1]}`;
if (isMain) {
  const open = runConverter(false);
  const closed = runConverter(true);
  const bSat = demoMaterials.ferrite.saturationFluxDensity!;
  const row = (name: string, r: ReturnType<typeof runConverter>) =>
    `${name.padEnd(12)} mean B (period 10, 100, last): ${[r.meanB[9]!, r.meanB[99]!, r.meanB[r.meanB.length - 1]!].map((x) => x.toFixed(4).padStart(8)).join(' ')} T   peak |B| ${r.peakB.toFixed(3)} T   correction ${(r.correction * 1e9).toFixed(1)} ns`;
  console.log(`Push-pull transformer, ${AMPLITUDE} V, ${(1 / T / 1e3).toFixed(0)} kHz, on-time fault ${FAULT * 1e9} ns, ${PERIODS} periods; demo ferrite B_sat ${bSat} T`);
  console.log(row('open loop', open));
  console.log(row('closed loop', closed));
  console.log(`The controller holds the DC flux offset near zero (its correction all but cancels the fault); open loop the peak flux density ${open.peakB > bSat ? 'exceeds' : 'approaches'} B_sat.`);
  console.log('Engineering estimate: verify against measurements before relying on it.');
}
