import { InputError } from '../errors.js';
import { MU0 } from '../constants.js';
import type { MaterialLaw } from './material-law.js';
import { checkBhTable, type BhTableData, type CheckedBhTable } from './bh-table-data.js';
import { frohlichKennellyMaterial, type FrohlichKennellySpec } from './frohlich-kennelly.js';
import { brauerMaterial, type BrauerSpec } from './brauer.js';
import { levenbergMarquardt, type LevenbergMarquardtStatus } from './levenberg-marquardt.js';

/**
 * Starting values for a Frohlich-Kennelly fit.
 *
 * @example
 * ```ts
 * const start: FrohlichKennellyParameters = { initialRelativePermeability: 3000, saturationPolarisation: 1.5 };
 * ```
 */
export type FrohlichKennellyParameters = Pick<FrohlichKennellySpec, 'initialRelativePermeability' | 'saturationPolarisation'>;
/**
 * Starting values for a Brauer fit.
 *
 * @example
 * ```ts
 * const start: BrauerParameters = { k1: 1e-8, k2: 6, k3: 20 };
 * ```
 */
export type BrauerParameters = Pick<BrauerSpec, 'k1' | 'k2' | 'k3'>;

/**
 * Options of {@link fitMaterial}.
 *
 * @example
 * ```ts
 * const options: FitMaterialOptions = { model: 'brauer', initial: { k1: 1e-8, k2: 6, k3: 20 }, maxIterations: 200 };
 * ```
 */
export type FitMaterialOptions =
  | { readonly model: 'frohlich-kennelly'; readonly initial?: FrohlichKennellyParameters; readonly maxIterations?: number }
  | { readonly model: 'brauer'; readonly initial?: BrauerParameters; readonly maxIterations?: number };

/**
 * How far the fitted law is from the data. All four numbers compare the
 * law's field strength H_fit(B_i) with the data H_i at the data's flux
 * densities B_i (the origin excluded).
 *
 * @example
 * ```ts
 * const e: FitError = fitMaterial(demoMaterials.amorphous, { model: 'brauer' }).error;
 * console.log(`${(100 * e.rmsRelative).toFixed(1)} % rms in H`);
 * ```
 */
export interface FitError {
  /** Root mean square of H_fit(B_i) - H_i, A/m. */
  readonly rmsAbsolute: number;
  /** Largest |H_fit(B_i) - H_i|, A/m. */
  readonly maxAbsolute: number;
  /** Root mean square of (H_fit(B_i) - H_i) / H_i (dimensionless). */
  readonly rmsRelative: number;
  /** Largest |H_fit(B_i) - H_i| / H_i (dimensionless). */
  readonly maxRelative: number;
}

/**
 * A fitted material: its spec, the fit error and the solver's account.
 *
 * @example
 * ```ts
 * const fit: MaterialFit<BrauerSpec> = fitMaterial(demoMaterials.amorphous, { model: 'brauer' });
 * const law = compileMaterial(fit.spec);
 * ```
 */
export interface MaterialFit<S> {
  /** The fitted law as a plain-data spec (compile it with compileMaterial). */
  readonly spec: S;
  /** Error of the fitted law against the data, in H at the data's B. */
  readonly error: FitError;
  /** Levenberg-Marquardt iterations. */
  readonly iterations: number;
  /** Why the least-squares solver stopped. */
  readonly status: LevenbergMarquardtStatus;
  /** True when the solver met its convergence test. */
  readonly converged: boolean;
}

/** Parameterisation of a model in unconstrained log parameters q. */
interface Model<S> {
  readonly toLog: (s: S) => number[];
  readonly fromLog: (q: Float64Array, name: string) => S;
  readonly guess: (t: CheckedBhTable) => S;
  readonly compile: (s: S) => MaterialLaw;
}

const frohlichKennellyModel: Model<FrohlichKennellySpec> = {
  // q = (ln(mu_ri - 1), ln J_s): keeps mu_ri > 1 and J_s > 0.
  toLog: (s) => [Math.log(s.initialRelativePermeability - 1), Math.log(s.saturationPolarisation)],
  fromLog: (q, name) => ({
    kind: 'frohlich-kennelly',
    name,
    initialRelativePermeability: 1 + Math.exp(q[0] as number),
    saturationPolarisation: Math.exp(q[1] as number),
  }),
  guess: (t) => {
    // mu_ri from the first secant, J_s a little above the largest polarisation.
    const b1 = t.b[1] as number;
    const h1 = t.h[1] as number;
    let jmax = 0;
    for (let i = 1; i < t.b.length; i++) jmax = Math.max(jmax, (t.b[i] as number) - MU0 * (t.h[i] as number));
    return {
      kind: 'frohlich-kennelly',
      name: t.name,
      initialRelativePermeability: Math.max(b1 / (MU0 * h1), 2),
      saturationPolarisation: 1.05 * Math.max(jmax, 1e-3),
    };
  },
  compile: frohlichKennellyMaterial,
};

const brauerModel: Model<BrauerSpec> = {
  // q = (ln k1, ln k2, ln k3): keeps all three positive.
  toLog: (s) => [Math.log(s.k1), Math.log(s.k2), Math.log(s.k3)],
  fromLog: (q, name) => ({
    kind: 'brauer',
    name,
    k1: Math.exp(q[0] as number),
    k2: Math.exp(q[1] as number),
    k3: Math.exp(q[2] as number),
  }),
  guess: (t) => {
    // Reluctivity nu = H/B: nu(first point) ~ k1 + k3; at the last point the
    // exponential part dominates: k1 exp(k2 B_n^2) ~ nu_n - k3.
    const n = t.b.length - 1;
    const nu1 = (t.h[1] as number) / (t.b[1] as number);
    const bn = t.b[n] as number;
    const nun = (t.h[n] as number) / bn;
    const k1 = 0.1 * nu1;
    const k3 = 0.9 * nu1;
    const ratio = (nun - k3) / k1;
    const k2 = ratio > 1 ? Math.log(ratio) / (bn * bn) : 1;
    return { kind: 'brauer', name: t.name, k1, k2, k3 };
  },
  compile: brauerMaterial,
};

/**
 * Fit an analytic law (Frohlich-Kennelly or Brauer) to B-H table data by
 * our own Levenberg-Marquardt ({@link levenbergMarquardt}).
 *
 * What is minimised: the sum over the data rows (origin excluded) of the
 * squared relative error in H, ((H_law(B_i) - H_i) / H_i)^2. Relative
 * errors weigh the low-field rows (tens of A/m) and the saturated rows
 * (tens of kA/m) alike; the law is evaluated as H(B), the same direction
 * the simulation uses. The parameters are fitted in logarithms, which keeps
 * them in their domains (mu_ri > 1, J_s > 0, k1, k2, k3 > 0) and balances
 * their very different sizes. Starting values are estimated from the data
 * unless given.
 *
 * The data are validated like a table spec (same errors).
 *
 * @example
 * ```ts
 * const fit = fitMaterial(
 *   { fluxDensity: [0.2, 0.6, 1.0, 1.3, 1.5], fieldStrength: [20, 62, 120, 300, 1500], name: 'sample' },
 *   { model: 'frohlich-kennelly' },
 * );
 * fit.spec.initialRelativePermeability;
 * fit.error.maxRelative; // largest relative error in H
 * ```
 */
export function fitMaterial(
  data: BhTableData,
  options: { readonly model: 'frohlich-kennelly'; readonly initial?: FrohlichKennellyParameters; readonly maxIterations?: number },
): MaterialFit<FrohlichKennellySpec>;
export function fitMaterial(
  data: BhTableData,
  options: { readonly model: 'brauer'; readonly initial?: BrauerParameters; readonly maxIterations?: number },
): MaterialFit<BrauerSpec>;
export function fitMaterial(data: BhTableData, options: FitMaterialOptions): MaterialFit<FrohlichKennellySpec | BrauerSpec>;
export function fitMaterial(data: BhTableData, options: FitMaterialOptions): MaterialFit<FrohlichKennellySpec | BrauerSpec> {
  const table = checkBhTable(data);
  switch (options.model) {
    case 'frohlich-kennelly': {
      const start = options.initial ? { kind: 'frohlich-kennelly' as const, name: table.name, ...options.initial } : undefined;
      return runFit(frohlichKennellyModel, table, start, options.maxIterations);
    }
    case 'brauer': {
      const start = options.initial ? { kind: 'brauer' as const, name: table.name, ...options.initial } : undefined;
      return runFit(brauerModel, table, start, options.maxIterations);
    }
    default: {
      const model = String((options as { model?: unknown }).model);
      throw new InputError('unknown-fit-model', `fit model "${model}" is not known; use 'frohlich-kennelly' or 'brauer'`, [model]);
    }
  }
}

function runFit<S>(model: Model<S>, table: CheckedBhTable, start: S | undefined, maxIterations: number | undefined): MaterialFit<S> {
  const initialSpec = start ?? model.guess(table);
  try {
    model.compile(initialSpec);
  } catch (e) {
    const why = e instanceof Error ? e.message : String(e);
    throw new InputError('fit-bad-start', `material "${table.name}": the starting parameters are not valid (${why})`, [table.name]);
  }
  const residuals = (q: Float64Array): Float64Array => {
    const out = new Float64Array(table.b.length - 1);
    let law: MaterialLaw;
    try {
      law = model.compile(model.fromLog(q, table.name));
    } catch {
      return out.fill(Number.NaN);
    }
    for (let i = 1; i < table.b.length; i++) {
      const hi = table.h[i] as number;
      out[i - 1] = (law.fieldStrength(table.b[i] as number) - hi) / hi;
    }
    return out;
  };
  const result = levenbergMarquardt(
    { residuals, initial: model.toLog(initialSpec) },
    maxIterations !== undefined ? { maxIterations } : {},
  );
  const spec = model.fromLog(result.parameters, table.name);
  return {
    spec,
    error: fitError(model.compile(spec), table),
    iterations: result.iterations,
    status: result.status,
    converged: result.converged,
  };
}

/** Error of a law against table rows 1..n, in H at the rows' B. */
function fitError(law: MaterialLaw, table: CheckedBhTable): FitError {
  let sa = 0;
  let sr = 0;
  let ma = 0;
  let mr = 0;
  const n = table.b.length - 1;
  for (let i = 1; i <= n; i++) {
    const hi = table.h[i] as number;
    const e = law.fieldStrength(table.b[i] as number) - hi;
    sa += e * e;
    sr += (e / hi) ** 2;
    ma = Math.max(ma, Math.abs(e));
    mr = Math.max(mr, Math.abs(e / hi));
  }
  return { rmsAbsolute: Math.sqrt(sa / n), maxAbsolute: ma, rmsRelative: Math.sqrt(sr / n), maxRelative: mr };
}
