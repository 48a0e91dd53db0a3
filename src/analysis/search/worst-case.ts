import { FluxstateError, InputError } from '../../errors.js';
import { brentMinimum } from './brent-minimum.js';

/**
 * One parameter of a {@link worstCase} search, searched within its bounds.
 *
 * @example
 * ```ts
 * const angle: WorstCaseParameter = { name: 'angle', min: 0, max: 360, tolerance: 0.5, gridPoints: 13 };
 * ```
 */
export interface WorstCaseParameter {
  /** Name, the key of the value passed to `evaluate`. */
  readonly name: string;
  /** Lower bound. */
  readonly min: number;
  /** Upper bound (> min). */
  readonly max: number;
  /** Absolute tolerance of the search in this parameter. Default (max - min) / 1000. */
  readonly tolerance?: number;
  /**
   * Points of the coarse scan that brackets the worst case before the
   * refinement (at least 3, ends included). Default 9. More points guard
   * against a second, narrower peak.
   */
  readonly gridPoints?: number;
}

/**
 * Options of {@link worstCase}.
 *
 * @example
 * ```ts
 * const options: WorstCaseOptions = {
 *   goal: 'maximum',
 *   parameters: [{ name: 'angle', min: 0, max: 360, tolerance: 0.5 }, { name: 'remanence', min: -0.8, max: 0.8, tolerance: 0.01 }],
 *   evaluate: ({ angle, remanence }) => inrushPeak(angle!, remanence!),
 * };
 * ```
 */
export interface WorstCaseOptions {
  /** `'maximum'` (largest inrush peak) or `'minimum'` (smallest saturation margin). */
  readonly goal: 'maximum' | 'minimum';
  /** The parameters, searched one after the other in this order. */
  readonly parameters: readonly WorstCaseParameter[];
  /**
   * The figure of one case: typically builds the network for these values,
   * runs `simulate` and returns a metric. Must return a finite number; throw
   * (or return NaN) for a case that cannot be computed.
   */
  readonly evaluate: (values: Readonly<Record<string, number>>) => number;
  /** Starting values; default the middle of each range. */
  readonly start?: Readonly<Record<string, number>>;
  /** Passes over all parameters at most (coordinate search). Default 6. */
  readonly passes?: number;
  /** Evaluations at most. Default 400. */
  readonly maxEvaluations?: number;
}

/**
 * Outcome of {@link worstCase}.
 *
 * @example
 * ```ts
 * const w = worstCase(options);
 * console.log(`worst: ${w.objective} at`, w.values, `after ${w.evaluations} runs`);
 * ```
 */
export interface WorstCase {
  /** The parameter values of the worst case found. */
  readonly values: Readonly<Record<string, number>>;
  /** Its figure. */
  readonly objective: number;
  /** Number of evaluations (simulations) made. */
  readonly evaluations: number;
  /** True when a full pass moved no parameter by more than its tolerance; false when the passes or evaluations ran out. */
  readonly converged: boolean;
  /** Every evaluation in order, for plotting or for a check. */
  readonly history: readonly { readonly values: Readonly<Record<string, number>>; readonly objective: number }[];
}

/**
 * A bounded search for the worst case of a study: the largest figure
 * (inrush peak) or the smallest (saturation margin) over a few parameters
 * (switching angle, remanence, source impedance...), by coordinate search:
 * each parameter in turn, the others held, gets a coarse scan of
 * `gridPoints` values that brackets the worst, then Brent's method
 * (golden section with parabolic steps) inside that bracket down to its
 * tolerance; passes repeat until no parameter moves. The result is the best
 * case actually evaluated, never an extrapolation.
 *
 * Far fewer runs than a fine grid for the same resolution (a scan of
 * `gridPoints` and about 10 to 20 Brent steps per parameter in the first
 * pass, Brent steps only in later passes), but a local search: a worst case narrower than the
 * scan's spacing can be missed. Raise `gridPoints` when the figure has
 * several peaks, and check the result against a coarse grid once.
 *
 * Caution: the worst case is worst for the model and the ranges given; it is
 * no guarantee for the real equipment. Local codes, standards and licensed
 * engineering practice govern.
 *
 * @example
 * ```ts
 * const worst = worstCase({
 *   goal: 'maximum',
 *   parameters: [{ name: 'angle', min: 0, max: 360, tolerance: 0.5 }, { name: 'remanence', min: -0.8, max: 0.8, tolerance: 0.01 }],
 *   evaluate: ({ angle, remanence }) => {
 *     const { net, primary } = transformer(angle!, remanence!);
 *     const result = simulate(net, { stopTime: 0.04 });
 *     if (result.status !== 'success') return Number.NaN;
 *     return seriesPeak(result.time, result.current(primary)).peak;
 *   },
 * });
 * console.log(`largest inrush peak ${worst.objective.toFixed(1)} A at ${worst.values.angle} deg, B_r ${worst.values.remanence} T`);
 * ```
 */
export function worstCase(options: WorstCaseOptions): WorstCase {
  if (options === null || typeof options !== 'object') throw new InputError('bad-option', 'worstCase: give options with goal, parameters and evaluate', ['options']);
  const { goal, parameters, evaluate } = options;
  if (goal !== 'maximum' && goal !== 'minimum') {
    throw new InputError('bad-option', `worstCase: goal ${JSON.stringify(goal)} must be 'maximum' or 'minimum'`, ['goal']);
  }
  if (typeof evaluate !== 'function') throw new InputError('bad-option', 'worstCase: evaluate must be a function of the parameter values', ['evaluate']);
  if (!Array.isArray(parameters) || parameters.length === 0) {
    throw new InputError('bad-option', 'worstCase: give at least one parameter { name, min, max }', ['parameters']);
  }
  const names = new Set<string>();
  const specs = parameters.map((p) => {
    const name = String(p?.name);
    if (typeof p?.name !== 'string' || p.name === '' || names.has(name)) {
      throw new InputError('bad-option', `worstCase: parameter name ${JSON.stringify(p?.name)} must be a non-empty string used once`, [name]);
    }
    names.add(name);
    if (!Number.isFinite(p.min) || !Number.isFinite(p.max) || !(p.max > p.min)) {
      throw new InputError('bad-option', `worstCase: parameter "${name}" range [${p.min}, ${p.max}] must be finite with min < max`, [name]);
    }
    const tolerance = p.tolerance ?? (p.max - p.min) / 1000;
    if (!Number.isFinite(tolerance) || tolerance <= 0) {
      throw new InputError('bad-option', `worstCase: parameter "${name}" tolerance ${tolerance} must be positive`, [name]);
    }
    const gridPoints = p.gridPoints ?? 9;
    if (!Number.isInteger(gridPoints) || gridPoints < 3) {
      throw new InputError('bad-option', `worstCase: parameter "${name}" gridPoints ${gridPoints} must be an integer >= 3`, [name]);
    }
    return { name, min: p.min, max: p.max, tolerance, gridPoints };
  });
  const passes = options.passes ?? 6;
  const maxEvaluations = options.maxEvaluations ?? 400;
  if (!Number.isInteger(passes) || passes < 1) throw new InputError('bad-option', `worstCase: passes ${passes} must be a positive integer`, ['passes']);
  if (!Number.isInteger(maxEvaluations) || maxEvaluations < 1) {
    throw new InputError('bad-option', `worstCase: maxEvaluations ${maxEvaluations} must be a positive integer`, ['maxEvaluations']);
  }

  const current = specs.map((p) => {
    const s = options.start?.[p.name];
    if (s === undefined) return 0.5 * (p.min + p.max);
    if (!Number.isFinite(s) || s < p.min || s > p.max) {
      throw new InputError('bad-option', `worstCase: start value ${s} of "${p.name}" is outside [${p.min}, ${p.max}]`, [p.name]);
    }
    return s;
  });
  const sign = goal === 'maximum' ? -1 : 1; // search minimises sign * figure
  const history: { values: Readonly<Record<string, number>>; objective: number }[] = [];
  let best = { values: current.slice(), score: Infinity };
  const record = (values: number[]): Readonly<Record<string, number>> => Object.freeze(Object.fromEntries(specs.map((p, k) => [p.name, values[k]!])));

  class Exhausted extends Error {}
  const score = (values: number[]): number => {
    if (history.length >= maxEvaluations) throw new Exhausted();
    const named = record(values);
    let figure: number;
    try {
      figure = evaluate(named);
    } catch (cause) {
      throw new FluxstateError(
        'worst-case-evaluation-failed',
        `worstCase: evaluate threw at ${JSON.stringify(named)}: ${cause instanceof Error ? cause.message : String(cause)}; make every case in the ranges computable (or narrow the ranges)`,
        Object.keys(named),
      );
    }
    if (typeof figure !== 'number' || !Number.isFinite(figure)) {
      throw new FluxstateError(
        'worst-case-evaluation-failed',
        `worstCase: evaluate returned ${String(figure)} at ${JSON.stringify(named)}; it must return a finite figure (check the run's status there, or narrow the ranges)`,
        Object.keys(named),
      );
    }
    history.push({ values: named, objective: figure });
    const s = sign * figure;
    if (s < best.score) best = { values: values.slice(), score: s };
    return s;
  };

  let converged = false;
  try {
    for (let pass = 0; pass < passes && !converged; pass++) {
      let moved = false;
      specs.forEach((p, k) => {
        const start = best.values.slice();
        // Vary parameter k; hold the others at the best values so far.
        const at = (x: number): number => score(start.map((v, j) => (j === k ? x : v)));
        const step = (p.max - p.min) / (p.gridPoints - 1);
        let lo: number;
        let hi: number;
        if (pass === 0) {
          const grid = Array.from({ length: p.gridPoints }, (_, i) => (i === p.gridPoints - 1 ? p.max : p.min + i * step));
          const values = grid.map(at);
          let iBest = 0;
          for (let i = 1; i < values.length; i++) if (values[i]! < values[iBest]!) iBest = i;
          lo = grid[Math.max(0, iBest - 1)]!;
          hi = grid[Math.min(grid.length - 1, iBest + 1)]!;
        } else {
          // Later passes: the other parameters moved a little; search one scan step either side.
          lo = Math.max(p.min, start[k]! - step);
          hi = Math.min(p.max, start[k]! + step);
        }
        brentMinimum(at, lo, hi, p.tolerance, maxEvaluations);
        if (Math.abs(best.values[k]! - start[k]!) > p.tolerance) moved = true;
      });
      // A second pass only confirms when the first moved nothing (a single parameter needs one pass).
      if (!moved || specs.length === 1) converged = true;
    }
  } catch (e) {
    if (!(e instanceof Exhausted)) throw e;
  }
  if (history.length === 0) throw new InputError('bad-option', 'worstCase: maxEvaluations allowed no evaluation', ['maxEvaluations']);
  return { values: record(best.values), objective: sign * best.score, evaluations: history.length, converged, history };
}
