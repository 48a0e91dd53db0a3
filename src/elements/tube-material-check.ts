import { InputError } from '../errors.js';

/**
 * Run a tube's material check so that a bad material fails at the call that
 * gave it: its error keeps its code and gains the tube's name (in the
 * message and in `elements`).
 *
 * @example
 * ```ts
 * checkTubeMaterial(() => compileMaterial(law.material), 'tube "leg"', 'leg');
 * ```
 */
export function checkTubeMaterial(check: () => unknown, owner: string, name: string): void {
  try {
    check();
  } catch (e) {
    if (e instanceof InputError) throw new InputError(e.code, `${owner}: ${e.message}`, [name, ...e.elements]);
    throw e;
  }
}
