/**
 * Compiled RADAU5 for the bench scripts: the bench-anchor's Fortran (kept
 * outside the package, beside the checkout: ../shared/bench-anchor,
 * ../../shared/bench-anchor, or the folder of FLUXSTATE_BENCH_ANCHOR) built
 * with gfortran into a temporary folder. Its `driver` runs the Test Set
 * problems, its `fluxwalk` the flux walk as a one-unknown ODE restarted at
 * every edge. Undefined when the sources or gfortran are not at hand.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');

/** The built programs and a function that removes them. */
export interface BuiltRadau5 {
  readonly driver: string;
  readonly fluxwalk: string;
  remove(): void;
}

export function buildRadau5(): BuiltRadau5 | undefined {
  const candidates = [process.env.FLUXSTATE_BENCH_ANCHOR ? dirname(process.env.FLUXSTATE_BENCH_ANCHOR) : undefined, resolve(root, '../shared/bench-anchor'), resolve(root, '../../shared/bench-anchor')];
  const anchor = candidates.find((c): c is string => c !== undefined && existsSync(join(c, 'radau5', 'build.sh')));
  if (!anchor || spawnSync('sh', ['-c', 'command -v gfortran']).status !== 0) return undefined;
  const dir = mkdtempSync(join(tmpdir(), 'fluxstate-radau5-'));
  cpSync(join(anchor, 'radau5'), join(dir, 'radau5'), { recursive: true });
  const built = spawnSync('sh', [join(dir, 'radau5', 'build.sh')], { encoding: 'utf8' });
  const remove = (): void => rmSync(dir, { recursive: true, force: true });
  if (built.status !== 0) {
    remove();
    return undefined;
  }
  return { driver: join(dir, 'radau5', 'driver'), fluxwalk: join(dir, 'radau5', 'fluxwalk'), remove };
}

/**
 * RADAU5's median CPU ms per solve of the Test Set problem `id` (the driver's numbering: 1 ROBER,
 * 2 VDPOL, 3 HIRES, 4 RINGMOD, 5 TRANSAMP) with the given tolerances and initial step, repeated
 * for a second; NaN when the driver is not at hand or its output cannot be read.
 */
export function radau5DriverCpuMs(driver: string | undefined, id: number, rtol: number, atol: number, h0: number): number {
  if (!driver) return NaN;
  const r = spawnSync(driver, [String(id), String(rtol), String(atol), String(h0), '1'], { encoding: 'utf8' });
  try {
    return 1000 * (JSON.parse(r.stdout.replace(/\s+/g, '')) as { median_cpu_s: number }).median_cpu_s;
  } catch {
    return NaN;
  }
}
