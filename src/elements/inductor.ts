import { requireFinite, requirePositive } from '../network/argument-checks.js';
import type { InductorDescription } from '../network/description.js';
import { packedDoublesFrom } from '../solver/packed-doubles.js';
import type { CompiledElement, ElementGroup, ElementKind, InputView } from './element-kind.js';
import { stampBranch, type StampTarget } from './stamp-target.js';
import { stateValue } from './state-value.js';

/**
 * A linear inductor: L di/dt = v_plus - v_minus, with its branch current as
 * an unknown (a state: its initial value is the initial current).
 *
 * @example
 * ```ts
 * net.inductor('line', a, b, 2e-3, { initialCurrent: 0 });
 * ```
 */
export const inductorKind: ElementKind<InductorDescription> = {
  kind: 'inductor',
  noun: 'inductor',
  /** Affine: its terms are linear in the unknowns with coefficients fixed over an input interval. */
  nonAffineUnknowns: () => [],
  role: 'inductive',
  branchCurrent: true,
  openTerminalCode: 'open-terminal',
  check(d, ctx) {
    const inductance = requirePositive(d.inductance, `${ctx.owner} inductance`, d.name, 'H');
    const initialCurrent = requireFinite(d.initialCurrent ?? 0, `${ctx.owner} initial current`, d.name, 'A');
    return { kind: 'inductor', name: d.name, plus: d.plus, minus: d.minus, inductance, initialCurrent };
  },
  compile(list, ctx) {
    const p = Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Array.from(list, (e) => ctx.potential(e.d.minus));
    const b = Array.from(list, (e) => ctx.branchCurrent(e.index));
    const inductance = packedDoublesFrom(list, (e) => e.d.inductance);
    const initialCurrent = packedDoublesFrom(list, (e) => e.d.initialCurrent);
    return new InductorGroup(p, q, b, inductance, initialCurrent, list.map((e, k) => ({
      name: e.d.name,
      index: e.index,
      role: 'inductive' as const,
      current: (_t: number, y: Float64Array) => y[b[k]!]!,
      storedEnergy: (y: Float64Array) => 0.5 * e.d.inductance * y[b[k]!]! ** 2,
    })));
  },
  listing: (d) => [
    { name: 'inductance', value: d.inductance, unit: 'H' },
    { name: 'initial current', value: d.initialCurrent, unit: 'A' },
  ],
};

/**
 * The compiled inductors, f, J, M and the initial currents as prototype
 * methods: the same functions in every network compiled (see the voltage
 * source's group).
 */
class InductorGroup implements ElementGroup {
  constructor(
    /** Per inductor: plus and minus potentials (-1: ground), branch current, inductance, initial current. */
    private readonly p: readonly number[],
    private readonly q: readonly number[],
    private readonly b: readonly number[],
    private readonly inductance: readonly number[],
    private readonly initialCurrent: readonly number[],
    readonly elements: readonly CompiledElement[],
  ) {}

  residual(_t: number, y: Float64Array, _inputs: InputView, f: Float64Array): void {
    const { p, q, b } = this;
    for (let k = 0; k < b.length; k++) {
      const i = y[b[k]!]!;
      if (p[k]! >= 0) f[p[k]!]! -= i;
      if (q[k]! >= 0) f[q[k]!]! += i;
      f[b[k]!]! += stateValue(y, p[k]!) - stateValue(y, q[k]!);
    }
  }

  jacobian(_t: number, _y: Float64Array, _inputs: InputView, J: StampTarget): void {
    const { p, q, b } = this;
    for (let k = 0; k < b.length; k++) stampBranch(J, p[k]!, q[k]!, b[k]!, 1);
  }

  mass(M: StampTarget): void {
    const { b, inductance } = this;
    for (let k = 0; k < b.length; k++) M.add(b[k]!, b[k]!, inductance[k]!);
  }

  initial(y0: Float64Array): void {
    const { b, initialCurrent } = this;
    for (let k = 0; k < b.length; k++) y0[b[k]!] = initialCurrent[k]!;
  }
}
