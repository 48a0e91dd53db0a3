import { InputError } from '../errors.js';
import type { MaterialLaw } from '../materials/material-law.js';
import type { MaterialSpec } from '../materials/material-spec.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';
import type { ElementDescription, NetworkDescription, TubeDescription } from './description.js';
import type { ElectricNode, FluxTube, MagneticNode } from './handles.js';
import { NetworkBuilder } from './network-builder.js';

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
  const bad = (text: string, elements: readonly string[]): never => {
    throw new InputError('bad-description', `network description: ${text}`, elements);
  };
  if (!isObject(description)) bad(`expected an object { name, electricNodes, magneticNodes, tubes, elements }, got ${String(description)}`, []);
  const d = description as unknown as Fields;
  for (const list of ['electricNodes', 'magneticNodes', 'tubes', 'elements'] as const) {
    if (!Array.isArray(d[list])) bad(`"${list}" is ${d[list] === undefined ? 'missing' : 'not an array'}; give a list (possibly empty)`, [list]);
  }
  const electric = d.electricNodes as unknown[];
  const magnetic = d.magneticNodes as unknown[];
  const tubes = d.tubes as unknown[];
  const elements = d.elements as unknown[];
  const nameOf = (v: unknown, fallback: string): string => (isObject(v) && typeof v.name === 'string' ? v.name : fallback);

  const net = new NetworkBuilder(d.name as string);
  if (nameOf(electric[0], '') !== 'ground') {
    bad(`electric node 0 must be the reference node "ground", got ${JSON.stringify(nameOf(electric[0], String(electric[0])))}`, ['electricNodes']);
  }
  const nodes: ElectricNode[] = [net.ground];
  for (let k = 1; k < electric.length; k++) nodes.push(net.node(nameOf(electric[k], undefined as unknown as string)));
  const mnodes: MagneticNode[] = magnetic.map((m) => net.magneticNode(nameOf(m, undefined as unknown as string)));

  const index = <T>(list: readonly T[], value: unknown, owner: string, field: string, what: string): T => {
    if (typeof value !== 'number' || !Number.isInteger(value) || value < 0 || value >= list.length) {
      const range = list.length === 0 ? 'there are none' : `0..${list.length - 1}`;
      bad(`"${owner}" field "${field}" = ${String(value)} is not the index of ${what} (${range}); give the index in the description's list`, [owner]);
    }
    return list[value as number]!;
  };

  const handles: FluxTube[] = tubes.map((raw, b) => {
    const t = (isObject(raw) ? raw : {}) as Partial<TubeDescription>;
    const name = nameOf(raw, `tube ${b}`);
    const from = index(mnodes, t.from, name, 'from', 'a magnetic node');
    const to = index(mnodes, t.to, name, 'to', 'a magnetic node');
    const ic = {
      ...(t.initialFlux !== undefined ? { initialFlux: t.initialFlux } : {}),
      ...(t.initialFluxDensity !== undefined ? { initialFluxDensity: t.initialFluxDensity } : {}),
    };
    const law = (isObject(t.law) ? t.law : {}) as Fields;
    switch (law.kind) {
      case 'material':
        return net.fluxTube(name, {
          from, to, ...ic,
          length: law.length as number,
          area: law.area as number,
          material: law.material as MaterialSpec | MaterialLaw,
          ...(t.eddyResistance !== undefined ? { eddyResistance: t.eddyResistance } : {}),
        });
      case 'air-gap':
        return net.airGap(name, { from, to, ...ic, length: law.length as number, area: law.area as number, fringingFactor: law.fringingFactor as number });
      case 'reluctance':
        return net.reluctance(name, {
          from, to, ...ic,
          reluctance: law.reluctance as number,
          ...(law.area !== undefined ? { area: law.area as number } : {}),
        });
      default:
        return bad(`tube "${name}" has law kind ${JSON.stringify(law.kind)}; use 'material', 'air-gap' or 'reluctance'`, [name]);
    }
  });
  for (const [b, raw] of tubes.entries()) {
    const t = raw as Partial<TubeDescription>;
    const law = t.law as Fields;
    if (t.eddyResistance !== undefined && law.kind !== 'material') {
      bad(`tube "${nameOf(raw, `tube ${b}`)}" has an eddy resistance but is not a tube of material; drop eddyResistance`, [nameOf(raw, `tube ${b}`)]);
    }
  }

  elements.forEach((raw, k) => {
    const e = (isObject(raw) ? raw : {}) as Partial<ElementDescription> & Fields;
    const name = nameOf(raw, `element ${k}`);
    const plus = index(nodes, e.plus, name, 'plus', 'an electric node');
    const minus = index(nodes, e.minus, name, 'minus', 'an electric node');
    switch (e.kind) {
      case 'resistor':
        net.resistor(name, plus, minus, e.resistance as number);
        break;
      case 'capacitor':
        net.capacitor(name, plus, minus, e.capacitance as number, { initialVoltage: e.initialVoltage as number });
        break;
      case 'inductor':
        net.inductor(name, plus, minus, e.inductance as number, { initialCurrent: e.initialCurrent as number });
        break;
      case 'voltage-source':
        net.voltageSource(name, plus, minus, e.waveform as WaveformSpec);
        break;
      case 'current-source':
        net.currentSource(name, plus, minus, e.waveform as WaveformSpec);
        break;
      case 'switch': {
        if (typeof e.initiallyClosed !== 'boolean') bad(`switch "${name}" field "initiallyClosed" must be true or false`, [name]);
        if (!Array.isArray(e.toggleTimes)) bad(`switch "${name}" field "toggleTimes" must be a list of times`, [name]);
        let closed = e.initiallyClosed as boolean;
        const schedule = (e.toggleTimes as unknown[]).map((time) => ({ time: time as number, closed: (closed = !closed) }));
        net.switch(name, plus, minus, {
          onResistance: e.onResistance as number,
          offResistance: e.offResistance as number,
          closed: e.initiallyClosed as boolean,
          schedule,
        });
        break;
      }
      case 'winding':
        net.winding(name, {
          tube: index(handles, e.tube, name, 'tube', 'a flux tube'),
          turns: e.turns as number,
          resistance: e.resistance as number,
          orientation: e.orientation as 1 | -1,
          plus,
          minus,
        });
        break;
      default:
        bad(
          `element "${name}" has kind ${JSON.stringify(e.kind)}; use 'resistor', 'capacitor', 'inductor', 'voltage-source', 'current-source', 'switch' or 'winding'`,
          [name],
        );
    }
  });
  return net.describe();
}
