import type { ElementDescription, NetworkDescription, TubeDescription } from './description.js';
import { NetworkBuilder, badDescription as bad } from './network-builder.js';

type Fields = Record<string, unknown>;

function isObject(v: unknown): v is Fields {
  return v !== null && typeof v === 'object';
}

/**
 * Check a plain-data {@link NetworkDescription} that did not come straight
 * from a builder (read from JSON, sent to a worker, written by another
 * program) with exactly the checks the builder makes, and return a frozen
 * copy equal to it.
 *
 * It replays the description through a fresh {@link NetworkBuilder}: every
 * number, name, material, waveform and switch schedule meets the builder's
 * own check, so a fault gets the same code and message as the builder call
 * would have given (`non-positive-value`, `bad-waveform`, `duplicate-name`...).
 * What only plain data can get wrong (a missing list, an index out of range,
 * an unknown element kind) throws `InputError` with code `bad-description`,
 * naming the element and the field. Topology is checked later, by `simulate`.
 *
 * @example
 * ```ts
 * const description = validateDescription(JSON.parse(readFileSync('choke.json', 'utf8')));
 * const result = simulate(description, { stopTime: 0.02 });
 * ```
 */
export function validateDescription(description: NetworkDescription): NetworkDescription {
  return replayDescription(description).describe();
}

/**
 * Replay a plain-data description through a fresh builder, element by
 * element ({@link NetworkBuilder.tube}, {@link NetworkBuilder.element}), so
 * that every value meets the checks of its kind; returns the builder.
 *
 * @example
 * ```ts
 * const net = replayDescription(JSON.parse(text));
 * const coil = net.describe().elements[0];
 * ```
 */
export function replayDescription(description: NetworkDescription): NetworkBuilder {
  if (!isObject(description)) bad(`expected an object { name, electricNodes, magneticNodes, tubes, elements }, got ${String(description)}`, []);
  const d = description as unknown as Fields;
  for (const list of ['electricNodes', 'magneticNodes', 'tubes', 'elements'] as const) {
    if (!Array.isArray(d[list])) bad(`"${list}" is ${d[list] === undefined ? 'missing' : 'not an array'}; give a list (possibly empty)`, [list]);
  }
  const electric = d.electricNodes as unknown[];
  const nameOf = (v: unknown, fallback: string): string => (isObject(v) && typeof v.name === 'string' ? v.name : fallback);
  const net = new NetworkBuilder(d.name as string);
  if (nameOf(electric[0], '') !== 'ground') {
    bad(`electric node 0 must be the reference node "ground", got ${JSON.stringify(nameOf(electric[0], String(electric[0])))}`, ['electricNodes']);
  }
  for (let k = 1; k < electric.length; k++) net.node(nameOf(electric[k], undefined as unknown as string));
  for (const m of d.magneticNodes as unknown[]) net.magneticNode(nameOf(m, undefined as unknown as string));
  (d.tubes as unknown[]).forEach((raw) => net.tube((isObject(raw) ? raw : {}) as unknown as TubeDescription));
  (d.elements as unknown[]).forEach((raw) => net.element((isObject(raw) ? raw : {}) as unknown as ElementDescription));
  return net;
}

