import { FluxstateError } from '../../src/index.js';

/** The FluxstateError `fn` throws (undefined when it does not throw; any other error is rethrown). */
export function errorOf(fn: () => unknown): FluxstateError | undefined {
  try {
    fn();
  } catch (e) {
    if (e instanceof FluxstateError) return e;
    throw e;
  }
  return undefined;
}
