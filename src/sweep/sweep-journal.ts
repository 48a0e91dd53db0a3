import { createHash } from 'node:crypto';
import { appendFileSync, existsSync, readFileSync, writeFileSync } from 'node:fs';
import { InputError } from '../errors.js';
import { outputName } from './parse-sweep-job.js';
import { sweepCaseCount } from './sweep-cases.js';
import type { SweepJob } from './sweep-job.js';
import { sweepCaseResultFromJson, sweepCaseResultToJson, sweepResultToJson } from './sweep-result-json.js';
import type { SweepCaseResult, SweepResult } from './sweep-result.js';

/**
 * Format tag of the first line of a journal.
 *
 * @example
 * ```ts
 * const isJournal = JSON.parse(firstLine).format === SWEEP_JOURNAL_FORMAT;
 * ```
 */
export const SWEEP_JOURNAL_FORMAT = 'fluxstate-sweep-journal/1';

/**
 * Fingerprint of a checked job: the SHA-256 of its JSON text. Two runs may
 * share a journal, and a shard may reference a job file, only when their
 * fingerprints agree.
 *
 * @example
 * ```ts
 * const digest = sweepJobDigest(parseSweepJob(json));
 * ```
 */
export function sweepJobDigest(job: SweepJob): string {
  const { range: _range, ...rest } = job;
  return createHash('sha256').update(JSON.stringify(rest)).digest('hex');
}

/**
 * A journal of a sweep run: a JSON-lines file that receives each case's
 * result the moment it ends, then the merged result, so that a run that is
 * killed (a signal, a preempted batch task, a crash) keeps every case it
 * finished, and a rerun with the same journal resumes where it stopped.
 *
 * Lines: `{"type":"header","format":"fluxstate-sweep-journal/1","job":<digest>,...}`,
 * then `{"type":"case","case":<case result>}` per finished case, then
 * `{"type":"result","result":<result file>}` when the run ends (again after
 * each resumed run; the last one counts).
 *
 * @example
 * ```ts
 * const journal = openSweepJournal('inrush.jsonl', job);
 * const result = await runSweep(job, { previous: journal.previous, onCase: journal.append });
 * journal.finish(result);
 * ```
 */
export interface SweepJournal {
  /** Cases finished by earlier runs (empty for a new journal). */
  readonly previous: readonly SweepCaseResult[];
  /** Append one finished case (synchronously: on disk before the next case starts). */
  readonly append: (result: SweepCaseResult) => void;
  /** Append the merged result. */
  readonly finish: (result: SweepResult) => void;
}

/**
 * Open (create, or read back to resume) the journal of a checked job.
 * Throws `InputError` `'sweep-bad-journal'` when the file belongs to another
 * job or is not a journal. A last line cut short (the process was killed
 * while writing it) is ignored: that case runs again.
 *
 * @example
 * ```ts
 * const journal = openSweepJournal('run.jsonl', parseSweepJob(json));
 * ```
 */
export function openSweepJournal(file: string, job: SweepJob): SweepJournal {
  const digest = sweepJobDigest(job);
  const previous = new Map<number, SweepCaseResult>();
  if (existsSync(file)) {
    const lines = readFileSync(file, 'utf8').split('\n');
    const bad = (why: string): never => {
      throw new InputError('sweep-bad-journal', `journal ${file}: ${why}; give another --journal file, or delete this one to start again`, [file]);
    };
    let header: { type?: unknown; format?: unknown; job?: unknown } | undefined;
    try {
      header = JSON.parse(lines[0] ?? '') as typeof header;
    } catch {
      bad('the first line is not a journal header');
    }
    if (header?.type !== 'header' || header.format !== SWEEP_JOURNAL_FORMAT) bad('the first line is not a journal header');
    if (header?.job !== digest) bad('it records another job (its fingerprint differs)');
    lines.slice(1).forEach((line, k) => {
      if (line.trim() === '') return;
      let entry: { type?: unknown; case?: unknown };
      try {
        entry = JSON.parse(line) as typeof entry;
      } catch {
        // Only the last line may be cut short by a kill.
        if (lines.slice(k + 2).some((l) => l.trim() !== '')) bad(`line ${k + 2} is not JSON`);
        return;
      }
      if (entry.type === 'case') {
        const c = sweepCaseResultFromJson(entry.case);
        previous.set(c.index, c);
      }
    });
  } else {
    const total = sweepCaseCount(job);
    const header = {
      type: 'header', format: SWEEP_JOURNAL_FORMAT, job: digest,
      ...(job.name !== undefined ? { name: job.name } : {}),
      total, range: job.range ?? { start: 0, end: total },
      axes: job.parameters.axes.map((a) => a.name), outputs: job.outputs.map(outputName),
    };
    writeFileSync(file, `${JSON.stringify(header)}\n`);
  }
  return {
    previous: [...previous.values()].sort((a, b) => a.index - b.index),
    append: (c) => appendFileSync(file, `${JSON.stringify({ type: 'case', case: sweepCaseResultToJson(c) })}\n`),
    finish: (r) => appendFileSync(file, `${JSON.stringify({ type: 'result', result: sweepResultToJson(r) })}\n`),
  };
}
