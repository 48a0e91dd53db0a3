import { InputError } from '../errors.js';

/** Deepest nesting a job may have: a job is at most ~10 levels deep; values (waveform specs) add a few. */
export const MAX_JOB_DEPTH = 64;

/** Keys that would change an object's prototype when copied with `target[key] = value`. */
const RESERVED_KEYS = new Set(['__proto__']);

/** Render a path like `parameters.grid.angle[3]`. */
function pathText(path: readonly (string | number)[]): string {
  let text = '';
  for (const key of path) text += typeof key === 'number' ? `[${key}]` : text === '' ? key : `.${key}`;
  return text === '' ? '(top level)' : text;
}

/**
 * Check a raw job (or result) document before schema validation, without
 * recursion (so that no input can overflow the stack): nesting at most
 * {@link MAX_JOB_DEPTH} levels, no `__proto__` key anywhere (a JSON file may
 * hold one as an own key; copying it would replace an object's prototype),
 * only JSON values (no functions, symbols, bigints; a cycle ends as too
 * deep). With `allowLive`, functions and non-plain objects (live material
 * laws, in-process functions) pass, unwalked. Throws
 * `InputError` with `code` naming the first offending field.
 *
 * @internal
 */
export function checkJsonShape(input: unknown, code: string, what: string, allowLive = false): void {
  const fail = (path: readonly (string | number)[], why: string): never => {
    const field = pathText(path);
    throw new InputError(code, `${what}: ${field}: ${why}`, [field]);
  };
  const stack: { value: unknown; path: (string | number)[] }[] = [{ value: input, path: [] }];
  while (stack.length > 0) {
    const { value, path } = stack.pop()!;
    if (value === null || typeof value !== 'object') {
      if (typeof value === 'bigint' || typeof value === 'symbol') fail(path, `a ${typeof value} is not a JSON value`);
      if (typeof value === 'function' && !allowLive) fail(path, 'a function is not a JSON value');
      continue;
    }
    if (path.length > MAX_JOB_DEPTH) {
      fail(path.slice(0, 8), `nested more than ${MAX_JOB_DEPTH} levels deep (or refers to itself); a job is plain data a few levels deep`);
    }
    if (Array.isArray(value)) {
      for (let k = value.length - 1; k >= 0; k--) stack.push({ value: value[k], path: [...path, k] });
    } else {
      const proto = Object.getPrototypeOf(value);
      // Live objects (material laws, typed arrays) are allowed where the caller allows them; their insides are not walked.
      if (proto !== Object.prototype && proto !== null) {
        if (!allowLive) fail(path, 'is not plain data');
        continue;
      }
      for (const key of Object.keys(value)) {
        if (RESERVED_KEYS.has(key)) fail([...path, key], `"${key}" cannot be used as a name or field`);
        stack.push({ value: (value as Record<string, unknown>)[key], path: [...path, key] });
      }
    }
  }
}
