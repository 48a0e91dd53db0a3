import { FluxstateError, InputError } from '../errors.js';
import type { NetworkDescription } from '../network/description.js';
import { applySweepEdits, locateTarget } from './apply-sweep-edits.js';
import { checkJsonShape } from './check-json-shape.js';
import { sweepJobSchema } from './job-schema.js';
import { schemaError } from './schema-error.js';
import { axisTargets, sweepCaseCount } from './sweep-cases.js';
import type { SweepJob, SweepOutputRequest, SweepOutputTarget, SweepQuantity, SweepValue } from './sweep-job.js';

/** Which entries each quantity can be read from. */
const QUANTITY_HOLDERS: Readonly<Record<SweepQuantity, 'tube' | 'element' | 'winding' | 'node' | 'magneticNode'>> = {
  flux: 'tube',
  fluxDensity: 'tube',
  fieldStrength: 'tube',
  mmf: 'tube',
  eddyPower: 'tube',
  residualFluxDensity: 'tube',
  hysteresisPower: 'tube',
  current: 'element',
  voltage: 'element',
  power: 'element',
  emf: 'winding',
  fluxLinkage: 'winding',
  potential: 'node',
  magneticPotential: 'magneticNode',
};

const WINDOW_METRICS = new Set(['peak', 'peak-time', 'max', 'min', 'mean', 'rms']);

function jobError(code: string, field: string, message: string, elements: readonly string[] = []): InputError {
  return new InputError(code, `sweep job: ${field}: ${message}`, [field, ...elements]);
}

/** Name of the entry an output reads, and its kind of holder. @internal */
export function outputTargetName(of: SweepOutputTarget): { holder: 'tube' | 'element' | 'node' | 'magneticNode'; name: string } {
  if ('tube' in of) return { holder: 'tube', name: of.tube };
  if ('element' in of) return { holder: 'element', name: of.element };
  if ('node' in of) return { holder: 'node', name: of.node };
  return { holder: 'magneticNode', name: of.magneticNode };
}

/** The key of an output in each case's results. @internal */
export function outputName(o: SweepOutputRequest): string {
  return o.name ?? `${o.metric} ${o.quantity} ${outputTargetName(o.of).name}`;
}

function checkOutputs(job: SweepJob): void {
  const d = job.network;
  const seen = new Set<string>();
  job.outputs.forEach((o, i) => {
    const field = `outputs[${i}]`;
    const name = outputName(o);
    if (seen.has(name)) throw jobError('sweep-bad-output', field, `output name "${name}" is used twice; give each output a unique "name"`, [name]);
    seen.add(name);
    const { holder, name: target } = outputTargetName(o.of);
    const list: readonly { name: string }[] =
      holder === 'tube' ? d.tubes : holder === 'element' ? d.elements : holder === 'node' ? d.electricNodes : d.magneticNodes;
    if (!list.some((x) => x.name === target)) {
      const known = list.map((x) => `"${x.name}"`).join(', ') || 'none';
      throw jobError('sweep-unknown-target', `${field}.of`, `network "${d.name}" has no ${holder} named "${target}" (${holder}s: ${known})`, [target]);
    }
    const wants = QUANTITY_HOLDERS[o.quantity];
    const element = holder === 'element' ? d.elements.find((x) => x.name === target) : undefined;
    const fits = wants === holder || (wants === 'winding' && element?.kind === 'winding');
    if (!fits) {
      const what = wants === 'winding' ? 'a winding' : `a ${wants}`;
      throw jobError('sweep-bad-output', `${field}.quantity`, `"${o.quantity}" is read from ${what}, but "${target}" is ${element ? `a ${element.kind}` : `a ${holder}`}`, [target]);
    }
    const tube = holder === 'tube' ? d.tubes.find((x) => x.name === target) : undefined;
    if (tube && o.quantity === 'fluxDensity' && tube.law.kind === 'reluctance' && tube.law.area === undefined) {
      throw jobError('sweep-bad-output', `${field}.quantity`, `tube "${target}" is a reluctance without an area, so it has no flux density; read its "flux" or give it an area`, [target]);
    }
    if (tube && (o.quantity === 'residualFluxDensity' || o.quantity === 'hysteresisPower') && tube.law.kind !== 'hysteretic') {
      throw jobError('sweep-bad-output', `${field}.quantity`, `tube "${target}" is not hysteretic (law kind "${tube.law.kind}"), so it has no "${o.quantity}"; read its "fluxDensity" or "eddyPower"`, [target]);
    }
    if (tube && o.quantity === 'fieldStrength' && tube.law.kind === 'reluctance') {
      throw jobError('sweep-bad-output', `${field}.quantity`, `tube "${target}" is a reluctance without a length, so it has no field strength; read its "mmf"`, [target]);
    }
    const windowed = WINDOW_METRICS.has(o.metric);
    const cyclic = o.metric === 'cycle-means';
    if (!windowed && (o.from !== undefined || o.to !== undefined)) {
      throw jobError('sweep-bad-output', `${field}`, `"from"/"to" apply to the window metrics (${[...WINDOW_METRICS].join(', ')}), not to "${o.metric}"`);
    }
    if (!cyclic && (o.period !== undefined || o.start !== undefined)) {
      throw jobError('sweep-bad-output', `${field}`, `"period"/"start" apply to "cycle-means" only, not to "${o.metric}"`);
    }
    if (cyclic && !(o.period !== undefined && o.period > 0)) {
      throw jobError('sweep-bad-output', `${field}.period`, `"cycle-means" needs a period > 0 in s (got ${String(o.period)})`);
    }
    if (o.from !== undefined && o.to !== undefined && !(o.to > o.from)) {
      throw jobError('sweep-bad-output', `${field}`, `window "to" ${o.to} s must come after "from" ${o.from} s`);
    }
  });
}

function checkSimulateOptions(job: SweepJob): void {
  const s = job.simulate;
  const t0 = s.startTime ?? 0;
  const positive = (v: number | undefined, key: string): void => {
    if (v !== undefined && !(v > 0)) throw jobError('sweep-bad-job', `simulate.${key}`, `${v} must be > 0`);
  };
  if (!(s.stopTime > t0)) throw jobError('sweep-bad-job', 'simulate.stopTime', `${s.stopTime} s must come after startTime ${t0} s`);
  if (s.rtol !== undefined && !(s.rtol > 0 && s.rtol < 1)) throw jobError('sweep-bad-job', 'simulate.rtol', `${s.rtol} must be in (0, 1)`);
  if (typeof s.atol === 'number') positive(s.atol, 'atol');
  else if (s.atol) for (const [k, v] of Object.entries(s.atol)) positive(v, `atol.${k}`);
  positive(s.maxStep, 'maxStep');
  positive(s.initialStep, 'initialStep');
  positive(s.maxSteps, 'maxSteps');
  positive(s.maxWallTimeMs, 'maxWallTimeMs');
  const sampling = s.sampling;
  if (sampling !== undefined && sampling !== 'steps') {
    if ('interval' in sampling) positive(sampling.interval, 'sampling.interval');
    else if (sampling.times.some((t) => !(t >= t0 && t <= s.stopTime))) {
      throw jobError('sweep-bad-job', 'simulate.sampling.times', `every time must lie in [${t0}, ${s.stopTime}] s`);
    }
  }
}

/** Most cases a job may hold: case indices stay exact integers and a run's bookkeeping fits in memory. */
const MAX_CASES = 10_000_000;

function checkCaseCount(job: SweepJob): void {
  const p = job.parameters;
  if (p.grid === undefined) return;
  let total = 1;
  for (const a of p.axes) total *= p.grid[a.name]?.length ?? 0;
  if (total > MAX_CASES) {
    throw jobError('sweep-bad-job', 'parameters.grid', `${total.toExponential(3)} cases (the product of the value counts) is more than ${MAX_CASES}; split the study into several jobs`);
  }
}

function checkParameters(job: SweepJob): void {
  const p = job.parameters;
  const d: NetworkDescription = job.network;
  const axisNames = new Set<string>();
  const targeted = new Map<string, string>();
  p.axes.forEach((axis, i) => {
    const field = `parameters.axes[${i}]`;
    if (axisNames.has(axis.name)) throw jobError('sweep-bad-job', `${field}.name`, `axis name "${axis.name}" is used twice; name each axis once`, [axis.name]);
    axisNames.add(axis.name);
    for (const target of axisTargets(axis)) {
      try {
        locateTarget(d, target);
      } catch (e) {
        if (e instanceof FluxstateError) throw new InputError(e.code, `sweep job: ${field} (axis "${axis.name}"): ${e.message}`, [...e.elements, axis.name]);
        throw e;
      }
      const key = `${'tube' in target ? `tube ${target.tube}` : `element ${target.element}`}.${target.field}`;
      const other = targeted.get(key);
      if (other !== undefined) {
        throw jobError('sweep-bad-job', `${field}`, `axis "${axis.name}" sets ${key}, which axis "${other}" sets too; give each field one axis`, [axis.name, other]);
      }
      targeted.set(key, axis.name);
    }
  });
  const valuesOf = new Map<string, SweepValue[]>();
  if (p.grid !== undefined) {
    for (const key of Object.keys(p.grid)) {
      if (!axisNames.has(key)) throw jobError('sweep-bad-job', `parameters.grid.${key}`, `"${key}" is not an axis (axes: ${[...axisNames].map((a) => `"${a}"`).join(', ') || 'none'})`, [key]);
    }
    for (const axis of p.axes) {
      const values = p.grid[axis.name];
      if (values === undefined || values.length === 0) {
        throw jobError('sweep-bad-job', `parameters.grid`, `axis "${axis.name}" has no values; give a non-empty list`, [axis.name]);
      }
      valuesOf.set(axis.name, [...values]);
    }
  } else {
    (p.cases ?? []).forEach((row, k) => {
      for (const key of Object.keys(row)) {
        if (!axisNames.has(key)) throw jobError('sweep-bad-job', `parameters.cases[${k}].${key}`, `"${key}" is not an axis`, [key]);
      }
      for (const axis of p.axes) {
        const v = row[axis.name];
        if (v === undefined) throw jobError('sweep-bad-job', `parameters.cases[${k}]`, `no value for axis "${axis.name}"; give every axis a value in every case`, [axis.name]);
        const list = valuesOf.get(axis.name) ?? [];
        list.push(v);
        valuesOf.set(axis.name, list);
      }
    });
  }
  // Each distinct value of each axis, applied alone to the base network: the
  // field exists and the value has its type. Ranges are checked per case.
  for (const axis of p.axes) {
    const distinct = new Map<string, SweepValue>();
    for (const v of valuesOf.get(axis.name) ?? []) distinct.set(JSON.stringify(v), v);
    for (const value of distinct.values()) {
      try {
        applySweepEdits(d, axisTargets(axis).map((target) => ({ target, value })));
      } catch (e) {
        if (e instanceof FluxstateError) {
          throw new InputError(e.code, `sweep job: axis "${axis.name}" value ${JSON.stringify(value)}: ${e.message}`, [...e.elements, axis.name]);
        }
        throw e;
      }
    }
  }
}

/**
 * Validate a sweep job (for example parsed from a JSON file) and return a
 * checked deep copy of it. Errors are `InputError`s whose message names the
 * field (`network.tubes[1] (tube "leg").law.length: Invalid input: expected
 * number, received string`) and whose `elements` list the fields and names
 * involved. Codes:
 * - `'sweep-bad-job'`: wrong shape or type, unknown field, bad simulate
 *   option, axis and grid/case keys that do not match, a bad `range`;
 * - `'sweep-unknown-target'`: an axis or output names a tube or element the
 *   network does not have;
 * - `'sweep-unknown-field'`, `'sweep-fixed-field'`, `'sweep-bad-value'`: an
 *   axis sets a field the entry does not have, cannot change, or gives a
 *   value of the wrong type;
 * - `'sweep-bad-output'`: an output whose quantity, target and metric
 *   options do not fit together.
 *
 * Not checked here: value ranges of each case (a negative resistance) and
 * function-waveform modules; those are checked when the case is built, and
 * a failing case ends with status `'error'` without stopping the others.
 *
 * @example
 * ```ts
 * const job = parseSweepJob(JSON.parse(readFileSync('inrush-job.json', 'utf8')));
 * const result = await runSweep(job);
 * ```
 */
export function parseSweepJob(input: unknown): SweepJob {
  checkJsonShape(input, 'sweep-bad-job', 'sweep job', true);
  const parsed = sweepJobSchema.safeParse(input);
  if (!parsed.success) throw schemaError('sweep-bad-job', 'sweep job', parsed.error.issues, input);
  const job = parsed.data as unknown as SweepJob;
  checkSimulateOptions(job);
  checkCaseCount(job);
  checkParameters(job);
  checkOutputs(job);
  if (job.range !== undefined) {
    const total = sweepCaseCount(job);
    const { start, end } = job.range;
    if (!(start <= end && end <= total)) {
      throw jobError('sweep-bad-job', 'range', `cases ${start}..${end} (end exclusive) do not lie within the job's ${total} cases`);
    }
  }
  return job;
}
