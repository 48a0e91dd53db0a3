import type { Worker } from 'node:worker_threads';
import { FluxstateError } from '../errors.js';

/**
 * Messages between the pool and its workers. A worker posts `ready` once its
 * modules are loaded, then one `done` per `run` it receives; it gets one task
 * at a time.
 *
 * @internal
 */
export type PoolMessage<T, R> =
  | { readonly type: 'ready' }
  | { readonly type: 'run'; readonly task: T }
  | { readonly type: 'done'; readonly result: R };

/** Options of {@link runOnWorkers}. @internal */
export interface RunOnWorkersOptions<T, R> {
  /** Tasks, handed out in this order. */
  readonly tasks: readonly T[];
  /** Most workers alive at once (>= 1). */
  readonly size: number;
  /** Start one worker. */
  readonly spawn: () => Worker;
  readonly signal?: AbortSignal;
  /** A task finished in a worker. */
  readonly onResult: (task: T, result: R) => void;
  /** The worker running a task died (uncaught error, process.exit, out of memory); the pool starts another for the remaining tasks. */
  readonly onCrash: (task: T, reason: string) => void;
  /** Every worker that exits, for tests and diagnostics. */
  readonly onWorkerExit?: (code: number) => void;
  /**
   * Wall time one task may take, ms: past it the worker is terminated, the
   * task reported to `onTimeout`, and a new worker takes the remaining tasks.
   * Default: no limit.
   */
  readonly taskTimeLimitMs?: number;
  /** A task ran past `taskTimeLimitMs` and its worker was terminated. */
  readonly onTimeout?: (task: T, limitMs: number) => void;
}

/**
 * Run tasks on a small pool of worker threads: each worker takes the next
 * task when it finishes one, so the load balances itself; a worker that dies
 * costs only its task, and is replaced. Resolves when every task has a
 * result or a crash (`'complete'`), or after an abort once every worker has
 * been terminated (`'cancelled'`). Rejects, after terminating the others,
 * when a worker dies before it is ready (its modules do not load): every
 * task would fail the same way.
 *
 * @internal
 */
export function runOnWorkers<T, R>(options: RunOnWorkersOptions<T, R>): Promise<'complete' | 'cancelled'> {
  const { tasks, signal } = options;
  const queue = [...tasks];
  const live = new Set<Worker>();
  let finished = 0;
  let settled = false;

  return new Promise((resolve, reject) => {
    const timers = new Set<ReturnType<typeof setTimeout>>();
    const stop = (then: () => void): void => {
      if (settled) return;
      settled = true;
      for (const t of timers) clearTimeout(t);
      signal?.removeEventListener('abort', onAbort);
      void Promise.all([...live].map((w) => w.terminate())).then(then, then);
    };
    const onAbort = (): void => stop(() => resolve('cancelled'));
    // A throwing callback (a progress handler, say) ends the run: terminate, then reject with its error.
    const guarded = (fn: () => void): boolean => {
      try {
        fn();
        return true;
      } catch (e) {
        stop(() => reject(e));
        return false;
      }
    };
    const taskDone = (): void => {
      finished++;
      if (finished === tasks.length) stop(() => resolve('complete'));
    };

    const start = (): void => {
      const worker = options.spawn();
      live.add(worker);
      let ready = false;
      let busy: { task: T; timer?: ReturnType<typeof setTimeout> } | undefined;
      let timedOut = false;
      let lastError: Error | undefined;
      const limit = options.taskTimeLimitMs;
      const next = (): void => {
        if (settled) return;
        const task = queue.shift();
        if (task === undefined) return;
        busy = { task };
        if (limit !== undefined) {
          const timer = setTimeout(() => {
            timers.delete(timer);
            timedOut = true;
            void worker.terminate();
          }, limit);
          timers.add(timer);
          busy.timer = timer;
        }
        worker.postMessage({ type: 'run', task } satisfies PoolMessage<T, R>);
      };
      worker.on('message', (m: PoolMessage<T, R>) => {
        if (settled) return;
        if (m.type === 'ready') {
          ready = true;
          next();
        } else if (m.type === 'done' && busy && !timedOut) {
          const { task, timer } = busy;
          clearTimeout(timer);
          if (timer) timers.delete(timer);
          busy = undefined;
          if (!guarded(() => options.onResult(task, m.result))) return;
          taskDone();
          next();
        }
      });
      worker.on('error', (e) => {
        lastError = e;
      });
      worker.on('exit', (code) => {
        live.delete(worker);
        options.onWorkerExit?.(code);
        if (settled) return;
        if (!ready) {
          const why = lastError?.message ?? `exit code ${code}`;
          stop(() => reject(new FluxstateError('sweep-worker-start', `a sweep worker could not start (${why}); run with { inProcess: true } to see the error in this thread`)));
          return;
        }
        if (busy) {
          const { task, timer } = busy;
          clearTimeout(timer);
          if (timer) timers.delete(timer);
          busy = undefined;
          if (timedOut && limit !== undefined) {
            const report = options.onTimeout
              ? () => options.onTimeout!(task, limit)
              : () => options.onCrash(task, `the case ran past its time limit of ${limit} ms; its worker was terminated`);
            if (!guarded(report)) return;
          } else {
            const why = lastError ? `${lastError.name}: ${lastError.message}` : `the worker exited with code ${code}`;
            if (!guarded(() => options.onCrash(task, `worker thread died while running this case (${why})`))) return;
          }
          taskDone();
        }
        if (!settled && queue.length > 0 && live.size < options.size) start();
      });
    };

    if (signal?.aborted) {
      settled = true;
      resolve('cancelled');
      return;
    }
    if (tasks.length === 0) {
      settled = true;
      resolve('complete');
      return;
    }
    signal?.addEventListener('abort', onAbort, { once: true });
    for (let k = 0; k < Math.min(options.size, tasks.length); k++) start();
  });
}
