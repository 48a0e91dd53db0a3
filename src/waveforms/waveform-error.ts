import { InputError } from '../errors.js';

/**
 * Who a waveform belongs to, for error messages: a plain name (`'V1'`), or a
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
