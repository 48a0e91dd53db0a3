import { InputError } from '../errors.js';

// Internal argument checks shared by the geometry builders. Every failure is an
// InputError whose `elements` name the dimension, so a script can tell which
// number to change.

/**
 * Throw `invalid-dimension` unless `value` is a finite number > 0 (metres, m^2...).
 *
 * @internal
 * @example
 * ```ts
 * requirePositive(input.depth, 'depth', 'uCoreLayout'); // throws invalid-dimension naming 'depth'
 * ```
 */
export function requirePositive(value: number, name: string, owner: string, unit = 'm'): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new InputError(
      'invalid-dimension',
      `${owner}: ${name} = ${String(value)} ${unit} is not a positive finite number; give ${name} > 0 in SI units (${unit}; mm() and mm2() convert from millimetres)`,
      [name],
    );
  }
  return value;
}

/**
 * Throw `invalid-dimension` unless `value` is a finite number >= 0.
 *
 * @internal
 * @example
 * ```ts
 * requireNonNegative(w.spacing, 'windings.centre.spacing', 'eCoreLayout');
 * ```
 */
export function requireNonNegative(value: number, name: string, owner: string, unit = 'm'): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    throw new InputError(
      'invalid-dimension',
      `${owner}: ${name} = ${String(value)} ${unit} is not a finite number >= 0; give ${name} >= 0 in SI units (${unit})`,
      [name],
    );
  }
  return value;
}

/**
 * Stacking (lamination fill) factor in (0, 1]; default 1.
 *
 * @internal
 * @example
 * ```ts
 * const k = stackingFactorOf(input.stackingFactor, 'threeLimbLayout'); // 1 when absent
 * ```
 */
export function stackingFactorOf(value: number | undefined, owner: string): number {
  if (value === undefined) return 1;
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0 || value > 1) {
    throw new InputError(
      'invalid-stacking-factor',
      `${owner}: stackingFactor = ${String(value)} is outside (0, 1]; give the iron fraction of the stack (1 for a solid core, about 0.95 for laminations)`,
      ['stackingFactor'],
    );
  }
  return value;
}

/**
 * Freeze a plain-data value and everything it holds.
 *
 * @internal
 * @example
 * ```ts
 * const layout = deepFreeze({ nodes: ['n1'], paths: [] }); // nested arrays frozen too
 * ```
 */
export function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value)) {
    for (const key of Object.keys(value)) deepFreeze((value as Record<string, unknown>)[key]);
    Object.freeze(value);
  }
  return value;
}

/**
 * Neumaier's compensated sum (an improved Kahan summation: A. Neumaier,
 * ZAMM 54 (1974) 39-51). Keeps C1 and C2 exact to rounding when a core is
 * described by many thin sections of very different size.
 *
 * @internal
 * @example
 * ```ts
 * compensatedSum([1e16, 1, -1e16]); // 1 (a naive sum gives 0)
 * ```
 */
export function compensatedSum(terms: Iterable<number>): number {
  let sum = 0;
  let c = 0;
  for (const x of terms) {
    const t = sum + x;
    c += Math.abs(sum) >= Math.abs(x) ? sum - t + x : x - t + sum;
    sum = t;
  }
  return sum + c;
}
