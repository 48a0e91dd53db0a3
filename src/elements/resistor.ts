import { requirePositive } from '../network/argument-checks.js';
import type { ResistorDescription } from '../network/description.js';
import { packedDoublesFrom } from '../solver/packed-doubles.js';
import type { CompiledElement, ElementGroup, ElementKind, InputView } from './element-kind.js';
import { stampConductance, type StampTarget } from './stamp-target.js';
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
    return new ResistorGroup(p, q, g, list.map((e, k) => {
      const voltage = (y: Float64Array): number => stateValue(y, p[k]!) - stateValue(y, q[k]!);
      return {
        name: e.d.name,
        index: e.index,
        role: 'conductive' as const,
        current: (_t: number, y: Float64Array) => voltage(y) * g[k]!,
        loss: { category: 'resistors' as const, power: (_t: number, y: Float64Array) => voltage(y) ** 2 * g[k]! },
      };
    }));
  },
  listing: (d) => [{ name: 'resistance', value: d.resistance, unit: 'ohm' }],
};

/**
 * The compiled resistors, f and J as prototype methods: the same functions
 * in every network compiled (see the voltage source's group).
 */
class ResistorGroup implements ElementGroup {
  constructor(
    /** Per resistor: plus and minus potentials (-1: ground), conductance. */
    private readonly p: readonly number[],
    private readonly q: readonly number[],
    private readonly g: readonly number[],
    readonly elements: readonly CompiledElement[],
  ) {}

  residual(_t: number, y: Float64Array, _inputs: InputView, f: Float64Array): void {
    const { p, q, g } = this;
    for (let k = 0; k < g.length; k++) {
      const i = (stateValue(y, p[k]!) - stateValue(y, q[k]!)) * g[k]!;
      if (p[k]! >= 0) f[p[k]!]! -= i;
      if (q[k]! >= 0) f[q[k]!]! += i;
    }
  }

  jacobian(_t: number, _y: Float64Array, _inputs: InputView, J: StampTarget): void {
    const { p, q, g } = this;
    for (let k = 0; k < g.length; k++) stampConductance(J, p[k]!, q[k]!, g[k]!);
  }

  mass(): void {}
}
