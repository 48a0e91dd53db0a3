import { describe, expect, it } from 'vitest';
import { MU0 } from '../../../src/constants.js';
import { solveDae } from '../../../src/solver/solve-dae.js';
import { inverseJilesAtherton } from '../../../src/materials/hysteresis/inverse-jiles-atherton.js';
import { magnetisationRate } from '../../../src/materials/hysteresis/magnetisation-rate.js';
import {
  HYSTERETIC_REACTOR_UNKNOWNS as Y,
  hystereticReactorProblem,
  type HystereticReactorSpec,
} from '../../../src/materials/hysteresis/hysteretic-reactor-problem.js';
import { Solver } from '../../support/odex.js';

// Parameter set attributed to Jiles and Atherton, J. Magn. Magn. Mater. 61 (1986) 48-60
// (read in a secondary source, see /work/shared/REFERENCES.md section 5).
const model = inverseJilesAtherton({
  kind: 'jiles-atherton',
  saturationMagnetisation: 1.6e6,
  anhystereticShape: 1100,
  pinning: 400,
  reversibility: 0.2,
  interdomainCoupling: 1.6e-3,
});

// Our own scenario (invented): 200 turns on a 0.3 m x 1e-3 m^2 tube, 50 Hz, peak 1.5 T.
const l = 0.3;
const area = 1e-3;
const turns = 200;
const omega = 100 * Math.PI;
const peakB = 1.5;
const amplitude = turns * area * omega * peakB;

function spec(over: Partial<HystereticReactorSpec> = {}): HystereticReactorSpec {
  return {
    material: model,
    pathLength: l,
    area,
    turns,
    voltage: (t) => amplitude * Math.cos(omega * t),
    resistance: () => 0.5,
    t0: 0,
    tEnd: 0.06,
    ...over,
  };
}

/** The same equations as a plain ODE in (phi, m): i from the MMF balance, phi' from the winding. */
function odexReference(s: HystereticReactorSpec, times: readonly number[]): number[][] {
  const f = (t: number, y: number[]): number[] => {
    const b = y[0]! / area;
    const i = (l / turns) * (b / MU0 - y[1]!);
    const dphi = (s.voltage(t) - s.resistance(t) * i) / turns;
    return [dphi, magnetisationRate(model, b, y[1]!, dphi / area)];
  };
  const out: number[][] = [];
  let y = [(s.initialFluxDensity ?? 0) * area, s.initialMagnetisation ?? 0];
  let t = s.t0;
  const stops = [...(s.breakpoints ?? []), ...times].filter((x) => x > s.t0).sort((p, q) => p - q);
  for (const stop of stops) {
    if (stop > t) {
      const solver = new Solver(2);
      solver.absoluteTolerance = [1e-16, 1e-5];
      solver.relativeTolerance = 1e-13;
      solver.maxSteps = 1e6;
      const r = solver.solve(f, t, y, stop);
      expect(r.outcome).toBe(0);
      y = r.y;
      t = stop;
    }
    if (times.includes(stop)) out.push([...y]);
  }
  return out;
}

describe('hystereticReactorProblem (constant mass matrix, rate unknown)', () => {
  it('its analytic Jacobian matches central differences of the right-hand side on a rising branch', () => {
    const p = hystereticReactorProblem(spec());
    const b = 1.1;
    const m = b / MU0 - 350; // H = 350 A/m, a point on the rising branch of a 1.5 T loop
    const y = Float64Array.of(b * area, (l / turns) * 350, m, 120);
    const analytic = new Float64Array(16);
    p.jacobian!(0.001, y, analytic);
    const scale = [1e-3, 1, 1e6, 100];
    for (let j = 0; j < 4; j++) {
      const h = 1e-6 * scale[j]!;
      const up = Float64Array.from(y);
      const down = Float64Array.from(y);
      up[j] = y[j]! + h;
      down[j] = y[j]! - h;
      const fu = new Float64Array(4);
      const fd = new Float64Array(4);
      p.rhs(0.001, up, fu);
      p.rhs(0.001, down, fd);
      for (let i = 0; i < 4; i++) {
        const central = (fu[i]! - fd[i]!) / (2 * h);
        expect(Math.abs(analytic[4 * i + j]! - central)).toBeLessThanOrEqual(1e-5 * Math.max(Math.abs(central), 1e-9));
      }
    }
  });

  it('agrees with odex 2.0.4 on the same equations as an ODE to 1e-6 over three cycles (odd drive)', () => {
    const s = spec();
    const times = Array.from({ length: 60 }, (_, k) => 0.001 * (k + 1));
    const ours = solveDae(hystereticReactorProblem(s), {
      rtol: 1e-10,
      atol: [1e-14, 1e-9, 1e-3, 1e-7],
      outputTimes: times,
      maxSteps: 200_000,
    });
    expect(ours.status).toBe('success');
    const ref = odexReference(s, times);
    let worstB = 0;
    let worstM = 0;
    times.forEach((_, k) => {
      const y = ours.output.y[k]!;
      worstB = Math.max(worstB, Math.abs(y[Y.flux]! - ref[k]![0]!) / area / peakB);
      worstM = Math.max(worstM, Math.abs(y[Y.magnetisation]! - ref[k]![1]!) / model.spec.saturationMagnetisation);
    });
    console.log(`reactor vs odex: max |dB|/Bpk ${worstB.toExponential(2)}, max |dm|/Ms ${worstM.toExponential(2)}`);
    expect(worstB).toBeLessThan(1e-6);
    expect(worstM).toBeLessThan(1e-6);
  });
});
