import { InputError } from '../errors.js';

/**
 * Who a waveform belongs to, for error messages: a plain name (`'mains'`), or a
 * phrase for the message with the element's name for `error.elements`
 * (the network builder passes `{ label: 'voltage source "mains"', element: 'mains' }`).
 *
 * @example
 * ```ts
 * const owner: WaveformOwner = { label: 'voltage source "mains"', element: 'mains' };
 * compileWaveform(sine({ amplitude: 325, frequency: 50 }), owner);
 * ```
 */
export type WaveformOwner = string | { readonly label: string; readonly element: string };

/**
 * The error every waveform validation raises: code `'bad-waveform'`, the
 * owner's label first in the message and the owning element in `elements`.
 *
 * @internal
 */
export function waveformError(owner: WaveformOwner, text: string): InputError {
  const label = typeof owner === 'string' ? owner : owner.label;
  const element = typeof owner === 'string' ? owner : owner.element;
  return new InputError('bad-waveform', `${label}: ${text}`, [element]);
}

/**
 * Throw a {@link waveformError} unless `value` is a finite number.
 *
 * @internal
 */
export function requireFinite(owner: WaveformOwner, what: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw waveformError(owner, `${what} ${String(value)} is not a finite number; give a finite value`);
  }
}

/** The spec helper that makes each kind of waveform spec. */
const SPEC_HELPERS: Readonly<Record<string, string>> = {
  constant: 'constant',
  sine: 'sine',
  pulse: 'pulse',
  'bipolar-square': 'bipolarSquare',
  'piecewise-linear': 'piecewiseLinear',
  function: 'userFunction',
};

/**
 * What went wrong when something that is not a waveform spec of a known
 * kind reaches a compiler: a compiled waveform where the spec was meant, the
 * helper's parameters without the helper call, or an unknown kind. Names the
 * call that was meant.
 *
 * @internal
 */
export function notASpecMessage(spec: unknown): string {
  const s = spec as { kind?: unknown; value?: unknown; breakpoints?: unknown };
  if (typeof s.value === 'function' && typeof s.breakpoints === 'function') {
    return 'this is a compiled waveform (from sineWaveform(), pulseWaveform()...); sources take the plain spec: use sine({ ... }), pulse({ ... }) and the like, not the ...Waveform() functions';
  }
  if (s.kind === undefined) {
    const guess = 'amplitude' in (s as object) && 'frequency' in (s as object) ? 'sine' : 'period' in (s as object) ? 'pulse or bipolarSquare' : 'constant, sine, pulse...';
    return `the spec has no kind: were the parameters passed without the helper? write ${guess}({ ... }) around them`;
  }
  return `waveform kind ${JSON.stringify(s.kind)} is not known; use 'constant', 'sine', 'pulse', 'bipolar-square', 'piecewise-linear' or 'function'`;
}

/**
 * Refuse a spec of another kind in `helper` (e.g. `sineWaveform`), naming
 * the call that was meant.
 *
 * @internal
 */
export function requireSpecKind(spec: unknown, kind: string, helper: string, owner: WaveformOwner): void {
  const k = spec !== null && typeof spec === 'object' ? (spec as { kind?: unknown }).kind : undefined;
  if (k === kind) return;
  const maker = SPEC_HELPERS[kind] ?? kind;
  const other = typeof k === 'string' && SPEC_HELPERS[k] !== undefined ? ` this spec is a '${k}': compile it with compileWaveform(spec) or ${SPEC_HELPERS[k]}Waveform(spec).` : '';
  throw waveformError(
    owner,
    `${helper}() compiles a spec made by ${maker}() (kind '${kind}'); ${spec === null || typeof spec !== 'object' ? `got ${String(spec)}` : notASpecMessage(spec)}.${other} ` +
      `For a source, give ${maker}({ ... }) itself; to evaluate it, call ${helper}(${maker}({ ... }))`,
  );
}
