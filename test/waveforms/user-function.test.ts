import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { compileWaveform, InputError, resolveFunctionWaveform, userFunction, userFunctionWaveform } from '../../src/index.js';

function catchError(fn: () => unknown): InputError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('expected an InputError');
}

describe('userFunctionWaveform', () => {
  it('returns fn(t) and the declared breakpoints inside the window', () => {
    const w = userFunctionWaveform(userFunction({ fn: (t) => 3 * t * t, breakpoints: [0, 0.5, 2] }), 'V1');
    expect(w.value(0.7)).toBe(3 * 0.7 * 0.7);
    expect(w.breakpoints(0, 1)).toEqual([0, 0.5]);
    expect(w.breakpoints(0.25, 10)).toEqual([0.5, 2]);
    expect(w.breakpoints(3, 4)).toEqual([]);
  });

  it('names the source, the function and the time when fn throws, keeping the cause', () => {
    const boom = new RangeError('table lookup out of range');
    const w = compileWaveform(
      userFunction({
        fn: (t) => {
          if (t > 1) throw boom;
          return 0;
        },
        name: 'lookup',
      }),
      'Vaux',
    );
    const err = catchError(() => w.value(1.5));
    expect(err.code).toBe('bad-waveform');
    expect(err.elements).toEqual(['Vaux']);
    expect(err.message).toMatch(/^Vaux: function waveform "lookup" threw at t = 1.5 s: table lookup out of range/);
    expect(err.cause).toBe(boom);
  });

  it('names the source and the time when fn returns NaN, Infinity or a non-number', () => {
    const w = userFunctionWaveform(userFunction({ fn: (t) => Math.log(t) / (t - 2) }), 'Vlog');
    expect(catchError(() => w.value(-1)).message).toMatch(/Vlog: function waveform ".*" returned NaN at t = -1 s/);
    expect(catchError(() => w.value(2)).message).toMatch(/returned (-)?Infinity at t = 2 s/);
    const bad = userFunctionWaveform({ kind: 'function', fn: (() => 'x') as unknown as (t: number) => number }, 'Vstr');
    expect(catchError(() => bad.value(0)).message).toMatch(/returned x at t = 0 s/);
  });

  it('rejects an unresolved module reference, a missing fn, and unsorted breakpoints', () => {
    expect(catchError(() => userFunctionWaveform(userFunction({ module: './m.js', export: 'f' }), 'V')).message).toMatch(
      /"\.\/m\.js#f" is a module reference that has not been resolved; call `await resolveFunctionWaveform/,
    );
    expect(catchError(() => userFunctionWaveform(userFunction({}), 'V')).message).toMatch(/neither `fn` nor `module`/);
    expect(catchError(() => userFunctionWaveform(userFunction({ fn: () => 0, breakpoints: [1, 1] }), 'V')).message).toMatch(
      /breakpoints must be strictly increasing/,
    );
  });
});

describe('resolveFunctionWaveform', () => {
  const dir = mkdtempSync(join(tmpdir(), 'fluxstate-fn-'));
  writeFileSync(
    join(dir, 'drives.mjs'),
    'export function softStart(t) { return t < 1e-3 ? 1e4 * t : 10; }\nexport const notAFunction = 3;\nexport default (t) => 2 * t;\n',
  );
  const base = pathToFileURL(`${dir}/`);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('imports a relative module against baseUrl and picks the named export, without touching the input', async () => {
    const spec = userFunction({ module: './drives.mjs', export: 'softStart', breakpoints: [0, 1e-3] });
    const resolved = await resolveFunctionWaveform(spec, 'Vin', { baseUrl: base });
    expect(spec.fn).toBeUndefined();
    const w = compileWaveform(resolved, 'Vin');
    expect(w.value(5e-4)).toBe(5);
    expect(w.value(2e-3)).toBe(10);
    expect(w.breakpoints(0, 1)).toEqual([0, 1e-3]);
  });

  it('takes the default export when none is named, and accepts an absolute path', async () => {
    const resolved = await resolveFunctionWaveform(userFunction({ module: join(dir, 'drives.mjs') }), 'Vin');
    expect(compileWaveform(resolved).value(3)).toBe(6);
  });

  it('returns a spec that already has fn unchanged', async () => {
    const spec = userFunction({ fn: () => 1 });
    expect(await resolveFunctionWaveform(spec)).toBe(spec);
  });

  it('rejects a missing module, a missing export and a non-function export, naming the source', async () => {
    await expect(resolveFunctionWaveform(userFunction({ module: './nope.mjs' }), 'Vx', { baseUrl: base })).rejects.toThrow(
      /Vx: function waveform module "\.\/nope\.mjs" could not be imported/,
    );
    await expect(
      resolveFunctionWaveform(userFunction({ module: './drives.mjs', export: 'missing' }), 'Vx', { baseUrl: base }),
    ).rejects.toThrow(/has no export "missing" \(exports: .*softStart/);
    await expect(
      resolveFunctionWaveform(userFunction({ module: './drives.mjs', export: 'notAFunction' }), 'Vx', { baseUrl: base }),
    ).rejects.toThrow(/export "notAFunction" of "\.\/drives\.mjs" is a number, not a function/);
    await expect(resolveFunctionWaveform(userFunction({}), 'Vx')).rejects.toBeInstanceOf(InputError);
  });
});
