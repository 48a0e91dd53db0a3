import { InputError } from '../errors.js';
import { requireNonNegative, requirePositive } from '../network/argument-checks.js';
import type { DiodeDescription } from '../network/description.js';
import { packedDoubles, packedDoublesFrom } from '../solver/packed-doubles.js';
import type { CompiledElement, ElementEvent, ElementGroup, ElementKind, InputView } from './element-kind.js';
import { stampConductance, type StampTarget } from './stamp-target.js';
import { stateValue } from './state-value.js';
import { capacitorCurrent, stampCapacitance } from './capacitance-stamps.js';

/**
 * Relative width of the band around an ideal diode's threshold inside which
 * either state counts as consistent (times the terminal potentials and the
 * forward voltage). The event fires only below the band and the
 * consistent-state search flips only below it, so a diode just settled
 * never fires its own event at once (no chattering at one instant). About
 * 4500 units of round-off: far below any voltage a user reads.
 */
const THRESHOLD_BAND = 1e-12;
/** Absolute floor of that band, V. */
const THRESHOLD_FLOOR = 1e-12;
/** Newton iterations of the junction voltage of the exponential law (convex, monotone: a few suffice). */
const JUNCTION_ITERATIONS = 100;

/**
 * A diode from anode (`plus`) to cathode (`minus`).
 *
 * Ideal junction: two states. On: a forward voltage Vf in series with
 * onResistance, i = (v - Vf) / Ron. Off: i = offConductance v. The state is
 * a discrete input held over an interval (so the Jacobian is exact there),
 * changed at events located on the dense output (the margin of the present
 * state, v - Vf when on and Vf - v when off, crossing zero downwards) and
 * by the run's consistent-state search after every jump.
 *
 * Exponential junction: the Shockley law i = Is (exp(v_j / (n V_T)) - 1)
 * with onResistance in series (v = v_j + Ron i, solved for v_j inside each
 * evaluation, so no unknown is added) and offConductance in parallel;
 * smooth, no events.
 *
 * An optional junction capacitance sits across either kind.
 *
 * @example
 * ```ts
 * net.diode('D1', secondary, out, { forwardVoltage: 0.7, onResistance: 0.02 });
 * ```
 */
export const diodeKind: ElementKind<DiodeDescription> = {
  kind: 'diode',
  noun: 'diode',
  /**
   * The exponential law acts on its terminal potentials other than affinely. An ideal junction is
   * affine within an input interval (gOn or gOff, held, with a fixed offset); its commutations are
   * events, each followed by a restart that forms f's maps again.
   */
  nonAffineUnknowns: (d, ctx) => (d.junction === 'ideal' ? [] : [ctx.potential(d.plus), ctx.potential(d.minus)].filter((i) => i >= 0)),
  role: 'conductive',
  branchCurrent: false,
  check(d, ctx) {
    if (d.junction !== 'ideal' && d.junction !== 'exponential') {
      throw new InputError('unknown-junction', `${ctx.owner} junction ${JSON.stringify(d.junction)} is not 'ideal' or 'exponential'; choose one of them`, [d.name]);
    }
    const forwardVoltage = requireNonNegative(d.forwardVoltage, `${ctx.owner} forward voltage`, d.name, 'V');
    const onResistance = requirePositive(d.onResistance, `${ctx.owner} on-resistance`, d.name, 'ohm');
    const offConductance = requirePositive(d.offConductance, `${ctx.owner} off-conductance`, d.name, 'S');
    if (offConductance * onResistance >= 1) {
      throw new InputError(
        'bad-diode-resistance',
        `${ctx.owner} off-conductance ${offConductance} S is not below 1/onResistance = ${1 / onResistance} S; give a small leakage conductance (say 1e-9 S)`,
        [d.name],
      );
    }
    const saturationCurrent = requirePositive(d.saturationCurrent, `${ctx.owner} saturation current`, d.name, 'A');
    const emissionCoefficient = requirePositive(d.emissionCoefficient, `${ctx.owner} emission coefficient`, d.name, '');
    const thermalVoltage = requirePositive(d.thermalVoltage, `${ctx.owner} thermal voltage`, d.name, 'V');
    const capacitance = requireNonNegative(d.capacitance, `${ctx.owner} capacitance`, d.name, 'F');
    if (typeof d.initiallyOn !== 'boolean') {
      throw new InputError('bad-description', `network description: diode "${d.name}" field "initiallyOn" must be true or false`, [d.name]);
    }
    return {
      kind: 'diode', name: d.name, plus: d.plus, minus: d.minus, junction: d.junction, forwardVoltage, onResistance, offConductance,
      saturationCurrent, emissionCoefficient, thermalVoltage, capacitance, initiallyOn: d.initiallyOn,
    };
  },
  compile(list, ctx) {
    const p = Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Array.from(list, (e) => ctx.potential(e.d.minus));
    const element = Array.from(list, (e) => e.index);
    const ideal = list.map((e) => e.d.junction === 'ideal');
    const vf = packedDoublesFrom(list, (e) => e.d.forwardVoltage);
    const gOn = packedDoublesFrom(list, (e) => 1 / e.d.onResistance);
    const ron = packedDoublesFrom(list, (e) => e.d.onResistance);
    const gOff = packedDoublesFrom(list, (e) => e.d.offConductance);
    const is = packedDoublesFrom(list, (e) => e.d.saturationCurrent);
    const nvt = packedDoublesFrom(list, (e) => e.d.emissionCoefficient * e.d.thermalVoltage);
    const capacitance = packedDoublesFrom(list, (e) => e.d.capacitance);
    const group: DiodeGroup = new DiodeGroup(p, q, element, ideal, vf, gOn, ron, gOff, is, nvt, capacitance, list.map((e, k) => {
      const c = e.d.capacitance;
      const compiled: CompiledElement = {
        name: e.d.name,
        index: e.index,
        role: 'conductive' as const,
        current: c > 0
          ? (t, y, inputs, rates) => group.conduction(k, y, inputs) + capacitorCurrent(rates, `diode:${e.index}`, p[k]!, q[k]!, c, t, y, inputs)
          : (_t, y, inputs) => group.conduction(k, y, inputs),
        // Everything the junction conducts is dissipated (Vf i + Ron i^2 when on, gOff v^2 when off).
        loss: { category: 'resistors' as const, power: (_t, y, inputs) => group.voltage(k, y) * group.conduction(k, y, inputs) },
        conducting: c > 0 || !ideal[k] ? () => true : (_t, inputs) => inputs.deviceOn(e.index),
        offConductance: gOff[k]!,
        ...(c > 0 ? { storedEnergy: (y: Float64Array) => 0.5 * c * group.voltage(k, y) ** 2 } : {}),
      };
      return compiled;
    }));
    return group;
  },
  listing: (d) => [
    { name: 'junction', value: d.junction },
    ...(d.junction === 'ideal'
      ? [
          { name: 'forward voltage', value: d.forwardVoltage, unit: 'V' },
          { name: 'on resistance', value: d.onResistance, unit: 'ohm' },
          { name: 'off conductance', value: d.offConductance, unit: 'S' },
        ]
      : [
          { name: 'saturation current', value: d.saturationCurrent, unit: 'A' },
          { name: 'emission coefficient', value: d.emissionCoefficient },
          { name: 'thermal voltage', value: d.thermalVoltage, unit: 'V' },
          { name: 'series resistance', value: d.onResistance, unit: 'ohm' },
          { name: 'parallel conductance', value: d.offConductance, unit: 'S' },
        ]),
    ...(d.capacitance > 0 ? [{ name: 'capacitance', value: d.capacitance, unit: 'F' }] : []),
  ],
  deviceState: (d) => (d.junction === 'ideal' ? d.initiallyOn : undefined),
  capsStepBySources: true,
  parallelCapacitance: (d) => d.capacitance,
};

/**
 * The compiled diodes, f, J, M and the laws they share as prototype
 * methods: the same functions in every network compiled (see the voltage
 * source's group). The ideal diodes' events are instances of
 * {@link DiodeMarginEvent} for the same reason.
 */
class DiodeGroup implements ElementGroup {
  readonly events: readonly ElementEvent[];
  /** di/dv of the exponential junction, written by {@link DiodeGroup.exponentialCurrent}. */
  private readonly slope = packedDoubles(1);

  constructor(
    /** Per diode: anode and cathode potentials (-1: ground), element index, whether ideal. */
    private readonly p: readonly number[],
    private readonly q: readonly number[],
    private readonly element: readonly number[],
    private readonly ideal: readonly boolean[],
    /** Per diode: forward voltage, on conductance and resistance, off conductance, saturation current, n V_T, capacitance. */
    private readonly vf: readonly number[],
    private readonly gOn: readonly number[],
    private readonly ron: readonly number[],
    private readonly gOff: readonly number[],
    private readonly is: readonly number[],
    private readonly nvt: readonly number[],
    private readonly capacitance: readonly number[],
    readonly elements: readonly CompiledElement[],
  ) {
    const events: ElementEvent[] = [];
    for (let k = 0; k < p.length; k++) if (ideal[k]) events.push(new DiodeMarginEvent(this, k, element[k]!));
    this.events = events;
  }

  /** Voltage from anode to cathode of diode k. */
  voltage(k: number, y: Float64Array): number {
    return stateValue(y, this.p[k]!) - stateValue(y, this.q[k]!);
  }

  /** Current of the exponential junction k at voltage v; its slope di/dv into out[0]. */
  exponentialCurrent(k: number, v: number, out: number[]): number {
    const a = this.nvt[k]!;
    const s = this.is[k]!;
    const r = this.ron[k]!;
    // g(vj) = vj + R Is (exp(vj/a) - 1) - v is convex and increasing: Newton from above the root
    // converges monotonically (v > 0: both v and a log(1 + v/(R Is)) are above it; v <= 0: 0 is).
    let vj = v > 0 ? Math.min(v, a * Math.log1p(v / (r * s))) : 0;
    for (let it = 0; it < JUNCTION_ITERATIONS; it++) {
      const e = Math.exp(vj / a);
      const g = vj + r * s * (e - 1) - v;
      const step = g / (1 + (r * s * e) / a);
      vj -= step;
      if (!(Math.abs(step) > 1e-15 * (Math.abs(vj) + a))) break;
    }
    const e = Math.exp(vj / a);
    const gj = (s * e) / a;
    out[0] = gj / (1 + r * gj) + this.gOff[k]!;
    return s * (e - 1) + this.gOff[k]! * v;
  }

  /** Conduction current (no capacitance) of diode k at (y, inputs). */
  conduction(k: number, y: Float64Array, inputs: InputView): number {
    const v = this.voltage(k, y);
    if (!this.ideal[k]) return this.exponentialCurrent(k, v, this.slope);
    return inputs.deviceOn(this.element[k]!) ? (v - this.vf[k]!) * this.gOn[k]! : v * this.gOff[k]!;
  }

  /** Margin of the present state of ideal diode k (positive while right), V. */
  margin(k: number, y: Float64Array, inputs: InputView): number {
    const v = this.voltage(k, y) - this.vf[k]!;
    return inputs.deviceOn(this.element[k]!) ? v : -v;
  }

  /** Half-width of the band around diode k's threshold (see THRESHOLD_BAND), V. */
  band(k: number, y: Float64Array): number {
    return THRESHOLD_BAND * (Math.abs(stateValue(y, this.p[k]!)) + Math.abs(stateValue(y, this.q[k]!)) + this.vf[k]!) + THRESHOLD_FLOOR;
  }

  residual(_t: number, y: Float64Array, inputs: InputView, f: Float64Array): void {
    const { p, q } = this;
    for (let k = 0; k < p.length; k++) {
      const i = this.conduction(k, y, inputs);
      if (p[k]! >= 0) f[p[k]!]! -= i;
      if (q[k]! >= 0) f[q[k]!]! += i;
    }
  }

  jacobian(_t: number, y: Float64Array, inputs: InputView, J: StampTarget): void {
    const { p, q, ideal, element, gOn, gOff, slope } = this;
    for (let k = 0; k < p.length; k++) {
      let g: number;
      if (ideal[k]) g = inputs.deviceOn(element[k]!) ? gOn[k]! : gOff[k]!;
      else {
        this.exponentialCurrent(k, this.voltage(k, y), slope);
        g = slope[0]!;
      }
      stampConductance(J, p[k]!, q[k]!, g);
    }
  }

  mass(M: StampTarget): void {
    const { p, q, capacitance } = this;
    for (let k = 0; k < p.length; k++) {
      const c = capacitance[k]!;
      if (c > 0) stampCapacitance(M, p[k]!, q[k]!, c);
    }
  }
}

/** The event of ideal diode k: its margin crossing zero downwards one band below the threshold (see THRESHOLD_BAND). */
class DiodeMarginEvent implements ElementEvent {
  readonly direction = -1 as const;

  constructor(
    private readonly group: DiodeGroup,
    private readonly k: number,
    readonly element: number,
  ) {}

  value(_t: number, y: Float64Array, inputs: InputView): number {
    return this.group.margin(this.k, y, inputs) + 2 * this.group.band(this.k, y);
  }

  consistent(_t: number, y: Float64Array, inputs: InputView): boolean {
    return this.group.margin(this.k, y, inputs) >= -this.group.band(this.k, y);
  }
}
