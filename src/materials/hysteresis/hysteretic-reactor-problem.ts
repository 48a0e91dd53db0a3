import { InputError } from '../../errors.js';
import { MU0 } from '../../constants.js';
import type { DaeProblem } from '../../solver/types.js';
import type { HystereticMaterial } from './inverse-jiles-atherton.js';
import { magnetisationRate, magnetisationRatePartials } from './magnetisation-rate.js';

/**
 * One winding on one hysteretic flux tube (a reactor or an unloaded
 * transformer's magnetising branch), fed by a voltage through a resistance
 * that may change at given instants (an opening switch is a jump to a large
 * discharge resistance).
 *
 * @example
 * ```ts
 * const spec: HystereticReactorSpec = {
 *   material: model, pathLength: 0.3, area: 1e-3, turns: 200,
 *   voltage: (t) => 94 * Math.cos(100 * Math.PI * t), resistance: () => 0.5,
 *   t0: 0, tEnd: 0.04,
 * };
 * ```
 */
export interface HystereticReactorSpec {
  readonly material: HystereticMaterial;
  /** Mean path length of the tube, m. */
  readonly pathLength: number;
  /** Cross-section of the tube, m^2. */
  readonly area: number;
  readonly turns: number;
  /** Source voltage at t, V. */
  readonly voltage: (t: number) => number;
  /** Series resistance in force at t, ohm (> 0). */
  readonly resistance: (t: number) => number;
  readonly t0: number;
  readonly tEnd: number;
  /** Instants where voltage or resistance jump. */
  readonly breakpoints?: readonly number[];
  /** Flux density at t0, T. Default 0. */
  readonly initialFluxDensity?: number;
  /** Magnetisation at t0, A/m. Default 0. */
  readonly initialMagnetisation?: number;
}

/**
 * Positions of the unknowns of {@link hystereticReactorProblem}.
 *
 * @example
 * ```ts
 * const b = y[HYSTERETIC_REACTOR_UNKNOWNS.flux]! / area;
 * ```
 */
export const HYSTERETIC_REACTOR_UNKNOWNS = Object.freeze({ flux: 0, current: 1, fieldStrength: 2, rate: 3 });

/**
 * The reactor as M y' = f(t, y) with a CONSTANT mass matrix, in the form a
 * hysteretic tube takes in a network (docs/materials.md, "Hysteresis"):
 *
 *   N phi'        = v(t) - R(t) i                  (winding)
 *   0             = (l/N) H - i                    (magnetic loop: MMF balance)
 *   H'            = (1/mu0 - g(phi/A, m, sign u)) u  (field, inverse Jiles-Atherton: m' = g u)
 *   (1/A) phi'    = u                              (rate unknown u = db/dt)
 *
 * y = [phi, i, H, u], m = phi/(A mu0) - H (H is the state, not m: see
 * hystereticTubeKind in src/elements/hysteretic-tube.ts for why). The first and last mass rows are dependent; the solver
 * combines them, leaving 0 = u - (v - R i)/(N A): index 1 (the algebraic
 * Jacobian in (i, u) has determinant -1). The Jacobian is analytic.
 *
 * @example
 * ```ts
 * const solution = solveDae(hystereticReactorProblem(spec), { rtol: 1e-8, atol: [1e-12, 1e-9, 1e-3, 1e-6] });
 * ```
 */
export function hystereticReactorProblem(spec: HystereticReactorSpec): DaeProblem {
  const { material, pathLength: l, area: a, turns: n } = spec;
  for (const [field, value] of [['pathLength', l], ['area', a], ['turns', n]] as const) {
    if (!(value > 0) || !Number.isFinite(value)) {
      throw new InputError('bad-hysteretic-reactor', `hysteretic reactor on '${material.name}': ${field} must be a finite number > 0 (got ${value}); fix the spec`, [material.name]);
    }
  }
  const b0 = spec.initialFluxDensity ?? 0;
  const m0 = spec.initialMagnetisation ?? 0;
  const r0 = spec.resistance(spec.t0);
  if (!(r0 > 0)) {
    throw new InputError('bad-hysteretic-reactor', `hysteretic reactor on '${material.name}': resistance must be > 0 (got ${r0}); fix the spec`, [material.name]);
  }
  const h0 = material.fieldStrength(b0, m0);
  const i0 = (l / n) * h0;
  const u0 = (spec.voltage(spec.t0) - r0 * i0) / (n * a);
  const mass = new Float64Array(16);
  mass[0] = n;
  mass[2 * 4 + 2] = 1;
  mass[3 * 4 + 0] = 1 / a;
  return {
    size: 4,
    mass,
    t0: spec.t0,
    tEnd: spec.tEnd,
    y0: [b0 * a, i0, h0, u0],
    ...(spec.breakpoints ? { breakpoints: spec.breakpoints } : {}),
    rhs: (t, y, out) => {
      const b = y[0]! / a;
      out[0] = spec.voltage(t) - spec.resistance(t) * y[1]!;
      out[1] = (l / n) * y[2]! - y[1]!;
      out[2] = y[3]! / MU0 - magnetisationRate(material, b, b / MU0 - y[2]!, y[3]!);
      out[3] = y[3]!;
    },
    jacobian: (t, y, out) => {
      const b = y[0]! / a;
      const p = magnetisationRatePartials(material, b, b / MU0 - y[2]!, y[3]!);
      out[1] = -spec.resistance(t);
      out[4 + 1] = -1;
      out[4 + 2] = l / n;
      out[8 + 0] = -(p.db + p.dm / MU0) / a;
      out[8 + 2] = p.dm;
      out[8 + 3] = 1 / MU0 - p.du;
      out[12 + 3] = 1;
    },
  };
}
