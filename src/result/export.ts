import { tubeKind } from '../elements/registry.js';
import type { NetworkDescription } from '../network/description.js';
import type { AnyHandle, TwoTerminal } from '../network/handles.js';
import { QUANTITY_UNITS, type QuantityRequest } from './state-reader.js';
import type { SolverStats, DaeStatus } from '../solver/types.js';
import type { EnergyAudit } from './energy-audit.js';
import type { SimulationResult } from './simulation-result.js';

/** A column of an export: a quantity of a handle, with an optional label. */
export type ExportColumn = QuantityRequest & { readonly label?: string };

/** Options of {@link SimulationResult.toCSV}. */
export interface CsvOptions {
  /** Columns after time; default: flux density (or flux) of every tube, current and voltage of every element. */
  readonly columns?: readonly ExportColumn[];
  /** Field separator. Default ','. */
  readonly separator?: string;
}

/** Default export columns of a result. */
export function defaultColumns(network: NetworkDescription, networkId: number): ExportColumn[] {
  const h = <K extends AnyHandle['kind']>(kind: K, name: string, index: number): Extract<AnyHandle, { kind: K }> =>
    ({ kind, name, index, network: networkId }) as unknown as Extract<AnyHandle, { kind: K }>;
  const cols: ExportColumn[] = [];
  network.tubes.forEach((t, b) => {
    const hasArea = tubeKind(t.law).hasArea(t.law);
    cols.push({ quantity: hasArea ? 'fluxDensity' : 'flux', handle: h('flux-tube', t.name, b) });
  });
  network.elements.forEach((e, k) => {
    const handle = h(e.kind, e.name, k) as TwoTerminal;
    cols.push({ quantity: 'current', handle }, { quantity: 'voltage', handle });
  });
  return cols;
}

function columnLabel(c: ExportColumn): string {
  return c.label ?? `${c.quantity} ${c.handle.name} [${QUANTITY_UNITS[c.quantity]}]`;
}

function csvField(text: string, sep: string): string {
  return /["\n\r]/.test(text) || text.includes(sep) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** CSV text of a result (RFC 4180 quoting; numbers with 17 significant digits round-trip exactly). */
export function resultToCsv(r: SimulationResult, options: CsvOptions): string {
  const sep = options.separator ?? ',';
  const cols = options.columns ?? defaultColumns(r.network, resultNetworkId(r));
  const data = cols.map((c) => r.read(c));
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
      unit: QUANTITY_UNITS[c.quantity],
      values: Array.from(r.read(c)),
    })),
  };
}

function resultNetworkId(r: SimulationResult): number {
  return r.networkId ?? -1;
}
