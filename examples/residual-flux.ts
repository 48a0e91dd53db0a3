/**
 * Residual flux and re-energisation inrush of a single-phase core with
 * hysteretic steel (the demo hysteretic steel): energise at a voltage peak,
 * open the breaker at a chosen instant (a discharge resistor stays across
 * the winding), read the residual flux density each tube of the core keeps,
 * then close again at several angles and compare the inrush peaks with those
 * of a first energisation of the demagnetised core.
 *
 *     npx tsx examples/residual-flux.ts
 *
 * Everything is invented (a core of two legs and two yokes, 20 cm^2, 400
 * turns, 267 V rms at 50 Hz for 1.5 T); it describes no real product.
 *
 * CAUTION: residual flux and inrush peaks are engineering estimates from a
 * model and its inputs (material parameters, switching instants, source
 * impedance). They do not prove a protection setting or a design safe.
 * Verify them against measurements; local codes, standards and licensed
 * engineering practice govern.
 */
import {
  createNetwork,
  demoHystereticMaterials,
  residualFluxDensityAtEnd,
  simulate,
  sine,
  type FluxTube,
  type Winding,
} from '../src/index.js';

const steel = demoHystereticMaterials.steel; // invented demo data
const FREQUENCY = 50;
const AREA = 20e-4; // m^2
const TURNS = 400;
const PEAK_B = 1.5; // T in steady state
const AMPLITUDE = TURNS * AREA * 2 * Math.PI * FREQUENCY * PEAK_B; // V peak
const T_CLOSE = 0.1; // s, start of the cycle of re-energisation

interface Core {
  readonly net: ReturnType<typeof createNetwork>;
  readonly tubes: readonly FluxTube[];
  readonly coil: Winding;
}

/** The core and its circuit: supply (phase in rad) -> breaker (schedule) -> winding, discharge resistor across it. */
function build(phase: number, schedule: readonly { time: number; closed: boolean }[]): Core {
  const net = createNetwork('single-phase core, hysteretic steel');
  net.magneticNode('bottom left');
  net.magneticNode('top left');
  net.magneticNode('top right');
  net.magneticNode('bottom right');
  const tube = (name: string, from: number, to: number, length: number): FluxTube =>
    net.tube({ name, from, to, eddyResistance: 0.002, law: { kind: 'hysteretic', length, area: AREA, material: steel } });
  const tubes = [tube('wound leg', 0, 1, 0.2), tube('top yoke', 1, 2, 0.15), tube('return leg', 2, 3, 0.2), tube('bottom yoke', 3, 0, 0.15)];
  const line = net.node('line');
  const terminal = net.node('terminal');
  net.voltageSource('supply', line, net.ground, sine({ amplitude: AMPLITUDE, frequency: FREQUENCY, phase }));
  net.switch('breaker', line, terminal, { onResistance: 1e-3, offResistance: 1e9, closed: schedule.length === 0 || !schedule[0]!.closed, schedule });
  net.resistor('discharge', terminal, net.ground, 1000);
  const coil = net.winding('coil', { tube: tubes[0]!, turns: TURNS, resistance: 2, plus: terminal, minus: net.ground });
  return { net, tubes, coil };
}

function peakCurrent(core: Core, stopTime: number, from: number): number {
  const r = simulate(core.net, { stopTime, rtol: 1e-7 });
  if (r.status !== 'success') throw new Error(`run failed: ${r.message}`);
  const i = r.current(core.coil);
  let peak = 0;
  r.time.forEach((t, k) => {
    if (t >= from) peak = Math.max(peak, Math.abs(i[k]!));
  });
  return peak;
}

// Switch-off at three instants of the third cycle (voltage cos: flux peaks at 45 ms).
console.log('switch-off    residual flux density per tube (T)');
console.log(`instant       ${['wound leg', 'top yoke', 'return leg', 'bottom yoke'].map((n) => n.padStart(12)).join('')}`);
const losses: string[] = [];
for (const tOpen of [0.045, 0.0475, 0.05]) {
  const core = build(Math.PI / 2, [{ time: tOpen, closed: false }]);
  const r = simulate(core.net, { stopTime: 0.09, rtol: 1e-7, sampling: { times: [0.09] } });
  if (r.status !== 'success') throw new Error(`run failed: ${r.message}`);
  const residuals = core.tubes.map((t) => residualFluxDensityAtEnd(r, t));
  console.log(`${(tOpen * 1e3).toFixed(1).padStart(6)} ms  ${residuals.map((b) => b.toFixed(4).padStart(12)).join('')}`);
  // Loop loss per tube from the energy audit, beside the eddy loss (0 to 90 ms).
  const byTube = r.energy().byTube.map((t) => `${(t.hysteresis * 1e3).toFixed(1)}/${(t.eddy * 1e3).toFixed(2)}`);
  losses.push(`${(tOpen * 1e3).toFixed(1).padStart(6)} ms  ${byTube.map((x) => x.padStart(12)).join('')}`);
}
console.log('hysteresis/eddy loss per tube to 90 ms (mJ):');
for (const line of losses) console.log(line);

// Energised at a voltage peak (cos) and opened at the flux peak (45 ms, residual about +Br); closed again
// at an instant in the sixth cycle where the voltage angle (after a rising zero) is `degrees`.
const OMEGA = 2 * Math.PI * FREQUENCY;
console.log('re-energised in the sixth cycle after switch-off at 45 ms (flux peak):');
console.log('closing angle  inrush peak, demagnetised core  inrush peak, with residual flux');
for (const degrees of [0, 45, 90, 180, 270]) {
  const angle = (degrees * Math.PI) / 180;
  const first = peakCurrent(build(angle, []), 0.04, 0);
  const tClose = T_CLOSE + (((angle - Math.PI / 2 + 2 * Math.PI) % (2 * Math.PI)) / OMEGA);
  const again = peakCurrent(build(Math.PI / 2, [{ time: 0.045, closed: false }, { time: tClose, closed: true }]), tClose + 0.04, tClose);
  console.log(`${String(degrees).padStart(8)} deg ${first.toFixed(1).padStart(24)} A ${again.toFixed(1).padStart(28)} A`);
}
console.log('Caution: engineering estimates from an invented model; verify against measurements and follow local codes and licensed practice.');
