import type { ElementEvent, InputView } from '../elements/element-kind.js';
import { DenseStampTarget } from '../elements/stamp-target.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { algebraicJacobian, massSpaces, type MassSpaces } from '../solver/consistent-initialization.js';
import { createDenseLu } from '../solver/dense-lu.js';
import { SPARSE_MIN_SIZE } from '../solver/types.js';
import { leastChangeSettle, unknownTolerance } from './least-change-settle.js';
import { sparseAlgebraicSolver } from './sparse-algebraic-solver.js';

/** Newton iterations of one algebraic solve (piecewise-linear circuits need one; saturating cores a few). */
const MAX_NEWTON = 25;
/** Converged when the last correction is this small in tolerance units (atol + rtol |y|). */
const NEWTON_TOLERANCE = 1e-8;
/** A correction that stops shrinking below this (tolerance units) is round-off: converged. */
const STAGNATION_TOLERANCE = 1;

/**
 * What the consistent-state search needs: the devices (their margins and
 * consistency tests) and a solve of the algebraic part of the network at a
 * fixed differential state under trial device states.
 *
 * @example
 * ```ts
 * const problem: SettleProblem = { devices: compiled.events, names: ['D1', 'D2'], solve: (t, y, view) => solver(t, y, view) };
 * ```
 */
export interface SettleProblem {
  /** One event per device with a discrete state, as compiled (element order). */
  readonly devices: readonly ElementEvent[];
  /** Element names, by element index, for messages. */
  readonly names: readonly string[];
  /** Solve the algebraic unknowns of y in place at time t under `inputs`; false when that fails (singular, no convergence). */
  solve(t: number, y: Float64Array, inputs: InputView): boolean;
}

/**
 * Outcome of {@link settleDeviceStates}: the consistent states (per
 * element, in place in the given array) or why there are none.
 *
 * @example
 * ```ts
 * const r = settleDeviceStates(problem, t, y, states, base);
 * if (!r.ok) console.error(r.message, r.elements);
 * ```
 */
export type SettleOutcome =
  | { readonly ok: true; readonly trials: number }
  | { readonly ok: false; readonly trials: number; readonly message: string; readonly elements: readonly string[] };

/**
 * Settle every device state together after a jump (a gate edge, a source
 * step, a diode's own event, the start of a run): solve the algebraic part
 * of the network with the trial states; open the diodes that would carry
 * reverse current, close the blocked ones whose forward voltage exceeds
 * their threshold (each device's {@link ElementEvent.consistent}); repeat
 * until every device is consistent.
 *
 * Strategy: first every violated device flips at once (the usual case:
 * one round, or two in a bridge where a pair commutates together); a state
 * seen before means that would cycle, so from then on only the most
 * violated device flips per round (a pivoting rule in the manner of
 * Murty's for linear complementarity problems, from memory). With positive
 * on-resistances and off-conductances the piecewise-linear network has one
 * consistent set (its complementarity matrix is a P-matrix), so the limit
 * (4 rounds per device plus 10) is only reached by networks this reasoning
 * does not cover; it ends with a message naming the devices that were
 * still flipping.
 *
 * `states` (one per element) holds the trial on entry and the result on
 * return; `y` holds the state at the jump on entry and the settled state
 * (algebraic unknowns solved) on return.
 *
 * @example
 * ```ts
 * const states = [...schedule.deviceStates];
 * const outcome = settleDeviceStates(problem, t, y, states, live);
 * ```
 */
export function settleDeviceStates(problem: SettleProblem, t: number, y: Float64Array, states: boolean[], base: InputView): SettleOutcome {
  const view: InputView = {
    sourceValue: (e, tt) => base.sourceValue(e, tt),
    switchClosed: (e, tt) => base.switchClosed(e, tt),
    deviceOn: (e) => states[e]!,
  };
  const devices = problem.devices;
  const start = Float64Array.from(y);
  const seen = new Set<string>();
  const limit = 4 * devices.length + 10;
  let singleFlips = false;
  let flipping = new Set<number>();
  for (let trial = 1; trial <= limit; trial++) {
    y.set(start);
    if (!problem.solve(t, y, view)) {
      const names = devices.map((d) => problem.names[d.element]!);
      return {
        ok: false,
        trials: trial,
        message: `no consistent state of the devices at t = ${t} s: the circuit equations have no solution with the device states tried (${describe(devices, states, problem.names)})`,
        elements: names,
      };
    }
    let worst = -1;
    let worstValue = Infinity;
    const violated: number[] = [];
    for (let k = 0; k < devices.length; k++) {
      const d = devices[k]!;
      const ok = d.consistent ? d.consistent(t, y, view) : d.value(t, y, view) >= 0;
      if (ok) continue;
      violated.push(k);
      const v = d.value(t, y, view);
      if (v < worstValue) {
        worstValue = v;
        worst = k;
      }
    }
    if (violated.length === 0) return { ok: true, trials: trial };
    const key = devices.map((d) => (states[d.element] ? '1' : '0')).join('');
    if (seen.has(key)) singleFlips = true;
    seen.add(key);
    const flip = singleFlips ? [worst >= 0 ? worst : violated[0]!] : violated;
    for (const k of flip) {
      const e = devices[k]!.element;
      states[e] = !states[e];
      flipping.add(e);
    }
    if (trial > limit - devices.length - 2) flipping = new Set(flip.map((k) => devices[k]!.element));
  }
  const names = [...flipping].map((e) => problem.names[e]!);
  y.set(start);
  return {
    ok: false,
    trials: limit,
    message:
      `no consistent set of device states at t = ${t} s after ${limit} trials: ${names.map((n) => `"${n}"`).join(', ')} kept changing state; ` +
      'give the diodes an on-resistance and an off-conductance (> 0), or a capacitance, so that the circuit has one consistent state',
    elements: names,
  };
}

function describe(devices: readonly ElementEvent[], states: readonly boolean[], names: readonly string[]): string {
  return devices.map((d) => `"${names[d.element]}" ${states[d.element] ? 'on' : 'off'}`).join(', ');
}

/**
 * The algebraic solve of a compiled network for {@link settleDeviceStates}:
 * Newton on W0^T f(t, y + V0 z) = 0 (W0, V0: left and right null spaces of
 * the mass matrix), the differential content M y kept, with a fresh
 * Jacobian per iteration (the device states changed since the last call,
 * and a stale matrix would not see it). Buffers are allocated once. When
 * that matrix is too ill-conditioned for the LU's pivot test (a node held
 * only by the off-conductances of blocking diodes: 1e-9 S beside 1e3 S),
 * the solver's least-change initialisation (SVD based) takes over.
 *
 * @example
 * ```ts
 * const solve = algebraicSolver(compiled, 1e-6, 1e-6);
 * solve(t, y, inputs); // y's algebraic unknowns now meet the circuit equations
 * ```
 */
export function algebraicSolver(compiled: CompiledNetwork, atol: number | Float64Array, rtol: number): (t: number, y: Float64Array, inputs: InputView) => boolean {
  const n = compiled.layout.size;
  // Large networks: the same iteration on the stamps' pattern, without n x n arrays.
  if (compiled.jacobianPattern && n >= SPARSE_MIN_SIZE) return sparseAlgebraicSolver(compiled, atol, rtol, { maxIterations: MAX_NEWTON, tolerance: NEWTON_TOLERANCE, stagnation: STAGNATION_TOLERANCE });
  let spaces: MassSpaces | undefined;
  const f = new Float64Array(n);
  const jac = new Float64Array(n * n);
  const target = new DenseStampTarget(n).bind(jac);
  let reduced = new Float64Array(0);
  let work = new Float64Array(0);
  let z = new Float64Array(0);
  let lu: ReturnType<typeof createDenseLu> | undefined;
  const leastChange = leastChangeSettle(compiled, atol, rtol);
  return (t, y, inputs) => {
    if (!spaces) {
      spaces = massSpaces(compiled.sparseMass, n);
      reduced = new Float64Array(spaces.k * spaces.k);
      work = new Float64Array(n * spaces.k);
      z = new Float64Array(spaces.k);
      lu = createDenseLu(Math.max(1, spaces.k));
    }
    const { k, v0, w0 } = spaces;
    if (k === 0) return true;
    let previous = Infinity;
    for (let iter = 0; iter < MAX_NEWTON; iter++) {
      compiled.evaluate(t, y, inputs, f);
      jac.fill(0);
      compiled.stampJacobian(t, y, inputs, target);
      algebraicJacobian(spaces, jac, reduced, work);
      if (lu!.factor(reduced) >= 0) return leastChange(t, y, inputs, spaces);
      for (let j = 0; j < k; j++) {
        let acc = 0;
        for (let i = 0; i < n; i++) acc += w0[i * k + j]! * f[i]!;
        z[j] = -acc;
      }
      lu!.solve(z);
      let norm = 0;
      for (let i = 0; i < n; i++) {
        let dy = 0;
        for (let j = 0; j < k; j++) dy += v0[i * k + j]! * z[j]!;
        y[i] = y[i]! + dy;
        norm = Math.max(norm, Math.abs(dy) / unknownTolerance(atol, rtol, i, y[i]!));
      }
      if (!Number.isFinite(norm)) return false;
      if (norm <= NEWTON_TOLERANCE) return true;
      // Stagnation within tolerance: the round-off floor of an ill-conditioned solve (off-conductances).
      if (iter > 0 && norm <= STAGNATION_TOLERANCE && norm >= 0.5 * previous) return true;
      previous = norm;
    }
    return false;
  };
}
