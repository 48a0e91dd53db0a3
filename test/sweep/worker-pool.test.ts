import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { runOnWorkers } from '../../src/sweep/worker-pool.js';

// Workers for the pool's protocol (ready, then one `done` per `run`), as eval'd
// JavaScript. A task is a number: its result is task * 10, except:
//   -1: wait (Atomics.wait) until the pool has reported another task's result, then answer -10
//       (the flag is set by the main thread on that report, so the order does not race);
//   -2: end the thread with exit code 5;
//   -3: loop forever.
const WORKER = `
const { parentPort, workerData } = require('node:worker_threads');
const flag = new Int32Array(workerData.shared);
parentPort.on('message', (m) => {
  if (m.task === -1) Atomics.wait(flag, 0, 0);
  if (m.task === -2) process.exit(5);
  if (m.task === -3) for (;;) {}
  parentPort.postMessage({ type: 'done', result: m.task * 10 });
});
parentPort.postMessage({ type: 'ready' });
`;

function pool(tasks: number[], size: number, signal?: AbortSignal, extra: { taskTimeLimitMs?: number; onResult?: (count: number) => void } = {}) {
  const shared = new SharedArrayBuffer(4);
  const results: [number, number][] = [];
  const crashes: [number, string][] = [];
  const timeouts: [number, number][] = [];
  const exits: number[] = [];
  const run = runOnWorkers<number, number>({
    tasks,
    size,
    spawn: () => new Worker(WORKER, { eval: true, workerData: { shared } }),
    ...(signal ? { signal } : {}),
    ...(extra.taskTimeLimitMs !== undefined ? { taskTimeLimitMs: extra.taskTimeLimitMs, onTimeout: (task: number, ms: number) => timeouts.push([task, ms]) } : {}),
    onResult: (task, result) => {
      results.push([task, result]);
      if (task !== -1) {
        const flag = new Int32Array(shared);
        Atomics.store(flag, 0, 1);
        Atomics.notify(flag, 0);
      }
      extra.onResult?.(results.length);
    },
    onCrash: (task, reason) => crashes.push([task, reason]),
    onWorkerExit: (code) => exits.push(code),
  });
  return { run, results, crashes, timeouts, exits };
}

describe('runOnWorkers', () => {
  it('hands tasks out in order but reports them as they finish (task 0 here waits for a later one)', async () => {
    const p = pool([-1, 1, 2, 3], 2);
    expect(await p.run).toBe('complete');
    // Task -1 went first to a worker and could only finish after another task did.
    expect(p.results.map(([t]) => t)).not.toEqual([-1, 1, 2, 3]);
    expect(p.results.map(([t]) => t).sort((a, b) => a - b)).toEqual([-1, 1, 2, 3]);
    expect(Object.fromEntries(p.results)).toEqual({ '-1': -10, 1: 10, 2: 20, 3: 30 });
    expect(p.exits).toHaveLength(2); // both workers ended when the tasks were done
  });

  it('loses only the task of a worker that dies, and replaces the worker', async () => {
    const p = pool([1, -2, 2, 3, 4], 2);
    expect(await p.run).toBe('complete');
    expect(p.crashes).toHaveLength(1);
    expect(p.crashes[0]![0]).toBe(-2);
    expect(p.crashes[0]![1]).toMatch(/exited with code 5/);
    expect(p.results.map(([t]) => t).sort()).toEqual([1, 2, 3, 4]);
    expect(p.exits).toContain(5);
  });

  it('terminates every worker on abort, even one in an endless loop', async () => {
    // Abort once both finite tasks are done (an event, not a timer: on a loaded machine a
    // fixed delay may come before the workers have even started). Task -3 never ends by itself.
    const controller = new AbortController();
    const p = pool([-3, 1, 2], 2, controller.signal, { onResult: (count) => count === 2 && controller.abort() });
    expect(await p.run).toBe('cancelled');
    expect(p.results.map(([t]) => t).sort()).toEqual([1, 2]);
    expect(p.exits).toHaveLength(2); // resolved only after both threads exited
  });

  it('terminates the worker of a task past the time limit, reports it, and runs the rest on a new worker', async () => {
    // Task -3 never ends, so whatever the machine's load it passes the limit; the finite tasks (a
    // message round trip each) run on the replacement worker, far inside the limit.
    const p = pool([-3, 1, 2, 3], 1, undefined, { taskTimeLimitMs: 2000 });
    expect(await p.run).toBe('complete');
    expect(p.timeouts).toEqual([[-3, 2000]]);
    expect(p.crashes).toEqual([]);
    expect(p.results.map(([t]) => t).sort()).toEqual([1, 2, 3]);
  });

  it('rejects when a worker cannot start', async () => {
    const run = runOnWorkers<number, number>({
      tasks: [1, 2],
      size: 2,
      spawn: () => new Worker('throw new Error("module did not load")', { eval: true }),
      onResult: () => {},
      onCrash: () => {},
    });
    await expect(run).rejects.toMatchObject({ code: 'sweep-worker-start', message: expect.stringMatching(/module did not load/) });
  });
});
