import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/index.js';
import { parseSweepJob, sweepCase, sweepCaseCount, type SweepJob } from '../../src/sweep/index.js';
import { angleJob } from './rl-network.js';

/** The job as parsed JSON (plain objects we may break on purpose). */
function json(job: SweepJob = angleJob([0, 1])): Record<string, any> {
  return JSON.parse(JSON.stringify(job));
}

function errorOf(input: unknown): InputError {
  try {
    parseSweepJob(input);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('parseSweepJob accepted the job');
}

describe('parseSweepJob', () => {
  it('accepts a job read back from JSON and returns a checked copy', () => {
    const input = json();
    const job = parseSweepJob(input);
    expect(job).toEqual(input);
    expect(job).not.toBe(input);
    expect(job.network).not.toBe(input.network);
  });

  it('accepts the JSON example of docs/sweeps.md', () => {
    const doc = readFileSync(new URL('../../docs/sweeps.md', import.meta.url), 'utf8');
    const block = /```json\n([\s\S]*?)```/.exec(doc)?.[1];
    expect(block).toBeDefined();
    const job = parseSweepJob(JSON.parse(block!));
    expect(sweepCaseCount(job)).toBe(6);
    expect(sweepCase(job, 1).parameters).toEqual({ angle: 0, resistance: 2.1 });
  });

  it('names the field, and the named entry it is in, for a wrong type', () => {
    const input = json();
    input.network.tubes[1].law.length = '0.1';
    const e = errorOf(input);
    expect(e.code).toBe('sweep-bad-job');
    expect(e.message).toContain('network.tubes[1] (tube "yoke").law.length');
    expect(e.message).toMatch(/expected number, received string/);
    expect(e.elements).toContain('network.tubes[1] (tube "yoke").law.length');
  });

  it('names a misspelt field, even inside a material or waveform spec', () => {
    const input = json();
    input.network.tubes[0].law.material.relativePermeabilty = 3;
    input.network.elements[0].waveform.phse = 1;
    const e = errorOf(input);
    expect(e.message).toContain('network.tubes[0] (tube "leg").law.material.relativePermeabilty: unknown field');
    expect(e.message).toContain('network.elements[0] (element "mains").waveform.phse: unknown field');
  });

  it('names out-of-range node indices and a missing ground', () => {
    const input = json();
    input.network.elements[1].plus = 9;
    expect(errorOf(input).message).toContain('network.elements[1] (element "coil").plus: electric node index 9 is out of range');
    const noGround = json();
    noGround.network.electricNodes[0].name = 'gnd';
    expect(errorOf(noGround).message).toContain('network.electricNodes[0] (node "gnd").name');
  });

  it('refuses an axis target that names no element, listing the names there are', () => {
    const input = json();
    input.parameters.axes[0].target = { element: 'supply', field: 'waveform.phase' };
    const e = errorOf(input);
    expect(e.code).toBe('sweep-unknown-target');
    expect(e.message).toMatch(/axis "angle".*no element named "supply" \(elements: "mains", "coil"\)/);
    expect(e.elements).toContain('supply');
  });

  it('refuses an axis field the entry does not have, or one that cannot change', () => {
    const unknown = json();
    unknown.parameters.axes[0].target = { tube: 'leg', field: 'initalFluxDensity' };
    const e1 = errorOf(unknown);
    expect(e1.code).toBe('sweep-unknown-field');
    expect(e1.message).toMatch(/tube "leg" field "initalFluxDensity"/);
    const missing = json();
    missing.parameters.axes[0].target = { element: 'coil', field: 'waveform.phase' };
    expect(errorOf(missing)).toMatchObject({ code: 'sweep-unknown-field', elements: ['coil', 'waveform.phase', 'angle'] });
    const fixed = json();
    fixed.parameters.axes[0].target = { element: 'coil', field: 'plus' };
    expect(errorOf(fixed).code).toBe('sweep-fixed-field');
  });

  it('refuses a value of the wrong type for the field, naming axis, value and field', () => {
    const input = json();
    input.parameters.grid.angle = [0, 'ninety'];
    const e = errorOf(input);
    expect(e.code).toBe('sweep-bad-value');
    expect(e.message).toMatch(/axis "angle" value "ninety": voltage-source "mains" field "waveform.phase"/);
  });

  it('checks that grid keys and case entries match the axes', () => {
    const extra = json();
    extra.parameters.grid.remanence = [0];
    expect(errorOf(extra).message).toContain('parameters.grid.remanence: "remanence" is not an axis');
    const list = json();
    delete list.parameters.grid;
    list.parameters.cases = [{ angle: 0 }, {}];
    expect(errorOf(list).message).toContain('parameters.cases[1]: no value for axis "angle"');
    const both = json();
    both.parameters.cases = [];
    expect(errorOf(both).message).toContain('parameters: give only one of "grid", "cases"');
    const empty = json();
    empty.parameters.grid.angle = [];
    expect(errorOf(empty).message).toMatch(/axis "angle" has no values/);
  });

  it('checks outputs: target, quantity for its kind, metric options, unique names', () => {
    const target = json();
    target.outputs[0].of = { element: 'primary' };
    expect(errorOf(target)).toMatchObject({ code: 'sweep-unknown-target' });
    const kind = json();
    kind.outputs[0] = { quantity: 'emf', of: { element: 'mains' }, metric: 'peak' };
    expect(errorOf(kind).message).toContain('outputs[0].quantity: "emf" is read from a winding, but "mains" is a voltage-source');
    const period = json();
    period.outputs[0].metric = 'cycle-means';
    expect(errorOf(period).message).toContain('outputs[0].period: "cycle-means" needs a period > 0');
    const twice = json();
    twice.outputs[1].name = 'peak current';
    expect(errorOf(twice).message).toMatch(/output name "peak current" is used twice/);
    const badEnum = json();
    badEnum.outputs[0].metric = 'maximum';
    expect(errorOf(badEnum).message).toContain('outputs[0] (output "peak current").metric');
  });

  it('checks simulate options and the range', () => {
    const stop = json();
    stop.simulate.stopTime = -1;
    expect(errorOf(stop).message).toContain('simulate.stopTime');
    const unknownOption = json();
    unknownOption.simulate.tolerance = 1e-6;
    expect(errorOf(unknownOption).message).toContain('simulate.tolerance: unknown field');
    const range = json();
    range.range = { start: 1, end: 5 };
    expect(errorOf(range).message).toMatch(/range: cases 1\.\.5 .* within the job's 2 cases/);
  });
});
