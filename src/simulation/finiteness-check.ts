import type { CompiledNetwork } from '../formulation/compile-network.js';
import { handlesOf } from '../network/handles-of.js';
import { StateReader, type QuantityRequest, type StateFunction } from '../result/state-reader.js';
import type { NonFiniteValue } from './network-run.js';

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

/**
 * The finiteness check of a run: evaluates every quantity a result can read
 * (per tube, element, winding and node) at a recorded state and returns the
 * first that is not finite, named by quantity and element, or undefined.
 * So a run never reports `success` over data that reads as NaN: the run
 * stops there with status `'non-finite'` and keeps what came before.
 * Quantities a handle does not have (the flux density of a reluctance
 * without an area) are skipped.
 *
 * @example
 * ```ts
 * const run = new NetworkRun(compiled, { ...settings, check: finitenessCheck(compiled) });
 * ```
 *
 * @internal
 */
export function finitenessCheck(c: CompiledNetwork): (t: number, y: Float64Array) => NonFiniteValue | undefined {
  // Quantities that need a derivative of the state evaluate f(t, y); within one check (one t, one y,
  // one set of inputs) it is the same f, so it is evaluated once per check instead of once per quantity.
  const f = new Float64Array(c.layout.size);
  let fresh = false;
  const once: CompiledNetwork = {
    ...c,
    evaluate: (t, y, inputs, out) => {
      if (!fresh) {
        c.evaluate(t, y, inputs, f);
        fresh = true;
      }
      out.set(f);
    },
  };
  const reader = new StateReader(once, undefined);
  const checks: { readonly quantity: string; readonly name: string; readonly fn: StateFunction }[] = [];
  for (const request of everyRequest(c)) {
    try {
      checks.push({ quantity: request.quantity, name: request.handle.name, fn: reader.build(request) });
    } catch {
      // A quantity this handle does not have (no area, no length): nothing to check.
    }
  }
  return (t, y) => {
    fresh = false;
    for (const check of checks) {
      const value = check.fn(y, t);
      if (!Number.isFinite(value)) return { quantity: check.quantity, name: check.name, value };
    }
    return undefined;
  };
}
