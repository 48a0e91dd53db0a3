import { InputError } from '../errors.js';
import { requireNonNegative, requirePositive } from '../network/argument-checks.js';
import type { WindingDescription } from '../network/description.js';
import { packedDoublesFrom } from '../solver/packed-doubles.js';
import type { CompiledElement, ElementGroup, ElementKind, InputView } from './element-kind.js';
import type { TubeLoops } from './tube-kind.js';
import { loopFlux } from './loop-flux.js';
import { stampBranch, type StampTarget } from './stamp-target.js';
import { stateValue } from './state-value.js';

/**
 * A winding of N turns on a flux tube: v_plus - v_minus = R i + s N dphi/dt
 * (s the orientation), and the MMF s N i in every magnetic loop through its
 * tube. The N dphi/dt terms are mass-matrix entries on the loop fluxes, so
 * the winding voltage is integrated into flux, never differentiated out of it.
 *
 * @example
 * ```ts
 * net.winding('primary', { tube: leg, turns: 240, resistance: 1.2, plus: a, minus: net.ground });
 * ```
 */
export const windingKind: ElementKind<WindingDescription> = {
  kind: 'winding',
  noun: 'winding',
  /** Affine: its terms are linear in the unknowns with coefficients fixed over an input interval. */
  nonAffineUnknowns: () => [],
  role: 'inductive',
  branchCurrent: true,
  openTerminalCode: 'open-winding',
  check(d, ctx) {
    if (typeof d.tube !== 'number' || !Number.isInteger(d.tube) || d.tube < 0 || d.tube >= ctx.tubeCount) {
      throw new InputError('bad-description', `network description: "${d.name}" field "tube" = ${String(d.tube)} is not the index of a flux tube`, [d.name]);
    }
    const turns = requirePositive(d.turns, `${ctx.owner} turns`, d.name, '');
    const resistance = requireNonNegative(d.resistance ?? 0, `${ctx.owner} resistance`, d.name, 'ohm');
    const orientation = d.orientation ?? 1;
    if (orientation !== 1 && orientation !== -1) {
      throw new InputError('bad-orientation', `${ctx.owner} orientation ${String(orientation)} must be +1 or -1`, [d.name]);
    }
    return { kind: 'winding', name: d.name, plus: d.plus, minus: d.minus, tube: d.tube, turns, resistance, orientation };
  },
  compile(list, ctx) {
    const p = Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Array.from(list, (e) => ctx.potential(e.d.minus));
    const b = Array.from(list, (e) => ctx.branchCurrent(e.index));
    const r = packedDoublesFrom(list, (e) => e.d.resistance);
    const sN = packedDoublesFrom(list, (e) => e.d.orientation * e.d.turns);
    const loops = list.map((e) => ctx.tubeLoops(e.d.tube));
    const flux = (k: number, y: Float64Array): number => loopFlux(loops[k]!, y);
    return new WindingGroup(p, q, b, r, sN, loops, list.map((e, k) => {
        const voltage = (y: Float64Array): number => stateValue(y, p[k]!) - stateValue(y, q[k]!);
        const copper = (_t: number, y: Float64Array): number => r[k]! * y[b[k]!]! ** 2;
        return {
          name: e.d.name,
          index: e.index,
          role: 'inductive' as const,
          current: (_t: number, y: Float64Array) => y[b[k]!]!,
          loss: { category: 'windings' as const, power: copper },
          extra: {
            emf: (_t: number, y: Float64Array) => voltage(y) - r[k]! * y[b[k]!]!,
            copperLoss: copper,
            fluxLinkage: (_t: number, y: Float64Array) => sN[k]! * flux(k, y),
          },
        };
      }));
  },
  listing: (d, network) => [
    { name: 'tube', value: network.tubes[d.tube]!.name },
    { name: 'turns', value: d.turns, digits: 6 },
    { name: 'resistance', value: d.resistance, unit: 'ohm' },
    { name: 'orientation', value: d.orientation > 0 ? 'along tube' : 'against tube' },
  ],
  rigidVoltage: (d) => d.resistance === 0,
  linkedFlux: (d) => ({ tube: d.tube, turns: d.orientation * d.turns }),
};

/**
 * The compiled windings, f, J and M as prototype methods: the same
 * functions in every network compiled, so the network's f calls one target
 * per kind from run to run (closures per compile were a new target each time).
 */
class WindingGroup implements ElementGroup {
  constructor(
    /** Per winding: plus and minus potentials (-1: ground), branch current, resistance, signed turns, loops through its tube. */
    private readonly p: readonly number[],
    private readonly q: readonly number[],
    private readonly b: readonly number[],
    private readonly r: readonly number[],
    private readonly sN: readonly number[],
    private readonly loops: readonly TubeLoops[],
    readonly elements: readonly CompiledElement[],
  ) {}

  residual(_t: number, y: Float64Array, _inputs: InputView, f: Float64Array): void {
    const { p, q, b, r, sN, loops } = this;
    for (let k = 0; k < b.length; k++) {
      // Each position read once: a store into f between two reads of p[k] made the second a new read.
      const pk = p[k]!;
      const qk = q[k]!;
      const bk = b[k]!;
      const i = y[bk]!;
      f[bk]! += stateValue(y, pk) - stateValue(y, qk) - r[k]! * i;
      if (pk >= 0) f[pk]! -= i;
      if (qk >= 0) f[qk]! += i;
      const { index, sign } = loops[k]!;
      const mmf = sN[k]! * i;
      // A tube in one loop without a loop's back edge (as in the network's own tube loop).
      if (index.length === 1) f[index[0]!]! += sign[0]! * mmf;
      else for (let j = 0; j < index.length; j++) f[index[j]!]! += sign[j]! * mmf;
    }
  }

  jacobian(_t: number, _y: Float64Array, _inputs: InputView, J: StampTarget): void {
    const { p, q, b, r, sN, loops } = this;
    for (let k = 0; k < b.length; k++) {
      J.add(b[k]!, b[k]!, -r[k]!);
      stampBranch(J, p[k]!, q[k]!, b[k]!, 1);
      const { index, sign } = loops[k]!;
      for (let j = 0; j < index.length; j++) J.add(index[j]!, b[k]!, sign[j]! * sN[k]!);
    }
  }

  mass(M: StampTarget): void {
    const { b, sN, loops } = this;
    for (let k = 0; k < b.length; k++) {
      const { index, sign } = loops[k]!;
      for (let j = 0; j < index.length; j++) M.add(b[k]!, index[j]!, sign[j]! * sN[k]!);
    }
  }
}
