import type { Waveform } from './waveform.js';
import { requireFinite, waveformError, type WaveformOwner, requireSpecKind } from './waveform-error.js';

/**
 * Description of a waveform given by a user function of time.
 *
 * Two forms:
 * - in-process: `fn` is the function itself (scripts). Such a spec is not
 *   JSON-serialisable;
 * - by reference: `module` (a module specifier or a file path) and `export`
 *   (the export's name, default `'default'`), for descriptions that cross a
 *   process boundary. {@link resolveFunctionWaveform} imports the module and
 *   fills in `fn`; compile only after resolving.
 *
 * The function must return a finite number for every t the solver asks for.
 * It should be smooth between the times listed in `breakpoints` (absolute
 * times, strictly increasing): the solver lands on those exactly, and
 * anywhere else a jump or kink costs many small steps.
 *
 * @example
 * ```ts
 * const byRef: UserFunctionSpec = { kind: 'function', module: './drives.js', export: 'softStart', breakpoints: [0] };
 * ```
 */
export interface UserFunctionSpec {
  readonly kind: 'function';
  /** The function t (s) -> value (V or A). */
  readonly fn?: (t: number) => number;
  /** Module specifier or file path (relative paths resolve against the working directory or `baseUrl`). */
  readonly module?: string;
  /** Name of the module's export that is the function. Default `'default'`. */
  readonly export?: string;
  /** Absolute times, s, where the function or its slope jumps; strictly increasing. */
  readonly breakpoints?: readonly number[];
  /** Name of the function for messages. Default: `fn.name`, else `module#export`. */
  readonly name?: string;
}

/**
 * A user-function waveform spec. The breakpoint array is copied.
 *
 * @example
 * ```ts
 * // in a script: a 50 Hz sine with 5 % third harmonic, switched on at t = 0
 * const distorted = userFunction({
 *   fn: (t) => 325 * (Math.sin(2 * Math.PI * 50 * t) + 0.05 * Math.sin(6 * Math.PI * 50 * t)),
 *   breakpoints: [0],
 *   name: 'mains with 3rd harmonic',
 * });
 * // for a worker process: a reference, resolved there with resolveFunctionWaveform
 * const byRef = userFunction({ module: './drives.js', export: 'softStart' });
 * ```
 */
export function userFunction(params: Omit<UserFunctionSpec, 'kind'>): UserFunctionSpec {
  return {
    kind: 'function',
    ...params,
    ...(params.breakpoints !== undefined ? { breakpoints: [...params.breakpoints] } : {}),
  };
}

/** The name used for a function waveform in messages. */
function functionLabel(spec: UserFunctionSpec): string {
  if (spec.name !== undefined) return spec.name;
  if (spec.module !== undefined) return `${spec.module}#${spec.export ?? 'default'}`;
  if (spec.fn !== undefined && spec.fn.name !== '') return spec.fn.name;
  return 'anonymous function';
}

/**
 * Compile a {@link UserFunctionSpec}; `owner` names the element in errors.
 *
 * The compiled `value(t)` checks every result: if the function throws, or
 * returns anything but a finite number, it throws an `InputError` (code
 * `'bad-waveform'`) naming the source, the function and the time, with the
 * original error as `cause`.
 *
 * @example
 * ```ts
 * const w = userFunctionWaveform(userFunction({ fn: (t) => 1 - Math.exp(-t / 1e-3), breakpoints: [0] }), 'Vsoft');
 * w.value(1e-3); // 0.632...
 * w.breakpoints(0, 1); // [0]
 * ```
 */
export function userFunctionWaveform(spec: UserFunctionSpec, owner: WaveformOwner = 'waveform'): Waveform {
  requireSpecKind(spec, 'function', 'userFunctionWaveform', owner);
  const fn = spec.fn;
  const label = functionLabel(spec);
  if (fn === undefined) {
    if (spec.module !== undefined) {
      throw waveformError(
        owner,
        `function waveform "${label}" is a module reference that has not been resolved; call \`await resolveFunctionWaveform(spec)\` before compiling`,
      );
    }
    throw waveformError(owner, 'function waveform has neither `fn` nor `module`; give the function or a module and export name');
  }
  if (typeof fn !== 'function') {
    throw waveformError(owner, `function waveform "${label}": fn is a ${typeof fn}, not a function; give (t) => number`);
  }
  const bps = Float64Array.from(spec.breakpoints ?? []);
  for (let i = 0; i < bps.length; i++) {
    requireFinite(owner, `function waveform "${label}" breakpoint [${i}]`, bps[i] ?? Number.NaN);
    if (i > 0 && !((bps[i] ?? 0) > (bps[i - 1] ?? 0))) {
      throw waveformError(owner, `function waveform "${label}" breakpoints must be strictly increasing (breakpoints[${i}] = ${bps[i]} s); sort them and drop duplicates`);
    }
  }

  const value = (t: number): number => {
    let v: unknown;
    try {
      v = fn(t);
    } catch (cause) {
      const reason = cause instanceof Error ? cause.message : String(cause);
      const err = waveformError(owner, `function waveform "${label}" threw at t = ${t} s: ${reason}; fix the function or its domain`);
      err.cause = cause;
      throw err;
    }
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw waveformError(owner, `function waveform "${label}" returned ${String(v)} at t = ${t} s; it must return a finite number`);
    }
    return v;
  };

  const breakpoints = (t0: number, t1: number): number[] => {
    const out: number[] = [];
    if (!(t1 >= t0)) return out;
    // First breakpoint >= t0 by bisection; the list can be long (one per switching event).
    let lo = 0;
    let hi = bps.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if ((bps[mid] ?? 0) < t0) lo = mid + 1;
      else hi = mid;
    }
    for (let i = lo; i < bps.length; i++) {
      const b = bps[i] ?? 0;
      if (b > t1) break;
      out.push(b);
    }
    return out;
  };

  const nextBreakpoint = (after: number): number => {
    // First breakpoint > after by bisection.
    let lo = 0;
    let hi = bps.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if ((bps[mid] ?? 0) <= after) lo = mid + 1;
      else hi = mid;
    }
    return lo < bps.length ? bps[lo]! : Infinity;
  };

  return { value, breakpoints, nextBreakpoint };
}
