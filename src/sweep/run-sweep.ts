import { availableParallelism } from 'node:os';
import { pathToFileURL } from 'node:url';
import { InputError } from '../errors.js';
import type { NetworkDescription } from '../network/description.js';
import { networkFromDescription } from './network-from-description.js';
import { outputName, parseSweepJob } from './parse-sweep-job.js';
import { resolveFunctionWaveforms, runSweepCase } from './run-sweep-case.js';
import { sweepCase, sweepCaseCount } from './sweep-cases.js';
import type { SweepJob } from './sweep-job.js';
import { emptyCounts, type SweepCaseResult, type SweepProgress, type SweepResult } from './sweep-result.js';
import { spawnSweepWorker } from './worker-launch.js';
import { runOnWorkers } from './worker-pool.js';

/**
 * Options of {@link runSweep}.
 *
 * @example
 * ```ts
 * const options: RunSweepOptions = { concurrency: 4, signal: AbortSignal.timeout(600_000), onProgress: terminalProgress() };
 * ```
 */
export interface RunSweepOptions {
  /**
   * Worker threads to run cases on. Default: `os.availableParallelism()`,
   * all cores, at most one per case. Not one less: the main thread only
   * hands out cases and collects results, so it leaves its core to a worker
   * almost all the time (on a 2-core machine, "cores - 1" would mean no
   * parallelism at all).
   */
  readonly concurrency?: number;
  /**
   * Run every case in this thread, one after another, with no workers
   * (concurrency 1): for debugging (breakpoints and stack traces in the
   * case code) and for jobs holding in-process functions or live material
   * laws, which cannot be sent to a worker. Default false.
   */
  readonly inProcess?: boolean;
  /**
   * Cancels the sweep: workers are terminated at once (a case in progress
   * is lost), and the result holds every case finished so far, the others
   * with status `'cancelled'`. In process, the sweep stops before the next
   * case (a simulation runs synchronously, so an abort from a timer takes
   * effect between cases).
   */
  readonly signal?: AbortSignal;
  /** Called at the start, after each case (in the order cases finish) and at the end; see {@link SweepProgress}. */
  readonly onProgress?: (progress: SweepProgress) => void;
  /**
   * The job's base folder: relative module paths of function waveforms
   * (`./drives.js`) resolve against it, and every module the job names must
   * lie inside it or inside `allowModuleFolders` (see
   * {@link resolveFunctionWaveforms}). A directory path or file: URL.
   * Default: the working directory.
   */
  readonly baseUrl?: string | URL;
  /**
   * Further folders the job's modules may be in. A job that names modules
   * runs their code: allow only folders whose code you trust.
   */
  readonly allowModuleFolders?: readonly (string | URL)[];
}

/** A folder as a string (a path or URL href), to pass to a worker. */
function folderHref(folder: string | URL): string {
  return folder instanceof URL ? folder.href : folder;
}

/** The base URL as a string href (a plain path becomes a directory URL). */
function baseHref(base: string | URL | undefined): string | undefined {
  if (base === undefined) return undefined;
  if (base instanceof URL) return base.href;
  if (/^[a-z][a-z0-9+.-]*:\/\//i.test(base)) return base;
  return pathToFileURL(base.endsWith('/') ? base : `${base}/`).href;
}

/** In-process objects a worker cannot receive: function waveforms given as `fn`, live material laws. */
function inProcessOnly(d: NetworkDescription): string[] {
  const names: string[] = [];
  for (const e of d.elements) {
    if ((e.kind === 'voltage-source' || e.kind === 'current-source') && e.waveform.kind === 'function' && e.waveform.fn !== undefined) names.push(e.name);
  }
  for (const t of d.tubes) if (t.law.kind === 'material' && 'fieldStrength' in t.law.material) names.push(t.name);
  return names;
}

function checkOptions(o: RunSweepOptions): void {
  const c = o.concurrency;
  if (c !== undefined && !(Number.isInteger(c) && c >= 1)) {
    throw new InputError('sweep-bad-option', `runSweep option concurrency ${String(c)} must be an integer >= 1`, ['concurrency']);
  }
  if (o.inProcess && c !== undefined && c !== 1) {
    throw new InputError('sweep-bad-option', `runSweep options: inProcess runs one case at a time; drop concurrency ${c} or inProcess`, ['concurrency', 'inProcess']);
  }
}

/**
 * Run a sweep: every case of the job (or of its `range`), in parallel on
 * worker threads or in this thread, with the results in the job's case
 * order whatever order the cases finish in. A case that fails (an invalid
 * value, a simulation that stops early, a worker that dies) gets its
 * status and message and never stops the others.
 *
 * Before any case runs, the job is checked ({@link parseSweepJob}) and the
 * base network is rebuilt once in this thread (function-waveform modules
 * imported, every value checked): a broken job or base network rejects
 * with an `InputError` instead of failing every case.
 *
 * Determinism: a case's result depends only on the job and the case index,
 * never on the worker or the schedule, so a parallel run equals an
 * in-process run bit for bit.
 *
 * Results of inrush, saturation or high-voltage studies are engineering
 * estimates of a model; local codes, standards and licensed practice govern
 * decisions based on them.
 *
 * @example
 * ```ts
 * const controller = new AbortController();
 * const result = await runSweep(job, { onProgress: terminalProgress(), signal: controller.signal });
 * for (const c of result.cases) console.log(c.parameters, c.status, c.outputs['peak current']);
 * ```
 */
export async function runSweep(job: SweepJob, options: RunSweepOptions = {}): Promise<SweepResult> {
  const started = performance.now();
  checkOptions(options);
  const checked = parseSweepJob(job);
  const baseUrl = baseHref(options.baseUrl);
  const total = sweepCaseCount(checked);
  const range = checked.range ?? { start: 0, end: total };
  const indices = Array.from({ length: range.end - range.start }, (_, k) => range.start + k);
  const inProcess = options.inProcess ?? false;
  const concurrency = inProcess ? 1 : Math.max(1, Math.min(options.concurrency ?? availableParallelism(), indices.length));
  if (!inProcess) {
    const local = inProcessOnly(checked.network);
    if (local.length > 0) {
      throw new InputError(
        'sweep-not-transferable',
        `${local.map((n) => `"${n}"`).join(', ')} hold in-process functions or live material laws, which cannot be sent to a worker; ` +
          'give function waveforms as { module, export } and materials as specs, or run with { inProcess: true }',
        local,
      );
    }
  }
  const modules = {
    ...(baseUrl !== undefined ? { baseUrl } : {}),
    ...(options.allowModuleFolders !== undefined ? { allowModuleFolders: options.allowModuleFolders.map(folderHref) } : {}),
  };
  // The base network must be valid on its own: check it once here, not in every case.
  // Its module references are checked before anything is imported.
  networkFromDescription(await resolveFunctionWaveforms(checked.network, modules));

  const results = new Map<number, SweepCaseResult>();
  const counts = emptyCounts();
  const report = (p: Omit<SweepProgress, 'counts' | 'total'>): void => {
    options.onProgress?.({ ...p, total: indices.length, counts: { ...counts } });
  };
  const record = (r: SweepCaseResult): void => {
    results.set(r.index, r);
    counts[r.status]++;
    report({ phase: 'case', done: results.size, case: { index: r.index, status: r.status, message: r.message, parameters: r.parameters } });
  };
  report({ phase: 'start', done: 0 });

  if (inProcess) {
    for (const index of indices) {
      if (options.signal?.aborted) break;
      const r = await runSweepCase(checked, index, {
        ...modules,
        ...(options.signal ? { signal: options.signal } : {}),
      });
      record(r);
      if (r.status === 'cancelled') break;
      // Let timers and abort handlers run between cases.
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
  } else {
    await runOnWorkers<number, SweepCaseResult>({
      tasks: indices,
      size: concurrency,
      spawn: () => spawnSweepWorker({ job: checked, ...modules }),
      ...(options.signal ? { signal: options.signal } : {}),
      onResult: (_index, r) => record(r),
      onCrash: (index, reason) => {
        record({ index, parameters: sweepCase(checked, index).parameters, status: 'error', message: reason, outputs: {}, error: { name: 'WorkerError' } });
      },
    });
  }

  const cases = indices.map((index): SweepCaseResult => {
    const r = results.get(index);
    if (r) return r;
    counts.cancelled++;
    return { index, parameters: sweepCase(checked, index).parameters, status: 'cancelled', message: 'not run: the sweep was cancelled', outputs: {} };
  });
  const status = counts.cancelled > 0 ? 'cancelled' : 'complete';
  report({ phase: 'end', done: results.size });
  return {
    status,
    ...(checked.name !== undefined ? { name: checked.name } : {}),
    total,
    range: { ...range },
    axes: checked.parameters.axes.map((a) => a.name),
    outputs: checked.outputs.map(outputName),
    cases,
    counts: { ...counts },
    mode: inProcess ? 'in-process' : 'workers',
    concurrency,
    elapsedMs: performance.now() - started,
  };
}
