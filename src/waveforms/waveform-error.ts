import { InputError } from '../errors.js';

/**
 * The error every waveform validation raises: code `'bad-waveform'`, the
 * owning element named first in the message and listed in `elements`.
 *
 * @internal
 */
export function waveformError(owner: string, text: string): InputError {
  return new InputError('bad-waveform', `${owner}: ${text}`, [owner]);
}

/**
 * Throw a {@link waveformError} unless `value` is a finite number.
 *
 * @internal
 */
export function requireFinite(owner: string, what: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw waveformError(owner, `${what} ${String(value)} is not a finite number; give a finite value`);
  }
}
