import type { NetworkEquations } from '../formulation/network-equations.js';
import type { InputView } from '../elements/element-kind.js';
import { expandFromRhs, type AffinePartition } from '../solver/affine-elimination.js';
import { InnerNodes } from '../solver/reduced-integrator.js';
import type { StepBuffer } from './step-record.js';

/**
 * What a step kept in the reduced formulation's deferred form (see
 * InnerNodes) is completed with: the inputs its f was evaluated under (the
 * object itself, as the run held it) and the expansion map Q in force then
 * (never changed after its formation). Steps share one while neither changes.
 *
 * @internal
 */
export interface DeferredInputs {
  readonly inputs: InputView;
  readonly map: Float64Array;
}

/**
 * Fills in the algebraic unknowns of a kept step when it is read, with the
 * same function the run's integrator used: f(t, y_D, 0) by the network's
 * equations under the step's own inputs, then y_A = Q f (see
 * expandFromRhs), so the values are the run's bit for bit; evaluations made
 * here are not counted in the run's statistics (the run is over or does not
 * need them).
 *
 * @internal
 * @example
 * ```ts
 * const completion = new DeferredInnerNodes(compiled.equations, split);
 * completion.complete(step, { inputs, map });
 * ```
 */
export class DeferredInnerNodes {
  private readonly nodes: InnerNodes;
  private readonly y: Float64Array;
  private readonly f: Float64Array;
  private context: DeferredInputs | undefined;
  private readonly expand: (t: number, yD: Float64Array, out: Float64Array) => void;

  constructor(
    private readonly equations: NetworkEquations,
    private readonly split: AffinePartition,
  ) {
    this.nodes = new InnerNodes(split);
    this.y = new Float64Array(split.n);
    this.f = new Float64Array(split.n);
    // Bound once: a step read costs no closure.
    this.expand = (t, yD, out) => this.expandAt(t, yD, out);
  }

  /** Complete `step` (loaded as kept, in the deferred form) under `context`. */
  complete(step: StepBuffer, context: DeferredInputs): void {
    this.context = context;
    this.nodes.complete(step, this.expand);
    this.context = undefined;
  }

  /** The full state at (t, y_D): f at (y_D, 0) under the step's inputs, then y_A = Q f. */
  private expandAt(t: number, yD: Float64Array, out: Float64Array): void {
    const { y, f, split } = this;
    const c = this.context!;
    for (let j = 0; j < split.differential.length; j++) y[split.differential[j]!] = yD[j]!;
    for (let k = 0; k < split.algebraic.length; k++) y[split.algebraic[k]!] = 0;
    this.equations.evaluate(t, y, c.inputs, f);
    expandFromRhs(split, c.map, yD, f, out);
  }
}
