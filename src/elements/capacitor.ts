import { requireFinite, requirePositive } from '../network/argument-checks.js';
import type { CapacitorDescription } from '../network/description.js';
import { packedDoublesFrom } from '../solver/packed-doubles.js';
import { capacitorCurrent, stampCapacitance } from './capacitance-stamps.js';
import type { CompiledElement, ElementGroup, ElementKind, InputView, RateReader } from './element-kind.js';
import type { StampTarget } from './stamp-target.js';
import { stateValue } from './state-value.js';

/**
 * A linear capacitor: C d(v_plus - v_minus)/dt = i, a mass-matrix stamp on
 * the two node potentials; its initial voltage seeds the potentials.
 *
 * @example
 * ```ts
 * net.capacitor('dc link', bus, net.ground, 470e-6, { initialVoltage: 325 });
 * ```
 */
export const capacitorKind: ElementKind<CapacitorDescription> = {
  kind: 'capacitor',
  noun: 'capacitor',
  /** Affine: its terms are linear in the unknowns with coefficients fixed over an input interval. */
  nonAffineUnknowns: () => [],
  role: 'capacitive',
  branchCurrent: false,
  check(d, ctx) {
    const capacitance = requirePositive(d.capacitance, `${ctx.owner} capacitance`, d.name, 'F');
    const initialVoltage = requireFinite(d.initialVoltage ?? 0, `${ctx.owner} initial voltage`, d.name, 'V');
    return { kind: 'capacitor', name: d.name, plus: d.plus, minus: d.minus, capacitance, initialVoltage };
  },
  compile(list, ctx) {
    const p = Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Array.from(list, (e) => ctx.potential(e.d.minus));
    const capacitance = packedDoublesFrom(list, (e) => e.d.capacitance);
    return new CapacitorGroup(p, q, capacitance, list.map(({ d, index }, k) => {
      const pk = p[k]!;
      const qk = q[k]!;
      const voltage = (y: Float64Array): number => stateValue(y, pk) - stateValue(y, qk);
      return {
        name: d.name,
        index,
        role: 'capacitive' as const,
        // i = C dv/dt, read from the state through M y' = f.
        current: (t: number, y: Float64Array, inputs: InputView, rates: RateReader) =>
          capacitorCurrent(rates, `capacitor:${index}`, pk, qk, d.capacitance, t, y, inputs),
        storedEnergy: (y: Float64Array) => 0.5 * d.capacitance * voltage(y) ** 2,
      };
    }));
  },
  listing: (d) => [
    { name: 'capacitance', value: d.capacitance, unit: 'F' },
    { name: 'initial voltage', value: d.initialVoltage, unit: 'V' },
  ],
  initialVoltage: (d) => d.initialVoltage,
};

/**
 * The compiled capacitors: no terms of f or J, the mass matrix as a
 * prototype method (the same functions in every network compiled; see the
 * voltage source's group).
 */
class CapacitorGroup implements ElementGroup {
  constructor(
    /** Per capacitor: plus and minus potentials (-1: ground), capacitance. */
    private readonly p: readonly number[],
    private readonly q: readonly number[],
    private readonly capacitance: readonly number[],
    readonly elements: readonly CompiledElement[],
  ) {}

  residual(): void {}

  jacobian(): void {}

  mass(M: StampTarget): void {
    const { p, q, capacitance } = this;
    for (let k = 0; k < p.length; k++) stampCapacitance(M, p[k]!, q[k]!, capacitance[k]!);
  }
}
