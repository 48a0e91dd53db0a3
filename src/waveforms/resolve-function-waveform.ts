import type { UserFunctionSpec } from './user-function.js';
import { waveformError, type WaveformOwner } from './waveform-error.js';

/**
 * Options of {@link resolveFunctionWaveform}.
 *
 * @example
 * ```ts
 * await resolveFunctionWaveform(spec, 'Vin', { baseUrl: new URL('./', import.meta.url) });
 * ```
 */
export interface ResolveFunctionOptions {
  /**
   * Base for relative module paths (`./x.js`, `../x.js`): a file or directory
   * URL (with a trailing slash for a directory). Default: the current working
   * directory.
   */
  readonly baseUrl?: string | URL;
}

/** Whether a module string is a file path (relative or absolute) rather than a package specifier or URL. */
function isPath(module: string): boolean {
  return module.startsWith('./') || module.startsWith('../') || module.startsWith('/') || /^[A-Za-z]:[\\/]/.test(module);
}

/**
 * Turn a by-reference function waveform (`module` + `export`) into an
 * in-process one, by importing the module and picking the export. A spec
 * that already has `fn` is returned as is. The input is not modified; a new
 * spec is returned.
 *
 * The formulation calls this before compiling, so descriptions sent to a
 * worker process can name their functions instead of carrying them.
 * Relative paths resolve against `options.baseUrl`, else the working
 * directory; package names and `file:` URLs go to `import()` unchanged.
 *
 * Errors (`InputError`, code `'bad-waveform'`, naming `owner`): no module, a
 * module that cannot be imported (the import error is the `cause`), a
 * missing export, an export that is not a function.
 *
 * @example
 * ```ts
 * // drives.js: export function softStart(t) { return t < 1e-3 ? 1e4 * t : 10; }
 * const spec = await resolveFunctionWaveform(userFunction({ module: './drives.js', export: 'softStart', breakpoints: [0, 1e-3] }), 'Vin');
 * compileWaveform(spec, 'Vin').value(5e-4); // 5
 * ```
 */
export async function resolveFunctionWaveform(
  spec: UserFunctionSpec,
  owner: WaveformOwner = 'waveform',
  options: ResolveFunctionOptions = {},
): Promise<UserFunctionSpec> {
  if (spec.fn !== undefined) return spec;
  const module = spec.module;
  if (module === undefined || module === '') {
    throw waveformError(owner, 'function waveform has neither `fn` nor `module`; give the function or a module and export name');
  }
  const exportName = spec.export ?? 'default';
  let specifier = module;
  if (isPath(module)) {
    // Loaded lazily so that the waveform family stays importable where node:url is absent.
    const { pathToFileURL } = await import('node:url');
    const base = options.baseUrl ?? pathToFileURL(`${process.cwd()}/`);
    specifier = module.startsWith('.') ? new URL(module, base).href : pathToFileURL(module).href;
  }
  let namespace: Record<string, unknown>;
  try {
    namespace = (await import(specifier)) as Record<string, unknown>;
  } catch (cause) {
    const reason = cause instanceof Error ? cause.message : String(cause);
    const err = waveformError(owner, `function waveform module "${module}" could not be imported (${reason}); check the path or package name`);
    err.cause = cause;
    throw err;
  }
  const picked = namespace[exportName];
  if (picked === undefined) {
    const names = Object.keys(namespace).join(', ') || 'none';
    throw waveformError(owner, `function waveform module "${module}" has no export "${exportName}" (exports: ${names}); give an existing export name`);
  }
  if (typeof picked !== 'function') {
    throw waveformError(owner, `function waveform export "${exportName}" of "${module}" is a ${typeof picked}, not a function; export (t) => number`);
  }
  return { ...spec, fn: picked as (t: number) => number };
}
