import type { ListingParameter } from '../elements/element-kind.js';
import { elementKind, tubeKind } from '../elements/registry.js';
import { compileMaterial } from '../materials/material-spec.js';
import { MU0 } from '../constants.js';
import { residualFluxDensityAtEnd } from '../elements/hysteretic-tube-readings.js';
import type { NetworkDescription, TubeDescription } from '../network/description.js';
import type { ExportColumn } from '../result/export.js';
import type { SimulationResult } from '../result/simulation-result.js';
import { QUANTITY_UNITS } from '../result/state-reader.js';
import { resultSanityWarnings } from '../analysis/sanity-warnings.js';
import { formatNumber } from './format-number.js';
import type { MetricRow, MetricTable, NetworkRow, PlotGroup, PlotSeries, ReportData, ReportInfoItem, ReportSection } from './report-data.js';

/**
 * A plot of a result: a title and the quantities to draw (see {@link ExportColumn}).
 *
 * @example
 * ```ts
 * const plot: ResultPlot = {
 *   title: 'Primary',
 *   series: [{ quantity: 'current', handle: primary, label: 'current' }, { quantity: 'voltage', handle: primary, label: 'voltage' }],
 * };
 * ```
 */
export interface ResultPlot {
  readonly title: string;
  readonly description?: string;
  readonly series: readonly ExportColumn[];
  /** Draw +-saturation flux density lines for the flux-density series whose material has one. Default true. */
  readonly saturationLines?: boolean;
}

/**
 * Options of {@link resultReport}.
 *
 * @example
 * ```ts
 * const options: ResultReportOptions = {
 *   title: 'Energisation at a voltage zero',
 *   subtitle: 'Remanence 0.8 T (invented design)',
 *   plots: [{ title: 'Flux density', series: [{ quantity: 'fluxDensity', handle: leg, label: 'wound leg' }] }],
 *   metrics: [{ title: 'Study', rows: [{ name: 'peak inrush', value: 97.3, unit: 'A' }] }],
 * };
 * writeReport('out/energisation.html', resultReport(result, options));
 * ```
 */
export interface ResultReportOptions {
  readonly title: string;
  readonly subtitle?: string;
  /** Plots; default: flux density of every tube, then every winding current. */
  readonly plots?: readonly ResultPlot[];
  /** Extra metric tables placed before the standard ones. */
  readonly metrics?: readonly MetricTable[];
  /** Extra info lines. */
  readonly info?: readonly ReportInfoItem[];
  /** Free text under the first section's heading. */
  readonly description?: string;
  /** Replaces the default caution wording (it cannot be removed). */
  readonly caution?: string;
  /**
   * Points drawn inside each solver step, from the solver's dense output, so
   * that curves are smooth between steps (a sine's crest is not faceted).
   * 0 draws straight lines between the samples. Default 4; densification is
   * skipped for results of more than 100,000 samples (they are dense enough)
   * and for results without recorded steps.
   */
  readonly pointsPerStep?: number;
}

/** Axis names of the quantities (their units come from QUANTITY_UNITS). */
const QUANTITY_NAMES: Record<ExportColumn['quantity'], string> = {
  flux: 'Flux', fluxDensity: 'Flux density', fieldStrength: 'Field strength', mmf: 'MMF drop', eddyPower: 'Eddy power',
  current: 'Current', voltage: 'Voltage', power: 'Power', emf: 'EMF', fluxLinkage: 'Flux linkage', copperLoss: 'Copper loss',
  potential: 'Potential', magneticPotential: 'Magnetic potential',
};

/**
 * Turn a simulation result into report data: waveform plots (with the
 * saturation flux density drawn on flux-density plots), a table of peak flux
 * density and margin to saturation per tube, peak currents, the energy audit
 * and the solver's statistics, and the network listing with units.
 *
 * @example
 * ```ts
 * const result = simulate(net, { stopTime: 0.2 });
 * writeReport('out/energisation.html', resultReport(result, { title: 'Energisation at voltage zero' }));
 * ```
 */
export function resultReport(result: SimulationResult, options: ResultReportOptions): ReportData {
  const d = result.network;
  const handle = <K extends ExportColumn['handle']['kind']>(kind: K, name: string, index: number) =>
    ({ kind, name, index, network: result.networkId ?? -1 }) as unknown as Extract<ExportColumn['handle'], { kind: K }>;
  const plots = options.plots ?? defaultPlots(d, handle);
  const time = timeAxis(result);
  const plotGroups = plots.map((p) => plotGroup(result, p, time, options.pointsPerStep ?? 4));
  const sections: ReportSection[] = [
    { title: 'Waveforms', ...(options.description ? { description: options.description } : {}), plots: plotGroups },
    { title: 'Figures', metrics: [...(options.metrics ?? []), ...standardMetrics(result, handle)] },
    { title: 'Network', network: { title: `Network "${d.name}" (SI units)`, rows: networkRows(d) } },
  ];
  // The status in the API's own words: 'success' only for a run that reached its stop time.
  const warnings = [...result.warnings, ...resultSanityWarnings(result).map((w) => w.message)];
  const info: ReportInfoItem[] = [
    { label: 'Status', value: result.status === 'success' ? 'success' : `${result.status}: ${result.message}` },
    {
      label: 'Simulated time',
      value: `${formatNumber((result.time[0] ?? 0) * time.scale, 4)} ${time.unit} to ${formatNumber((result.time[result.time.length - 1] ?? 0) * time.scale, 4)} ${time.unit}`,
    },
    { label: 'Solver', value: `Radau IIA (order 5); ${result.stats.acceptedSteps} steps, ${result.stats.rejectedSteps} rejected` },
    ...(warnings.length ? [{ label: warnings.length === 1 ? 'Warning' : `Warnings (${warnings.length})`, value: warnings.join(' \u2022 ') }] : []),
    ...(options.info ?? []),
  ];
  return {
    title: options.title,
    ...(options.subtitle ? { subtitle: options.subtitle } : {}),
    info,
    ...(options.caution ? { caution: options.caution } : {}),
    sections,
  };
}

function defaultPlots(
  d: NetworkDescription,
  handle: <K extends ExportColumn['handle']['kind']>(kind: K, name: string, index: number) => Extract<ExportColumn['handle'], { kind: K }>,
): ResultPlot[] {
  const plots: ResultPlot[] = [];
  const tubes = d.tubes.flatMap((t, b) => (hasFluxDensityRow(t) ? [{ quantity: 'fluxDensity' as const, handle: handle('flux-tube', t.name, b) }] : []));
  if (tubes.length > 0) plots.push({ title: 'Flux density per tube', series: tubes });
  const windings = d.elements.flatMap((e, k) => (e.kind === 'winding' ? [{ quantity: 'current' as const, handle: handle('winding', e.name, k) }] : []));
  if (windings.length > 0) plots.push({ title: 'Winding currents', series: windings });
  return plots;
}

/**
 * The time unit of the plots: s, ms or us by the run's span, so that a
 * 500 us run reads 0 to 500 us rather than 0 to 0.0005 s.
 */
function timeAxis(r: SimulationResult): { unit: string; scale: number } {
  const span = Math.abs((r.time[r.time.length - 1] ?? 0) - (r.time[0] ?? 0));
  const end = Math.max(Math.abs(r.time[0] ?? 0), Math.abs(r.time[r.time.length - 1] ?? 0));
  const size = Math.max(span, end);
  if (size > 0 && size < 2e-3) return { unit: '\u00B5s', scale: 1e6 };
  if (size > 0 && size < 2) return { unit: 'ms', scale: 1e3 };
  return { unit: 's', scale: 1 };
}

/**
 * Times and values of a quantity for drawing: the samples themselves, plus
 * `perStep` points inside every sample interval from the dense output (the
 * solver's collocation polynomial), so curves are not faceted between steps.
 * Falls back to the samples when the result has no dense output.
 */
function plotSamples(r: SimulationResult, c: ExportColumn, perStep: number): { t: Float64Array; values: Float64Array } {
  const t = r.time;
  const x = r.read(c);
  if (perStep <= 0 || t.length < 2 || t.length > 100_000) return { t, values: x };
  let at: (s: number) => number;
  try {
    at = r.evaluator(c);
    at(t[0]!);
  } catch {
    return { t, values: x };
  }
  const times: number[] = [];
  const values: number[] = [];
  for (let i = 0; i < t.length; i++) {
    times.push(t[i]!);
    values.push(x[i]!);
    const t0 = t[i]!;
    const t1 = t[i + 1];
    if (t1 === undefined || !(t1 > t0)) continue;
    for (let k = 1; k <= perStep; k++) {
      const s = t0 + ((t1 - t0) * k) / (perStep + 1);
      const v = at(s);
      if (!Number.isFinite(v)) return { t, values: x };
      times.push(s);
      values.push(v);
    }
  }
  return { t: Float64Array.from(times), values: Float64Array.from(values) };
}

function plotGroup(r: SimulationResult, p: ResultPlot, time: { unit: string; scale: number }, perStep: number): PlotGroup {
  const series: PlotSeries[] = p.series.map((c) => {
    const quantity = QUANTITY_NAMES[c.quantity];
    const unit = QUANTITY_UNITS[c.quantity];
    const samples = plotSamples(r, c, perStep);
    return { label: c.label ?? c.handle.name, unit, quantity, t: samples.t.map((v) => v * time.scale), values: samples.values };
  });
  const saturation = new Set<number>();
  if (p.saturationLines ?? true) {
    for (const c of p.series) {
      if (c.quantity !== 'fluxDensity') continue;
      const bs = saturationOf(r.network.tubes[c.handle.index]!);
      if (bs !== undefined) saturation.add(bs);
    }
  }
  // The page prints a reference as "label = value unit": the label carries no value of its own.
  const references = [...saturation].flatMap((bs) => [
    { label: saturation.size > 1 ? `+B_sat (${bs} T material)` : '+B_sat', value: bs, unit: 'T' },
    { label: saturation.size > 1 ? `-B_sat (${bs} T material)` : '-B_sat', value: -bs, unit: 'T' },
  ]);
  return {
    title: p.title,
    ...(p.description ? { description: p.description } : {}),
    xUnit: time.unit,
    series,
    ...(references.length ? { references } : {}),
  };
}

function saturationOf(t: TubeDescription): number | undefined {
  if (t.law.kind === 'hysteretic') return t.law.material.saturationFluxDensity ?? MU0 * t.law.material.saturationMagnetisation;
  if (t.law.kind !== 'material') return undefined;
  return compileMaterial(t.law.material).saturationFluxDensity;
}

/** Tubes of a material (single-valued or hysteretic) get flux-density plots and rows. */
function hasFluxDensityRow(t: TubeDescription): boolean {
  return t.law.kind === 'material' || t.law.kind === 'hysteretic';
}

function standardMetrics(
  r: SimulationResult,
  handle: <K extends ExportColumn['handle']['kind']>(kind: K, name: string, index: number) => Extract<ExportColumn['handle'], { kind: K }>,
): MetricTable[] {
  const d = r.network;
  const peakAbs = (x: Float64Array): number => x.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
  const bRows: MetricRow[] = d.tubes.flatMap((t, b) => {
    if (!hasFluxDensityRow(t)) return [];
    const peak = peakAbs(r.fluxDensity(handle('flux-tube', t.name, b)));
    const bs = saturationOf(t);
    const rows: MetricRow[] = [{ name: `peak |B| ${t.name}`, value: peak, unit: 'T' }];
    if (bs !== undefined) {
      const margin = bs - peak;
      rows.push({
        name: `margin to B_sat ${t.name}`, value: margin, unit: 'T', note: `B_sat = ${bs} T`,
        status: margin < 0 ? 'alert' : margin < 0.1 * bs ? 'warning' : 'ok',
      });
    }
    if (t.law.kind === 'hysteretic') {
      rows.push({
        name: `residual B ${t.name}`, value: residualFluxDensityAtEnd(r, handle('flux-tube', t.name, b)), unit: 'T',
        note: 'where B settles if H relaxes to zero from the last sample (remanence a re-energisation starts from)',
      });
    }
    return rows;
  });
  const iRows: MetricRow[] = d.elements.flatMap((e, k) =>
    e.kind === 'winding' || e.kind === 'voltage-source'
      ? [{ name: `peak |i| ${e.name}`, value: peakAbs(r.current(handle(e.kind, e.name, k))), unit: 'A' }]
      : [],
  );
  const audit = r.energy();
  const energyRows: MetricRow[] = [
    { name: 'energy from sources', value: audit.sourceEnergy, unit: 'J' },
    { name: 'dissipated (resistors, switches)', value: audit.dissipated.resistors, unit: 'J' },
    { name: 'dissipated (winding copper)', value: audit.dissipated.windings, unit: 'J' },
    { name: 'dissipated (eddy currents)', value: audit.dissipated.eddy, unit: 'J' },
    ...(audit.byTube.some((t) => t.hysteresis > 0) ? [{ name: 'dissipated (hysteresis)', value: audit.dissipated.hysteresis, unit: 'J' }] : []),
    { name: 'stored energy change', value: audit.storedEnd - audit.storedStart, unit: 'J' },
    {
      name: 'energy audit relative error', value: audit.relativeError, digits: 2,
      status: audit.relativeError < 1e-4 ? 'ok' : audit.relativeError < 1e-2 ? 'warning' : 'alert',
      note: 'sources - losses - change of stored energy, over the energy exchanged',
    },
  ];
  // Eddy loss of every tube with an eddy resistance, hysteresis loss beside it for hysteretic tubes.
  const lossRows: MetricRow[] = audit.byTube.flatMap((t) => {
    const tube = d.tubes.find((x) => x.name === t.tube);
    const rows: MetricRow[] = [];
    if (tube?.eddyResistance !== undefined && tube.eddyResistance > 0) rows.push({ name: `eddy loss ${t.tube}`, value: t.eddy, unit: 'J' });
    if (tube?.law.kind === 'hysteretic') rows.push({ name: `hysteresis loss ${t.tube}`, value: t.hysteresis, unit: 'J', note: 'loop area x volume per cycle' });
    return rows;
  });
  const s = r.stats;
  const solverRows: MetricRow[] = [
    { name: 'accepted steps', value: s.acceptedSteps, digits: 15 },
    { name: 'rejected steps', value: s.rejectedSteps, digits: 15 },
    { name: 'f evaluations', value: s.rhsEvaluations, digits: 15 },
    { name: 'Jacobians', value: s.jacobianEvaluations, digits: 15 },
    { name: 'LU factorisations', value: s.luFactorizations, digits: 15 },
  ];
  return [
    ...(bRows.length ? [{ title: 'Flux density', rows: bRows }] : []),
    ...(iRows.length ? [{ title: 'Currents', rows: iRows }] : []),
    { title: 'Energy audit', rows: energyRows },
    ...(lossRows.length ? [{ title: 'Losses per tube', rows: lossRows }] : []),
    { title: 'Solver', rows: solverRows },
  ];
}

function networkRows(d: NetworkDescription): NetworkRow[] {
  const node = (k: number): string => d.electricNodes[k]!.name;
  const mnode = (k: number): string => d.magneticNodes[k]!.name;
  const rows: NetworkRow[] = d.tubes.map((t) => {
    const kind = tubeKind(t.law);
    const parameters: ListingParameter[] = kind.listing(t.law);
    if (t.eddyResistance !== undefined) parameters.push({ name: 'eddy resistance', value: t.eddyResistance, unit: 'ohm' });
    if (t.initialFluxDensity !== undefined) parameters.push({ name: 'initial B', value: t.initialFluxDensity, unit: 'T' });
    if (t.initialFlux !== undefined) parameters.push({ name: 'initial flux', value: t.initialFlux, unit: 'Wb' });
    return { element: t.name, kind: kind.noun, connections: `${mnode(t.from)} -> ${mnode(t.to)}`, parameters };
  });
  for (const e of d.elements) {
    const kind = elementKind(e);
    rows.push({ element: e.name, kind: kind.noun, connections: `${node(e.plus)} -> ${node(e.minus)}`, parameters: kind.listing(e, d) });
  }
  return rows;
}
