import type { CompiledNetwork } from '../formulation/compile-network.js';
import { handlesOf } from '../network/handles-of.js';
import { StateReader, type QuantityRequest, type StateFunction } from '../result/state-reader.js';
import type { NonFiniteValue } from './network-run.js';

/**
 * Largest |y_i| and |f_i| for which a recorded state is passed without
 * evaluating its quantities. Every quantity a result reads is the state, f,
 * or a product of two of them with the network's coefficients (turns,
 * lengths, areas, resistances, the derivative functional's entries), so with
 * both at most 1e100 a product stays below 1e200 times such a coefficient:
 * far from overflow. Above it (a run heading for overflow) every quantity is
 * evaluated, so the first one to overflow is still named. Our choice.
 */
const QUICK_PASS_BOUND = 1e100;

/** Every quantity a result can read, by handle: what the finiteness check evaluates. */
function everyRequest(c: CompiledNetwork): QuantityRequest[] {
  const h = handlesOf(c.description);
  const out: QuantityRequest[] = [];
  for (const tube of h.tubes.values()) {
    for (const quantity of ['flux', 'fluxDensity', 'fieldStrength', 'mmf', 'eddyPower'] as const) out.push({ quantity, handle: tube });
  }
  for (const element of h.elements.values()) {
    for (const quantity of ['current', 'voltage', 'power'] as const) out.push({ quantity, handle: element });
    if (element.kind === 'winding') for (const quantity of ['emf', 'fluxLinkage', 'copperLoss'] as const) out.push({ quantity, handle: element });
  }
  for (const node of h.nodes.values()) out.push({ quantity: 'potential', handle: node });
  for (const node of h.magneticNodes.values()) out.push({ quantity: 'magneticPotential', handle: node });
  return out;
}

/** Whether every entry of v is finite and at most `bound` in magnitude (NaN fails the comparison). */
function finiteWithin(v: Float64Array, bound: number): boolean {
  for (let i = 0; i < v.length; i++) {
    const a = Math.abs(v[i]!);
    if (!(a <= bound)) return false;
  }
  return true;
}

/**
 * The finiteness check of a run: returns the first quantity a result can
 * read (per tube, element, winding and node) that is not finite at a
 * recorded state, named by quantity and element, or undefined. So a run
 * never reports `success` over data that reads as NaN: the run stops there
 * with status `'non-finite'` and keeps what came before.
 *
 * Cheap in the common case: when the state y and f(t, y) are finite and
 * moderate (see QUICK_PASS_BOUND) no quantity can be non-finite, and one
 * evaluation of f is all it costs (none when the caller hands in f at (t, y),
 * as a run does at a step's end with the solver's own); otherwise every quantity is evaluated
 * to name the culprit. Quantities a handle does not have (the flux density
 * of a reluctance without an area) are skipped. Must be called with the
 * inputs in force for the state (`compiled.inputs.during`).
 *
 * @example
 * ```ts
 * const run = new NetworkRun(compiled, { ...settings, check: finitenessCheck(compiled) });
 * ```
 *
 * @internal
 */
export function finitenessCheck(c: CompiledNetwork): FinitenessCheck {
  return new FinitenessCheck(c);
}

/** A quantity the check reads, by name. */
type Check = { readonly quantity: string; readonly name: string; readonly fn: StateFunction };

/**
 * The check of {@link finitenessCheck}, a class so that the run calls one
 * function (`check.check(t, y)`) in every run: a closure per run was a new
 * call target each time and deoptimised the run's code in the next run.
 *
 * @internal
 */
export class FinitenessCheck {
  // Quantities that need a derivative of the state evaluate f(t, y); within one check (one t, one y,
  // one set of inputs) it is the same f, so it is evaluated once per check instead of once per quantity.
  private readonly f: Float64Array;
  private fresh = false;
  // Built on the first state that needs them (most runs never do).
  private checks: Check[] | undefined;
  /** The network with f evaluated once per check (for the quantities' readers). */
  private readonly once: CompiledNetwork;

  constructor(private readonly c: CompiledNetwork) {
    this.f = new Float64Array(c.layout.size);
    this.once = {
      ...c,
      evaluate: (t, y, inputs, out) => {
        if (!this.fresh) {
          c.evaluate(t, y, inputs, this.f);
          this.fresh = true;
        }
        out.set(this.f);
      },
    };
  }

  /**
   * The first non-finite value at (t, y) under the network's inputs in force, or undefined.
   * `rhs`, when given, is f(t, y) under those inputs, evaluated already (the solver's, at a step's end).
   */
  check(t: number, y: Float64Array, rhs?: Float64Array): NonFiniteValue | undefined {
    const c = this.c;
    const f = this.f;
    if (finiteWithin(y, QUICK_PASS_BOUND)) {
      if (rhs) {
        if (finiteWithin(rhs, QUICK_PASS_BOUND)) return undefined;
        f.set(rhs);
      } else {
        // The inputs in force themselves, not the network's view that forwards to them (the same
        // values): the elements' residuals then see one kind of inputs from the solver and from here.
        c.equations.evaluate(t, y, c.inputs.inForce, f);
        if (finiteWithin(f, QUICK_PASS_BOUND)) return undefined;
      }
      this.fresh = true; // f at (t, y) is in hand for the quantities below
    } else {
      this.fresh = false;
    }
    const list = (this.checks ??= this.build());
    for (const check of list) {
      const value = check.fn(y, t);
      if (!Number.isFinite(value)) return { quantity: check.quantity, name: check.name, value };
    }
    return undefined;
  }

  private build(): Check[] {
    const c = this.c;
    const reader = new StateReader(this.once, undefined);
    const list: Check[] = [];
    for (const request of everyRequest(c)) {
      try {
        list.push({ quantity: request.quantity, name: request.handle.name, fn: reader.build(request) });
      } catch {
        // A quantity this handle does not have (no area, no length): nothing to check.
      }
    }
    return list;
  }
}
