import { describe, expect, it } from 'vitest';
import { MU0 } from '../../../src/constants.js';
import { solveDae } from '../../../src/solver/solve-dae.js';
import { inverseJilesAtherton } from '../../../src/materials/hysteresis/inverse-jiles-atherton.js';
import { advanceAlongPath } from '../../../src/materials/hysteresis/flux-density-path.js';
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

/** Magnetisation from the reactor's state [phi, i, H, u]: m = b/mu0 - H. */
function magnetisationOf(y: ArrayLike<number>): number {
  return y[Y.flux]! / area / MU0 - y[Y.fieldStrength]!;
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
    // H = 350 A/m (the state), a point on the rising branch of a 1.5 T loop.
    const y = Float64Array.of(b * area, (l / turns) * 350, 350, 120);
    const analytic = new Float64Array(16);
    p.jacobian!(0.001, y, analytic);
    const scale = [1e-3, 1, 1e3, 100];
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
      worstM = Math.max(worstM, Math.abs(magnetisationOf(y) - ref[k]![1]!) / model.spec.saturationMagnetisation);
    });
    console.log(`reactor vs odex: max |dB|/Bpk ${worstB.toExponential(2)}, max |dm|/Ms ${worstM.toExponential(2)}`);
    expect(worstB).toBeLessThan(1e-6);
    expect(worstM).toBeLessThan(1e-6);
  });
});

/** The b where H reaches 0 when b moves from (b0, m0) in `direction` (bisection on Runge-Kutta steps). */
function residualAlongLoop(b0: number, m0: number, direction: number): number {
  const steps = 20000;
  let state = { b: b0, m: m0, work: 0, loss: 0 };
  const span = 3 * direction;
  for (let j = 1; j <= steps; j++) {
    const next = advanceAlongPath(model, state, b0 + (span * j) / steps);
    if (Math.sign(model.fieldStrength(next.b, next.m)) !== Math.sign(model.fieldStrength(state.b, state.m))) {
      let lo = state.b;
      let hi = next.b;
      for (let k = 0; k < 100; k++) {
        const mid = 0.5 * (lo + hi);
        const s = advanceAlongPath(model, state, mid);
        if (Math.sign(model.fieldStrength(s.b, s.m)) === Math.sign(model.fieldStrength(state.b, state.m))) lo = mid;
        else hi = mid;
      }
      return 0.5 * (lo + hi);
    }
    state = next;
  }
  throw new Error('no crossing');
}

describe('switch-off and re-energisation of a hysteretic reactor (our scenario, invented values)', () => {
  const rClosed = 0.2;
  const rOpen = 1e3; // discharge path while the breaker is open
  const tClose = 0.07;
  /** Energised at a voltage peak (no offset), opened at tOpen (source gone, discharge resistor), closed again at a voltage zero. */
  const scenario = (tOpen: number, polarity: number): HystereticReactorSpec =>
    spec({
      voltage: (t) => (t < tOpen ? amplitude * Math.cos(omega * t) : t >= tClose ? polarity * amplitude * Math.sin(omega * (t - tClose)) : 0),
      resistance: (t) => (t < tOpen || t >= tClose ? rClosed : rOpen),
      breakpoints: [tOpen, tClose],
      tEnd: tClose + 0.02,
    });
  const options = { rtol: 1e-8, atol: [1e-13, 1e-8, 1e-3, 1e-6], maxSteps: 200_000 };

  it('settles at the residual flux density the loop gives, which depends on the instant of switch-off', () => {
    const residuals: number[] = [];
    for (const tOpen of [0.045, 0.0425, 0.04]) {
      const p = hystereticReactorProblem({ ...scenario(tOpen, 1), tEnd: tClose - 1e-9, breakpoints: [tOpen] });
      const s = solveDae(p, { ...options, outputTimes: [tOpen, tClose - 1e-9] });
      expect(s.status).toBe('success');
      const [atOpen, atEnd] = s.output.y;
      const bOpen = atOpen![Y.flux]! / area;
      const hOpen = atOpen![Y.fieldStrength]!;
      const bResidual = atEnd![Y.flux]! / area;
      // After opening, H relaxes to 0 through the discharge resistor: b moves against the sign of H.
      const expected = residualAlongLoop(bOpen, magnetisationOf(atOpen!), -Math.sign(hOpen));
      console.log(`open at ${tOpen * 1e3} ms: b ${bOpen.toFixed(4)} T, H ${hOpen.toFixed(1)} A/m -> residual ${bResidual.toFixed(6)} T (loop: ${expected.toFixed(6)})`);
      expect(Math.abs(bResidual - expected)).toBeLessThan(1e-6);
      residuals.push(bResidual);
    }
    // Opening at the flux peak leaves the loop's remanence; later on the descending branch slightly less;
    // near the flux zero (current still at the coercive field) almost nothing (a fact of the trade).
    expect(residuals[0]!).toBeGreaterThan(0.6);
    expect(residuals[0]! - residuals[1]!).toBeGreaterThan(5e-3);
    expect(Math.abs(residuals[2]!)).toBeLessThan(0.1);
  });

  it('gives a larger inrush on re-energisation at the worst angle than the first energisation from the demagnetised state', () => {
    // First energisation: demagnetised, closed at a voltage zero with rising flux (the worst angle for no residual).
    const first = solveDae(
      hystereticReactorProblem(spec({ voltage: (t) => amplitude * Math.sin(omega * t), resistance: () => rClosed, tEnd: 0.02 })),
      options,
    );
    expect(first.status).toBe('success');
    const firstPeak = Math.max(...first.component(Y.current));
    // Second: opened at the flux peak (residual +Br), closed again at a voltage zero that drives flux further positive.
    const second = solveDae(hystereticReactorProblem(scenario(0.045, 1)), options);
    expect(second.status).toBe('success');
    const current = second.component(Y.current);
    let secondPeak = 0;
    second.t.forEach((t, k) => {
      if (t >= tClose) secondPeak = Math.max(secondPeak, current[k]!);
    });
    console.log(`inrush peaks: first ${firstPeak.toFixed(1)} A, after switch-off at the flux peak ${secondPeak.toFixed(1)} A`);
    expect(secondPeak).toBeGreaterThan(1.2 * firstPeak);
  });
});
