import { cycleMeans } from '../analysis/metrics/cycle-means.js';
import { seriesMean } from '../analysis/metrics/series-mean.js';
import { seriesPeak } from '../analysis/metrics/series-peak.js';
import { seriesRms } from '../analysis/metrics/series-rms.js';
import { hystereticTubeReadings } from '../elements/hysteretic-tube-readings.js';
import type { DescriptionHandles } from '../network/handles-of.js';
import type { SimulationResult } from '../result/simulation-result.js';
import { outputName, outputTargetName } from './parse-sweep-job.js';
import type { SweepOutputRequest } from './sweep-job.js';

/** The samples of the requested quantity. */
function readQuantity(result: SimulationResult, h: DescriptionHandles, o: SweepOutputRequest): Float64Array {
  const { name } = outputTargetName(o.of);
  switch (o.quantity) {
    case 'flux':
      return result.flux(h.tube(name));
    case 'fluxDensity':
      return result.fluxDensity(h.tube(name));
    case 'fieldStrength':
      return result.fieldStrength(h.tube(name));
    case 'mmf':
      return result.mmf(h.tube(name));
    case 'eddyPower':
      return result.eddyPower(h.tube(name));
    case 'residualFluxDensity':
      return hystereticTubeReadings(result, h.tube(name)).residualFluxDensity;
    case 'hysteresisPower':
      return hystereticTubeReadings(result, h.tube(name)).hysteresisPower;
    case 'current':
      return result.current(h.element(name));
    case 'voltage':
      return result.voltage(h.element(name));
    case 'power':
      return result.power(h.element(name));
    case 'emf':
      return result.emf(h.winding(name));
    case 'fluxLinkage':
      return result.fluxLinkage(h.winding(name));
    case 'potential':
      return result.potential(h.node(name));
    case 'magneticPotential':
      return result.magneticPotential(h.magneticNode(name));
  }
}

/** One metric of one series. */
function metric(t: Float64Array, x: Float64Array, o: SweepOutputRequest, label: string): number | Float64Array {
  const window = { name: label, ...(o.from !== undefined ? { from: o.from } : {}), ...(o.to !== undefined ? { to: o.to } : {}) };
  switch (o.metric) {
    case 'peak':
      return seriesPeak(t, x, window).maxAbs;
    case 'peak-time':
      return seriesPeak(t, x, window).timeOfMaxAbs;
    case 'max':
      return seriesPeak(t, x, window).max;
    case 'min':
      return seriesPeak(t, x, window).min;
    case 'mean':
      return seriesMean(t, x, window);
    case 'rms':
      return seriesRms(t, x, window);
    case 'final':
      return x.length > 0 ? x[x.length - 1]! : Number.NaN;
    case 'cycle-means':
      return Float64Array.from(cycleMeans(t, x, { name: label, period: o.period!, ...(o.start !== undefined ? { start: o.start } : {}) }).means);
    case 'series':
      return Float64Array.from(x);
  }
}

/**
 * Compute the requested outputs of a simulated case. For a run that reached
 * its stop time any failure is thrown (the case becomes `'error'`); for a
 * run that stopped early, an output that cannot be computed on the partial
 * data is NaN (scalars) or empty (arrays), and `notes` says which.
 *
 * @internal
 */
export function computeOutputs(
  result: SimulationResult,
  handles: DescriptionHandles,
  requests: readonly SweepOutputRequest[],
  complete: boolean,
): { outputs: Record<string, number | Float64Array>; notes: string[] } {
  const outputs: Record<string, number | Float64Array> = {};
  const notes: string[] = [];
  for (const o of requests) {
    const name = outputName(o);
    try {
      outputs[name] = metric(result.time, readQuantity(result, handles, o), o, name);
    } catch (e) {
      if (complete) throw e;
      const arrays = o.metric === 'series' || o.metric === 'cycle-means';
      outputs[name] = arrays ? new Float64Array(0) : Number.NaN;
      notes.push(`output "${name}" not computed (${e instanceof Error ? e.message : String(e)})`);
    }
  }
  return { outputs, notes };
}
