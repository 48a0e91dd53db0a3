import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';

/**
 * Absolute tolerances per kind of unknown.
 *
 * @example
 * ```ts
 * const atol: AbsoluteTolerances = { current: 1e-7, fluxDensity: 1e-8 };
 * ```
 */
export interface AbsoluteTolerances {
  /** Node potentials and voltages, V. Default 1e-6. */
  readonly voltage?: number;
  /** Branch currents, A. Default 1e-6. */
  readonly current?: number;
  /**
   * Flux density, T: each loop flux gets this times the smallest area of
   * its tubes (1e-4 m^2 assumed for tubes without an area). Default 1e-7.
   */
  readonly fluxDensity?: number;
}

/**
 * Solver settings shared by every entry point (`simulate`, `createStepper`,
 * `periodicSteadyState`, a sweep job's `simulate`): one type, one check,
 * one resolution into what the run needs, so the entry points cannot drift
 * apart.
 *
 * @example
 * ```ts
 * const settings: SolverSettings = { rtol: 1e-7, atol: { current: 1e-8 }, maxStep: 1e-5 };
 * simulate(net, { stopTime: 0.02, ...settings });
 * createStepper(net, { horizon: 0.02, ...settings });
 * ```
 */
export interface SolverSettings {
  /** Relative tolerance, in (0, 1). Default 1e-6 (1e-8 for the periodic steady state). */
  readonly rtol?: number;
  /** Absolute tolerances: one number for every unknown, or per kind. */
  readonly atol?: number | AbsoluteTolerances;
  /** Largest solver step, s. Default: no limit beyond the span. */
  readonly maxStep?: number;
  /** First step to try, s. */
  readonly initialStep?: number;
  /** Budget of solver steps (accepted + rejected). Default 1e6 (1e7 over a stepper's life; per period for the periodic steady state). */
  readonly maxSteps?: number;
  /** Wall-time budget, ms (over a stepper's life; over all periods for the periodic steady state). */
  readonly maxWallTimeMs?: number;
  /** Cancels the run; what was computed is kept (status `'aborted'`). */
  readonly signal?: AbortSignal;
  /**
   * How the network's equations reach the integrator. `'full'` (default):
   * every unknown, as the DAE M y' = f(t, y). `'reduced'`: the algebraic
   * unknowns (node potentials, branch currents without a derivative, loop
   * fluxes through linear tubes only) are solved inside f from the
   * differential ones, so Newton and the error control act on the
   * differential unknowns alone (atol of an algebraic unknown then has no
   * effect). Sound only where f enters every algebraic unknown affinely with
   * coefficients fixed between breakpoints, as the elements declare: a
   * network with an ideal diode, an index-2 unknown, or a saturating or
   * hysteretic tube on a loop no winding drives is refused (InputError
   * `not-reducible`, naming the element). Results differ from `'full'` at the
   * tolerance level; on small saturating networks it takes fewer Newton
   * iterations per step (docs/solver.md, "Eighth pass").
   */
  readonly formulation?: 'full' | 'reduced';
}

/**
 * Solver settings resolved for one network (defaults filled in, tolerances per unknown).
 *
 * @example
 * ```ts
 * const resolved: ResolvedSolverSettings = resolveSolverSettings(compiled, { rtol: 1e-7 }, { rtol: 1e-6, maxSteps: 1e6 });
 * ```
 *
 * @internal
 */
export interface ResolvedSolverSettings {
  readonly rtol: number;
  readonly atol: number | Float64Array;
  readonly maxStep?: number;
  readonly initialStep?: number;
  readonly maxSteps: number;
  readonly maxWallTimeMs?: number;
  readonly signal?: AbortSignal;
  /** `'reduced'`: algebraic unknowns eliminated inside f (see {@link SolverSettings.formulation}); absent: the full DAE. */
  readonly formulation?: 'full' | 'reduced';
  /**
   * Whether the absolute tolerances follow rtol through radau5's map
   * (atol' = rtol'/rtol atol, looser as rtol tightens): only when the user
   * gave atol; the per-quantity defaults stay put, so tightening rtol never
   * loosens them.
   */
  readonly atolFollowsRtol?: boolean;
}

/**
 * Check solver settings; `where` names the entry point in messages
 * (`'simulate options'`, `'stepper options'`...). Throws `InputError`
 * (`bad-tolerance`, `bad-option`).
 *
 * @example
 * ```ts
 * checkSolverSettings({ rtol: 2 }, 'simulate options'); // throws bad-tolerance
 * ```
 */
export function checkSolverSettings(o: SolverSettings, where: string): void {
  const tolerance = (text: string): never => {
    throw new InputError('bad-tolerance', `${where}: ${text}`, ['options']);
  };
  const option = (text: string): never => {
    throw new InputError('bad-option', `${where}: ${text}`, ['options']);
  };
  if (o.rtol !== undefined && !(typeof o.rtol === 'number' && o.rtol > 0 && o.rtol < 1)) tolerance(`rtol ${String(o.rtol)} must be in (0, 1)`);
  if (o.atol !== undefined && typeof o.atol !== 'number' && (typeof o.atol !== 'object' || o.atol === null)) {
    tolerance(`atol must be a number or { voltage, current, fluxDensity }, got ${String(o.atol)}`);
  }
  const positive = (fail: (text: string) => never, name: string, v: unknown, min = 0, relation = '> 0'): void => {
    if (v === undefined) return;
    if (!(typeof v === 'number' && (relation === '> 0' ? v > min : v >= min))) fail(`${name} ${String(v)} must be ${relation}`);
    if (!Number.isFinite(v as number)) fail(`${name} ${String(v)} must be finite`);
  };
  if (typeof o.atol === 'number') positive(tolerance, 'atol', o.atol);
  if (typeof o.atol === 'object' && o.atol !== null) {
    for (const [k, v] of Object.entries(o.atol)) positive(tolerance, `atol.${k}`, v);
  }
  positive(option, 'maxStep', o.maxStep);
  positive(option, 'initialStep', o.initialStep);
  positive(option, 'maxSteps', o.maxSteps, 1, '>= 1');
  positive(option, 'maxWallTimeMs', o.maxWallTimeMs);
  if (o.signal !== undefined && !(typeof o.signal === 'object' && o.signal !== null && 'aborted' in o.signal)) option('signal must be an AbortSignal');
  if (o.formulation !== undefined && o.formulation !== 'full' && o.formulation !== 'reduced') option(`formulation ${JSON.stringify(o.formulation)} must be 'full' or 'reduced'`);
}

/**
 * Resolve checked settings for a compiled network: defaults filled in, the
 * absolute tolerances per unknown.
 *
 * @example
 * ```ts
 * const run = new NetworkRun(compiled, { t0: 0, horizon: 0.02, ...resolveSolverSettings(compiled, options, { rtol: 1e-6, maxSteps: 1e6 }) });
 * ```
 *
 * @internal
 */
export function resolveSolverSettings(
  c: CompiledNetwork,
  o: SolverSettings,
  defaults: { readonly rtol: number; readonly maxSteps: number },
): ResolvedSolverSettings {
  return {
    rtol: o.rtol ?? defaults.rtol,
    atol: absoluteTolerances(c, o.atol),
    atolFollowsRtol: o.atol !== undefined,
    maxSteps: o.maxSteps ?? defaults.maxSteps,
    ...(o.maxStep !== undefined ? { maxStep: o.maxStep } : {}),
    ...(o.initialStep !== undefined ? { initialStep: o.initialStep } : {}),
    ...(o.maxWallTimeMs !== undefined ? { maxWallTimeMs: o.maxWallTimeMs } : {}),
    ...(o.signal !== undefined ? { signal: o.signal } : {}),
    ...(o.formulation === 'reduced' ? { formulation: o.formulation } : {}),
  };
}

/**
 * Per-unknown absolute tolerances from the settings.
 *
 * @example
 * ```ts
 * const atol = absoluteTolerances(compiled, { current: 1e-7 }); // Float64Array, one per unknown
 * ```
 *
 * @internal
 */
export function absoluteTolerances(c: CompiledNetwork, atol: SolverSettings['atol']): Float64Array | number {
  if (typeof atol === 'number') return atol;
  const voltage = atol?.voltage ?? 1e-6;
  const current = atol?.current ?? 1e-6;
  const fluxDensity = atol?.fluxDensity ?? 1e-7;
  // Internal states of tubes scale with the flux-density tolerance (a hysteretic tube: m per tesla, db/dt per tesla).
  const stateTolerance = new Map<number, number>();
  for (const tube of c.tubes) {
    tube.stateScales?.forEach((scale, k) => stateTolerance.set(tube.stateOffset! + k, fluxDensity * scale));
  }
  return Float64Array.from(c.layout.kinds, (kind, i) => {
    if (kind === 'potential') return voltage;
    if (kind === 'current') return current;
    if (kind === 'internal-state') return stateTolerance.get(i) ?? current;
    const entries = c.loops.loops[i - c.layout.loopOffset]!;
    const area = Math.min(...entries.map((en) => {
      const a = c.tubes[en.tube]!.area;
      return Number.isFinite(a) ? a : 1e-4;
    }));
    return fluxDensity * area;
  });
}
