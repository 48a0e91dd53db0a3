import { InputError } from '../errors.js';
import { MU0 } from '../constants.js';
import { requirePositive } from '../network/argument-checks.js';
import type { HystereticTubeLaw } from '../network/description.js';
import { checkJilesAthertonSpec, inverseJilesAtherton, type HystereticMaterial } from '../materials/hysteresis/inverse-jiles-atherton.js';
import { hysteresisLossRate, magnetisationRate, magnetisationRatePartials } from '../materials/hysteresis/magnetisation-rate.js';
import type { InputView } from './element-kind.js';
import type { StampTarget } from './stamp-target.js';
import type { TubeKind, TubeLoops, TubeStateStamps } from './tube-kind.js';
import { loopFlux } from './loop-flux.js';
import { checkTubeMaterial } from './tube-material-check.js';

/**
 * A body of hysteretic material (inverse Jiles-Atherton, driven by the
 * tube's flux density b = phi/A). Two internal unknowns per tube, in this
 * order: the field strength H (A/m) and the rate u = db/dt (T/s); the
 * magnetisation is m = b/mu0 - H. Rows, all with constant mass entries
 * (docs/materials.md, "Hysteresis"):
 *
 *   rate row:    (1/A) sum_k s_k phi_k' = u      (phi_k: loop fluxes through the tube)
 *   field row:   H' = (1/mu0 - g(b, m, sign u)) u   (the same as m' = g u)
 *   loop rows:   MMF drop F = l H (+ R_e phi' from the eddy term)
 *
 * Why H and not m as the state: H = b/mu0 - m is a small difference of two
 * numbers near 1e6 A/m, so from stored b and m it carries about 1e-10 A/m of
 * round-off; a tube discharged through a large resistance has db/dt = -kappa H
 * with kappa up to 1e4 T/s per A/m, and that round-off in db/dt stalled the
 * Newton iteration at rest (1 Mohm discharge: 'newton-failure'). Stored as a
 * state, H relaxes to zero with full relative precision.
 *
 * A tube without an eddy resistance is fine where the network fixes its flux
 * derivative (a winding fed from a voltage, or an eddy resistance elsewhere on
 * its loop); where only the MMF balance fixes its flux (an unwound branch in
 * parallel with another path, a winding fed from a current source) db/dt has
 * no equation of its own (index 2), and compiling the network throws
 * `hysteretic-tube-needs-eddy` naming the tube (src/formulation/flux-rate-check.ts).
 * Stored energy:
 * volume x W(b, m); hysteresis loss: volume x the model's dissipation rate,
 * booked by the energy audit as dissipation (`hysteresis`).
 *
 * @example
 * ```ts
 * net.tube({ name: 'core', from: 0, to: 1,
 *   law: { kind: 'hysteretic', length: 0.3, area: 1e-3, material: demoHystereticMaterials.steel } });
 * ```
 */
export const hystereticTubeKind: TubeKind<HystereticTubeLaw> = {
  kind: 'hysteretic',
  noun: 'flux tube',
  /** The hysteresis model acts on the loop fluxes through it and on its own two states. */
  nonAffineUnknowns: (_law, _tube, ctx) => [...ctx.loops.index, ctx.stateOffset, ctx.stateOffset + 1],
  allowsEddy: true,
  check(law, owner, name) {
    const length = requirePositive(law.length, `${owner} length`, name, 'm');
    const area = requirePositive(law.area, `${owner} area`, name, 'm^2');
    checkTubeMaterial(() => checkJilesAthertonSpec(law.material), owner, name);
    const m0 = law.initialMagnetisation;
    if (m0 !== undefined && !(Math.abs(m0) < law.material.saturationMagnetisation)) {
      throw new InputError(
        'bad-hysteresis-parameters',
        `${owner}: initialMagnetisation must be finite and below the saturation magnetisation in size (got ${m0}); fix the tube's law`,
        [name],
      );
    }
    return {
      kind: 'hysteretic',
      length,
      area,
      material: Object.freeze({ ...law.material }),
      ...(m0 !== undefined ? { initialMagnetisation: m0 } : {}),
    };
  },
  hasArea: () => true,
  internalStates: () => ['field-strength', 'flux-density-rate'],
  compile(law, tube, ctx) {
    const model = inverseJilesAtherton(law.material);
    const { length, area } = law;
    const volume = length * area;
    const s = ctx.stateOffset;
    const startB = tube.initialFluxDensity ?? (tube.initialFlux !== undefined ? tube.initialFlux / area : 0);
    const m0 = law.initialMagnetisation ?? startB / MU0;
    const h0 = startB / MU0 - m0;
    const magnetisation = (flux: number, y: Float64Array): number => magnetisationOf(flux, area, y[s]!);
    return {
      name: tube.name,
      law: undefined,
      length,
      area,
      reluctance: NaN,
      eddyResistance: tube.eddyResistance ?? 0,
      volume,
      // Initial flux division weight: the slope at the demagnetised state.
      zeroFluxReluctance: (length / area) * (1 / MU0 - model.magnetisationSlope(0, 0, 0)),
      mmf: (_flux, y) => length * y[s]!,
      // F = l H depends on the flux only through the state H.
      mmfSlope: () => 0,
      energy: (flux, y) => volume * model.storedEnergyDensity(flux / area, magnetisation(flux, y)),
      lossPower: (flux, y) => volume * hysteresisLossRate(model, flux / area, magnetisation(flux, y), y[s + 1]!),
      magnetisation,
      material: model,
      ...((tube.eddyResistance ?? 0) > 0
        ? {}
        : { missingFluxRateError: (reason: string, names: readonly string[]) => needsEddyError(law, names, reason) }),
      stateOffset: s,
      // H in A/m: 1/mu0 per tesla; u = db/dt: a tesla per millisecond.
      stateScales: [1 / MU0, 1e3],
      states: new HystereticTubeStates(model, length, area, s, ctx.loops, h0),
    };
  },
  listing: (law) => [
    { name: 'length', value: law.length, unit: 'm' },
    { name: 'area', value: law.area, unit: 'm^2' },
    { name: 'material', value: law.material.name ?? 'Jiles-Atherton material' },
  ],
};

/** Magnetisation M = B/mu0 - H of a tube of cross-section `area` carrying `flux` at field strength h, A/m. */
function magnetisationOf(flux: number, area: number, h: number): number {
  return flux / area / MU0 - h;
}

/**
 * The rows of one hysteretic tube's internal states (H, then u = db/dt) as
 * prototype methods: the same functions in every network compiled, so the
 * network's f calls one target for every such tube from run to run
 * (closures per compile were a new target each time).
 */
class HystereticTubeStates implements TubeStateStamps {
  constructor(
    private readonly model: HystereticMaterial,
    private readonly length: number,
    private readonly area: number,
    /** Index in y of H (u follows it). */
    private readonly s: number,
    /** Loop fluxes through the tube: positions in y and signs. */
    private readonly loops: TubeLoops,
    /** Initial field strength, A/m. */
    private readonly h0: number,
  ) {}

  residual(_t: number, y: Float64Array, _inputs: InputView, f: Float64Array): void {
    const s = this.s;
    const area = this.area;
    const u = y[s + 1]!;
    const flux = loopFlux(this.loops, y);
    f[s]! += u / MU0 - magnetisationRate(this.model, flux / area, magnetisationOf(flux, area, y[s]!), u);
    f[s + 1]! += u;
  }

  jacobian(_t: number, y: Float64Array, _inputs: InputView, J: StampTarget): void {
    const { s, area, length } = this;
    const { index, sign } = this.loops;
    const flux = loopFlux(this.loops, y);
    const p = magnetisationRatePartials(this.model, flux / area, magnetisationOf(flux, area, y[s]!), y[s + 1]!);
    // Field row f = u/mu0 - R(b, m, u) with m = b/mu0 - H.
    const dFieldDb = -(p.db + p.dm / MU0);
    for (let k = 0; k < index.length; k++) {
      J.add(s, index[k]!, (sign[k]! * dFieldDb) / area);
      // Loop rows hold -sign * F with F = l H: d/dH = -sign * l.
      J.add(index[k]!, s, -sign[k]! * length);
    }
    J.add(s, s, p.dm);
    J.add(s, s + 1, 1 / MU0 - p.du);
    J.add(s + 1, s + 1, 1);
  }

  mass(M: StampTarget): void {
    const { s, area } = this;
    const { index, sign } = this.loops;
    M.add(s, s, 1);
    for (let k = 0; k < index.length; k++) M.add(s + 1, index[k]!, sign[k]! / area);
  }

  initial(y0: Float64Array): void {
    y0[this.s] = this.h0;
    y0[this.s + 1] = 0;
  }
}

/**
 * Largest eddy resistance that keeps a hysteretic tube's eddy MMF R_e dphi/dt
 * below 1 % of its pinning MMF l k at 50 Hz and saturation (our rule of
 * thumb; k is of the order of the coercive field): 0.01 l k / (omega B_sat A).
 *
 * @example
 * ```ts
 * suggestedEddyCeiling({ kind: 'hysteretic', length: 0.3, area: 1e-3, material: demoHystereticMaterials.steel });
 * ```
 */
export function suggestedEddyCeiling(law: HystereticTubeLaw): number {
  const saturation = law.material.saturationFluxDensity ?? MU0 * law.material.saturationMagnetisation;
  return (0.01 * law.length * law.material.pinning) / (2 * Math.PI * 50 * saturation * law.area);
}

/**
 * The error for hysteretic tubes without an eddy resistance whose flux
 * derivative the network does not fix (found by the compiler's index check,
 * src/formulation/flux-rate-check.ts): names the tubes, says why, what to set
 * and how large (sized for the first named tube's law).
 */
function needsEddyError(law: HystereticTubeLaw, names: readonly string[], reason: string): InputError {
  const list = names.map((x) => `"${x}"`).join(', ');
  return new InputError(
    'hysteretic-tube-needs-eddy',
    `hysteretic tube${names.length > 1 ? 's' : ''} ${list} need${names.length > 1 ? '' : 's'} an eddy resistance here; ` +
      `give ${names.length > 1 ? 'them' : 'it'} eddyResistance > 0 (ohm, as a shorted turn). Why: ${reason}. ` +
      `Size: at most ${formatSuggestion(suggestedEddyCeiling(law))} ohm keeps the eddy MMF below 1 % of the pinning MMF ` +
      `at 50 Hz and saturation (0.01 l k / (omega B_sat A)); values down to 1e-6 of that only add a fast mode the solver handles`,
    names,
  );
}

/** Two significant digits for a message. */
function formatSuggestion(value: number): string {
  return Number(value.toPrecision(2)).toString();
}
