import { clonePlain } from '../network/clone-plain.js';
import type { VoltageSourceDescription } from '../network/description.js';
import { compileWaveform } from '../waveforms/waveform-spec.js';
import { describeWaveform } from './describe-waveform.js';
import type { CompiledElement, ElementGroup, ElementKind, InputView } from './element-kind.js';
import type { StampTarget } from './stamp-target.js';
import { stateValue } from './state-value.js';

/**
 * An ideal voltage source: v_plus - v_minus = waveform(t), with its current
 * (delivered out of the plus terminal) as an unknown.
 *
 * @example
 * ```ts
 * net.voltageSource('mains', line, net.ground, sine({ amplitude: 325, frequency: 50 }));
 * ```
 */
export const voltageSourceKind: ElementKind<VoltageSourceDescription> = {
  kind: 'voltage-source',
  noun: 'voltage source',
  /** Affine: v+ - v- = V(t), the waveform entering as a term of t alone. */
  nonAffineUnknowns: () => [],
  role: 'voltage-source',
  branchCurrent: true,
  check(d, ctx) {
    compileWaveform(d.waveform, { label: ctx.owner, element: d.name });
    return { kind: 'voltage-source', name: d.name, plus: d.plus, minus: d.minus, waveform: clonePlain(d.waveform) };
  },
  compile(list, ctx) {
    const p = Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Array.from(list, (e) => ctx.potential(e.d.minus));
    const b = Array.from(list, (e) => ctx.branchCurrent(e.index));
    const element = Array.from(list, (e) => e.index);
    return new VoltageSourceGroup(p, q, b, element, list.map((e, k) => ({
      name: e.d.name,
      index: e.index,
      role: 'voltage-source' as const,
      current: (_t: number, y: Float64Array) => y[b[k]!]!,
      sourcePower: (_t: number, y: Float64Array) => (stateValue(y, p[k]!) - stateValue(y, q[k]!)) * y[b[k]!]!,
    })));
  },
  listing: (d) => [{ name: 'waveform', value: describeWaveform(d.waveform, 'V') }],
  waveform: (d) => d.waveform,
  waveformFields: ['waveform'],
  rigidVoltage: () => true,
};

/**
 * The compiled voltage sources, f and J as prototype methods: the same
 * functions in every network compiled, so the network's f calls one target
 * per kind from run to run (closures per compile were a new target each time).
 */
class VoltageSourceGroup implements ElementGroup {
  constructor(
    /** Per source: plus and minus potentials (-1: ground), branch current, element index. */
    private readonly p: readonly number[],
    private readonly q: readonly number[],
    private readonly b: readonly number[],
    private readonly element: readonly number[],
    readonly elements: readonly CompiledElement[],
  ) {}

  residual(t: number, y: Float64Array, inputs: InputView, f: Float64Array): void {
    const { p, q, b, element } = this;
    for (let k = 0; k < b.length; k++) {
      // Each position read once: a store into f between two reads of p[k] made the second a new read.
      const pk = p[k]!;
      const qk = q[k]!;
      const bk = b[k]!;
      const i = y[bk]!;
      if (pk >= 0) f[pk]! += i;
      if (qk >= 0) f[qk]! -= i;
      f[bk]! += stateValue(y, pk) - stateValue(y, qk) - inputs.sourceValue(element[k]!, t);
    }
  }

  jacobian(_t: number, _y: Float64Array, _inputs: InputView, J: StampTarget): void {
    const { p, q, b } = this;
    for (let k = 0; k < b.length; k++) {
      J.add(p[k]!, b[k]!, 1);
      J.add(q[k]!, b[k]!, -1);
      J.add(b[k]!, p[k]!, 1);
      J.add(b[k]!, q[k]!, -1);
    }
  }

  mass(): void {}
}
