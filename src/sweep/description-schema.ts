import { z } from 'zod';
import type { MaterialLaw } from '../materials/material-law.js';
import type { NetworkDescription } from '../network/description.js';

// zod schemas of the plain-data network description (src/network/description.ts),
// material specs (src/materials) and waveform specs (src/waveforms). Objects are
// strict, so a misspelt field is an error rather than silently ignored. They check
// shape and types; value domains (positive lengths, sorted tables...) are checked by
// the network builder when a case is rebuilt (network-from-description.ts), so the
// rules live in one place. Keep these in step with the interfaces: the type test in
// test/sweep/description-schema.test-d.ts fails when they drift apart.

const num = z.number();
const optNum = z.optional(num);
const index = z.int().check(z.nonnegative());

/** A live material law object (in-process runs only). */
const liveMaterial = z.custom<MaterialLaw>(
  (v) => typeof v === 'object' && v !== null && typeof (v as { fieldStrength?: unknown }).fieldStrength === 'function',
  { message: 'expected a material spec or a live material law' },
);

const materialSpec = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('linear'),
    relativePermeability: num,
    name: z.optional(z.string()),
    saturationFluxDensity: optNum,
  }),
  z.strictObject({
    kind: z.literal('frohlich-kennelly'),
    initialRelativePermeability: num,
    saturationPolarisation: num,
    name: z.optional(z.string()),
    saturationFluxDensity: optNum,
  }),
  z.strictObject({
    kind: z.literal('brauer'),
    k1: num,
    k2: num,
    k3: num,
    name: z.optional(z.string()),
    saturationFluxDensity: optNum,
  }),
  z.strictObject({
    kind: z.literal('table'),
    fluxDensity: z.array(num),
    fieldStrength: z.array(num),
    name: z.optional(z.string()),
    saturationFluxDensity: optNum,
  }),
]);

/** Schema of a material: a plain-data spec, or a live law (in-process only). @internal */
export const materialSchema = z.union([materialSpec, liveMaterial]);

/** Schema of a waveform spec (every kind of src/waveforms). @internal */
export const waveformSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('constant'), value: num }),
  z.strictObject({ kind: z.literal('sine'), amplitude: num, frequency: num, phase: optNum, offset: optNum, start: optNum }),
  z.strictObject({
    kind: z.literal('pulse'), low: optNum, high: num, period: num, duty: num, delay: optNum, rise: optNum, fall: optNum,
  }),
  z.strictObject({
    kind: z.literal('bipolar-square'), amplitude: num, period: num, deadTime: optNum, mismatch: optNum, delay: optNum,
  }),
  z.strictObject({ kind: z.literal('piecewise-linear'), times: z.array(num), values: z.array(num), period: optNum }),
  z.strictObject({
    kind: z.literal('function'),
    fn: z.optional(z.custom<(t: number) => number>((v) => typeof v === 'function', { message: 'expected a function' })),
    module: z.optional(z.string()),
    export: z.optional(z.string()),
    breakpoints: z.optional(z.array(num)),
    name: z.optional(z.string()),
  }),
]);

const tubeLaw = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('material'), length: num, area: num, material: materialSchema }),
  z.strictObject({ kind: z.literal('air-gap'), length: num, area: num, fringingFactor: num }),
  z.strictObject({ kind: z.literal('reluctance'), reluctance: num, area: optNum }),
  z.strictObject({
    kind: z.literal('hysteretic'),
    length: num,
    area: num,
    material: z.strictObject({
      kind: z.literal('jiles-atherton'),
      name: z.string().optional(),
      saturationMagnetisation: num,
      anhystereticShape: num,
      pinning: num,
      reversibility: num,
      interdomainCoupling: num,
      saturationFluxDensity: optNum,
    }),
    initialMagnetisation: optNum,
  }),
]);

const tube = z.strictObject({
  name: z.string(),
  from: index,
  to: index,
  law: tubeLaw,
  eddyResistance: optNum,
  initialFlux: optNum,
  initialFluxDensity: optNum,
});

const terminals = { name: z.string(), plus: index, minus: index };

const element = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('resistor'), ...terminals, resistance: num }),
  z.strictObject({ kind: z.literal('capacitor'), ...terminals, capacitance: num, initialVoltage: num }),
  z.strictObject({ kind: z.literal('inductor'), ...terminals, inductance: num, initialCurrent: num }),
  z.strictObject({ kind: z.literal('voltage-source'), ...terminals, waveform: waveformSchema }),
  z.strictObject({ kind: z.literal('current-source'), ...terminals, waveform: waveformSchema }),
  z.strictObject({
    kind: z.literal('switch'), ...terminals,
    onResistance: num, offResistance: num, initiallyClosed: z.boolean(), toggleTimes: z.array(num),
    gate: z.optional(waveformSchema), capacitance: optNum,
  }),
  z.strictObject({
    kind: z.literal('diode'), ...terminals,
    junction: z.union([z.literal('ideal'), z.literal('exponential')]),
    forwardVoltage: num, onResistance: num, offConductance: num,
    saturationCurrent: num, emissionCoefficient: num, thermalVoltage: num, capacitance: num, initiallyOn: z.boolean(),
  }),
  z.strictObject({
    kind: z.literal('winding'), ...terminals,
    tube: index, turns: num, resistance: num, orientation: z.union([z.literal(1), z.literal(-1)]),
  }),
]);

const named = z.strictObject({ name: z.string() });

/**
 * Schema of a {@link NetworkDescription}: shapes and types, node and tube
 * indices in range, electric node 0 named as the ground.
 *
 * @internal
 */
export const networkSchema = z
  .strictObject({
    name: z.string(),
    electricNodes: z.array(named).check(z.minLength(1, 'needs at least the ground node')),
    magneticNodes: z.array(named),
    tubes: z.array(tube),
    elements: z.array(element),
  })
  .superRefine((d, ctx) => {
    const bad = (path: (string | number)[], message: string): void => {
      ctx.addIssue({ code: 'custom', path, message });
    };
    if (d.electricNodes[0]?.name !== 'ground') bad(['electricNodes', 0, 'name'], 'electric node 0 is the ground and must be named "ground"');
    d.tubes.forEach((t, i) => {
      for (const end of ['from', 'to'] as const) {
        if (t[end] >= d.magneticNodes.length) bad(['tubes', i, end], `magnetic node index ${t[end]} is out of range (${d.magneticNodes.length} magnetic nodes)`);
      }
    });
    d.elements.forEach((e, i) => {
      for (const end of ['plus', 'minus'] as const) {
        if (e[end] >= d.electricNodes.length) bad(['elements', i, end], `electric node index ${e[end]} is out of range (${d.electricNodes.length} electric nodes)`);
      }
      if (e.kind === 'winding' && e.tube >= d.tubes.length) bad(['elements', i, 'tube'], `tube index ${e.tube} is out of range (${d.tubes.length} tubes)`);
    });
  });

// Compile-time check that the schema's output is a NetworkDescription.
const _networkSchemaMatches: (v: z.output<typeof networkSchema>) => NetworkDescription = (v) => v;
void _networkSchemaMatches;
