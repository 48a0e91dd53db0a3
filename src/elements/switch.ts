import { InputError } from '../errors.js';
import { requireFinite, requireNonNegative, requirePositive } from '../network/argument-checks.js';
import { clonePlain } from '../network/clone-plain.js';
import type { SwitchDescription } from '../network/description.js';
import { compileWaveform } from '../waveforms/waveform-spec.js';
import { packedDoublesFrom } from '../solver/packed-doubles.js';
import { describeWaveform } from './describe-waveform.js';
import type { CompiledElement, ElementGroup, ElementKind, InputView, RateReader } from './element-kind.js';
import { capacitorCurrent, stampCapacitance } from './capacitance-stamps.js';
import { stampConductance, type StampTarget } from './stamp-target.js';
import { stateValue } from './state-value.js';

/**
 * A switch: a conductance 1/onResistance when closed and 1/offResistance
 * when open, changing state at its toggle times (a schedule) or at the
 * edges of its gate waveform (closed while the gate is above 0.5); both are
 * exact breakpoints of the run. An optional capacitance sits across it.
 *
 * @example
 * ```ts
 * net.switch('breaker', a, b, { closed: false, schedule: [{ time: 0.005, closed: true }] });
 * net.switch('Q1', drain, net.ground, { gate: pulse({ high: 1, period: 10e-6, duty: 0.4 }), onResistance: 0.05 });
 * ```
 */
export const switchKind: ElementKind<SwitchDescription> = {
  kind: 'switch',
  noun: 'switch',
  /** Affine: its conductance is fixed over an input interval (switching instants are breakpoints). */
  nonAffineUnknowns: () => [],
  role: 'conductive',
  branchCurrent: false,
  check(d, ctx) {
    const onResistance = requirePositive(d.onResistance, `${ctx.owner} on-resistance`, d.name, 'ohm');
    const offResistance = requirePositive(d.offResistance, `${ctx.owner} off-resistance`, d.name, 'ohm');
    if (offResistance <= onResistance) {
      throw new InputError(
        'bad-switch-resistance',
        `${ctx.owner} off-resistance ${offResistance} ohm is not above its on-resistance ${onResistance} ohm; swap them`,
        [d.name],
      );
    }
    if (typeof d.initiallyClosed !== 'boolean') {
      throw new InputError('bad-description', `network description: switch "${d.name}" field "initiallyClosed" must be true or false`, [d.name]);
    }
    if (!Array.isArray(d.toggleTimes)) {
      throw new InputError('bad-description', `network description: switch "${d.name}" field "toggleTimes" must be a list of times`, [d.name]);
    }
    const toggleTimes = increasingTimes(d.toggleTimes, ctx.owner, d.name);
    const capacitance = d.capacitance === undefined ? undefined : requireNonNegative(d.capacitance, `${ctx.owner} capacitance`, d.name, 'F');
    if (d.gate !== undefined) {
      if (toggleTimes.length > 0) {
        throw new InputError('gate-with-schedule', `${ctx.owner} has both a gate and a schedule; drive it by one of them (drop the schedule or the gate)`, [d.name]);
      }
      // Validated here (the same checks as a source's waveform), so a bad gate fails at the builder call.
      compileWaveform(d.gate, { label: `${ctx.owner} gate`, element: d.name });
    }
    return {
      kind: 'switch', name: d.name, plus: d.plus, minus: d.minus, onResistance, offResistance, initiallyClosed: d.initiallyClosed, toggleTimes,
      ...(d.gate !== undefined ? { gate: clonePlain(d.gate) } : {}),
      ...(capacitance ? { capacitance } : {}),
    };
  },
  compile(list, ctx) {
    const p = Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Array.from(list, (e) => ctx.potential(e.d.minus));
    const gOn = packedDoublesFrom(list, (e) => 1 / e.d.onResistance);
    const gOff = packedDoublesFrom(list, (e) => 1 / e.d.offResistance);
    const element = Array.from(list, (e) => e.index);
    const capacitance = packedDoublesFrom(list, (e) => e.d.capacitance ?? 0);
    return new SwitchGroup(p, q, gOn, gOff, element, capacitance, list.map((e, k) => {
      const conductance = (t: number, inputs: InputView): number => (inputs.switchClosed(e.index, t) ? gOn[k]! : gOff[k]!);
      const voltage = (y: Float64Array): number => stateValue(y, p[k]!) - stateValue(y, q[k]!);
      const c = e.d.capacitance ?? 0;
      const compiled: CompiledElement = {
        name: e.d.name,
        index: e.index,
        role: 'conductive' as const,
        // Conduction current plus, with a capacitance, its C dv/dt.
        current: c > 0
          ? (t, y, inputs, rates) => voltage(y) * conductance(t, inputs) + capacitorCurrent(rates, `switch:${e.index}`, p[k]!, q[k]!, c, t, y, inputs)
          : (t, y, inputs) => voltage(y) * conductance(t, inputs),
        loss: { category: 'resistors' as const, power: (t, y, inputs) => voltage(y) ** 2 * conductance(t, inputs) },
        conducting: c > 0 ? () => true : (t, inputs) => inputs.switchClosed(e.index, t),
        offConductance: gOff[k]!,
        ...(c > 0 ? { storedEnergy: (y: Float64Array) => 0.5 * c * voltage(y) ** 2 } : {}),
      };
      return compiled;
    }));
  },
  listing: (d) => [
    { name: 'on resistance', value: d.onResistance, unit: 'ohm' },
    { name: 'off resistance', value: d.offResistance, unit: 'ohm' },
    ...(d.gate !== undefined
      ? [{ name: 'gate', value: describeWaveform(d.gate, '') }]
      : [
          { name: 'initially', value: d.initiallyClosed ? 'closed' : 'open' },
          { name: 'toggles at', value: d.toggleTimes.length ? d.toggleTimes.join(', ') + ' s' : 'never' },
        ]),
    ...(d.capacitance ? [{ name: 'capacitance', value: d.capacitance, unit: 'F' }] : []),
  ],
  schedule: (d) => ({ initiallyClosed: d.initiallyClosed, toggleTimes: d.toggleTimes }),
  gate: (d) => d.gate,
  waveformFields: ['gate'],
  parallelCapacitance: (d) => d.capacitance ?? 0,
};

/**
 * The compiled switches, f, J and M as prototype methods: the same
 * functions in every network compiled (see the voltage source's group).
 */
class SwitchGroup implements ElementGroup {
  constructor(
    /** Per switch: plus and minus potentials (-1: ground), closed and open conductances, element index, capacitance (0: none). */
    private readonly p: readonly number[],
    private readonly q: readonly number[],
    private readonly gOn: readonly number[],
    private readonly gOff: readonly number[],
    private readonly element: readonly number[],
    private readonly capacitance: readonly number[],
    readonly elements: readonly CompiledElement[],
  ) {}

  residual(t: number, y: Float64Array, inputs: InputView, f: Float64Array): void {
    const { p, q, gOn, gOff, element } = this;
    for (let k = 0; k < p.length; k++) {
      const g = inputs.switchClosed(element[k]!, t) ? gOn[k]! : gOff[k]!;
      const i = (stateValue(y, p[k]!) - stateValue(y, q[k]!)) * g;
      if (p[k]! >= 0) f[p[k]!]! -= i;
      if (q[k]! >= 0) f[q[k]!]! += i;
    }
  }

  jacobian(t: number, _y: Float64Array, inputs: InputView, J: StampTarget): void {
    const { p, q, gOn, gOff, element } = this;
    for (let k = 0; k < p.length; k++) stampConductance(J, p[k]!, q[k]!, inputs.switchClosed(element[k]!, t) ? gOn[k]! : gOff[k]!);
  }

  mass(M: StampTarget): void {
    const { p, q, capacitance } = this;
    for (let k = 0; k < p.length; k++) {
      const c = capacitance[k]!;
      if (c > 0) stampCapacitance(M, p[k]!, q[k]!, c);
    }
  }
}

/**
 * Turn a builder schedule (states at times) into toggle times: entries
 * that keep the state are dropped; times must increase.
 *
 * @example
 * ```ts
 * toggleTimesOf(false, [{ time: 0.005, closed: true }, { time: 0.02, closed: false }], 'switch "breaker"', 'breaker'); // [0.005, 0.02]
 * ```
 */
export function toggleTimesOf(
  initiallyClosed: boolean,
  schedule: readonly { readonly time: number; readonly closed: boolean }[],
  owner: string,
  name: string,
): number[] {
  const times = increasingTimes(schedule.map((entry) => entry.time), owner, name);
  const toggleTimes: number[] = [];
  let state = initiallyClosed;
  schedule.forEach((entry, k) => {
    if (entry.closed === state) return;
    toggleTimes.push(times[k]!);
    state = entry.closed;
  });
  return toggleTimes;
}

/** Check that schedule times are finite and strictly increasing; a copy of them. */
function increasingTimes(times: readonly number[], owner: string, name: string): number[] {
  let last = -Infinity;
  return times.map((time, k) => {
    requireFinite(time, `${owner} schedule entry ${k} time`, name, 's');
    if (time <= last) {
      throw new InputError(
        'unsorted-schedule',
        `${owner} schedule entry ${k} at t = ${time} s does not come after the previous entry (${last} s); sort the schedule by time`,
        [name],
      );
    }
    last = time;
    return time;
  });
}
