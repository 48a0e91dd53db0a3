import { InputError } from '../errors.js';
import type { NetworkDescription } from '../network/description.js';
import type { ElectricNode, FluxTube, MagneticNode } from '../network/handles.js';
import { createNetwork, type NetworkBuilder } from '../network/network-builder.js';

/**
 * Rebuild a network builder from a plain-data description by replaying the
 * builder calls, so that every value goes through the builder's own checks
 * (positive lengths, sorted schedules, valid waveforms, unique names...) and
 * a bad value throws the builder's `InputError` naming the element. A
 * description that came from JSON or from sweep edits is validated this
 * way before it is simulated. `rebuilt.describe()` equals the input.
 *
 * Function waveforms given by module reference must be resolved first
 * (`resolveFunctionWaveform`), as the builder compiles every waveform.
 *
 * @example
 * ```ts
 * const net = networkFromDescription(JSON.parse(text));
 * const result = simulate(net, { stopTime: 0.1 });
 * ```
 */
export function networkFromDescription(description: NetworkDescription): NetworkBuilder {
  const d = description;
  const net = createNetwork(d.name);
  const ground = d.electricNodes[0];
  if (ground === undefined || ground.name !== 'ground') {
    throw new InputError('sweep-bad-job', `network "${d.name}": electric node 0 must be the ground, named "ground"`, ['electricNodes']);
  }
  const nodes: ElectricNode[] = [net.ground, ...d.electricNodes.slice(1).map((n) => net.node(n.name))];
  const magnetic: MagneticNode[] = d.magneticNodes.map((n) => net.magneticNode(n.name));
  const at = <T>(list: readonly T[], i: number, what: string, owner: string): T => {
    const v = list[i];
    if (v === undefined) throw new InputError('sweep-bad-job', `${owner}: ${what} index ${i} is out of range (${list.length} entries)`, [owner]);
    return v;
  };
  const tubes: FluxTube[] = d.tubes.map((t) => {
    const from = at(magnetic, t.from, 'magnetic node', t.name);
    const to = at(magnetic, t.to, 'magnetic node', t.name);
    const ic = {
      ...(t.initialFlux !== undefined ? { initialFlux: t.initialFlux } : {}),
      ...(t.initialFluxDensity !== undefined ? { initialFluxDensity: t.initialFluxDensity } : {}),
    };
    const law = t.law;
    switch (law.kind) {
      case 'material':
        return net.fluxTube(t.name, {
          from, to, length: law.length, area: law.area, material: law.material, ...ic,
          ...(t.eddyResistance !== undefined ? { eddyResistance: t.eddyResistance } : {}),
        });
      case 'air-gap':
        return net.airGap(t.name, { from, to, length: law.length, area: law.area, fringingFactor: law.fringingFactor, ...ic });
      case 'reluctance':
        return net.reluctance(t.name, { from, to, reluctance: law.reluctance, ...(law.area !== undefined ? { area: law.area } : {}), ...ic });
    }
  });
  for (const e of d.elements) {
    const plus = at(nodes, e.plus, 'electric node', e.name);
    const minus = at(nodes, e.minus, 'electric node', e.name);
    switch (e.kind) {
      case 'resistor':
        net.resistor(e.name, plus, minus, e.resistance);
        break;
      case 'capacitor':
        net.capacitor(e.name, plus, minus, e.capacitance, { initialVoltage: e.initialVoltage });
        break;
      case 'inductor':
        net.inductor(e.name, plus, minus, e.inductance, { initialCurrent: e.initialCurrent });
        break;
      case 'voltage-source':
        net.voltageSource(e.name, plus, minus, e.waveform);
        break;
      case 'current-source':
        net.currentSource(e.name, plus, minus, e.waveform);
        break;
      case 'switch': {
        // The description keeps the toggle times; the builder takes the states they lead to.
        let closed = e.initiallyClosed;
        const schedule = e.toggleTimes.map((time) => {
          closed = !closed;
          return { time, closed };
        });
        net.switch(e.name, plus, minus, { onResistance: e.onResistance, offResistance: e.offResistance, closed: e.initiallyClosed, schedule });
        break;
      }
      case 'winding':
        net.winding(e.name, {
          tube: at(tubes, e.tube, 'tube', e.name), turns: e.turns, resistance: e.resistance, plus, minus, orientation: e.orientation,
        });
        break;
    }
  }
  return net;
}
