import { requireFinite, requirePositive } from '../network/argument-checks.js';
import type { CapacitorDescription } from '../network/description.js';
import type { ElementKind } from './element-kind.js';
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
    return {
      residual() {},
      jacobian() {},
      mass(M) {
        for (const { d } of list) {
          const p = ctx.potential(d.plus);
          const q = ctx.potential(d.minus);
          M.add(p, p, d.capacitance);
          M.add(p, q, -d.capacitance);
          M.add(q, p, -d.capacitance);
          M.add(q, q, d.capacitance);
        }
      },
      elements: list.map(({ d, index }) => {
        const p = ctx.potential(d.plus);
        const q = ctx.potential(d.minus);
        const voltage = (y: Float64Array): number => stateValue(y, p) - stateValue(y, q);
        return {
          name: d.name,
          index,
          role: 'capacitive' as const,
          // i = C dv/dt, read from the state through M y' = f.
          current: (t, y, inputs, rates) =>
            rates.rate(`capacitor:${index}`, (u) => {
              if (p >= 0) u[p] = d.capacitance;
              if (q >= 0) u[q] = -d.capacitance;
            }, t, y, inputs),
          storedEnergy: (y: Float64Array) => 0.5 * d.capacitance * voltage(y) ** 2,
        };
      }),
    };
  },
  listing: (d) => [
    { name: 'capacitance', value: d.capacitance, unit: 'F' },
    { name: 'initial voltage', value: d.initialVoltage, unit: 'V' },
  ],
  initialVoltage: (d) => d.initialVoltage,
};
