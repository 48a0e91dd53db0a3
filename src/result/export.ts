import type { NetworkDescription } from '../network/description.js';
import type { AnyHandle, ElectricNode, FluxTube, MagneticNode, TwoTerminal, Winding } from '../network/handles.js';
import type { SolverStats, DaeStatus } from '../solver/types.js';
import type { EnergyAudit } from './energy-audit.js';
import type { SimulationResult } from './simulation-result.js';

/** Quantities that can be exported, with the handle kinds they apply to. */
export type ExportColumn =
  | { readonly quantity: 'flux' | 'fluxDensity' | 'fieldStrength' | 'mmf' | 'eddyPower'; readonly handle: FluxTube; readonly label?: string }
  | { readonly quantity: 'current' | 'voltage' | 'power'; readonly handle: TwoTerminal; readonly label?: string }
  | { readonly quantity: 'emf' | 'fluxLinkage'; readonly handle: Winding; readonly label?: string }
  | { readonly quantity: 'potential'; readonly handle: ElectricNode; readonly label?: string }
  | { readonly quantity: 'magneticPotential'; readonly handle: MagneticNode; readonly label?: string };

/** Options of {@link SimulationResult.toCSV}. */
export interface CsvOptions {
  /** Columns after time; default: flux density (or flux) of every tube, current and voltage of every element. */
  readonly columns?: readonly ExportColumn[];
  /** Field separator. Default ','. */
  readonly separator?: string;
}

const UNITS: Record<ExportColumn['quantity'], string> = {
  flux: 'Wb', fluxDensity: 'T', fieldStrength: 'A/m', mmf: 'A', eddyPower: 'W',
  current: 'A', voltage: 'V', power: 'W', emf: 'V', fluxLinkage: 'Wb', potential: 'V', magneticPotential: 'A',
};

/** Default export columns of a result. */
export function defaultColumns(network: NetworkDescription, networkId: number): ExportColumn[] {
  const h = <K extends AnyHandle['kind']>(kind: K, name: string, index: number): Extract<AnyHandle, { kind: K }> =>
    ({ kind, name, index, network: networkId }) as unknown as Extract<AnyHandle, { kind: K }>;
  const cols: ExportColumn[] = [];
  network.tubes.forEach((t, b) => {
    const hasArea = t.law.kind !== 'reluctance' || t.law.area !== undefined;
    cols.push({ quantity: hasArea ? 'fluxDensity' : 'flux', handle: h('flux-tube', t.name, b) });
  });
  network.elements.forEach((e, k) => {
    const handle = h(e.kind, e.name, k) as TwoTerminal;
    cols.push({ quantity: 'current', handle }, { quantity: 'voltage', handle });
  });
  return cols;
}

function columnLabel(c: ExportColumn): string {
  return c.label ?? `${c.quantity} ${c.handle.name} [${UNITS[c.quantity]}]`;
}

function columnValues(r: SimulationResult, c: ExportColumn): Float64Array {
  switch (c.quantity) {
    case 'flux': return r.flux(c.handle);
    case 'fluxDensity': return r.fluxDensity(c.handle);
    case 'fieldStrength': return r.fieldStrength(c.handle);
    case 'mmf': return r.mmf(c.handle);
    case 'eddyPower': return r.eddyPower(c.handle);
    case 'current': return r.current(c.handle);
    case 'voltage': return r.voltage(c.handle);
    case 'power': return r.power(c.handle);
    case 'emf': return r.emf(c.handle);
    case 'fluxLinkage': return r.fluxLinkage(c.handle);
    case 'potential': return r.potential(c.handle);
    case 'magneticPotential': return r.magneticPotential(c.handle);
  }
}

function csvField(text: string, sep: string): string {
  return /["\n\r]/.test(text) || text.includes(sep) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** CSV text of a result (RFC 4180 quoting; numbers with 17 significant digits round-trip exactly). */
export function resultToCsv(r: SimulationResult, options: CsvOptions): string {
  const sep = options.separator ?? ',';
  const cols = options.columns ?? defaultColumns(r.network, resultNetworkId(r));
  const data = cols.map((c) => columnValues(r, c));
  const lines = [['time [s]', ...cols.map(columnLabel)].map((x) => csvField(x, sep)).join(sep)];
  for (let k = 0; k < r.time.length; k++) {
    lines.push([r.time[k]!, ...data.map((d) => d[k]!)].map((x) => String(x)).join(sep));
  }
  return lines.join('\n') + '\n';
}

/** JSON form of a result. */
export interface ResultJson {
  readonly network: unknown;
  readonly status: DaeStatus;
  readonly message: string;
  readonly stats: SolverStats;
  readonly energy: EnergyAudit;
  readonly time: number[];
  readonly series: { readonly label: string; readonly quantity: string; readonly element: string; readonly unit: string; readonly values: number[] }[];
}

/** Plain-data form of a result (live material objects in the network are replaced by their names). */
export function resultToJson(r: SimulationResult): ResultJson {
  const cols = defaultColumns(r.network, resultNetworkId(r));
  return {
    network: JSON.parse(JSON.stringify(r.network, (_k, v: unknown) =>
      v !== null && typeof v === 'object' && 'fieldStrength' in v ? { kind: 'live-law', name: (v as { name?: string }).name } : typeof v === 'function' ? '[function]' : v)),
    status: r.status,
    message: r.message,
    stats: { ...r.stats },
    energy: r.energy(),
    time: Array.from(r.time),
    series: cols.map((c) => ({
      label: columnLabel(c),
      quantity: c.quantity,
      element: c.handle.name,
      unit: UNITS[c.quantity],
      values: Array.from(columnValues(r, c)),
    })),
  };
}

function resultNetworkId(r: SimulationResult): number {
  return r.networkId ?? -1;
}
