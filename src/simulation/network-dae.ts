import type { InputView } from '../elements/element-kind.js';
import { DenseStampTarget } from '../elements/stamp-target.js';
import type { NetworkEquations } from '../formulation/network-equations.js';
import type { DaeEvent, DaeProblem, JacobianEntryTarget, MassEntries } from '../solver/types.js';

/** Where a run's inputs in force are read (they change from interval to interval). */
export interface LiveInputs {
  readonly inputs: InputView;
}

/** What a {@link NetworkDae} is made of, besides the network's equations and the run's inputs. */
export interface NetworkDaeData {
  readonly size: number;
  readonly massEntries: MassEntries;
  readonly jacobianPattern: { readonly rows: ArrayLike<number>; readonly cols: ArrayLike<number> } | undefined;
  readonly y0: ArrayLike<number>;
  readonly t0: number;
  readonly tEnd: number;
  readonly index2: readonly number[];
  readonly events: readonly DaeEvent[];
}

/**
 * A network run's DAE as the solver takes it, f and J as prototype methods.
 * The solver calls them as methods of this object: the same functions in
 * every run, so code optimised in one run stays valid in the next (closures
 * made per run were a new call target each time).
 *
 * @example
 * ```ts
 * const dae = new NetworkDae(compiled.equations, run, { size, massEntries, jacobianPattern, y0, t0, tEnd, index2, events: [] });
 * const integ = createDaeIntegrator(dae, { rtol: 1e-6 });
 * ```
 */
export class NetworkDae implements DaeProblem {
  readonly size: number;
  readonly massEntries: MassEntries;
  readonly jacobianPattern?: { readonly rows: ArrayLike<number>; readonly cols: ArrayLike<number> };
  readonly y0: ArrayLike<number>;
  readonly t0: number;
  readonly tEnd: number;
  readonly index2: readonly number[];
  readonly events?: readonly DaeEvent[];
  private readonly jacobianTarget: DenseStampTarget;

  constructor(
    private readonly equations: NetworkEquations,
    /** The run, read for its inputs in force at each call: nothing a reader does to the network's own inputs reaches it. */
    private readonly live: LiveInputs,
    data: NetworkDaeData,
  ) {
    this.size = data.size;
    this.massEntries = data.massEntries;
    // The stamps' positions, fixed at compile time: large networks factor on them sparsely.
    if (data.jacobianPattern) this.jacobianPattern = data.jacobianPattern;
    this.y0 = data.y0;
    this.t0 = data.t0;
    this.tEnd = data.tEnd;
    this.index2 = data.index2;
    if (data.events.length > 0) this.events = data.events;
    this.jacobianTarget = new DenseStampTarget(data.size);
  }

  rhs(t: number, y: Float64Array, out: Float64Array): void {
    this.equations.evaluate(t, y, this.live.inputs, out);
  }

  jacobian(t: number, y: Float64Array, out: Float64Array): void {
    this.equations.stampJacobian(t, y, this.live.inputs, this.jacobianTarget.bind(out));
  }

  /** The same stamps entry by entry: the sparse path holds J on the pattern alone. */
  jacobianEntries(t: number, y: Float64Array, target: JacobianEntryTarget): void {
    this.equations.stampJacobian(t, y, this.live.inputs, target);
  }
}
