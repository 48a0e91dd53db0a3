// Entry of a sweep worker thread: receives the checked job once (workerData),
// then runs the cases the pool sends, one at a time, with the same code as an
// in-process run (runSweepCase), and posts back plain data. Started by runSweep;
// not part of the public API.
import { parentPort, workerData } from 'node:worker_threads';
import { runSweepCase } from './run-sweep-case.js';
import type { SweepJob } from './sweep-job.js';
import type { SweepCaseResult } from './sweep-result.js';
import type { PoolMessage } from './worker-pool.js';

/** What runSweep passes to each worker. @internal */
export interface SweepWorkerData {
  readonly job: SweepJob;
  readonly baseUrl?: string;
  readonly allowModuleFolders?: readonly string[];
}

/** The buffers of a case result's arrays, each once, to move rather than copy them. */
function transferables(result: SweepCaseResult): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  const add = (v: unknown): void => {
    if (v instanceof Float64Array && v.buffer instanceof ArrayBuffer) buffers.add(v.buffer);
  };
  Object.values(result.outputs).forEach(add);
  add(result.time);
  return [...buffers];
}

const port = parentPort;
if (port) {
  const { job, baseUrl, allowModuleFolders } = workerData as SweepWorkerData;
  const options = {
    ...(baseUrl !== undefined ? { baseUrl } : {}),
    ...(allowModuleFolders !== undefined ? { allowModuleFolders } : {}),
  };
  port.on('message', (m: PoolMessage<number, SweepCaseResult>) => {
    if (m.type !== 'run') return;
    void runSweepCase(job, m.task, options).then((result) => {
      port.postMessage({ type: 'done', result } satisfies PoolMessage<number, SweepCaseResult>, transferables(result));
    });
  });
  port.postMessage({ type: 'ready' } satisfies PoolMessage<number, SweepCaseResult>);
}
