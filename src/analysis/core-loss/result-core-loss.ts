import { InputError } from '../../errors.js';
import type { FluxTube } from '../../network/handles.js';
import type { SimulationResult } from '../../result/simulation-result.js';
import { coreLoss, type CoreLoss, type CoreLossOptions, type CoreLossTube } from './core-loss.js';
import type { SteinmetzCoefficients } from './steinmetz-coefficients.js';

/** Options of {@link resultCoreLoss}. */
export interface ResultCoreLossOptions extends Omit<CoreLossOptions, 'coefficients'> {
  /** Coefficients for every tube that the `perTube` list does not cover. */
  readonly coefficients?: SteinmetzCoefficients;
  /** Tubes to include, each with optional coefficients of its own; default every material tube. */
  readonly tubes?: readonly { readonly tube: FluxTube; readonly coefficients?: SteinmetzCoefficients }[];
}

/**
 * Core loss of a simulation result's flux tubes over one period of steady
 * state (iGSE by default): each material tube's flux density series and its
 * volume (length times area) go to {@link coreLoss}. Post-processing only:
 * the loss does not act back on the waveforms (model it in the simulation
 * with a tube's eddy resistance when that matters).
 *
 * @example
 * ```ts
 * const r = simulate(net, { stopTime: 0.1, sampling: { interval: 1e-5, exact: true } });
 * const loss = resultCoreLoss(r, { period: 0.02, start: 0.08, coefficients: { k: 2.5, alpha: 1.4, beta: 2.2 } });
 * console.log(loss.total, 'W');
 * ```
 */
export function resultCoreLoss(result: SimulationResult, options: ResultCoreLossOptions): CoreLoss {
  const d = result.network;
  const selected: readonly { readonly tube: FluxTube; readonly coefficients?: SteinmetzCoefficients }[] =
    options.tubes ??
    d.tubes.flatMap((t, index) =>
      t.law.kind === 'material' ? [{ tube: { kind: 'flux-tube' as const, name: t.name, index, network: result.networkId ?? -1 } }] : []);
  const tubes: CoreLossTube[] = selected.map(({ tube, coefficients }) => {
    const desc = d.tubes[tube.index];
    if (!desc || desc.name !== tube.name || desc.law.kind === 'reluctance') {
      throw new InputError(
        'no-volume',
        `tube "${tube.name}" has no length and area in network "${d.name}"; core loss needs a tube of material or an air gap`,
        [tube.name],
      );
    }
    return {
      name: tube.name,
      b: result.fluxDensity(tube),
      volume: desc.law.length * desc.law.area,
      ...(coefficients ? { coefficients } : {}),
    };
  });
  return coreLoss(result.time, tubes, {
    period: options.period,
    ...(options.start !== undefined ? { start: options.start } : {}),
    ...(options.method ? { method: options.method } : {}),
    ...(options.coefficients ? { coefficients: options.coefficients } : {}),
  });
}
