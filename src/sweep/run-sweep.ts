import { availableParallelism } from 'node:os';
import { pathToFileURL } from 'node:url';
import { FluxstateError, InputError } from '../errors.js';
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
  /**
   * Wall time one case may take, ms. On worker threads, a case past it has
   * its worker terminated (a case stuck in a user function or a runaway
   * input is stopped too) and ends `'error'` with code
   * `'sweep-case-time-limit'`; the sweep goes on with a new worker. In
   * process, where nothing can interrupt a running case, it caps the case's
   * `maxWallTimeMs` budget instead (the case ends `'incomplete'`,
   * `time-budget`). Default: no limit beyond the job's `maxWallTimeMs`.
   */
  readonly caseTimeLimitMs?: number;
  /**
   * Heap limit of each worker thread, MB (Node's `resourceLimits.maxOldGenerationSizeMb`):
   * a case that needs more ends `'error'` and its worker is replaced, instead
   * of taking the whole process down. Default 2048.
   */
  readonly workerMemoryLimitMb?: number;
  /**
   * Cases already finished by an earlier, interrupted run of the same job
   * (from its journal): they are not run again, and the result holds them
   * as they are. Cases with status `'cancelled'` among them are run.
   */
  readonly previous?: readonly SweepCaseResult[];
  /** Called with each case's full result as soon as it ends (before `onProgress`), for example to stream it to a file. */
  readonly onCase?: (result: SweepCaseResult) => void;
}

/** Default heap limit of a sweep worker, MB. */
const DEFAULT_WORKER_MEMORY_MB = 2048;

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
  for (const key of ['caseTimeLimitMs', 'workerMemoryLimitMb'] as const) {
    const v = o[key];
    if (v !== undefined && !(Number.isFinite(v) && v > 0)) throw new InputError('sweep-bad-option', `runSweep option ${key} ${String(v)} must be a number > 0`, [key]);
  }
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
  const done = new Map<number, SweepCaseResult>();
  for (const r of options.previous ?? []) {
    if (r.index < range.start || r.index >= range.end || r.status === 'cancelled') continue;
    done.set(r.index, r);
  }
  const all = Array.from({ length: range.end - range.start }, (_, k) => range.start + k);
  const indices = all.filter((i) => !done.has(i));
  const inProcess = options.inProcess ?? false;
  const concurrency = inProcess ? 1 : Math.max(1, Math.min(options.concurrency ?? availableParallelism(), Math.max(indices.length, 1)));
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

  const results = new Map<number, SweepCaseResult>(done);
  const counts = emptyCounts();
  for (const r of done.values()) counts[r.status]++;
  const report = (p: Omit<SweepProgress, 'counts' | 'total'>): void => {
    options.onProgress?.({ ...p, total: all.length, counts: { ...counts } });
  };
  const record = (r: SweepCaseResult): void => {
    results.set(r.index, r);
    counts[r.status]++;
    options.onCase?.(r);
    report({ phase: 'case', done: results.size, case: { index: r.index, status: r.status, message: r.message, parameters: r.parameters } });
  };
  report({ phase: 'start', done: results.size });

  const limit = options.caseTimeLimitMs;
  if (inProcess) {
    // Nothing interrupts a synchronous case: the limit becomes the case's wall-time budget.
    const budget = checked.simulate.maxWallTimeMs;
    const job = limit === undefined ? checked : { ...checked, simulate: { ...checked.simulate, maxWallTimeMs: Math.min(limit, budget ?? Infinity) } };
    for (const index of indices) {
      if (options.signal?.aborted) break;
      const r = await runSweepCase(job, index, {
        ...modules,
        ...(options.signal ? { signal: options.signal } : {}),
      });
      record(r);
      if (r.status === 'cancelled') break;
      // Let timers and abort handlers run between cases.
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
  } else if (indices.length > 0) {
    const memory = options.workerMemoryLimitMb ?? DEFAULT_WORKER_MEMORY_MB;
    await runOnWorkers<number, SweepCaseResult>({
      tasks: indices,
      size: concurrency,
      spawn: () => spawnSweepWorker({ job: checked, ...modules }, { maxOldGenerationSizeMb: memory }),
      ...(options.signal ? { signal: options.signal } : {}),
      ...(limit !== undefined ? { taskTimeLimitMs: limit } : {}),
      onResult: (_index, r) => record(r),
      onCrash: (index, reason) => {
        record({ index, parameters: sweepCase(checked, index).parameters, status: 'error', message: reason, outputs: {}, error: { name: 'WorkerError' } });
      },
      onTimeout: (index, ms) => {
        const e = new FluxstateError('sweep-case-time-limit', `the case ran past the sweep's case time limit of ${ms} ms; its worker was terminated`, [`case ${index}`]);
        record({ index, parameters: sweepCase(checked, index).parameters, status: 'error', message: e.message, outputs: {}, error: { name: e.name, code: e.code, elements: [...e.elements] } });
      },
    });
  }

  const cases = all.map((index): SweepCaseResult => {
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
