import { z } from 'zod';
import { networkSchema } from './description-schema.js';
import { SWEEP_JOB_FORMAT } from './sweep-job.js';

// zod schema of a sweep job (sweep-job.ts). Shapes and types only; names,
// fields and combinations are checked in parse-sweep-job.ts.

const num = z.number();
const optNum = z.optional(num);
const name = z.string().check(z.minLength(1, 'must be a non-empty string'));

/** Exactly one of `keys` present. */
function exactlyOne(keys: readonly string[]) {
  return (v: Record<string, unknown>, ctx: z.RefinementCtx): void => {
    const given = keys.filter((k) => v[k] !== undefined);
    if (given.length !== 1) {
      ctx.addIssue({
        code: 'custom',
        message: given.length === 0 ? `give one of ${keys.map((k) => `"${k}"`).join(', ')}` : `give only one of ${given.map((k) => `"${k}"`).join(', ')}`,
      });
    }
  };
}

const target = z
  .strictObject({ tube: z.optional(name), element: z.optional(name), field: name })
  .superRefine(exactlyOne(['tube', 'element']));

const axis = z.strictObject({ name, target: z.union([target, z.array(target).check(z.minLength(1))]) });

const parameters = z
  .strictObject({
    axes: z.array(axis),
    grid: z.optional(z.record(z.string(), z.array(z.json()))),
    cases: z.optional(z.array(z.record(z.string(), z.json()))),
  })
  .superRefine(exactlyOne(['grid', 'cases']));

const outputTarget = z
  .strictObject({ tube: z.optional(name), element: z.optional(name), node: z.optional(name), magneticNode: z.optional(name) })
  .superRefine(exactlyOne(['tube', 'element', 'node', 'magneticNode']));

/** Quantities a sweep output may read. @internal */
export const SWEEP_QUANTITIES = [
  'flux', 'fluxDensity', 'fieldStrength', 'mmf', 'eddyPower', 'residualFluxDensity', 'hysteresisPower',
  'current', 'voltage', 'power', 'emf', 'fluxLinkage', 'potential', 'magneticPotential',
] as const;

/** Metrics a sweep output may compute. @internal */
export const SWEEP_METRICS = ['peak', 'peak-time', 'max', 'min', 'mean', 'rms', 'final', 'cycle-means', 'series'] as const;

const output = z.strictObject({
  name: z.optional(name),
  quantity: z.enum(SWEEP_QUANTITIES),
  of: outputTarget,
  metric: z.enum(SWEEP_METRICS),
  from: optNum,
  to: optNum,
  period: optNum,
  start: optNum,
});

const sampling = z.union([
  z.literal('steps'),
  z.strictObject({ interval: num, includeSteps: z.optional(z.boolean()) }),
  z.strictObject({ times: z.array(num), includeSteps: z.optional(z.boolean()) }),
]);

const simulateOptions = z.strictObject({
  stopTime: num,
  startTime: optNum,
  rtol: optNum,
  atol: z.optional(z.union([num, z.strictObject({ voltage: optNum, current: optNum, fluxDensity: optNum })])),
  maxStep: optNum,
  initialStep: optNum,
  sampling: z.optional(sampling),
  maxSteps: optNum,
  maxWallTimeMs: optNum,
  formulation: z.optional(z.enum(['full', 'reduced'])),
});

const count = z.int().check(z.nonnegative());

/** Schema of a sweep job file. @internal */
export const sweepJobSchema = z.strictObject({
  format: z.optional(z.literal(SWEEP_JOB_FORMAT)),
  name: z.optional(z.string()),
  network: networkSchema,
  simulate: simulateOptions,
  parameters,
  outputs: z.array(output),
  range: z.optional(z.strictObject({ start: count, end: count })),
});
