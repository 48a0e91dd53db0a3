import { realpathSync, statSync } from 'node:fs';
import { isAbsolute, relative, resolve, sep } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { InputError } from '../errors.js';

/**
 * Where the modules named by a sweep job may live: the job's base folder and
 * any folders the caller allows explicitly (in code or with the command
 * line's `--allow-modules`), as real paths (symbolic links resolved).
 *
 * A job file is untrusted data (it travels between machines and people), but
 * a module it names is code that runs with the user's rights; so a job may
 * only name files the person running it placed in those folders.
 *
 * @internal
 */
export interface JobModuleFolders {
  /** Real path of the folder relative module paths resolve against. */
  readonly base: string;
  /** Real paths of every folder a module may be in (the base first). */
  readonly allowed: readonly string[];
}

/** A folder given as a path or a file: URL, as an absolute path; other URL schemes are refused. */
function folderPath(folder: string | URL, what: string): string {
  const text = folder instanceof URL ? folder.href : folder;
  if (/^[a-z][a-z0-9+.-]*:/i.test(text) && !/^[a-z]:[\\/]/i.test(text)) {
    if (!text.toLowerCase().startsWith('file:')) {
      throw new InputError('sweep-bad-option', `${what} "${text}" is not a folder on this machine; give a directory path or a file: URL`, [what]);
    }
    return fileURLToPath(text);
  }
  return resolve(text);
}

function realFolder(folder: string | URL, what: string): string {
  const path = folderPath(folder, what);
  let real: string;
  try {
    real = realpathSync(path);
  } catch {
    throw new InputError('sweep-bad-option', `${what} "${path}" does not exist; give an existing directory`, [what]);
  }
  if (!statSync(real).isDirectory()) throw new InputError('sweep-bad-option', `${what} "${path}" is not a directory`, [what]);
  return real;
}

/**
 * The folders of a sweep: `baseUrl` (default: the working directory) and the
 * explicitly allowed ones. Throws `'sweep-bad-option'` for a folder that does
 * not exist or is not on this machine.
 *
 * @internal
 */
export function jobModuleFolders(baseUrl: string | URL | undefined, allow: readonly (string | URL)[] = []): JobModuleFolders {
  const base = realFolder(baseUrl ?? process.cwd(), 'baseUrl');
  return { base, allowed: [base, ...allow.map((f) => realFolder(f, 'allowModuleFolders'))] };
}

/** Whether `path` is `folder` or inside it (both real, absolute paths). */
function inside(path: string, folder: string): boolean {
  const r = relative(folder, path);
  return r === '' || (!r.startsWith(`..${sep}`) && r !== '..' && !isAbsolute(r));
}

/**
 * Check a module reference of a job file and return the file: URL to import.
 * Accepted: a relative path (`./drives.js`, `../shared/drives.js`) that names an
 * existing file inside the base folder or an allowed folder once symbolic
 * links are resolved. Refused with `InputError` `'sweep-bad-job'` naming
 * `field`: URLs of any scheme (`data:`, `file:`, `http:`, `node:`), absolute
 * paths, package names, paths that leave the folders (`../`, a symbolic
 * link that points out), files that do not exist.
 *
 * @internal
 */
export function checkedJobModule(module: string, field: string, folders: JobModuleFolders, names: readonly string[] = []): string {
  const refuse = (why: string): never => {
    throw new InputError(
      'sweep-bad-job',
      `sweep job: ${field}: module "${module}" is refused: ${why}. A job may only name modules by a relative path inside its base folder ` +
        `(${folders.base}) or a folder allowed explicitly (option allowModuleFolders, command line --allow-modules DIR)`,
      [field, ...names],
    );
  };
  if (module.length === 0) refuse('it is empty');
  if (module.includes('\0')) refuse('it contains a NUL character');
  if (/^[a-z][a-z0-9+.-]*:/i.test(module) && !/^[a-z]:[\\/]/i.test(module)) refuse('a URL is not a relative path');
  if (isAbsolute(module) || /^[a-z]:/i.test(module) || module.startsWith('\\') || module.startsWith('/')) refuse('an absolute path is not a relative path');
  if (!module.startsWith('./') && !module.startsWith('../')) refuse('a package name or bare specifier; write the path as "./file.js"');
  const target = resolve(folders.base, module);
  if (!folders.allowed.some((f) => inside(target, f))) refuse('the path leaves the base folder');
  let real: string;
  try {
    real = realpathSync(target);
  } catch {
    return refuse(`no file ${target}`);
  }
  if (!folders.allowed.some((f) => inside(real, f))) refuse(`it is a symbolic link to ${real}, outside the allowed folders`);
  if (!statSync(real).isFile()) refuse('it is not a file');
  return pathToFileURL(real).href;
}
