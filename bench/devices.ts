/**
 * Power-electronic devices: a 300-period flyback (100 kHz, D = 0.4, 1 uH
 * leakage, RCD clamp; our own test circuit, invented values) with ideal
 * diodes (events, settling, cheap restarts) against the same circuit with
 * every diode a smooth exponential junction (given 100 pF each: without a
 * capacitance the smooth junction's blocking node has a 1e-14 s time
 * constant and the run fails). Prints device events, steps and wall time,
 * measured side by side in one run.
 */
import { createNetwork, pulse, type DiodeOptions } from '../src/index.js';
import { acceptNetwork } from '../src/simulation/accept-network.js';
import { NetworkRun } from '../src/simulation/network-run.js';
import { printTable, timeMedian } from './timing.js';

const PERIOD = 10e-6;

/** The flyback: primary leakage as its own flux tube, a gapped main path with the secondary. */
export function flybackWithClamp(diode: DiodeOptions) {
  const net = createNetwork('flyback with RCD clamp');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const legP = net.reluctance('primary leg', { from: m1, to: m2, reluctance: 1e3 });
  net.reluctance('leakage', { from: m2, to: m1, reluctance: 4e8 }); // 20^2 / 4e8 = 1 uH
  const gap = net.reluctance('gap', { from: m2, to: m1, reluctance: 4e6 }); // 100 uH magnetising
  const vin = net.node('vin');
  const drain = net.node('drain');
  const sec = net.node('sec');
  const out = net.node('out');
  const clamp = net.node('clamp');
  net.voltageSource('Vin', vin, net.ground, { kind: 'constant', value: 24 });
  net.winding('P', { tube: legP, turns: 20, resistance: 0.05, plus: vin, minus: drain });
  net.winding('S', { tube: gap, turns: 10, resistance: 0.02, plus: net.ground, minus: sec });
  net.switch('Q1', drain, net.ground, { gate: pulse({ high: 1, period: PERIOD, duty: 0.4 }), onResistance: 0.05 });
  net.diode('Dout', sec, out, diode);
  net.capacitor('Cout', out, net.ground, 100e-6, { initialVoltage: 5.5 });
  net.resistor('Rload', out, net.ground, 10);
  net.diode('Dclamp', drain, clamp, diode);
  net.capacitor('Cclamp', clamp, vin, 100e-9, { initialVoltage: 30 });
  net.resistor('Rclamp', clamp, vin, 2e3);
  return net;
}

export function benchDevices(periods = 300): void {
  console.log(`\n## Devices: ${periods}-period flyback with 1 uH leakage and an RCD clamp`);
  const cases: [string, DiodeOptions][] = [
    ['ideal diodes', { forwardVoltage: 0.5, onResistance: 0.01 }],
    ['exponential, 100 pF', { junction: 'exponential', saturationCurrent: 1e-9, emissionCoefficient: 1.5, onResistance: 0.01, capacitance: 100e-12 }],
  ];
  const rows: (string | number)[][] = [];
  let idealMs = NaN;
  for (const [label, diode] of cases) {
    const compiled = acceptNetwork(flybackWithClamp(diode), 'bench').compiled;
    const end = periods * PERIOD;
    const { ms, result } = timeMedian(() => {
      const run = new NetworkRun(compiled, { t0: 0, horizon: end, rtol: 1e-6, atol: 1e-6 });
      run.advanceTo(end, { steps: false, interpolants: false });
      return run;
    }, 1, 0);
    if (label === 'ideal diodes') idealMs = ms;
    const status = result.t === end ? 'reached end' : `${result.status} at ${(result.t / PERIOD).toFixed(0)} periods`;
    rows.push([label, status, result.deviceEvents, result.stats.acceptedSteps, result.stats.rejectedSteps, ms, ms / idealMs]);
  }
  printTable(['diodes', 'status', 'device events', 'steps', 'rejected', 'wall ms', 'x ideal'], rows);
  console.log('x ideal: wall time over the ideal run (the smooth run may stop early at its step budget: compare the periods reached)');
}
