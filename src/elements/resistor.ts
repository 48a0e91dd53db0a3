import { requirePositive } from '../network/argument-checks.js';
import type { ResistorDescription } from '../network/description.js';
import { packedDoublesFrom } from '../solver/packed-doubles.js';
import type { ElementKind } from './element-kind.js';
import { stampConductance } from './stamp-target.js';
import { stateValue } from './state-value.js';

/**
 * A linear resistor: i = (v_plus - v_minus) / R.
 *
 * @example
 * ```ts
 * net.resistor('load', out, net.ground, 12);
 * ```
 */
export const resistorKind: ElementKind<ResistorDescription> = {
  kind: 'resistor',
  noun: 'resistor',
  /** Affine: its terms are linear in the unknowns with coefficients fixed over an input interval. */
  nonAffineUnknowns: () => [],
  role: 'conductive',
  branchCurrent: false,
  check(d, ctx) {
    const resistance = requirePositive(d.resistance, `${ctx.owner} resistance`, d.name, 'ohm');
    return { kind: 'resistor', name: d.name, plus: d.plus, minus: d.minus, resistance };
  },
  compile(list, ctx) {
    const p = Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Array.from(list, (e) => ctx.potential(e.d.minus));
    const g = packedDoublesFrom(list, (e) => 1 / e.d.resistance);
    return {
      residual(_t, y, _inputs, f) {
        for (let k = 0; k < g.length; k++) {
          const i = (stateValue(y, p[k]!) - stateValue(y, q[k]!)) * g[k]!;
          if (p[k]! >= 0) f[p[k]!]! -= i;
          if (q[k]! >= 0) f[q[k]!]! += i;
        }
      },
      jacobian(_t, _y, _inputs, J) {
        for (let k = 0; k < g.length; k++) stampConductance(J, p[k]!, q[k]!, g[k]!);
      },
      mass() {},
      elements: list.map((e, k) => {
        const voltage = (y: Float64Array): number => stateValue(y, p[k]!) - stateValue(y, q[k]!);
        return {
          name: e.d.name,
          index: e.index,
          role: 'conductive' as const,
          current: (_t: number, y: Float64Array) => voltage(y) * g[k]!,
          loss: { category: 'resistors' as const, power: (_t: number, y: Float64Array) => voltage(y) ** 2 * g[k]! },
        };
      }),
    };
  },
  listing: (d) => [{ name: 'resistance', value: d.resistance, unit: 'ohm' }],
};
