import { expect } from 'vitest';
import { FluxstateError, InputError, TopologyError } from '../../src/index.js';

/** What a catalogue entry promises about an error (docs/errors.md). */
export interface ExpectedError {
  readonly errorClass: typeof InputError | typeof TopologyError;
  readonly code: string;
  /** Names that `error.elements` must contain. */
  readonly elements: readonly string[];
  /** Patterns the message must match: the element's name, the value, the fix. */
  readonly message: readonly RegExp[];
}

/**
 * Call `fn`, expect it to throw the typed error of a catalogue entry, and
 * return the error for further checks.
 *
 * @example
 * ```ts
 * expectError(() => net.node(''), { errorClass: InputError, code: 'bad-name', elements: [], message: [/non-empty name/] });
 * ```
 */
export function expectError(fn: () => unknown, expected: ExpectedError): FluxstateError {
  let thrown: unknown;
  try {
    fn();
  } catch (e) {
    thrown = e;
  }
  if (thrown === undefined) throw new Error(`expected ${expected.code} to be thrown, but the call returned`);
  if (!(thrown instanceof FluxstateError)) throw thrown;
  expect(thrown).toBeInstanceOf(expected.errorClass);
  expect(thrown.code).toBe(expected.code);
  expect(thrown.elements).toEqual(expect.arrayContaining([...expected.elements]));
  for (const m of expected.message) expect(thrown.message).toMatch(m);
  // One line a person can act on.
  expect(thrown.message).not.toMatch(/\n/);
  return thrown;
}
