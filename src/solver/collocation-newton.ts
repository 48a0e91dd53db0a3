import { float64View, ownFloat64, type TakeFloat64 } from './float64-chunks.js';
import type { ComplexLinearSolver, RealLinearSolver } from './linear-solver.js';
import type { DependentError } from './dependent-error.js';
import {
  C1,
  C2,
  DIVERGENT_RATE,
  JACOBIAN_RATE_THRESHOLD,
  MU_COMPLEX_IM,
  MU_COMPLEX_RE,
  MU_REAL,
  NEWTON_MAX_ITERATIONS,
  T,
  TI,
} from './radau-tableau.js';
import { packedDoubles } from './packed-doubles.js';
import { ComponentList } from './component-list.js';

/** Unit round-off (radau5's UROUND). */
const UROUND = Number.EPSILON / 2;
/** Shrink factor after a Newton failure without a rate estimate, or with non-finite stage values (radau5: 0.5). */
export const NEWTON_FAILURE_SHRINK = 0.5;

/**
 * What the collocation Newton iteration needs from the integrator: f, the
 * mass matrix, the two factored iteration matrices (gamma/h) M - J and
 * ((alpha - i beta)/h) M - J for the step size h being tried, and the
 * Newton stopping tolerance.
 *
 * @internal
 * @example
 * ```ts
 * const sys: CollocationSystem = { n, rhs, multiplyMass, luReal, luComplex, fnewt, stats };
 * ```
 */
export interface CollocationSystem {
  readonly n: number;
  /** f(t, y) into out (length n). Counted and guarded by the caller; may throw. */
  readonly rhs: (t: number, y: Float64Array, out: Float64Array) => void;
  /** out = M v[vOff .. vOff + n). */
  readonly multiplyMass: (v: number[], vOff: number, out: number[]) => void;
  /** M is the identity (an ODE): M W is W itself, read in place instead of copied. */
  readonly identityMass?: boolean;
  readonly luReal: RealLinearSolver;
  readonly luComplex: ComplexLinearSolver;
  /** radau5's FNEWT. */
  readonly fnewt: number;
  /** Newton iterations are counted here. */
  readonly stats: { newtonIterations: number };
  /** Unknowns that follow from the state, taken into the increment's norm too (see {@link DependentError}). */
  readonly dependentError?: DependentError | undefined;
}

/**
 * Work arrays of the iteration, allocated once per integrator. Shapes (n
 * unknowns): z, w, fz, dw are 3n, stage k at [k n, k n + n); the views are
 * made once here so the iteration itself allocates nothing. What only the
 * iteration and the integrator read (z, w and M W) is kept in plain arrays
 * of doubles ({@link packedDoubles} says why); what f writes and the
 * factorisations solve in place stays in Float64Arrays. A class, not an
 * object literal: a literal made once per integrator takes, at its second
 * evaluation in a process, a map whose array fields are generalised, and the
 * code compiled against the first integrator's objects is thrown away (a
 * class keeps one map).
 *
 * @internal
 * @example
 * ```ts
 * const work = createCollocationWork(n);
 * work.z.fill(0); // start values
 * ```
 */
export class CollocationWork {
  /** Stage increments Z_k = Y_k - y (3n): start values in, solution out. */
  readonly z: number[];
  /** Transformed increments W = T^-1 Z (3n). */
  readonly w: number[];
  /** f at the stages (3n), and its per-stage views. */
  readonly fz: Float64Array;
  readonly fzStage: readonly [Float64Array, Float64Array, Float64Array];
  /** Newton increment of W (3n): real part [0, n), complex pair [n, 2n) + i [2n, 3n). */
  readonly dw: Float64Array;
  readonly dwReal: Float64Array;
  readonly dwRe: Float64Array;
  readonly dwIm: Float64Array;
  /** Stage state y + Z_k (n). */
  readonly ys: Float64Array;
  /** M W_k (n each). */
  readonly m1: number[];
  readonly m2: number[];
  readonly m3: number[];

  constructor(n: number, take: TakeFloat64) {
    const fz = take(3 * n);
    const dw = take(3 * n);
    this.z = packedDoubles(3 * n);
    this.w = packedDoubles(3 * n);
    this.fz = fz;
    this.fzStage = [float64View(fz, 0, n), float64View(fz, n, n), float64View(fz, 2 * n, n)];
    this.dw = dw;
    this.dwReal = float64View(dw, 0, n);
    this.dwRe = float64View(dw, n, n);
    this.dwIm = float64View(dw, 2 * n, n);
    this.ys = take(n);
    this.m1 = packedDoubles(n);
    this.m2 = packedDoubles(n);
    this.m3 = packedDoubles(n);
  }
}

/** @internal @example `const work = createCollocationWork(3);` (arrays from `take`, see {@link TakeFloat64}) */
export function createCollocationWork(n: number, take: TakeFloat64 = ownFloat64): CollocationWork {
  return new CollocationWork(n, take);
}

/**
 * The step being tried, passed to {@link solveCollocation} (and to the error
 * estimate) in one object the integrator rewrites per attempt: numbers
 * passed as arguments to a call that is not inlined are boxed on the heap
 * each time (about a dozen per attempt with the acceptance's, most of what
 * a step allocated).
 *
 * @internal
 * @example
 * ```ts
 * const at: CollocationStep = { t: 0, h: 0.1, tLastStage: 0.1, faccon: 1 };
 * ```
 */
export interface CollocationStep {
  /** Start of the step. */
  t: number;
  /** Step size. */
  h: number;
  /** Where the last stage is evaluated: t + h, or one ulp before a breakpoint. */
  tLastStage: number;
  /** radau5's FACCON carried in from the previous step. */
  faccon: number;
}

/**
 * Outcome of {@link solveCollocation}; one object per integrator, rewritten
 * by each call (nothing is allocated on success).
 *
 * @internal
 * @example
 * ```ts
 * const outcome = solveCollocation(sys, work, y, scale, { t, h, tLastStage: tNew, faccon }, createNewtonOutcome(n));
 * if (!outcome.converged) h *= outcome.shrink;
 * ```
 */
export interface NewtonOutcome {
  converged: boolean;
  /** Iterations done (the last one included). */
  iterations: number;
  /** Observed contraction rate. */
  theta: number;
  /** Factor for the step size on failure (1 on success). */
  shrink: number;
  /** radau5's FACCON after the call: theta/(1 - theta) of the last rate estimate, carried to the next step. */
  faccon: number;
  /** Whether the iteration failed on a non-finite f at a stage (its components are then in `nonFinite`). */
  nonFiniteF: boolean;
  /**
   * Components with non-finite f at a stage, ascending: written by such a
   * failure only, kept until the next (read only if the run finally fails).
   */
  readonly nonFinite: ComponentList;
  /**
   * Components with the largest increments (or the non-finite ones of an
   * overflowed increment): written by any other failure only, kept until
   * the next.
   */
  readonly components: ComponentList;
}

/** @internal @example `const outcome = createNewtonOutcome(n);` (n unknowns) */
export function createNewtonOutcome(n: number): NewtonOutcome {
  return new NewtonOutcomeRecord(n);
}

/** A class, not a literal: a literal made once per integrator has its field types widened at its second evaluation (see the normalised problem). */
class NewtonOutcomeRecord implements NewtonOutcome {
  converged = false;
  iterations = 0;
  // NaN until the first solve writes them (never read before). Started as small integers, the first
  // non-integer rate made V8 store them as doubles under a new map for the class, which widened the
  // next integrator's field holding an outcome and threw away its optimised code.
  theta = NaN;
  shrink = NaN;
  faccon = NaN;
  nonFiniteF = false;
  readonly nonFinite: ComponentList;
  readonly components: ComponentList;

  constructor(n: number) {
    this.nonFinite = new ComponentList(n);
    this.components = new ComponentList(n);
  }
}

/**
 * The outcome's fields, every argument given: with a default parameter this no longer fitted
 * TurboFan's inlining budget of the kernel when a network's f is inlined into it, and its numbers
 * were boxed on the heap at each call (measured: 16 bytes per Newton iteration of the flux walk).
 */
function finish(out: NewtonOutcome, converged: boolean, iterations: number, theta: number, shrink: number, faccon: number, nonFiniteF: boolean): NewtonOutcome {
  out.converged = converged;
  out.iterations = iterations;
  out.theta = theta;
  out.shrink = shrink;
  out.faccon = faccon;
  out.nonFiniteF = nonFiniteF;
  return out;
}

/**
 * Simplified Newton iteration on the collocation system of Radau IIA,
 * transformed to one real and one complex system (Hairer and Wanner II,
 * sect. IV.8, eq. 8.9-8.16; radau5; SciPy's solve_collocation_system with M):
 * per iteration the stage values f(t + c_k h, y + Z_k), then
 * (gamma/h) M - J and ((alpha - i beta)/h) M - J solve for the increment of
 * W = T^-1 Z. Stops when faccon ||dW|| <= fnewt, early when the observed
 * contraction rate says it cannot converge within the iteration limit
 * (returning radau5's step reduction), on divergence, and on non-finite f.
 *
 * Shapes: y, scale (n); work.z (3n) holds the start values on entry and the
 * converged increments on success. The step is `at` (t, h, the time of the
 * last stage: t + h, or one ulp before a breakpoint, and the carried
 * FACCON). Pure apart from the
 * work arrays, `out` and the iteration count in `sys.stats`.
 *
 * @internal
 * @example
 * ```ts
 * const outcome = solveCollocation(sys, work, y, scale, { t, h, tLastStage: t + h, faccon }, createNewtonOutcome(n));
 * ```
 */
export function solveCollocation(
  sys: CollocationSystem,
  work: CollocationWork,
  y: Float64Array,
  scale: Float64Array,
  at: CollocationStep,
  out: NewtonOutcome,
): NewtonOutcome {
  const n = sys.n;
  const t = at.t;
  const h = at.h;
  const tLastStage = at.tLastStage;
  let faccon = at.faccon;
  const { z, w, fz, fzStage, dw, ys, m1, m2, m3 } = work;
  const fac1 = MU_REAL / h;
  const alphn = MU_COMPLEX_RE / h;
  const betan = MU_COMPLEX_IM / h;
  const fnewt = sys.fnewt;
  const identity = sys.identityMass === true;
  // The transformation's entries as locals, read once per call rather than in every loop pass.
  const ti0 = TI[0]!, ti1 = TI[1]!, ti2 = TI[2]!, ti3 = TI[3]!, ti4 = TI[4]!, ti5 = TI[5]!, ti6 = TI[6]!, ti7 = TI[7]!, ti8 = TI[8]!;
  const t0 = T[0]!, t1 = T[1]!, t2 = T[2]!, t3 = T[3]!, t4 = T[4]!, t5 = T[5]!, t6 = T[6]!, t7 = T[7]!, t8 = T[8]!;
  // w = T^-1 z
  for (let i = 0; i < n; i++) {
    const z1 = z[i]!;
    const z2 = z[n + i]!;
    const z3 = z[2 * n + i]!;
    w[i] = ti0 * z1 + ti1 * z2 + ti2 * z3;
    w[n + i] = ti3 * z1 + ti4 * z2 + ti5 * z3;
    w[2 * n + i] = ti6 * z1 + ti7 * z2 + ti8 * z3;
  }
  // radau5 carries FACCON^0.8 into the step; the power is taken only where that value is read (the
  // first iteration's stopping test, when bounds cannot decide it, and an early return): most steps
  // replace it by the observed rate in the second iteration without reading it.
  faccon = Math.max(faccon, UROUND);
  let facconPowered = false;
  let theta = Math.abs(JACOBIAN_RATE_THRESHOLD);
  let dynold = 0;
  let thqold = 0;
  const nit = NEWTON_MAX_ITERATIONS;
  for (let newt = 1; newt <= nit; newt++) {
    // Stage values f(t + c_k h, y + z_k).
    for (let s = 0; s < 3; s++) {
      const off = s * n;
      for (let i = 0; i < n; i++) ys[i] = y[i]! + z[off + i]!;
      sys.rhs(s === 0 ? t + C1 * h : s === 1 ? t + C2 * h : tLastStage, ys, fzStage[s]!);
    }
    sys.stats.newtonIterations++;
    // Right-hand sides of the transformed system: M W_k in m1, m2, m3 at offset 0, or W itself
    // (stage k at offset k n) when M is the identity.
    let o1 = 0;
    let o2 = 0;
    let o3 = 0;
    let mw1 = m1;
    let mw2 = m2;
    let mw3 = m3;
    if (identity) {
      mw1 = mw2 = mw3 = w;
      o2 = n;
      o3 = 2 * n;
    } else {
      sys.multiplyMass(w, 0, m1);
      sys.multiplyMass(w, n, m2);
      sys.multiplyMass(w, 2 * n, m3);
    }
    // probe: 0 f is NaN exactly when f is NaN or infinite, so one NaN test after the loop finds a
    // non-finite stage value (nothing below reads dw before that test).
    let probe = 0;
    for (let i = 0; i < n; i++) {
      const f1 = fz[i]!;
      const f2 = fz[n + i]!;
      const f3 = fz[2 * n + i]!;
      probe += f1 * 0 + f2 * 0 + f3 * 0;
      const a1 = mw1[o1 + i]!;
      const a2 = mw2[o2 + i]!;
      const a3 = mw3[o3 + i]!;
      dw[i] = ti0 * f1 + ti1 * f2 + ti2 * f3 - fac1 * a1;
      const cr = ti3 * f1 + ti4 * f2 + ti5 * f3;
      const ci = ti6 * f1 + ti7 * f2 + ti8 * f3;
      dw[n + i] = cr - (alphn * a2 - betan * a3);
      dw[2 * n + i] = ci - (alphn * a3 + betan * a2);
    }
    if (probe !== probe) {
      if (!facconPowered) faccon = faccon ** 0.8;
      nonFiniteStages(fz, n, out.nonFinite);
      return finish(out, false, newt, theta, NEWTON_FAILURE_SHRINK, faccon, true);
    }
    sys.luReal.solve(work.dwReal);
    sys.luComplex.solve(work.dwRe, work.dwIm);
    // dyno: weighted RMS of the increment over all 3n entries.
    let sum = 0;
    for (let k = 0; k < 3; k++) {
      for (let i = 0; i < n; i++) {
        const r = dw[k * n + i]! / scale[i]!;
        sum += r * r;
      }
    }
    let count = 3 * n;
    const dependent = sys.dependentError;
    if (dependent !== undefined) {
      dependent.measureIncrement(at, y, dw);
      sum += dependent.squares;
      count = 3 * (n + dependent.count);
    }
    const dyno = Math.sqrt(sum / count);
    if (!Number.isFinite(dyno)) {
      // The increment overflowed: name its non-finite components (or, when every entry is finite
      // and only the sum of squares overflowed, the largest), so a failure can be diagnosed.
      if (!facconPowered) faccon = faccon ** 0.8;
      overflowedIncrement(dw, n, scale, out.components);
      return finish(out, false, newt, theta, NEWTON_FAILURE_SHRINK, faccon, false);
    }
    if (newt > 1 && newt < nit) {
      const thq = dyno / dynold;
      theta = newt === 2 ? thq : Math.sqrt(thq * thqold);
      thqold = thq;
      if (theta < DIVERGENT_RATE) {
        faccon = theta / (1 - theta);
        facconPowered = true;
        if (cannotConverge(faccon, dyno, theta, nit - 1 - newt, fnewt)) {
          const dyth = (faccon * dyno * theta ** (nit - 1 - newt)) / fnewt;
          // Cannot converge within nit iterations: shrink h by radau5's estimate.
          const qnewt = Math.max(1e-4, Math.min(20, dyth));
          const shrink = 0.8 * qnewt ** (-1 / (4 + nit - 1 - newt));
          worstIncrement(dw, n, scale, out.components);
          return finish(out, false, newt, theta, shrink, faccon, false);
        }
      } else {
        if (!facconPowered) faccon = faccon ** 0.8;
        worstIncrement(dw, n, scale, out.components);
        return finish(out, false, newt, theta, NEWTON_FAILURE_SHRINK, faccon, false);
      }
    }
    dynold = Math.max(dyno, UROUND);
    for (let k = 0; k < 3 * n; k++) w[k] = w[k]! + dw[k]!;
    // z = T w
    for (let i = 0; i < n; i++) {
      const w1 = w[i]!;
      const w2 = w[n + i]!;
      const w3 = w[2 * n + i]!;
      z[i] = t0 * w1 + t1 * w2 + t2 * w3;
      z[n + i] = t3 * w1 + t4 * w2 + t5 * w3;
      z[2 * n + i] = t6 * w1 + t7 * w2 + t8 * w3;
    }
    if (!facconPowered && !surelyAbove(faccon, dyno, fnewt)) {
      faccon = faccon ** 0.8;
      facconPowered = true;
    }
    if (facconPowered && faccon * dyno <= fnewt) return finish(out, true, newt, theta, 1, faccon, false);
  }
  if (!facconPowered) faccon = faccon ** 0.8;
  worstIncrement(dw, n, scale, out.components);
  return finish(out, false, nit, theta, NEWTON_FAILURE_SHRINK, faccon, false);
}

/** Relative margin that covers the rounding of the bounds and products below (a few ulp each). */
const BOUND_MARGIN = 1e-12;

/**
 * Whether x^0.8 dyno > fnewt for certain, from bounds by square roots
 * (x^0.875 <= x^0.8 <= x^0.75 for x <= 1, reversed above 1) instead of the
 * power: the first iteration's stopping test decided without it. False
 * when the bounds cannot decide (the caller then takes the power).
 *
 * @internal
 * @example
 * ```ts
 * surelyAbove(0.01, 1, 1e-3); // true: 0.01^0.8 = 0.025 > 1e-3
 * ```
 */
export function surelyAbove(x: number, dyno: number, fnewt: number): boolean {
  const s1 = Math.sqrt(x);
  const s2 = Math.sqrt(s1);
  const lower = (x <= 1 ? s1 * s2 * Math.sqrt(s2) : s1 * s2) * (1 - BOUND_MARGIN);
  return lower * dyno > fnewt * (1 + BOUND_MARGIN) && Number.isFinite(lower * dyno);
}

/**
 * radau5's test dyth = faccon dyno theta^k / fnewt >= 1 (the iteration
 * cannot converge within the limit), with theta^k by multiplication first:
 * it differs from the power by a few ulp, so a result clearly below 1
 * decides; near 1, or with theta^k near underflow, the power decides as in
 * radau5. The same decisions, without a power in most iterations.
 *
 * @internal
 * @example
 * ```ts
 * cannotConverge(0.1, 1, 0.1, 4, 0.03); // false: 0.1 * 1e-4 / 0.03 < 1
 * ```
 */
export function cannotConverge(faccon: number, dyno: number, theta: number, k: number, fnewt: number): boolean {
  let tk = 1;
  for (let j = 0; j < k; j++) tk *= theta;
  if (tk > 1e-280 && (faccon * dyno * tk) / fnewt < 1 - BOUND_MARGIN) return false;
  return (faccon * dyno * theta ** k) / fnewt >= 1;
}

/** Components with a non-finite value at any of the three stages of `v` (3n: f, or a Newton increment), ascending, into `out`. */
function nonFiniteStages(v: Float64Array, n: number, out: ComponentList): void {
  out.clear();
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(v[i]!) || !Number.isFinite(v[n + i]!) || !Number.isFinite(v[2 * n + i]!)) out.push(i);
  }
}

/** Components whose Newton increment is NaN or infinite, into `out`; the largest ones when all are finite. */
function overflowedIncrement(dw: Float64Array, n: number, scale: Float64Array, out: ComponentList): void {
  nonFiniteStages(dw, n, out);
  if (out.length === 0) worstIncrement(dw, n, scale, out);
}

/** Components with the largest scaled increment over the three stages, into `out` (three at most). */
function worstIncrement(dw: Float64Array, n: number, scale: Float64Array, out: ComponentList): void {
  out.clear();
  for (let i = 0; i < n; i++) {
    const m = Math.max(Math.abs(dw[i]!), Math.abs(dw[n + i]!), Math.abs(dw[2 * n + i]!));
    out.keepLargest(3, i, Math.abs(m / scale[i]!));
  }
}
