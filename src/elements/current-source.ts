import { clonePlain } from '../network/clone-plain.js';
import type { CurrentSourceDescription } from '../network/description.js';
import { compileWaveform } from '../waveforms/waveform-spec.js';
import type { CompiledElement, ElementGroup, ElementKind, InputView } from './element-kind.js';
import { stateValue } from './state-value.js';
import { describeWaveform } from './describe-waveform.js';

/**
 * An ideal current source driving waveform(t) out of its plus terminal into
 * the circuit; it adds no unknown.
 *
 * @example
 * ```ts
 * net.currentSource('bias', a, net.ground, constant(1.5));
 * ```
 */
export const currentSourceKind: ElementKind<CurrentSourceDescription> = {
  kind: 'current-source',
  noun: 'current source',
  /** Affine: its terms are linear in the unknowns with coefficients fixed over an input interval. */
  nonAffineUnknowns: () => [],
  role: 'current-source',
  branchCurrent: false,
  openTerminalCode: 'open-terminal',
  check(d, ctx) {
    compileWaveform(d.waveform, { label: ctx.owner, element: d.name });
    return { kind: 'current-source', name: d.name, plus: d.plus, minus: d.minus, waveform: clonePlain(d.waveform) };
  },
  compile(list, ctx) {
    const p = Array.from(list, (e) => ctx.potential(e.d.plus));
    const q = Array.from(list, (e) => ctx.potential(e.d.minus));
    const element = Array.from(list, (e) => e.index);
    return new CurrentSourceGroup(p, q, element, list.map((e, k) => ({
      name: e.d.name,
      index: e.index,
      role: 'current-source' as const,
      current: (t: number, _y: Float64Array, inputs: InputView) => inputs.sourceValue(e.index, t),
      sourcePower: (t: number, y: Float64Array, inputs: InputView) =>
        (stateValue(y, p[k]!) - stateValue(y, q[k]!)) * inputs.sourceValue(e.index, t),
    })));
  },
  listing: (d) => [{ name: 'waveform', value: describeWaveform(d.waveform, 'A') }],
  waveform: (d) => d.waveform,
  waveformFields: ['waveform'],
};

/**
 * The compiled current sources, f as a prototype method: the same function
 * in every network compiled (see the voltage source's group).
 */
class CurrentSourceGroup implements ElementGroup {
  constructor(
    /** Per source: plus and minus potentials (-1: ground), element index. */
    private readonly p: readonly number[],
    private readonly q: readonly number[],
    private readonly element: readonly number[],
    readonly elements: readonly CompiledElement[],
  ) {}

  residual(t: number, _y: Float64Array, inputs: InputView, f: Float64Array): void {
    const { p, q, element } = this;
    for (let k = 0; k < p.length; k++) {
      const i = inputs.sourceValue(element[k]!, t);
      if (p[k]! >= 0) f[p[k]!]! += i;
      if (q[k]! >= 0) f[q[k]!]! -= i;
    }
  }

  jacobian(): void {}

  mass(): void {}
}
