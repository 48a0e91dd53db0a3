import { Matrix, pseudoInverse } from 'ml-matrix';
import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { resultFromRun, type SimulationResult } from '../result/simulation-result.js';
import { acceptNetwork, type NetworkInput } from '../simulation/accept-network.js';
import { checkedInitialState } from '../simulation/checked-initial-state.js';
import { finitenessCheck } from '../simulation/finiteness-check.js';
import { NetworkRun } from '../simulation/network-run.js';
import { checkSolverSettings, resolveSolverSettings, type SolverSettings } from '../simulation/solver-settings.js';
import type { DaeStatus, SolverStats } from '../solver/types.js';

/**
 * Options of {@link periodicSteadyState}: the shared {@link SolverSettings}
 * for each period's integration (rtol default 1e-8, because the
 * finite-difference sensitivities need an accurate map; maxSteps, default
 * 1e6, counts per period; maxWallTimeMs and signal cover the whole search)
 * plus the period and the Newton iteration's settings.
 *
 * @example
 * ```ts
 * const options: PeriodicSteadyStateOptions = { period: 20e-6, rtol: 1e-9, maxIterations: 30 };
 * ```
 */
export interface PeriodicSteadyStateOptions extends SolverSettings {
  /** Period T of the drive, s (every source and switch must repeat with it). */
  readonly period: number;
  /** Start of the periods, s. Default 0. */
  readonly startTime?: number;
  /**
   * Convergence: the change of the state over one period, in units of the
   * absolute tolerances, must fall below this. Default 1 (one tolerance).
   */
  readonly tolerance?: number;
  /** Newton iterations at most. Default 20. */
  readonly maxIterations?: number;
  /** First guess (raw state vector at startTime); default the network's initial conditions. */
  readonly initialState?: ArrayLike<number>;
  /** Output sampling of the returned period, as in `simulate`. Default 200 points per period. */
  readonly samplesPerPeriod?: number;
  /** Called after each simulated period. */
  readonly onProgress?: (progress: { readonly iteration: number; readonly periods: number; readonly residual: number }) => void;
}

/** Outcome of {@link periodicSteadyState}. */
export interface PeriodicSteadyState {
  /** `'converged'`, `'not-converged'` (iteration budget used up), or the solver status that stopped a period. */
  readonly status: 'converged' | 'not-converged' | DaeStatus;
  readonly message: string;
  /** The periodic state at startTime (raw state vector). */
  readonly state: Float64Array;
  /** Newton iterations taken. */
  readonly iterations: number;
  /** Periods simulated in all (map evaluations and finite-difference columns). */
  readonly periods: number;
  /** Residual (max over differential unknowns of |y(T) - y(0)| / atol) after each iteration. */
  readonly residuals: readonly number[];
  /** One period from the periodic state, read by handles like any result. */
  readonly result: SimulationResult;
  /** Solver work over all periods. */
  readonly stats: SolverStats;
}

/**
 * Periodic steady state of a network driven with period T, by the shooting
 * method: find the state y0 whose one-period map returns to itself,
 * Phi(y0) = y0, by Newton's method on the differential unknowns (those the
 * mass matrix differentiates), with the Jacobian of the map from finite
 * differences (one period per differential unknown) and rank-one Broyden
 * updates between refreshes (T. J. Aprille and T. N. Trick, "Steady-state
 * analysis of nonlinear circuits with periodic inputs", Proc. IEEE 60(1),
 * 1972, pp. 108-114; C. G. Broyden, Math. Comp. 19, 1965, pp. 577-593; from
 * memory). The algebraic unknowns follow by consistent initialisation.
 *
 * Far cheaper than simulating until transients die out when the slowest
 * time constant is many periods long (flux walk under a small DC imbalance).
 *
 * @example
 * ```ts
 * const pss = periodicSteadyState(net, { period: 1 / 50e3 });
 * if (pss.status === 'converged') console.log(pss.result.fluxDensity(leg));
 * ```
 */
export function periodicSteadyState(network: NetworkInput, options: PeriodicSteadyStateOptions): PeriodicSteadyState {
  if (options === null || typeof options !== 'object') {
    throw new InputError('bad-option', `periodicSteadyState: options must be an object with at least period, got ${String(options)}`, ['options']);
  }
  const T = options.period;
  if (!(Number.isFinite(T) && T > 0)) throw new InputError('bad-option', `periodic steady state: period ${T} s must be > 0`, ['options']);
  const t0 = options.startTime ?? 0;
  if (!Number.isFinite(t0)) throw new InputError('bad-option', `periodic steady state: startTime ${t0} is not finite`, ['options']);
  checkSolverSettings(options, 'periodic steady state');
  const { compiled, networkId } = acceptNetwork(network, 'periodicSteadyState');
  const settings = resolveSolverSettings(compiled, options, { rtol: 1e-8, maxSteps: 1e6 });
  const { rtol, atol: atolOpt } = settings;
  const n = compiled.layout.size;
  const atol = typeof atolOpt === 'number' ? new Float64Array(n).fill(atolOpt) : atolOpt;
  const tolerance = options.tolerance ?? 1;
  const maxIterations = options.maxIterations ?? 20;
  const diff = differentialUnknowns(compiled);
  const stats: SolverStats = { acceptedSteps: 0, rejectedSteps: 0, rhsEvaluations: 0, jacobianEvaluations: 0, luFactorizations: 0, newtonIterations: 0, newtonFailures: 0, retakenSteps: 0 };
  let periods = 0;
  let iterations = 0;
  const began = Date.now();

  /** Settings of one period's run: the wall-time budget is what is left of the whole search's. */
  const periodSettings = (y: Float64Array) => ({
    ...settings,
    t0,
    horizon: t0 + T,
    initialState: y,
    ...(settings.maxWallTimeMs !== undefined ? { maxWallTimeMs: Math.max(1, settings.maxWallTimeMs - (Date.now() - began)) } : {}),
  });

  /** One period from y: the state at t0 + T, the consistent start, or a failure. */
  const periodMap = (y: Float64Array): { ok: true; start: Float64Array; end: Float64Array } | { ok: false; status: DaeStatus; message: string } => {
    const run = new NetworkRun(compiled, periodSettings(y));
    run.advanceTo(t0 + T, { steps: false, interpolants: false });
    periods++;
    const s = run.stats;
    for (const k of Object.keys(stats) as (keyof SolverStats)[]) stats[k] += s[k];
    const status = run.status === 'running' ? 'success' : run.status;
    if (status !== 'success') return { ok: false, status, message: run.message };
    return { ok: true, start: run.initialState ?? Float64Array.from(y), end: run.y };
  };

  let y: Float64Array = options.initialState !== undefined ? checkedInitialState(compiled, options.initialState, 'periodic steady state') : Float64Array.from(compiled.y0);
  const residuals: number[] = [];
  const scaledResidual = (start: Float64Array, end: Float64Array): Float64Array =>
    Float64Array.from(diff, (j) => (end[j]! - start[j]!) / atol[j]!);
  const norm = (r: Float64Array): number => r.reduce((m, x) => Math.max(m, Math.abs(x)), 0);

  let first = periodMap(y);
  if (!first.ok) return finish(first.status, first.message);
  let r = scaledResidual(first.start, first.end);
  y = first.start;
  residuals.push(norm(r));
  options.onProgress?.({ iteration: 0, periods, residual: residuals[0]! });
  let jac: Matrix | undefined;
  let converged = norm(r) <= tolerance;
  while (!converged && iterations < maxIterations) {
    iterations++;
    if (!jac) {
      // Finite-difference Jacobian of the scaled residual g(x) = (Phi(y) - y) / atol on the differential unknowns.
      jac = new Matrix(diff.length, diff.length);
      for (let c = 0; c < diff.length; c++) {
        const j = diff[c]!;
        const delta = Math.sqrt(rtol) * Math.max(Math.abs(y[j]!), atol[j]! / rtol);
        const yp = Float64Array.from(y);
        yp[j] = yp[j]! + delta;
        const m = periodMap(yp);
        if (!m.ok) return finish(m.status, m.message);
        const rp = scaledResidual(yp, m.end);
        // Columns in scaled units: d g / d (x_j / atol_j).
        for (let k = 0; k < diff.length; k++) jac.set(k, c, ((rp[k]! - r[k]!) / delta) * atol[j]!);
      }
    }
    const dx = pseudoInverse(jac).mmul(Matrix.columnVector(Array.from(r))).neg();
    const yNew = Float64Array.from(y);
    diff.forEach((j, c) => (yNew[j] = yNew[j]! + dx.get(c, 0) * atol[j]!));
    const m = periodMap(yNew);
    if (!m.ok) return finish(m.status, m.message);
    const rNew = scaledResidual(m.start, m.end);
    // Broyden's update: J += (dr - J dx) dx^T / (dx^T dx), all in scaled units.
    const dr = Matrix.columnVector(Array.from(rNew, (v, k) => v - r[k]!));
    const jdx = jac.mmul(dx);
    const dxTdx = dx.transpose().mmul(dx).get(0, 0);
    if (dxTdx > 0) jac = jac.add(dr.sub(jdx).mmul(dx.transpose()).div(dxTdx));
    if (norm(rNew) > norm(r)) jac = undefined; // not contracting: refresh the Jacobian next time
    y = m.start;
    r = rNew;
    residuals.push(norm(r));
    options.onProgress?.({ iteration: iterations, periods, residual: residuals[residuals.length - 1]! });
    converged = norm(r) <= tolerance;
  }
  return finish(
    converged ? 'converged' : 'not-converged',
    converged
      ? `periodic steady state after ${iterations} Newton iterations (${periods} periods simulated)`
      : `no periodic steady state within ${maxIterations} iterations: the change over a period is still ${residuals[residuals.length - 1]!.toPrecision(3)} tolerances`,
  );

  function finish(status: PeriodicSteadyState['status'], message: string): PeriodicSteadyState {
    const samples = options.samplesPerPeriod ?? 200;
    const run = new NetworkRun(compiled, { ...periodSettings(y), check: finitenessCheck(compiled) });
    run.advanceTo(t0 + T, {
      steps: true, interpolants: true,
      sampleTimes: Array.from({ length: samples }, (_, k) => t0 + ((k + 1) * T) / samples),
      exact: true,
    });
    const result = resultFromRun(compiled, networkId, run, `one period from the ${status === 'converged' ? 'periodic' : 'last'} state`);
    // A converged state whose returned period did not run through (a non-finite quantity, a budget) is not a success.
    if (status === 'converged' && result.status !== 'success') {
      return { status: result.status, message: `the periodic state was found, but its period stopped: ${result.message}`, state: run.initialState ?? y, iterations, periods, residuals, result, stats };
    }
    return { status, message, state: run.initialState ?? y, iterations, periods, residuals, result, stats };
  }
}

/** Unknowns that the mass matrix differentiates (a non-zero column): the state of the period map. */
function differentialUnknowns(c: CompiledNetwork): number[] {
  const n = c.layout.size;
  const out: number[] = [];
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      if (c.mass[i * n + j] !== 0) {
        out.push(j);
        break;
      }
    }
  }
  return out;
}
