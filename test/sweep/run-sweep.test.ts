import { describe, expect, it } from 'vitest';
import { InputError, userFunction } from '../../src/index.js';
import { runSweep, type SweepCaseResult, type SweepJob, type SweepProgress } from '../../src/sweep/index.js';
import { angleJob, F, L, R, rlDescription, rlPeak, W } from './rl-network.js';

/** Every number of the cases as its 64-bit pattern, so equality is bit for bit (NaN, -0 included). */
function bits(cases: readonly SweepCaseResult[]): unknown {
  const view = new DataView(new ArrayBuffer(8));
  const hex = (x: number): string => {
    view.setFloat64(0, x);
    return view.getBigUint64(0).toString(16);
  };
  const walk = (v: unknown): unknown => {
    if (typeof v === 'number') return hex(v);
    if (v instanceof Float64Array) return Array.from(v, hex);
    if (Array.isArray(v)) return v.map(walk);
    if (v !== null && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x)]));
    return v;
  };
  return walk(cases);
}

/** A job whose case 0 takes far longer than the others (a 2 kHz source: 80 cycles in the run). */
function unevenJob(): SweepJob {
  return {
    network: rlDescription(),
    simulate: { stopTime: 2 / F, sampling: { interval: 1e-3, includeSteps: true } },
    parameters: { axes: [{ name: 'frequency', target: { element: 'mains', field: 'waveform.frequency' } }], grid: { frequency: [2000, 50, 55, 60, 65, 70] } },
    outputs: [
      { name: 'peak current', quantity: 'current', of: { element: 'coil' }, metric: 'peak' },
      { name: 'dc offset', quantity: 'fluxDensity', of: { tube: 'leg' }, metric: 'cycle-means', period: 1 / F },
      { name: 'current', quantity: 'current', of: { element: 'coil' }, metric: 'series' },
    ],
  };
}

describe('runSweep', () => {
  it('returns the same results bit for bit on workers as in process, in case order', async () => {
    // Case 0 is slow, so on two workers it usually finishes after later cases; the
    // order of results must not depend on that (forced reordering: worker-pool.test.ts).
    const job = unevenJob();
    const order: number[] = [];
    const onProgress = (p: SweepProgress): void => {
      if (p.phase === 'case') order.push(p.case!.index);
    };
    const parallel = await runSweep(job, { concurrency: 2, onProgress });
    const serial = await runSweep(job, { inProcess: true });
    expect(parallel.mode).toBe('workers');
    expect(parallel.concurrency).toBe(2);
    expect(serial.mode).toBe('in-process');
    expect(parallel.status).toBe('complete');
    expect(parallel.counts.success).toBe(6);
    expect(parallel.cases.map((c) => c.index)).toEqual([0, 1, 2, 3, 4, 5]);
    expect(parallel.cases.map((c) => c.parameters.frequency)).toEqual([2000, 50, 55, 60, 65, 70]);
    expect([...order].sort((a, b) => a - b)).toEqual([0, 1, 2, 3, 4, 5]);
    // Every number is the same as in process.
    expect(bits(parallel.cases)).toEqual(bits(serial.cases));
    const c1 = parallel.cases[1]!;
    expect(c1.time).toBeInstanceOf(Float64Array);
    expect((c1.outputs.current as Float64Array).length).toBe(c1.time!.length);
  });

  it('matches the closed-form RL energisation peak over a sweep of the switching angle', async () => {
    // Outside reference: the complete response of a series RL circuit (derived in
    // rl-network.ts, rlCurrent), with L = N^2/R_m from the magnetic circuit law. Its
    // peak |i| over two cycles is found by scan + golden section on the closed form.
    // The sweep reads the peak from samples every 10 us: a smooth peak between samples
    // is missed by at most |i''| h^2 / 8 = (w^2 I) h^2 / 8, 1.2e-6 relative here, and
    // the solver runs at rtol 1e-9, so 1e-5 relative bounds both.
    const angles = [0, Math.PI / 6, Math.PI / 3, Math.PI / 2, (2 * Math.PI) / 3, (5 * Math.PI) / 6];
    const job = angleJob(angles, {
      simulate: { stopTime: 2 / F, rtol: 1e-9, atol: { voltage: 1e-9, current: 1e-9, fluxDensity: 1e-11 }, sampling: { interval: 1e-5, includeSteps: true } },
    });
    const result = await runSweep(job, { concurrency: 2 });
    expect(result.counts.success).toBe(angles.length);
    for (const c of result.cases) {
      const exact = rlPeak(c.parameters.angle as number, 2 / F);
      expect(Math.abs((c.outputs['peak current'] as number) / exact - 1)).toBeLessThan(1e-5);
    }
    // The worst angle is the one with the largest natural (DC) term, amplitude
    // (V/Z) |sin(theta - phi)| (DERIVED from the same closed form): theta near phi - pi/2.
    const phi = Math.atan2(W * L, R);
    const peaks = result.cases.map((c) => c.outputs['peak current'] as number);
    const worst = peaks.indexOf(Math.max(...peaks));
    const offsets = angles.map((a) => Math.abs(Math.sin(a - phi)));
    const nearest = offsets.indexOf(Math.max(...offsets));
    expect(worst).toBe(nearest);
  });

  it('keeps running when cases fail: a bad value, a function returning NaN, a worker that dies', async () => {
    // Case values: the winding resistance axis (a negative one is refused by the builder)
    // crossed with the source function export (NaN after 10 ms; a worker exit).
    const network = {
      ...rlDescription(),
      elements: rlDescription().elements.map((e) =>
        e.kind === 'voltage-source' ? { ...e, waveform: userFunction({ module: './test/fixtures/sweep-drives.ts', export: 'mainsSine' }) } : e,
      ),
    };
    const job: SweepJob = {
      network,
      simulate: { stopTime: 1 / F },
      parameters: {
        axes: [
          { name: 'resistance', target: { element: 'coil', field: 'resistance' } },
          { name: 'drive', target: { element: 'mains', field: 'waveform.export' } },
        ],
        cases: [
          { resistance: 2, drive: 'mainsSine' },
          { resistance: -1, drive: 'mainsSine' },
          { resistance: 2, drive: 'nanAfterHalfCycle' },
          { resistance: 2, drive: 'exitWorker' },
          { resistance: 3, drive: 'mainsSine' },
        ],
      },
      outputs: [{ name: 'peak current', quantity: 'current', of: { element: 'coil' }, metric: 'peak' }],
    };
    const result = await runSweep(job, { concurrency: 2 });
    expect(result.status).toBe('complete');
    expect(result.cases.map((c) => c.status)).toEqual(['success', 'error', 'incomplete', 'error', 'success']);
    const bad = result.cases[1]!;
    expect(bad.error?.code).toBe('negative-value');
    expect(bad.message).toMatch(/winding "coil" resistance is -1/);
    const nan = result.cases[2]!;
    expect(nan.simulation?.status).toBe('rhs-error');
    expect(nan.simulation!.reachedTime).toBeLessThanOrEqual(0.01 + 1e-12);
    expect(nan.outputs['peak current']).toBeGreaterThan(0); // computed on the data up to the stop
    expect(result.cases[3]!.message).toMatch(/worker thread died .*exited with code 7/);
    expect(result.counts).toEqual({ success: 2, incomplete: 1, error: 2, cancelled: 0 });
    // The survivors equal the same cases run alone in process.
    const alone = await runSweep({ ...job, parameters: { ...job.parameters, cases: [job.parameters.cases![0]!, job.parameters.cases![4]!] } }, { inProcess: true });
    expect(result.cases[0]!.outputs).toEqual(alone.cases[0]!.outputs);
    expect(result.cases[4]!.outputs).toEqual(alone.cases[1]!.outputs);
  });

  it('resolves a function waveform by module path and export in the workers (matches the closed form)', async () => {
    // The source is the fixture's 100 V 50 Hz sine, imported by each worker; the
    // response is the closed-form RL current with theta = 0 (rl-network.ts).
    const base = rlDescription();
    const network = {
      ...base,
      elements: base.elements.map((e) =>
        e.kind === 'voltage-source' ? { ...e, waveform: { kind: 'function' as const, module: './fixtures/sweep-drives.ts', export: 'mainsSine' } } : e,
      ),
    };
    const job: SweepJob = {
      network,
      simulate: { stopTime: 2 / F, rtol: 1e-9, atol: { voltage: 1e-9, current: 1e-9, fluxDensity: 1e-11 }, sampling: { interval: 1e-5, includeSteps: true } },
      parameters: { axes: [{ name: 'turns', target: { element: 'coil', field: 'turns' } }], grid: { turns: [100, 100] } },
      outputs: [{ name: 'peak current', quantity: 'current', of: { element: 'coil' }, metric: 'peak' }],
    };
    const result = await runSweep(JSON.parse(JSON.stringify(job)) as SweepJob, { concurrency: 2, baseUrl: new URL('../', import.meta.url) });
    expect(result.counts.success).toBe(2);
    for (const c of result.cases) expect(Math.abs((c.outputs['peak current'] as number) / rlPeak(0, 2 / F) - 1)).toBeLessThan(1e-5);
  });

  it('cancels on abort: terminates the workers (even one stuck in a loop) and returns the finished cases', async () => {
    const base = rlDescription();
    const network = {
      ...base,
      elements: base.elements.map((e) =>
        e.kind === 'voltage-source' ? { ...e, waveform: userFunction({ module: './test/fixtures/sweep-drives.ts', export: 'mainsSine' }) } : e,
      ),
    };
    // Case 0 never ends; the others are quick. Abort once three cases are done.
    const drives = ['spin', 'mainsSine', 'mainsSine', 'mainsSine', 'mainsSine', 'mainsSine', 'mainsSine', 'mainsSine'];
    const job: SweepJob = {
      network,
      simulate: { stopTime: 1 / F },
      parameters: { axes: [{ name: 'drive', target: { element: 'mains', field: 'waveform.export' } }], cases: drives.map((drive) => ({ drive })) },
      outputs: [{ name: 'peak current', quantity: 'current', of: { element: 'coil' }, metric: 'peak' }],
    };
    const controller = new AbortController();
    const phases: string[] = [];
    const result = await runSweep(job, {
      concurrency: 2,
      signal: controller.signal,
      onProgress: (p) => {
        phases.push(p.phase);
        if (p.done === 3) controller.abort();
      },
    });
    expect(result.status).toBe('cancelled');
    expect(result.cases).toHaveLength(8);
    expect(result.cases[0]!.status).toBe('cancelled');
    expect(result.counts.success).toBeGreaterThanOrEqual(3);
    expect(result.counts.success + result.counts.cancelled).toBe(8);
    expect(result.cases.filter((c) => c.status === 'cancelled').every((c) => c.message.includes('cancelled'))).toBe(true);
    expect(phases[0]).toBe('start');
    expect(phases[phases.length - 1]).toBe('end');
  });

  it('stops between cases when aborted in process, and runs nothing when aborted before it starts', async () => {
    const job = angleJob([0, 0.5, 1, 1.5, 2]);
    const controller = new AbortController();
    const result = await runSweep(job, {
      inProcess: true,
      signal: controller.signal,
      onProgress: (p) => {
        if (p.done === 2) controller.abort();
      },
    });
    expect(result.cases.map((c) => c.status)).toEqual(['success', 'success', 'cancelled', 'cancelled', 'cancelled']);
    const before = await runSweep(job, { signal: AbortSignal.abort() });
    expect(before.counts.cancelled).toBe(5);
    expect(before.status).toBe('cancelled');
  });

  it('reports progress: start, one event per case with its status, end', async () => {
    const events: SweepProgress[] = [];
    await runSweep(angleJob([0, 1]), { inProcess: true, onProgress: (p) => events.push(p) });
    expect(events.map((e) => [e.phase, e.done, e.total])).toEqual([['start', 0, 2], ['case', 1, 2], ['case', 2, 2], ['end', 2, 2]]);
    expect(events[1]!.case).toMatchObject({ index: 0, status: 'success', parameters: { angle: 0 } });
    expect(events[3]!.counts.success).toBe(2);
  });

  it('runs only the job range, keeping the whole job case indices', async () => {
    const result = await runSweep({ ...angleJob([0, 0.5, 1, 1.5]), range: { start: 1, end: 3 } }, { inProcess: true });
    expect(result.total).toBe(4);
    expect(result.range).toEqual({ start: 1, end: 3 });
    expect(result.cases.map((c) => [c.index, c.parameters.angle])).toEqual([[1, 0.5], [2, 1]]);
  });

  it('refuses in-process functions for workers, a broken base network, and bad options (InputError)', async () => {
    const base = rlDescription();
    const withFn = {
      ...base,
      elements: base.elements.map((e) => (e.kind === 'voltage-source' ? { ...e, waveform: userFunction({ fn: (t) => 100 * Math.sin(W * t) }) } : e)),
    };
    const job = { ...angleJob([0]), network: withFn, parameters: { axes: [], grid: {} } };
    await expect(runSweep(job)).rejects.toMatchObject({ code: 'sweep-not-transferable', elements: ['mains'] });
    // The same job runs in process, where the function lives.
    expect((await runSweep(job, { inProcess: true })).counts.success).toBe(1);
    const negative = { ...base, elements: base.elements.map((e) => (e.kind === 'winding' ? { ...e, turns: -5 } : e)) };
    await expect(runSweep({ ...angleJob([0]), network: negative })).rejects.toMatchObject({ code: 'non-positive-value', elements: ['coil'] });
    await expect(runSweep(angleJob([0]), { concurrency: 0 })).rejects.toBeInstanceOf(InputError);
    await expect(runSweep(angleJob([0]), { inProcess: true, concurrency: 2 })).rejects.toMatchObject({ code: 'sweep-bad-option' });
  });
});
