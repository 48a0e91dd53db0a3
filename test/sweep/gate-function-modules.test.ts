/**
 * Sweep jobs whose switch gate is a user function named by module (issue 12):
 * the gate resolves like a source's waveform, through the element kind's
 * declared waveform fields, in process and in worker threads, under the same
 * module rules (a reference leaving the base folder is refused, naming the
 * gate's field, and nothing is imported).
 *
 * Circuit (values of our own): 10 V, a switch closed while the gate function
 * is 1 (t < 1 ms), R in series, C = 100 uF to ground. The capacitor charges
 * as v(t) = 10 (1 - exp(-t / ((R + Ron) C))) (RC charging, closed form; any
 * circuits textbook, e.g. Hayt and Kemmerly, Engineering Circuit Analysis,
 * first-order RC circuits) and holds from 1 ms on: the open switch's 1e12
 * ohm moves it by under 1e-10 V in the next millisecond.
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { constant, createNetwork, InputError } from '../../src/index.js';
import { resolveFunctionWaveforms, runSweep, type SweepJob } from '../../src/sweep/index.js';

let root = '';
let jobs = '';
let marker = '';

const GATE = 'export function firstMillisecond(t) { return t < 1e-3 ? 1 : 0; }\n';
const [C, RON] = [100e-6, 0.01];

beforeAll(() => {
  root = mkdtempSync(join(tmpdir(), 'fluxstate-gate-modules-'));
  jobs = join(root, 'jobs');
  marker = join(root, 'imported.txt');
  mkdirSync(jobs);
  mkdirSync(join(root, 'outside'));
  writeFileSync(join(jobs, 'gates.mjs'), GATE);
  const evil = `import { writeFileSync } from 'node:fs';\nwriteFileSync(${JSON.stringify(marker)}, 'ran');\n${GATE}`;
  writeFileSync(join(root, 'outside', 'evil.mjs'), evil);
});

afterAll(() => rmSync(root, { recursive: true, force: true }));

function gatedJob(module: string): SweepJob {
  const net = createNetwork('gated RC');
  const [a, b, out] = [net.node('a'), net.node('b'), net.node('out')];
  net.voltageSource('V', a, net.ground, constant(10));
  // Built with a placeholder gate, then given the by-reference gate as a job file would carry it.
  net.switch('Q1', a, b, { gate: constant(1), onResistance: RON, offResistance: 1e12 });
  net.resistor('R', b, out, 10);
  net.capacitor('C', out, net.ground, C);
  const description = net.describe();
  const gate = { kind: 'function' as const, module, export: 'firstMillisecond', breakpoints: [1e-3] };
  return {
    format: 'fluxstate-sweep/1',
    name: 'gated RC',
    network: { ...description, elements: description.elements.map((e) => (e.kind === 'switch' ? { ...e, gate } : e)) },
    simulate: { stopTime: 2e-3, rtol: 1e-8 },
    parameters: { axes: [{ name: 'resistance', target: { element: 'R', field: 'resistance' } }], grid: { resistance: [10, 20] } },
    outputs: [{ name: 'held voltage', quantity: 'voltage', of: { element: 'C' }, metric: 'final' }],
  };
}

/** RC charging for 1 ms (closed form above). */
const held = (r: number): number => 10 * (1 - Math.exp(-1e-3 / ((r + RON) * C)));

describe('sweep jobs with a switch gate given by module', () => {
  it('resolves the gate like a source waveform and runs each case to the closed form (in process)', async () => {
    const r = await runSweep(gatedJob('./gates.mjs'), { inProcess: true, baseUrl: jobs });
    expect(r.cases.map((c) => c.status)).toEqual(['success', 'success']);
    expect(r.cases[0]!.outputs['held voltage']).toBeCloseTo(held(10), 6);
    expect(r.cases[1]!.outputs['held voltage']).toBeCloseTo(held(20), 6);
  });

  it('the same in worker threads', async () => {
    const r = await runSweep(gatedJob('./gates.mjs'), { concurrency: 2, baseUrl: jobs });
    expect(r.cases.map((c) => c.outputs['held voltage'])).toEqual([
      expect.closeTo(held(10), 6), expect.closeTo(held(20), 6),
    ]);
  });

  it('the public resolver gives the switch its function and keeps the job reference', async () => {
    const live = await resolveFunctionWaveforms(gatedJob('./gates.mjs').network, { baseUrl: jobs });
    const sw = live.elements.find((e) => e.kind === 'switch');
    expect(sw?.kind === 'switch' && sw.gate?.kind === 'function' ? [typeof sw.gate.fn, sw.gate.module, sw.gate.fn?.(5e-4), sw.gate.fn?.(2e-3)] : undefined)
      .toEqual(['function', './gates.mjs', 1, 0]);
  });

  it('refuses a gate module outside the base folder with sweep-bad-job naming the gate field, importing nothing', async () => {
    const field = 'network.elements[1] (switch "Q1").gate.module';
    for (const attempt of [
      runSweep(gatedJob('../outside/evil.mjs'), { inProcess: true, baseUrl: jobs }),
      resolveFunctionWaveforms(gatedJob('../outside/evil.mjs').network, { baseUrl: jobs }),
    ]) {
      const e = await attempt.then(() => undefined, (x: unknown) => x);
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).code).toBe('sweep-bad-job');
      expect((e as InputError).elements[0]).toBe(field);
    }
    expect(existsSync(marker)).toBe(false);
  });
});
