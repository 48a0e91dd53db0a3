import type { InputView, RateReader } from '../elements/element-kind.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import type { RecordedStep } from './recorded-step.js';

/** Unit round-off. */
const UROUND = Number.EPSILON / 2;
/**
 * Length of the first jump across a knee, in units of u |t|: a thousand
 * times the integrator's smallest step (10 u |t|), still far below any step
 * the error control would take (6.7e-15 s at t = 3 ms).
 */
const FIRST_JUMP = 1e4;
/** A junction voltage change across the jump that only a knee swing makes, V. */
const SWING = 1;
/** A junction current changing by this factor across the jump has crossed (part of) its knee. */
const CURRENT_RATIO = 100;
/** Jumps in a row (no step accepted between them) before the run gives up; each ten times the last. */
const MAX_JUMPS = 3;

/**
 * A smooth (exponential) junction without capacitance whose current
 * reverses carries no charge across its knee: its voltage swings from the
 * forward drop to the full blocking voltage (or back) in about
 * n V_T G_off / |di/dt|, below 1e-16 s with a 1e-9 S off-conductance. The
 * integrator's simplified Newton, whose Jacobian is taken at the start of a
 * step, converges only on steps that stay on one side of the swing, so the
 * steps approach it geometrically until they fall below the round-off
 * limit of t (10 u |t|: 7e-18 s at t = 3 ms). Measured on the 300-period
 * flyback of bench/flyback-commutation.ts: a step-size underflow at 69
 * periods.
 *
 * The crossing: from the last accepted state, the differential unknowns
 * are carried a short time delta ahead along the last step's secant (first
 * order: the change over delta is delta y', the error delta h y''/2, far
 * below a tolerance unit with delta below 1e-14 s), the algebraic unknowns
 * are solved there by full Newton
 * (a fresh Jacobian per iteration follows the junction across its knee),
 * and the run restarts from that state. The crossing is accepted only when
 * a smooth junction's current changed sign across it (the swing is what
 * stopped the run, not some other trouble); otherwise the failure stands,
 * with {@link SmoothJunctionCrossing.hint} naming the junctions and the fix.
 * The energy of the skipped interval (delta times the power) is below the
 * audit's round-off.
 *
 * @example
 * ```ts
 * const crossing = smoothJunctionCrossing(compiled, solveAlgebraic);
 * const landed = crossing?.cross(t, y, lastStep, edge, inputs);
 * ```
 */
export interface SmoothJunctionCrossing {
  /**
   * The state delta past t with the algebraic unknowns solved, when a smooth
   * junction's current changed sign across it and t + delta stays before
   * `edge`; undefined otherwise (or after {@link MAX_JUMPS} in a row).
   */
  cross(t: number, y: Float64Array, step: RecordedStep | undefined, edge: number, inputs: InputView): { readonly t: number; readonly y: Float64Array } | undefined;
  /** A step was accepted: the next crossing is a first one again. */
  stepped(): void;
  /** The sentence added to a solver failure of a network with smooth junctions: which ones and the fix. */
  hint(): string;
  /** Crossings made so far. */
  readonly count: number;
}

/**
 * The crossing for a compiled network, or undefined when it has no smooth
 * junction without capacitance. `solve` solves the algebraic unknowns of y
 * in place (full Newton; see algebraicSolver).
 *
 * @example
 * ```ts
 * const crossing = smoothJunctionCrossing(compiled, algebraicSolver(compiled, 1e-6, 1e-6));
 * ```
 */
export function smoothJunctionCrossing(
  compiled: CompiledNetwork,
  solve: (t: number, y: Float64Array, inputs: InputView) => boolean,
): SmoothJunctionCrossing | undefined {
  const junctions = compiled.description.elements.flatMap((e, k) =>
    e.kind === 'diode' && e.junction === 'exponential' && !(e.capacitance > 0) ? [k] : []);
  if (junctions.length === 0) return undefined;
  const names = junctions.map((k) => compiled.description.elements[k]!.name);
  let inRow = 0;
  const slope = new Float64Array(compiled.layout.size);
  const yNew = new Float64Array(compiled.layout.size);
  let count = 0;
  // Junctions without capacitance read no rate.
  const noRates: RateReader = { rate: () => NaN };
  const current = (k: number, t: number, y: Float64Array, inputs: InputView): number => compiled.elements[k]!.current(t, y, inputs, noRates);
  const plus = junctions.map((k) => compiled.layout.potential[compiled.description.elements[k]!.plus]!);
  const minus = junctions.map((k) => compiled.layout.potential[compiled.description.elements[k]!.minus]!);
  const potential = (i: number, y: Float64Array): number => (i >= 0 ? y[i]! : 0);
  const voltage = (j: number, y: Float64Array): number => potential(plus[j]!, y) - potential(minus[j]!, y);
  return {
    get count() {
      return count;
    },
    stepped() {
      inRow = 0;
    },
    cross(t, y, step, edge, inputs) {
      if (inRow >= MAX_JUMPS || !step) return undefined;
      if (inRow === 0) {
        // The slope of the last step; a jump in a row (no step accepted since the last) keeps it.
        if (!(step.t === t)) return undefined;
        for (let i = 0; i < y.length; i++) slope[i] = (y[i]! - step.yOld[i]!) / step.h;
      }
      // Ten times longer each try (and each jump in a row) until a junction has crossed its knee.
      for (let k = inRow; k < MAX_JUMPS; k++) {
        const delta = FIRST_JUMP * 10 ** k * UROUND * Math.max(Math.abs(t), step.h);
        const tNew = t + delta;
        // The jump may not pass an input breakpoint.
        if (!(tNew < edge)) return undefined;
        // First order along the last step's secant (its polynomial, extrapolated far beyond a short last
        // step, would amplify the stage noise); the algebraic unknowns are then solved afresh.
        for (let i = 0; i < y.length; i++) yNew[i] = y[i]! + delta * slope[i]!;
        if (!solve(tNew, yNew, inputs)) continue;
        let finite = true;
        for (let i = 0; i < yNew.length; i++) finite &&= Number.isFinite(yNew[i]!);
        // A volt, a current reversing or growing or falling a hundredfold, in less than 1e-12 s: a junction
        // swinging across its knee.
        const swung = junctions.some((k, j) => {
          const [before, after] = [current(k, t, y, inputs), current(k, tNew, yNew, inputs)];
          return Math.abs(voltage(j, yNew) - voltage(j, y)) > SWING || before * after < 0
            || Math.abs(after) > CURRENT_RATIO * Math.abs(before) || Math.abs(before) > CURRENT_RATIO * Math.abs(after);
        });
        if (!finite || !swung) continue;
        inRow = k + 1;
        count++;
        return { t: tNew, y: Float64Array.from(yNew) };
      }
      return undefined;
    },
    hint() {
      const who = names.map((n) => `"${n}"`).join(', ');
      return (
        ` Smooth junction${names.length > 1 ? 's' : ''} ${who} without capacitance: a junction whose current reverses swings across its knee ` +
        'in about n V_T offConductance / |di/dt| seconds, which the solver may not resolve; give the diode a capacitance (its junction ' +
        'capacitance), a larger offConductance (1e-7 S or more), or the ideal junction.'
      );
    },
  };
}
