import { InputError } from '../errors.js';

/** Throw unless `value` is a finite number > 0. `what` reads like "tube \"leg\" length". */
export function requirePositive(value: unknown, what: string, owner: string, unit: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new InputError(
      'non-positive-value',
      `${what} is ${String(value)}${unit ? ' ' + unit : ''}; give a finite number > 0${unit ? ' in ' + unit : ''}`,
      [owner],
    );
  }
  return value;
}

/** Throw unless `value` is a finite number >= 0. */
export function requireNonNegative(value: unknown, what: string, owner: string, unit: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    throw new InputError(
      'negative-value',
      `${what} is ${String(value)}${unit ? ' ' + unit : ''}; give a finite number >= 0${unit ? ' in ' + unit : ''}`,
      [owner],
    );
  }
  return value;
}

/** Throw unless `value` is a finite number. */
export function requireFinite(value: unknown, what: string, owner: string, unit: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new InputError('non-finite-value', `${what} is ${String(value)}; give a finite number${unit ? ' in ' + unit : ''}`, [owner]);
  }
  return value;
}

/** Throw unless `name` is a non-empty string. */
export function requireName(name: unknown, kind: string): string {
  if (typeof name !== 'string' || name.trim() === '') {
    throw new InputError('bad-name', `a ${kind} needs a non-empty name (got ${JSON.stringify(name)}); names appear in messages and exports`, []);
  }
  return name;
}
