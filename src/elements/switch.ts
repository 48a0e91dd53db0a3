import { InputError } from '../errors.js';
import { requireFinite, requirePositive } from '../network/argument-checks.js';
import type { SwitchDescription } from '../network/description.js';
import type { ElementKind } from './element-kind.js';
import { stampConductance } from './stamp-target.js';
import { stateValue } from './state-value.js';

/**
 * A scheduled switch: a conductance 1/onResistance when closed and
 * 1/offResistance when open, changing state at its toggle times (exact
 * breakpoints of the run).
 *
 * @example
 * ```ts
 * net.switch('breaker', a, b, { closed: false, schedule: [{ time: 0.005, closed: true }] });
 * ```
 */
export const switchKind: ElementKind<SwitchDescription> = {
  kind: 'switch',
  noun: 'switch',
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
    return { kind: 'switch', name: d.name, plus: d.plus, minus: d.minus, onResistance, offResistance, initiallyClosed: d.initiallyClosed, toggleTimes };
  },
  compile(list, ctx) {
    const p = Int32Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Int32Array.from(list, (e) => ctx.potential(e.d.minus));
    const gOn = Float64Array.from(list, (e) => 1 / e.d.onResistance);
    const gOff = Float64Array.from(list, (e) => 1 / e.d.offResistance);
    const element = Int32Array.from(list, (e) => e.index);
    return {
      residual(t, y, inputs, f) {
        for (let k = 0; k < p.length; k++) {
          const g = inputs.switchClosed(element[k]!, t) ? gOn[k]! : gOff[k]!;
          const i = (stateValue(y, p[k]!) - stateValue(y, q[k]!)) * g;
          if (p[k]! >= 0) f[p[k]!]! -= i;
          if (q[k]! >= 0) f[q[k]!]! += i;
        }
      },
      jacobian(t, _y, inputs, J) {
        for (let k = 0; k < p.length; k++) stampConductance(J, p[k]!, q[k]!, inputs.switchClosed(element[k]!, t) ? gOn[k]! : gOff[k]!);
      },
      mass() {},
      elements: list.map((e, k) => {
        const conductance = (t: number, inputs: { switchClosed(e: number, t: number): boolean }): number =>
          inputs.switchClosed(e.index, t) ? gOn[k]! : gOff[k]!;
        const voltage = (y: Float64Array): number => stateValue(y, p[k]!) - stateValue(y, q[k]!);
        return {
          name: e.d.name,
          index: e.index,
          role: 'conductive' as const,
          current: (t, y, inputs) => voltage(y) * conductance(t, inputs),
          loss: { category: 'resistors' as const, power: (t, y, inputs) => voltage(y) ** 2 * conductance(t, inputs) },
        };
      }),
    };
  },
  listing: (d) => [
    { name: 'on resistance', value: d.onResistance, unit: 'ohm' },
    { name: 'off resistance', value: d.offResistance, unit: 'ohm' },
    { name: 'initially', value: d.initiallyClosed ? 'closed' : 'open' },
    { name: 'toggles at', value: d.toggleTimes.length ? d.toggleTimes.join(', ') + ' s' : 'never' },
  ],
  schedule: (d) => ({ initiallyClosed: d.initiallyClosed, toggleTimes: d.toggleTimes }),
};

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
