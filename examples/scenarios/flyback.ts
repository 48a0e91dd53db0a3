// Scenario: a small flyback converter (our own invented design, demo values): 24 V in,
// 100 kHz, 40 % duty, a 2:1 gapped transformer with 100 uH magnetising and 1 uH leakage
// inductance, an ideal output diode into a capacitor and a load, and an RCD clamp that takes
// the leakage energy at each turn-off. The switch is driven by a gate pulse train; every diode
// turn-on and turn-off is an event located by the solver. Results are an engineering estimate.
import {
  constant, createNetwork, MU0, pulse, simulate,
  type SimulationResult,
} from '../../src/index.js';
import { resultReport } from '../../src/report/index.js';
import type { ScenarioOutcome, ScenarioProgress } from './scenario.js';
import { sig } from './scenario.js';

/** The flyback's design values (invented). */
export const FLYBACK = {
  vin: 24, // V
  frequency: 100e3, // Hz
  duty: 0.4,
  primaryTurns: 20,
  secondaryTurns: 10,
  magnetising: 100e-6, // H, seen from the primary
  leakage: 1e-6, // H
  load: 8, // ohm
  output: 47e-6, // F
  diodeForward: 0.5, // V
  diodeOn: 0.01, // ohm
  switchOn: 0.05, // ohm
  clampCapacitance: 100e-9, // F
  clampResistance: 1000, // ohm
  core: { length: 0.05, area: 5e-5, relativePermeability: 2000 }, // m, m^2
} as const;

export interface FlybackOptions {
  /** Diode model of every diode: ideal switch (events) or smooth exponential junction. */
  readonly junction?: 'ideal' | 'exponential';
  /** Leakage inductance and RCD clamp. Default true. */
  readonly clamp?: boolean;
  /** Output capacitor voltage at the start, V. Default 0. */
  readonly initialOutput?: number;
  readonly duty?: number;
  /** Capacitance across the switch, F. Default none. */
  readonly switchCapacitance?: number;
}

/** The flyback as a network, with handles to what a study reads. */
export function flybackConverter(options: FlybackOptions = {}) {
  const d = FLYBACK;
  const net = createNetwork('flyback converter');
  const [m1, m2] = [net.magneticNode('m1'), net.magneticNode('m2')];
  const core = net.fluxTube('core', { from: m1, to: m2, length: d.core.length, area: d.core.area, material: { kind: 'linear', relativePermeability: d.core.relativePermeability } });
  // The gap sets the magnetising inductance: L = N^2 / (R_core + R_gap).
  const coreReluctance = d.core.length / (MU0 * d.core.relativePermeability * d.core.area);
  net.reluctance('gap', { from: m2, to: m1, reluctance: d.primaryTurns ** 2 / d.magnetising - coreReluctance, area: d.core.area });
  const vin = net.node('vin');
  const drain = net.node('drain');
  const sec = net.node('sec');
  const out = net.node('out');
  const supply = net.voltageSource('supply', vin, net.ground, constant(d.vin));
  const junction = options.junction ?? 'ideal';
  const diodeOptions = junction === 'ideal'
    ? { forwardVoltage: d.diodeForward, onResistance: d.diodeOn, offConductance: 1e-9 }
    : { junction: 'exponential' as const, saturationCurrent: 1e-9, emissionCoefficient: 1.5, onResistance: d.diodeOn, offConductance: 1e-9 };
  const withClamp = options.clamp ?? true;
  let top = vin;
  let clamp;
  if (withClamp) {
    top = net.node('top');
    net.inductor('leakage', vin, top, d.leakage);
    const c = net.node('clamp');
    const clampDiode = net.diode('Dc', drain, c, diodeOptions);
    const clampCapacitor = net.capacitor('Cc', c, vin, d.clampCapacitance);
    net.resistor('Rc', c, vin, d.clampResistance);
    clamp = { clampDiode, clampCapacitor };
  }
  const primary = net.winding('primary', { tube: core, turns: d.primaryTurns, resistance: 0.02, plus: top, minus: drain });
  const gate = pulse({ high: 1, period: 1 / d.frequency, duty: options.duty ?? d.duty });
  const sw = net.switch('Q1', drain, net.ground, { gate, onResistance: d.switchOn, offConductance: 1e-7, ...(options.switchCapacitance ? { capacitance: options.switchCapacitance } : {}) });
  // Wound the other way round: it takes over the flux when the switch opens.
  const secondary = net.winding('secondary', { tube: core, turns: d.secondaryTurns, resistance: 0.01, plus: net.ground, minus: sec });
  const diode = net.diode('D1', sec, out, diodeOptions);
  const output = net.capacitor('Co', out, net.ground, d.output, { initialVoltage: options.initialOutput ?? 0 });
  const load = net.resistor('load', out, net.ground, d.load);
  return { net, core, supply, primary, sw, secondary, diode, output, load, clamp };
}

/** Ideal continuous-conduction output, n D Vin / (1 - D) - Vf (textbook flyback relation, drops other than Vf left out). */
export function idealFlybackOutput(duty: number = FLYBACK.duty): number {
  const n = FLYBACK.secondaryTurns / FLYBACK.primaryTurns;
  return (n * duty * FLYBACK.vin) / (1 - duty) - FLYBACK.diodeForward;
}

/** Mean of a series over [a, b] by the trapezoidal rule on its samples. */
function windowMean(t: Float64Array, x: Float64Array, a: number, b: number): number {
  let s = 0;
  for (let k = 1; k < t.length; k++) {
    const lo = Math.max(a, t[k - 1]!);
    const hi = Math.min(b, t[k]!);
    if (hi > lo) s += ((x[k - 1]! + x[k]!) / 2) * (hi - lo);
  }
  return s / (b - a);
}

export function runFlyback(progress: ScenarioProgress = () => {}): ScenarioOutcome {
  const periods = 300;
  const T = 1 / FLYBACK.frequency;
  const duties = [0.3, 0.4, 0.5];
  const rows: string[][] = [];
  let shown: { result: SimulationResult; model: ReturnType<typeof flybackConverter> } | undefined;
  duties.forEach((duty, k) => {
    progress(k / duties.length, `duty ${duty}`);
    const model = flybackConverter({ duty, initialOutput: idealFlybackOutput(duty) });
    const result = simulate(model.net, {
      stopTime: periods * T, rtol: 1e-6,
      onProgress: (p) => progress((k + p.fraction) / duties.length, `duty ${duty}`),
    });
    const t = result.time;
    const vout = windowMean(t, result.voltage(model.output), (periods - 10) * T, periods * T);
    const clampV = model.clamp ? windowMean(t, result.voltage(model.clamp.clampCapacitor), (periods - 10) * T, periods * T) : NaN;
    const drain = result.voltage(model.sw);
    let peakDrain = 0;
    for (let j = 0; j < t.length; j++) if (t[j]! >= (periods - 10) * T) peakDrain = Math.max(peakDrain, drain[j]!);
    const audit = result.energy();
    rows.push([
      sig(duty), sig(idealFlybackOutput(duty)), sig(vout), sig(clampV), sig(peakDrain), `${result.stats.acceptedSteps}`, audit.relativeError.toExponential(1), result.status,
    ]);
    if (duty === FLYBACK.duty) shown = { result, model };
  });
  progress(1, 'done');
  const { result, model } = shown!;
  const report = resultReport(result, {
    title: 'Flyback converter with leakage and an RCD clamp',
    subtitle: `${FLYBACK.vin} V in, ${FLYBACK.frequency / 1e3} kHz, duty ${FLYBACK.duty}, 1 uH leakage (invented design)`,
    description:
      'The gate drives the switch; the output diode and the clamp diode change state at events located by the solver. ' +
      'The output settles a little below the ideal continuous-conduction value n D Vin/(1 - D) - Vf: the leakage ' +
      'inductance delays the transfer of the current to the secondary at each turn-off and its energy goes to the clamp.',
    metrics: [{
      title: 'Study (all duties)',
      rows: rows.map((r) => ({ name: `duty ${r[0]}`, value: Number(r[2]), unit: 'V', note: `ideal ${r[1]} V; clamp ${r[3]} V; peak switch voltage ${r[4]} V` })),
    }],
    plots: [
      { title: 'Output voltage', series: [{ quantity: 'voltage', handle: model.output, label: 'output' }] },
      { title: 'Switch voltage', series: [{ quantity: 'voltage', handle: model.sw, label: 'Q1' }] },
      { title: 'Primary and diode currents', series: [{ quantity: 'current', handle: model.primary, label: 'primary' }, { quantity: 'current', handle: model.diode, label: 'D1' }] },
    ],
  });
  return {
    slug: 'flyback',
    title: `Flyback converter with leakage and an RCD clamp (${periods} periods at ${FLYBACK.frequency / 1e3} kHz, invented design)`,
    table: {
      head: ['duty', 'ideal Vout V', 'Vout V', 'clamp V', 'peak Vsw V', 'steps', 'audit', 'status'],
      rows,
    },
    notes: [
      'Ideal Vout: n D Vin / (1 - D) - Vf, continuous conduction, without leakage or resistive drops.',
      'Engineering estimate: verify against measurements before relying on it; the switch voltage rating is a safety matter.',
    ],
    report,
    csv: { flyback: result.toCSV() },
  };
}
