import { z } from 'zod';
import { checkJsonShape } from './check-json-shape.js';
import { schemaError } from './schema-error.js';
import type { SweepCaseResult, SweepResult } from './sweep-result.js';

/**
 * A number in a result file: JSON has no NaN, infinities or negative zero,
 * so those are written as the strings `"NaN"`, `"Infinity"`, `"-Infinity"`,
 * `"-0"`; every other double is written exactly (JSON.stringify prints the
 * shortest decimal that reads back to the same double).
 *
 * @example
 * ```ts
 * const values: JsonNumber[] = [1.5, 'NaN', '-Infinity', '-0'];
 * ```
 */
export type JsonNumber = number | 'NaN' | 'Infinity' | '-Infinity' | '-0';

/**
 * One case of a result file: {@link SweepCaseResult} with arrays as JSON
 * arrays.
 *
 * @example
 * ```ts
 * const c: SweepCaseResultJson = { index: 0, parameters: { angle: 0 }, status: 'success', message: 'reached t = 0.1 s', outputs: { peak: 12.5 } };
 * ```
 */
export interface SweepCaseResultJson extends Omit<SweepCaseResult, 'outputs' | 'time'> {
  readonly outputs: Readonly<Record<string, JsonNumber | readonly JsonNumber[]>>;
  readonly time?: readonly JsonNumber[];
}

/**
 * A {@link SweepResult} as JSON-ready plain data: what the sweep CLI prints
 * and what {@link sweepResultFromJson} reads back, exactly.
 *
 * @example
 * ```ts
 * writeFileSync('result.json', JSON.stringify(sweepResultToJson(result)));
 * ```
 */
export interface SweepResultJson extends Omit<SweepResult, 'cases'> {
  readonly format: 'fluxstate-sweep-result/1';
  readonly cases: readonly SweepCaseResultJson[];
}

function toJsonNumber(x: number): JsonNumber {
  if (Object.is(x, -0)) return '-0';
  if (Number.isFinite(x)) return x;
  return Number.isNaN(x) ? 'NaN' : x > 0 ? 'Infinity' : '-Infinity';
}

function fromJsonNumber(x: JsonNumber): number {
  return typeof x === 'number' ? x : Number(x);
}

/**
 * Turn a sweep result into JSON-ready data: Float64Arrays become arrays,
 * non-finite numbers become strings (see {@link JsonNumber}).
 *
 * @example
 * ```ts
 * process.stdout.write(JSON.stringify(sweepResultToJson(await runSweep(job))));
 * ```
 */
export function sweepResultToJson(result: SweepResult): SweepResultJson {
  return {
    ...result,
    format: 'fluxstate-sweep-result/1',
    cases: result.cases.map(sweepCaseResultToJson),
  };
}

/**
 * One case result as JSON-ready data (what a journal line holds); see {@link sweepResultToJson}.
 *
 * @example
 * ```ts
 * appendFileSync('run.jsonl', `${JSON.stringify(sweepCaseResultToJson(c))}\n`);
 * ```
 */
export function sweepCaseResultToJson(c: SweepCaseResult): SweepCaseResultJson {
  const outputs: Record<string, JsonNumber | JsonNumber[]> = {};
  for (const [k, v] of Object.entries(c.outputs)) outputs[k] = typeof v === 'number' ? toJsonNumber(v) : Array.from(v, toJsonNumber);
  const { time, ...rest } = c;
  return { ...rest, outputs, ...(time !== undefined ? { time: Array.from(time, toJsonNumber) } : {}) };
}

const jsonNumber = z.union([z.number(), z.literal('NaN'), z.literal('Infinity'), z.literal('-Infinity'), z.literal('-0')]);
const status = z.enum(['success', 'incomplete', 'error', 'cancelled']);
const caseSchema = z.object({
  index: z.int().check(z.nonnegative()),
  parameters: z.record(z.string(), z.json()),
  status,
  message: z.string(),
  outputs: z.record(z.string(), z.union([jsonNumber, z.array(jsonNumber)])),
  time: z.optional(z.array(jsonNumber)),
  simulation: z.optional(z.object({ status: z.string(), reachedTime: jsonNumber, stats: z.record(z.string(), z.number()) })),
  error: z.optional(z.object({ name: z.string(), code: z.optional(z.string()), elements: z.optional(z.array(z.string())) })),
});
const resultSchema = z.object({
  format: z.literal('fluxstate-sweep-result/1'),
  status: z.enum(['complete', 'cancelled']),
  name: z.optional(z.string()),
  total: z.int().check(z.nonnegative()),
  range: z.object({ start: z.int(), end: z.int() }),
  axes: z.array(z.string()),
  outputs: z.array(z.string()),
  cases: z.array(caseSchema),
  counts: z.object({ success: z.int(), incomplete: z.int(), error: z.int(), cancelled: z.int() }),
  mode: z.enum(['workers', 'in-process']),
  concurrency: z.int(),
  elapsedMs: z.number(),
});

/**
 * Read a result file back (for example a shard's output from a batch
 * system): checks its shape (`InputError` `'sweep-bad-result'` naming the
 * field) and restores Float64Arrays and non-finite numbers, so that
 * `sweepResultFromJson(JSON.parse(JSON.stringify(sweepResultToJson(r))))`
 * equals `r` bit for bit.
 *
 * @example
 * ```ts
 * const shards = files.map((f) => sweepResultFromJson(JSON.parse(readFileSync(f, 'utf8'))));
 * const all = mergeSweepResults(shards);
 * ```
 */
export function sweepResultFromJson(json: unknown): SweepResult {
  checkJsonShape(json, 'sweep-bad-result', 'sweep result');
  const parsed = resultSchema.safeParse(json);
  if (!parsed.success) throw schemaError('sweep-bad-result', 'sweep result', parsed.error.issues, json);
  const { format: _format, ...r } = parsed.data;
  return {
    ...r,
    cases: r.cases.map((c) => caseFromParsed(c as z.infer<typeof caseSchema>)),
  };
}

/** A schema-checked case back to a {@link SweepCaseResult}. */
function caseFromParsed(c: z.infer<typeof caseSchema>): SweepCaseResult {
  const outputs: Record<string, number | Float64Array> = {};
  for (const [k, v] of Object.entries(c.outputs)) outputs[k] = Array.isArray(v) ? Float64Array.from(v, fromJsonNumber) : fromJsonNumber(v as JsonNumber);
  const { time, simulation, ...rest } = c;
  return {
    ...(rest as Omit<SweepCaseResult, 'outputs' | 'time' | 'simulation'>),
    outputs,
    ...(time !== undefined ? { time: Float64Array.from(time, fromJsonNumber) } : {}),
    ...(simulation !== undefined
      ? { simulation: { ...simulation, reachedTime: fromJsonNumber(simulation.reachedTime) } as SweepCaseResult['simulation'] }
      : {}),
  };
}

/**
 * Read one case result back (a journal line); checks its shape (`InputError`
 * `'sweep-bad-result'`). The inverse of {@link sweepCaseResultToJson}.
 *
 * @example
 * ```ts
 * const c = sweepCaseResultFromJson(JSON.parse(line));
 * ```
 */
export function sweepCaseResultFromJson(json: unknown): SweepCaseResult {
  checkJsonShape(json, 'sweep-bad-result', 'sweep case result');
  const parsed = caseSchema.safeParse(json);
  if (!parsed.success) throw schemaError('sweep-bad-result', 'sweep case result', parsed.error.issues, json);
  return caseFromParsed(parsed.data);
}
