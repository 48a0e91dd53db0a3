import type { NetworkDescription } from '../network/description.js';
import type { FluxTube } from '../network/handles.js';
import type { SimulationResult } from '../result/simulation-result.js';

/**
 * A value far outside the practical range, most likely a unit slip.
 *
 * @example
 * ```ts
 * for (const w of sanityWarnings(net.describe())) console.warn(w.message);
 * ```
 */
export interface SanityWarning {
  /** The element (tube) concerned. */
  readonly element: string;
  /** What is out of range: `'length'`, `'area'`, `'relative permeability'`, `'saturation'`, `'flux density'`. */
  readonly quantity: string;
  /** The value found, SI units. */
  readonly value: number;
  /** Plain-language message naming the element, the value, the likely slip and the fix. */
  readonly message: string;
}

/** A value as a person would type it (6 significant digits, no trailing rounding noise). */
const typed = (v: number): string => String(Number(v.toPrecision(6)));

/** Longest magnetic path that occurs in practice, m (the largest power-transformer cores are a few metres). */
const MAX_LENGTH = 10;
/** Largest cross-section that occurs in practice, m^2. */
const MAX_AREA = 1;
/** Flux density no practical core material reaches, T (the best iron-cobalt alloys saturate near 2.4 T). */
const MAX_FLUX_DENSITY = 3;
/** Relative permeabilities beyond the best nanocrystalline and amorphous alloys (about 1e6 at most). */
const MAX_RELATIVE_PERMEABILITY = 1e6;

/**
 * Sanity checks of a network description: geometry and material values far
 * outside practical ranges (a magnetic path longer than 10 m, an area above
 * 1 m^2, a relative permeability below 1 or above 1e6, a saturation above
 * 3 T), each naming the tube, the value and the likely unit slip (metres
 * for millimetres, m^2 for mm^2). Such a network still simulates, to a
 * "success" with meaningless flux densities: check these before trusting a
 * run. A pure function of the description, cheap enough to call before
 * every run.
 *
 * The limits are common practice, not a standard: a real machine outside
 * them is possible but rare enough to deserve a second look.
 *
 * @example
 * ```ts
 * net.fluxTube('leg', { from: a, to: b, length: 150, area: 900, material }); // meant mm(150), mm2(900)
 * sanityWarnings(net.describe())[0]!.message;
 * // 'tube "leg": magnetic path length 150 m is longer than 10 m; was it given in millimetres? write mm(150)'
 * ```
 */
export function sanityWarnings(description: NetworkDescription): SanityWarning[] {
  const out: SanityWarning[] = [];
  for (const tube of description.tubes) {
    const law = tube.law;
    const where = `tube "${tube.name}"`;
    if (law.kind !== 'reluctance' && law.length > MAX_LENGTH) {
      out.push({
        element: tube.name,
        quantity: 'length',
        value: law.length,
        message: `${where}: magnetic path length ${typed(law.length)} m is longer than ${MAX_LENGTH} m; was it given in millimetres? write mm(${typed(law.length)})`,
      });
    }
    const area = law.area;
    if (area !== undefined && area > MAX_AREA) {
      out.push({
        element: tube.name,
        quantity: 'area',
        value: area,
        message: `${where}: cross-section ${typed(area)} m^2 is larger than ${MAX_AREA} m^2; was it given in mm^2? write mm2(${typed(area)})`,
      });
    }
    if (law.kind === 'material') {
      const m = law.material as unknown as Record<string, unknown>;
      const mu = typeof m.relativePermeability === 'number' ? m.relativePermeability : typeof m.initialRelativePermeability === 'number' ? m.initialRelativePermeability : undefined;
      if (mu !== undefined && (mu < 1 || mu > MAX_RELATIVE_PERMEABILITY)) {
        out.push({
          element: tube.name,
          quantity: 'relative permeability',
          value: mu,
          message: `${where}: relative permeability ${mu} is outside 1 to ${MAX_RELATIVE_PERMEABILITY}; give mu_r (dimensionless), not the absolute permeability in H/m`,
        });
      }
      for (const key of ['saturationPolarisation', 'saturationFluxDensity'] as const) {
        const b = m[key];
        if (typeof b === 'number' && b > MAX_FLUX_DENSITY) {
          out.push({
            element: tube.name,
            quantity: 'saturation',
            value: b,
            message: `${where}: material ${key} ${b} T is above ${MAX_FLUX_DENSITY} T, beyond any core material; give it in tesla (1 T = 10 kG = 10,000 G)`,
          });
        }
      }
    }
  }
  return out;
}

/**
 * {@link sanityWarnings} of the simulated network plus the flux densities
 * the run reached: a tube with an area whose |B| exceeds 3 T at any sample
 * (no core material carries that; the area is probably too small by a unit
 * slip, or the turns or the voltage are wrong).
 *
 * @example
 * ```ts
 * const result = simulate(net, { stopTime: 0.1 });
 * for (const w of resultSanityWarnings(result)) console.warn(w.message);
 * ```
 */
export function resultSanityWarnings(result: SimulationResult): SanityWarning[] {
  const out = sanityWarnings(result.network);
  result.network.tubes.forEach((tube, index) => {
    const area = tube.law.area;
    if (area === undefined || result.length === 0) return;
    // A handle is plain data; this one names the tube of the simulated network.
    const handle: FluxTube = { kind: 'flux-tube', name: tube.name, index, network: result.networkId ?? 0 };
    const b = result.fluxDensity(handle);
    let peak = 0;
    let at = 0;
    b.forEach((v, k) => {
      if (Math.abs(v) > peak) {
        peak = Math.abs(v);
        at = result.time[k] ?? 0;
      }
    });
    if (peak > MAX_FLUX_DENSITY) {
      out.push({
        element: tube.name,
        quantity: 'flux density',
        value: peak,
        message:
          `tube "${tube.name}": |B| reaches ${peak.toPrecision(4)} T at t = ${at.toPrecision(4)} s, above ${MAX_FLUX_DENSITY} T, which no core material carries; ` +
          `check the area (${typed(area)} m^2: mm2() for mm^2), the turns and the source amplitude`,
      });
    }
  });
  return out;
}
