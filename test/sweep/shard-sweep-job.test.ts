import { describe, expect, it } from 'vitest';
import { mergeSweepResults, runSweep, shardSweepJob, sweepResultFromJson, sweepResultToJson } from '../../src/sweep/index.js';
import { angleJob } from './rl-network.js';

const angles = [0, 0.4, 0.8, 1.2, 1.6, 2.0, 2.4];

describe('shardSweepJob / mergeSweepResults', () => {
  it('splits a job into consecutive ranges that cover every case once', () => {
    const shards = shardSweepJob(angleJob(angles), 3);
    expect(shards.map((s) => s.range)).toEqual([{ start: 0, end: 2 }, { start: 2, end: 4 }, { start: 4, end: 7 }]);
    expect(shards[1]!.name).toBe('rl switching angle [shard 2/3]');
    expect(shardSweepJob(angleJob([0, 1]), 5)).toHaveLength(2);
    expect(() => shardSweepJob(angleJob(angles), 0)).toThrow(expect.objectContaining({ code: 'sweep-bad-option' }));
  });

  it('merges shard results, passed through JSON as a batch system would, into the whole run, bit for bit', async () => {
    const job = angleJob(angles);
    const whole = await runSweep(job, { inProcess: true });
    const shards = shardSweepJob(job, 3);
    const files: string[] = [];
    for (const shard of shards.reverse()) {
      const part = await runSweep(JSON.parse(JSON.stringify(shard)), { inProcess: true });
      files.push(JSON.stringify(sweepResultToJson(part)));
    }
    const merged = mergeSweepResults(files.map((text) => sweepResultFromJson(JSON.parse(text))));
    expect(merged.name).toBe('rl switching angle');
    expect(merged.range).toEqual({ start: 0, end: 7 });
    expect(merged.counts).toEqual(whole.counts);
    expect(merged.cases).toEqual(whole.cases);
  });

  it('refuses overlapping, missing or foreign shard results, naming the cases', async () => {
    const job = angleJob(angles);
    const [a, b, c] = await Promise.all(shardSweepJob(job, 3).map((s) => runSweep(s, { inProcess: true })));
    expect(() => mergeSweepResults([a!, c!])).toThrow(expect.objectContaining({ code: 'sweep-bad-shards', message: expect.stringContaining('cases 2-3 are in no shard result') }));
    expect(() => mergeSweepResults([a!, b!, b!, c!])).toThrow(expect.objectContaining({ code: 'sweep-bad-shards', message: expect.stringContaining('case 2 is in more than one') }));
    const other = await runSweep(angleJob([0, 1]), { inProcess: true });
    expect(() => mergeSweepResults([a!, other])).toThrow(expect.objectContaining({ code: 'sweep-bad-shards' }));
  });
});

describe('sweepResultToJson / sweepResultFromJson', () => {
  it('round-trips NaN, infinities, -0 and series exactly, and names a bad field', async () => {
    const r = await runSweep(
      {
        ...angleJob([0]),
        outputs: [{ name: 'i', quantity: 'current', of: { element: 'coil' }, metric: 'series' }],
      },
      { inProcess: true },
    );
    const c = r.cases[0]!;
    const odd = { ...r, cases: [{ ...c, outputs: { ...c.outputs, nan: Number.NaN, inf: -Infinity, zero: -0, arr: Float64Array.of(1, Number.NaN, -0) } }] };
    const back = sweepResultFromJson(JSON.parse(JSON.stringify(sweepResultToJson(odd))));
    const out = back.cases[0]!.outputs;
    expect(out.nan).toBeNaN();
    expect(out.inf).toBe(-Infinity);
    expect(Object.is(out.zero, -0)).toBe(true);
    expect(Object.is((out.arr as Float64Array)[2], -0)).toBe(true);
    expect(back.cases[0]!.time).toEqual(c.time);
    expect(out.i).toEqual(c.outputs.i);
    const broken = JSON.parse(JSON.stringify(sweepResultToJson(r)));
    broken.cases[0].status = 'done';
    expect(() => sweepResultFromJson(broken)).toThrow(expect.objectContaining({ code: 'sweep-bad-result', message: expect.stringContaining('cases[0].status') }));
  });
});
