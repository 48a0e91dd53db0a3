/**
 * One bad case must not stop a sweep: a case stuck in a loop is ended by the
 * case time limit, a stack overflow or an out-of-memory case costs its own
 * case only; a killed run keeps its finished cases (previous results are not
 * rerun). No assertion here bounds how long anything takes.
 */
import { appendFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openSweepJournal, parseSweepJob, runSweep, type SweepJob } from '../../src/sweep/index.js';
import { angleJob } from './rl-network.js';

/** The RL job whose source function is an axis: one value per export of sweep-faulty-drives.ts. */
function exportsJob(exports: readonly string[]): SweepJob {
  const base = angleJob([0]);
  return {
    ...base,
    network: {
      ...base.network,
      elements: base.network.elements.map((e) =>
        e.kind === 'voltage-source' ? { ...e, waveform: { kind: 'function' as const, module: './test/fixtures/sweep-faulty-drives.ts', export: 'mainsSine' } } : e,
      ),
    },
    parameters: { axes: [{ name: 'drive', target: { element: 'mains', field: 'waveform.export' } }], grid: { drive: [...exports] } },
  };
}

describe('sweep robustness', () => {
  it('ends a case stuck in a loop at the case time limit (its worker terminated) and runs the others', async () => {
    const r = await runSweep(exportsJob(['mainsSine', 'spin', 'mainsSine']), { concurrency: 2, caseTimeLimitMs: 10_000 });
    expect(r.status).toBe('complete');
    expect(r.cases.map((c) => c.status)).toEqual(['success', 'error', 'success']);
    expect(r.cases[1]!.error?.code).toBe('sweep-case-time-limit');
    expect(r.cases[1]!.message).toMatch(/time limit of 10000 ms/);
  });

  it('turns a stack overflow in a user function into an incomplete case (rhs-error), on workers and in process', async () => {
    for (const inProcess of [false, true]) {
      const r = await runSweep(exportsJob(['overflow', 'mainsSine']), inProcess ? { inProcess } : { concurrency: 1 });
      expect(r.cases.map((c) => c.status)).toEqual(['incomplete', 'success']);
      expect(r.cases[0]!.simulation?.status).toBe('rhs-error');
      expect(r.cases[0]!.message).toMatch(/call stack/i);
    }
  });

  it('turns an out-of-memory case into an error of its case (worker heap limit) and replaces the worker', async () => {
    const r = await runSweep(exportsJob(['mainsSine', 'hog', 'mainsSine']), { concurrency: 1, workerMemoryLimitMb: 256 });
    expect(r.cases.map((c) => c.status)).toEqual(['success', 'error', 'success']);
    expect(r.cases[1]!.message).toMatch(/worker thread died|memory/i);
  });

  it('does not rerun the cases of an earlier run, and runs its cancelled ones', async () => {
    const job = angleJob([0, 0.5, 1, 1.5]);
    const first = await runSweep(job, { inProcess: true });
    const kept = [first.cases[0]!, { ...first.cases[2]!, status: 'cancelled' as const, outputs: {} }, first.cases[3]!];
    const ran: number[] = [];
    const second = await runSweep(job, { inProcess: true, previous: kept, onCase: (c) => ran.push(c.index) });
    expect(ran).toEqual([1, 2]);
    expect(second.cases).toEqual(first.cases);
    expect(second.counts.success).toBe(4);
  });

  it('refuses bad limits', async () => {
    await expect(runSweep(angleJob([0]), { caseTimeLimitMs: 0 })).rejects.toMatchObject({ code: 'sweep-bad-option' });
    await expect(runSweep(angleJob([0]), { workerMemoryLimitMb: Number.NaN })).rejects.toMatchObject({ code: 'sweep-bad-option' });
  });

  it('keeps a journal that resumes a run, ignores a last line cut short, and refuses another job\'s journal', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxstate-journal-'));
    try {
      const file = join(dir, 'run.jsonl');
      const job = parseSweepJob(angleJob([0, 0.5, 1]));
      const first = openSweepJournal(file, job);
      expect(first.previous).toEqual([]);
      const partial = await runSweep({ ...job, range: { start: 0, end: 2 } }, { inProcess: true, onCase: first.append });
      // A kill in the middle of writing the next line.
      appendFileSync(file, '{"type":"case","case":{"index":2,"param');
      const again = openSweepJournal(file, job);
      expect(again.previous).toEqual(partial.cases);
      const ran: number[] = [];
      const whole = await runSweep(job, { inProcess: true, previous: again.previous, onCase: (c) => ran.push(c.index) });
      expect(ran).toEqual([2]);
      expect(whole.counts.success).toBe(3);
      expect(() => openSweepJournal(file, parseSweepJob(angleJob([0, 2])))).toThrow(expect.objectContaining({ code: 'sweep-bad-journal' }));
      writeFileSync(join(dir, 'not.jsonl'), 'hello\n');
      expect(() => openSweepJournal(join(dir, 'not.jsonl'), job)).toThrow(expect.objectContaining({ code: 'sweep-bad-journal' }));
      expect(readFileSync(file, 'utf8').split('\n')[0]).toMatch(/^\{"type":"header","format":"fluxstate-sweep-journal\/1"/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
