import { Solver } from './odex.js';
import { compileMaterial, createNetwork, demoMaterials, simulate, sine } from '../../src/index.js';

// An energisation at a voltage zero: one winding on a closed core of the demo grain-oriented steel
// (a Brauer law, test data of our own), 325 V at 50 Hz, 462 turns, 3 ohm, 0.5 m of path, 1.6e-3 m^2,
// 0.1 s sampled at 1000 points. The flux heads for twice its steady peak, so the current peaks at
// tens of amperes where the steady magnetising current is a few tens of milliamperes: the current is
// the steep image of the flux. Shared by test/simulation/reduced-error-control.test.ts and
// bench/formulation-accuracy.ts.
const steelSpec = demoMaterials.grainOrientedSteel;
const steel = compileMaterial(steelSpec);
const [N, R, area, lLeg, lRest, Vm, fHz] = [462, 3, 1.6e-3, 0.2, 0.3, 325, 50];
const stopTime = 0.1;

/** The sampling instants, s. */
export const energisationTimes: readonly number[] = Array.from({ length: 1000 }, (_, k) => ((k + 1) * stopTime) / 1000);

/** Ampere's law on the one loop (both tubes carry phi): N i = (l_leg + l_rest) H(phi / A). */
const currentOf = (phi: number): number => ((lLeg + lRest) * steel.fieldStrength(phi / area)) / N;

/**
 * The winding current at {@link energisationTimes} from odex (Hairer's
 * extrapolation code, an outside integrator) on the one-unknown ODE
 * N phi' = v(t) - R i(phi), at rtol 1e-12.
 */
export function energisationReference(): number[] {
  const odex = new Solver(1);
  odex.absoluteTolerance = 1e-16;
  odex.relativeTolerance = 1e-12;
  const f = (t: number, y: number[]): number[] => [(Vm * Math.sin(2 * Math.PI * fHz * t) - R * currentOf(y[0]!)) / N];
  const out: number[] = [];
  let phi = 0;
  let t0 = 0;
  for (const t of energisationTimes) {
    phi = odex.solve(f, t0, [phi], t).y[0]!;
    out.push(currentOf(phi));
    t0 = t;
  }
  return out;
}

/** One run of the energisation through the network API: its status, the winding current at the sampling instants and its counts. */
export function energise(formulation: 'full' | 'reduced', rtol: number): { status: string; current: Float64Array; steps: number; f: number } {
  const net = createNetwork('energisation at a voltage zero');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: lLeg, area, material: steelSpec });
  net.fluxTube('rest', { from: m2, to: m1, length: lRest, area, material: steelSpec });
  const a = net.node('a');
  net.voltageSource('mains', a, net.ground, sine({ amplitude: Vm, frequency: fHz }));
  const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: a, minus: net.ground });
  const r = simulate(net, { stopTime, rtol, formulation, sampling: { times: energisationTimes } });
  return { status: r.status, current: Float64Array.from(r.current(coil)), steps: r.stats.acceptedSteps, f: r.stats.rhsEvaluations };
}
