import { FluxstateError } from '../errors.js';
import type { ElementDescription, NetworkDescription } from '../network/description.js';
import { handlesOf } from '../network/handles-of.js';
import { simulate, type SimulateOptions } from '../simulate.js';
import { resolveFunctionWaveform } from '../waveforms/resolve-function-waveform.js';
import type { WaveformSpec } from '../waveforms/waveform-spec.js';
import { elementKind } from '../elements/registry.js';
import { applySweepEdits } from './apply-sweep-edits.js';
import { computeOutputs } from './compute-outputs.js';
import { checkedJobModule, jobModuleFolders, type JobModuleFolders } from './job-module-policy.js';
import { sweepCase } from './sweep-cases.js';
import type { SweepJob } from './sweep-job.js';
import type { SweepCaseResult } from './sweep-result.js';

/**
 * Options of {@link runSweepCase}.
 *
 * @example
 * ```ts
 * const options: RunSweepCaseOptions = { baseUrl: new URL('./jobs/', import.meta.url) };
 * ```
 */
export interface RunSweepCaseOptions {
  /**
   * Base folder of the job: relative module paths of function waveforms
   * resolve against it, and modules must lie inside it (or inside
   * `allowModuleFolders`). A directory path or file: URL. Default: the
   * working directory.
   */
  readonly baseUrl?: string | URL;
  /** Further folders the job's modules may be in (see {@link resolveFunctionWaveforms}). */
  readonly allowModuleFolders?: readonly (string | URL)[];
  /** Stops the case's simulation; the case then ends `'cancelled'`. */
  readonly signal?: AbortSignal;
}

/**
 * Options of {@link resolveFunctionWaveforms}.
 *
 * @example
 * ```ts
 * const options: ResolveJobModulesOptions = { baseUrl: pathToFileURL('jobs/'), allowModuleFolders: ['/opt/drives'] };
 * ```
 */
export interface ResolveJobModulesOptions {
  /** The job's base folder (directory path or file: URL). Default: the working directory. */
  readonly baseUrl?: string | URL;
  /** Further folders modules may be in, besides the base folder. */
  readonly allowModuleFolders?: readonly (string | URL)[];
}

/**
 * Import the modules of function waveforms given by reference (module and
 * export) and return a description whose elements carry the functions: a
 * source's waveform, a switch's gate, any waveform input an element kind
 * declares (`waveformFields` of its registry entry). The input is not
 * modified.
 *
 * A job that names modules runs their code. Module references are therefore
 * treated as untrusted: each must be a relative path (`./drives.js`) to a file
 * inside the base folder or an allowed folder, symbolic links resolved.
 * URLs (`data:`, `file:`, ...), absolute paths, package names, `../` paths
 * and links that lead out of the folders are refused, before anything is
 * imported, with `InputError` `'sweep-bad-job'` naming the field
 * (`network.elements[2] (voltage-source "drive").waveform.module`,
 * `network.elements[4] (switch "Q1").gate.module`).
 *
 * @example
 * ```ts
 * const live = await resolveFunctionWaveforms(description, { baseUrl: pathToFileURL('jobs/') });
 * ```
 */
export async function resolveFunctionWaveforms(
  description: NetworkDescription,
  options: ResolveJobModulesOptions = {},
): Promise<NetworkDescription> {
  let folders: JobModuleFolders | undefined;
  let changed = false;
  const elements: ElementDescription[] = [];
  for (const [i, e] of description.elements.entries()) {
    let element = e;
    for (const field of (elementKind(e).waveformFields ?? []) as readonly string[]) {
      const spec = (e as unknown as Record<string, WaveformSpec | undefined>)[field];
      if (spec === undefined || spec.kind !== 'function' || spec.fn !== undefined) continue;
      const owner = `${e.kind} "${e.name}"`;
      const label = field === 'waveform' ? owner : `${owner} ${field}`;
      const module = spec.module;
      let waveform: WaveformSpec;
      if (typeof module === 'string') {
        folders ??= jobModuleFolders(options.baseUrl, options.allowModuleFolders);
        const href = checkedJobModule(module, `network.elements[${i}] (${owner}).${field}.module`, folders, [e.name]);
        // Import the checked file URL; keep the job's own reference in the description.
        waveform = { ...(await resolveFunctionWaveform({ ...spec, module: href }, { label, element: e.name })), module };
      } else {
        waveform = await resolveFunctionWaveform(spec, { label, element: e.name });
      }
      element = { ...element, [field]: waveform } as ElementDescription;
      changed = true;
    }
    elements.push(element);
  }
  return changed ? { ...description, elements } : description;
}

/** The job's simulate options as `SimulateOptions`. */
function simulateOptions(job: SweepJob, signal: AbortSignal | undefined): SimulateOptions {
  return { ...job.simulate, ...(signal !== undefined ? { signal } : {}) };
}

/**
 * Run one case of a sweep in this thread and return its plain-data result:
 * apply the case's values to the base network, import function waveforms
 * named by module, simulate (whose front door checks every value by the
 * builder's rules, as for any plain description), and compute the outputs. Never throws for a failing
 * case: the failure is the case's status and message. This is the code
 * path of every case, in process and in a worker; call it alone to debug
 * one case. The job should have passed {@link parseSweepJob}.
 *
 * @example
 * ```ts
 * const c = await runSweepCase(parseSweepJob(json), 17);
 * console.log(c.status, c.message, c.outputs);
 * ```
 */
export async function runSweepCase(job: SweepJob, index: number, options: RunSweepCaseOptions = {}): Promise<SweepCaseResult> {
  const c = sweepCase(job, index);
  const base = { index, parameters: c.parameters };
  try {
    const edited = applySweepEdits(job.network, c.edits);
    const resolved = await resolveFunctionWaveforms(edited, {
      ...(options.baseUrl !== undefined ? { baseUrl: options.baseUrl } : {}),
      ...(options.allowModuleFolders !== undefined ? { allowModuleFolders: options.allowModuleFolders } : {}),
    });
    // The front door shared with simulate, the stepper and the periodic steady state: the description is checked there, once.
    const result = simulate(resolved, simulateOptions(job, options.signal));
    const description = result.network;
    const simulation = { status: result.status, reachedTime: result.time[result.time.length - 1] ?? Number.NaN, stats: { ...result.stats } };
    if (result.status === 'aborted' && options.signal?.aborted) {
      return { ...base, status: 'cancelled', message: 'cancelled while running', outputs: {}, simulation };
    }
    const complete = result.status === 'success';
    const { outputs, notes } = computeOutputs(result, handlesOf(description), job.outputs, complete);
    const time = job.outputs.some((o) => o.metric === 'series') ? { time: Float64Array.from(result.time) } : {};
    const message = [result.message, ...notes].join('; ');
    return { ...base, status: complete ? 'success' : 'incomplete', message, outputs, ...time, simulation };
  } catch (e) {
    const error = e instanceof FluxstateError
      ? { name: e.name, code: e.code, elements: [...e.elements] }
      : { name: e instanceof Error ? e.name : 'Error' };
    return { ...base, status: 'error', message: e instanceof Error ? e.message : String(e), outputs: {}, error };
  }
}
