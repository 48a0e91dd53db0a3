/**
 * Errors raised for mistakes in a call (bad input, unknown handle, invalid
 * option). Numerical outcomes (step-size underflow, Newton failure, budgets)
 * are not thrown: they come back as a status on the result, with everything
 * computed so far.
 *
 * Every error carries a stable {@link FluxstateError.code} (documented in
 * docs/errors.md) and the names of the elements involved, so that a script
 * can react to it and a person can fix the model.
 *
 * @example
 * ```ts
 * try {
 *   simulate(net, { stopTime: 0.1 });
 * } catch (e) {
 *   if (e instanceof FluxstateError && e.code === 'floating-node') console.error(e.elements);
 * }
 * ```
 */
export class FluxstateError extends Error {
  /** Stable machine-readable code; see docs/errors.md for the catalogue. */
  readonly code: string;
  /** Names of the elements (or options, or table rows) the error is about. */
  readonly elements: readonly string[];

  constructor(code: string, message: string, elements: readonly string[] = []) {
    super(message);
    this.name = 'FluxstateError';
    this.code = code;
    this.elements = Object.freeze([...elements]);
  }
}

/**
 * A value given by the user is out of its domain (non-finite, negative,
 * unsorted, wrong length...). The message names the value and the fix.
 *
 * @example
 * ```ts
 * throw new InputError('non-positive-length', 'tube "core" has length -1 m; give a length > 0', ['core']);
 * ```
 */
export class InputError extends FluxstateError {
  constructor(code: string, message: string, elements: readonly string[] = []) {
    super(code, message, elements);
    this.name = 'InputError';
  }
}

/**
 * The network's topology cannot be simulated as built (floating node, open
 * winding, loop of ideal voltage sources...). The message names the elements
 * and how to fix the model.
 *
 * @example
 * ```ts
 * throw new TopologyError('floating-node', 'node "x" has no path to ground; add a resistor to ground', ['x']);
 * ```
 */
export class TopologyError extends FluxstateError {
  constructor(code: string, message: string, elements: readonly string[] = []) {
    super(code, message, elements);
    this.name = 'TopologyError';
  }
}
