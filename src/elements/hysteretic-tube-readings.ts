import { InputError } from '../errors.js';
import { compileNetwork } from '../formulation/compile-network.js';
import type { FluxTube } from '../network/handles.js';
import type { SimulationResult } from '../result/simulation-result.js';
import { residualFluxDensity } from '../materials/hysteresis/residual-flux-density.js';

/**
 * Series of a hysteretic tube's own quantities at the result's samples.
 *
 * @example
 * ```ts
 * const r: HystereticTubeReadings = hystereticTubeReadings(result, core);
 * r.residualFluxDensity.at(-1); // T
 * ```
 */
export interface HystereticTubeReadings {
  /** Magnetisation m, A/m. */
  readonly magnetisation: Float64Array;
  /** db/dt (the tube's rate unknown), T/s. */
  readonly fluxDensityRate: Float64Array;
  /**
   * Residual flux density, T: where b would settle if the tube's field
   * strength relaxed to zero from the state at that sample
   * (`residualFluxDensity` with Runge-Kutta steps of 1 mT: about 1e-7 T).
   */
  readonly residualFluxDensity: Float64Array;
  /** Hysteresis loss power of the tube (volume x loss density rate), W. */
  readonly hysteresisPower: Float64Array;
}

/**
 * Reads the internal states of a hysteretic tube from a simulation result
 * and derives its residual flux density and hysteresis loss power at every
 * sample. Throws `not-hysteretic` for a tube of another kind.
 *
 * @example
 * ```ts
 * const core = net.tube({ name: 'core', from: 0, to: 1, eddyResistance: 0.01,
 *   law: { kind: 'hysteretic', length: 0.3, area: 1e-3, material: demoHystereticMaterials.steel } });
 * const result = simulate(net, { stopTime: 0.1 });
 * const { residualFluxDensity } = hystereticTubeReadings(result, core);
 * ```
 */
export function hystereticTubeReadings(result: SimulationResult, tube: FluxTube): HystereticTubeReadings {
  const compiled = compileNetwork(result.network);
  const b = compiled.description.tubes.findIndex((t) => t.name === tube.name);
  const compiledTube = b < 0 ? undefined : compiled.tubes[b];
  const model = compiledTube?.material;
  if (compiledTube === undefined || model === undefined || compiledTube.stateOffset === undefined) throw notHysteretic(tube);
  const s = compiledTube.stateOffset;
  const n = result.length;
  const magnetisation = new Float64Array(n);
  const fluxDensityRate = new Float64Array(n);
  const fluxDensity = new Float64Array(n);
  const power = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const y = result.state(k);
    const flux = compiled.tubeFlux(y, b);
    fluxDensity[k] = flux / compiledTube.area;
    magnetisation[k] = compiledTube.magnetisation!(flux, y);
    fluxDensityRate[k] = y[s + 1]!;
    power[k] = compiledTube.lossPower!(flux, y);
  }
  // The residual needs an integration per sample: computed on first use only.
  let residual: Float64Array | undefined;
  return {
    magnetisation,
    fluxDensityRate,
    get residualFluxDensity(): Float64Array {
      residual ??= fluxDensity.map((bk, k) => residualFluxDensity(model, bk, magnetisation[k]!, 1e-3));
      return residual;
    },
    hysteresisPower: power,
  };
}

/**
 * Residual flux density of a hysteretic tube at the last sample of a result
 * (where b would settle if H relaxed to zero from there), T; one integration
 * instead of one per sample. Throws `not-hysteretic` as
 * {@link hystereticTubeReadings} does.
 *
 * @example
 * ```ts
 * const br = residualFluxDensityAtEnd(result, core); // T
 * ```
 */
export function residualFluxDensityAtEnd(result: SimulationResult, tube: FluxTube): number {
  const { magnetisation, fluxDensity, model } = lastState(result, tube);
  if (!Number.isFinite(fluxDensity) || !Number.isFinite(magnetisation)) return Number.NaN;
  return residualFluxDensity(model, fluxDensity, magnetisation, 1e-3);
}

/** b and m of a hysteretic tube at the last sample. */
function lastState(result: SimulationResult, tube: FluxTube) {
  const compiled = compileNetwork(result.network);
  const b = compiled.description.tubes.findIndex((t) => t.name === tube.name);
  const compiledTube = b < 0 ? undefined : compiled.tubes[b];
  const model = compiledTube?.material;
  if (compiledTube === undefined || model === undefined || compiledTube.stateOffset === undefined) throw notHysteretic(tube);
  if (result.length === 0) return { model, fluxDensity: Number.NaN, magnetisation: Number.NaN };
  const y = result.state(result.length - 1);
  const flux = compiled.tubeFlux(y, b);
  return { model, fluxDensity: flux / compiledTube.area, magnetisation: compiledTube.magnetisation!(flux, y) };
}

function notHysteretic(tube: FluxTube): InputError {
  return new InputError(
    'not-hysteretic',
    `tube "${tube.name}" is not a hysteretic tube of this result's network; read its flux density instead, or give it a law of kind 'hysteretic'`,
    [tube.name],
  );
}
