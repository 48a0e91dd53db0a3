import { Worker, type ResourceLimits } from 'node:worker_threads';
import type { SweepWorkerData } from './sweep-worker.js';

/**
 * How to start a sweep worker from wherever this module runs.
 *
 * - Built package (`dist/sweep/*.js`): the worker is `sweep-worker.js` next to
 *   this file, plain JavaScript, started with Node's defaults (it inherits the
 *   process's exec arguments).
 * - TypeScript sources (vitest, `tsx script.ts`): this file is `*.ts`. Node 20
 *   cannot load `sweep-worker.ts` by itself, and tsx does not register itself
 *   in worker threads on Node 20, so the worker starts from
 *   `ts-worker-bootstrap.mjs`, which registers tsx (a dev dependency) through
 *   its public API (`tsx/esm/api`) and then imports `sweep-worker.ts`. The
 *   parent's exec arguments are not passed on, so tsx is registered once.
 *
 * @internal
 */
export function sweepWorkerLaunch(): { readonly url: URL; readonly execArgv?: string[] } {
  const here = import.meta.url;
  if (/\.[cm]?ts$/.test(new URL(here).pathname)) return { url: new URL('./ts-worker-bootstrap.mjs', here), execArgv: [] };
  return { url: new URL('./sweep-worker.js', here) };
}

/** Start one sweep worker with the job. @internal */
export function spawnSweepWorker(data: SweepWorkerData, resourceLimits?: ResourceLimits): Worker {
  const { url, execArgv } = sweepWorkerLaunch();
  return new Worker(url, { workerData: data, ...(execArgv ? { execArgv } : {}), ...(resourceLimits ? { resourceLimits } : {}) });
}
