import { InputError } from '../../errors.js';
import type { HystereticMaterial } from './inverse-jiles-atherton.js';

/**
 * Options of {@link traceFluxDensityPath}.
 *
 * @example
 * ```ts
 * const options: FluxDensityPathOptions = { stepsPerSegment: 4000, initialMagnetisation: 0 };
 * ```
 */
export interface FluxDensityPathOptions {
  /** Classical Runge-Kutta steps per monotone segment. Default 2000. */
  readonly stepsPerSegment?: number;
  /** Magnetisation at the first turning point, A/m. Default 0 (demagnetised when b starts at 0). */
  readonly initialMagnetisation?: number;
}

/**
 * A hysteretic material driven along a piecewise monotone flux-density path:
 * the samples of b, H and m, and the running energy densities.
 *
 * @example
 * ```ts
 * const trace: FluxDensityTrace = traceFluxDensityPath(model, [0, 1.5, -1.5, 1.5]);
 * trace.fieldStrength.at(-1); // H at the last tip
 * ```
 */
export interface FluxDensityTrace {
  /** Flux density samples, T (turning points included; each shared point once). */
  readonly fluxDensity: Float64Array;
  /** Field strength H at the samples, A/m. */
  readonly fieldStrength: Float64Array;
  /** Magnetisation at the samples, A/m. */
  readonly magnetisation: Float64Array;
  /** Running integral of H db from the start, J/m^3 (work done on the material). */
  readonly work: Float64Array;
  /** Running hysteresis loss density from the start, J/m^3 (integral of the dissipation rate). */
  readonly loss: Float64Array;
  /** Sample index of each turning point. */
  readonly turningIndices: readonly number[];
}

/**
 * Drives a hysteretic material along straight flux-density segments between
 * the given turning points (b is the independent variable, so the model's
 * ODE dm/db = g(b, m, direction) is integrated without any inversion),
 * accumulating the work integral of H db and the loss. Each monotone segment
 * uses fixed-step classical Runge-Kutta (order 4); the direction is constant
 * within a segment, so its right-hand side is smooth apart from the kink
 * where the safeguard releases. Used for loop features, fitting and tests.
 *
 * @example
 * ```ts
 * const trace = traceFluxDensityPath(model, [0, 1.2, -1.2, 1.2], { stepsPerSegment: 1000 });
 * ```
 */
export function traceFluxDensityPath(
  model: HystereticMaterial,
  turningPoints: readonly number[],
  options: FluxDensityPathOptions = {},
): FluxDensityTrace {
  const steps = options.stepsPerSegment ?? 2000;
  if (!Number.isInteger(steps) || steps < 1) {
    throw new InputError('bad-path', `flux-density path of '${model.name}': stepsPerSegment must be an integer >= 1 (got ${steps})`, [model.name]);
  }
  if (turningPoints.length < 1 || !turningPoints.every(Number.isFinite)) {
    throw new InputError('bad-path', `flux-density path of '${model.name}': give at least one finite turning point`, [model.name]);
  }
  const n = 1 + (turningPoints.length - 1) * steps;
  const bs = new Float64Array(n);
  const hs = new Float64Array(n);
  const ms = new Float64Array(n);
  const work = new Float64Array(n);
  const loss = new Float64Array(n);
  const turningIndices: number[] = [0];
  let state: PathState = { b: turningPoints[0]!, m: options.initialMagnetisation ?? 0, work: 0, loss: 0 };
  const record = (i: number): void => {
    bs[i] = state.b;
    ms[i] = state.m;
    hs[i] = model.fieldStrength(state.b, state.m);
    work[i] = state.work;
    loss[i] = state.loss;
  };
  record(0);
  let index = 0;
  for (let s = 1; s < turningPoints.length; s++) {
    const b0 = turningPoints[s - 1]!;
    const b1 = turningPoints[s]!;
    for (let j = 1; j <= steps; j++) {
      state = advanceAlongPath(model, state, b0 + ((b1 - b0) * j) / steps);
      record(++index);
    }
    turningIndices.push(index);
  }
  return { fluxDensity: bs, fieldStrength: hs, magnetisation: ms, work, loss, turningIndices };
}

/**
 * State carried along a flux-density path: b (T), m (A/m), and the running
 * work and loss densities (J/m^3).
 *
 * @example
 * ```ts
 * const start: PathState = { b: 0, m: 0, work: 0, loss: 0 };
 * ```
 */
export interface PathState {
  readonly b: number;
  readonly m: number;
  readonly work: number;
  readonly loss: number;
}

/**
 * One classical Runge-Kutta step in b from `state` to flux density `b1` (the
 * direction of travel is the sign of b1 - state.b). Carries m, the work
 * integral of H db and the loss integral.
 *
 * @example
 * ```ts
 * const next = advanceAlongPath(model, { b: 0, m: 0, work: 0, loss: 0 }, 0.001);
 * ```
 */
export function advanceAlongPath(model: HystereticMaterial, state: PathState, b1: number): PathState {
  const h = b1 - state.b;
  if (h === 0) return state;
  const direction = Math.sign(h);
  // d/db of (m, work, loss); the loss rate is linear in db/dt, so rate(db/dt = direction) / direction.
  const rates = (b: number, m: number): [number, number, number] => [
    model.magnetisationSlope(b, m, direction),
    model.fieldStrength(b, m),
    model.dissipationRate(b, m, direction) / direction,
  ];
  const k1 = rates(state.b, state.m);
  const k2 = rates(state.b + h / 2, state.m + (h / 2) * k1[0]);
  const k3 = rates(state.b + h / 2, state.m + (h / 2) * k2[0]);
  const k4 = rates(b1, state.m + h * k3[0]);
  const avg = (i: 0 | 1 | 2): number => (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]) / 6;
  return { b: b1, m: state.m + h * avg(0), work: state.work + h * avg(1), loss: state.loss + h * avg(2) };
}
