/**
 * Periodic steady state by shooting against brute force (simulate period after
 * period until the state changes by less than the same tolerance over one
 * period), side by side on the same networks. Networks are test data of our own.
 */
import {
  bipolarSquare, createNetwork, createStepper, periodicSteadyState, sine, type FluxTube, type NetworkBuilder,
} from '../src/index.js';
import { printTable, timeMedian } from './timing.js';

interface Case {
  readonly net: NetworkBuilder;
  readonly period: number;
  readonly leg: FluxTube;
  readonly area: number;
}

function saturatingChoke(): Case {
  const net = createNetwork('saturating choke, 50 Hz');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const material = { kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: 1.5 } as const;
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.2, area: 1e-3, material });
  net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-3, material });
  const a = net.node('a');
  net.voltageSource('mains', a, net.ground, sine({ amplitude: 60, frequency: 50 }));
  net.winding('coil', { tube: leg, turns: 200, resistance: 2, plus: a, minus: net.ground });
  return { net, period: 1 / 50, leg, area: 1e-3 };
}

function pushPull(): Case {
  const T = 2e-5;
  const net = createNetwork('push-pull, 60 ns mismatch, 50 kHz');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const material = { kind: 'frohlich-kennelly', initialRelativePermeability: 2500, saturationPolarisation: 0.47 } as const;
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.03, area: 1.2e-4, material });
  net.fluxTube('yoke', { from: m2, to: m1, length: 0.03, area: 1.2e-4, material });
  const d = net.node('drive');
  const o = net.node('out');
  net.voltageSource('bridge', d, net.ground, bipolarSquare({ amplitude: 24, period: T, deadTime: 3e-7, mismatch: 60e-9 }));
  net.winding('primary', { tube: leg, turns: 6, resistance: 0.05, plus: d, minus: net.ground });
  net.winding('secondary', { tube: leg, turns: 3, resistance: 0.02, plus: o, minus: net.ground });
  net.resistor('load', o, net.ground, 1.5);
  return { net, period: T, leg, area: 1.2e-4 };
}

/**
 * Brute force: advance period by period until the leg's flux changes by less than one
 * absolute tolerance of the shooting method (its default: 1e-7 T times the area) over a period.
 */
function bruteForce(c: Case, maxPeriods: number): { periods: number; converged: boolean } {
  const stepper = createStepper(c.net, { horizon: maxPeriods * c.period, rtol: 1e-8, record: false });
  const tol = 1e-7 * c.area;
  let previous = stepper.flux(c.leg);
  for (let k = 1; k <= maxPeriods; k++) {
    stepper.advanceTo(k * c.period);
    const phi = stepper.flux(c.leg);
    const change = Math.abs(phi - previous);
    previous = phi;
    if (change < tol) return { periods: k, converged: true };
  }
  return { periods: maxPeriods, converged: false };
}

export function benchPeriodicSteadyState(): void {
  console.log('\n## Periodic steady state: shooting (Newton on the period map) vs brute force, rtol 1e-8');
  console.log('brute force: period after period until the leg flux changes by < 1e-7 T x area over a period (the shooting tolerance); median wall times');
  const rows: (string | number)[][] = [];
  for (const make of [saturatingChoke, pushPull]) {
    const c = make();
    const { net, period } = c;
    const shoot = timeMedian(() => periodicSteadyState(net, { period, samplesPerPeriod: 50 }), 3);
    const brute = timeMedian(() => bruteForce(c, 4000), 1, 0);
    rows.push([
      net.name, shoot.result.status, shoot.result.periods, shoot.ms,
      brute.result.converged ? brute.result.periods : `>${brute.result.periods}`, brute.ms,
      brute.result.periods / shoot.result.periods, brute.ms / shoot.ms,
    ]);
  }
  printTable(['network', 'shooting', 'periods', 'ms', 'brute periods', 'brute ms', 'periods brute/shoot', 'time brute/shoot'], rows);
}
