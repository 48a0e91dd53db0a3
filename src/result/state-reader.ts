import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { derivativeFunctional } from '../formulation/derivative-functional.js';
import type { ElementDescription } from '../network/description.js';
import type { AnyHandle, ElectricNode, FluxTube, MagneticNode, TwoTerminal, Winding } from '../network/handles.js';

/** A quantity that can be read from a state, with the handle kind it applies to. */
export type QuantityRequest =
  | { readonly quantity: 'flux' | 'fluxDensity' | 'fieldStrength' | 'mmf' | 'eddyPower'; readonly handle: FluxTube }
  | { readonly quantity: 'current' | 'voltage' | 'power'; readonly handle: TwoTerminal }
  | { readonly quantity: 'emf' | 'fluxLinkage' | 'copperLoss'; readonly handle: Winding }
  | { readonly quantity: 'potential'; readonly handle: ElectricNode }
  | { readonly quantity: 'magneticPotential'; readonly handle: MagneticNode };

/** Names of the quantities. */
export type QuantityName = QuantityRequest['quantity'];

/** SI unit of each quantity. */
export const QUANTITY_UNITS: Readonly<Record<QuantityName, string>> = Object.freeze({
  flux: 'Wb', fluxDensity: 'T', fieldStrength: 'A/m', mmf: 'A', eddyPower: 'W',
  current: 'A', voltage: 'V', power: 'W', emf: 'V', fluxLinkage: 'Wb', copperLoss: 'W', potential: 'V', magneticPotential: 'A',
});

/** Evaluates one quantity at a state y and time t (the inputs' interval must be set for t). */
export type StateFunction = (y: Float64Array, t: number) => number;

/**
 * Reads per-handle quantities from raw state vectors of a compiled network:
 * the shared back end of simulation results (whole series) and of the
 * stepping interface (present values). Checks each handle once when the
 * reader function is built.
 *
 * Quantities that need a derivative of the state (a capacitor's current, the
 * eddy term R_e dphi/dt) use u^T y' = w^T f(t, y) for u in the row space of M
 * (see `derivativeFunctional`).
 *
 * @example
 * ```ts
 * const reader = new StateReader(compiled, net.id);
 * const b = reader.build({ quantity: 'fluxDensity', handle: leg });
 * b(y, t); // T
 * ```
 */
export class StateReader {
  private readonly functionals = new Map<string, Float64Array | undefined>();
  private readonly f: Float64Array;

  constructor(
    private readonly compiled: CompiledNetwork,
    private readonly networkId: number | undefined,
  ) {
    this.f = new Float64Array(compiled.layout.size);
  }

  /** A function evaluating the requested quantity; throws InputError for a handle of the wrong kind or network. */
  build(request: QuantityRequest): StateFunction {
    const c = this.compiled;
    const d = c.description;
    switch (request.quantity) {
      case 'flux': {
        const b = this.checkHandle(request.handle, 'flux-tube').index;
        return (y) => c.tubeFlux(y, b);
      }
      case 'fluxDensity': {
        const b = this.checkHandle(request.handle, 'flux-tube').index;
        const area = c.tubes[b]!.area;
        if (!Number.isFinite(area)) {
          throw new InputError('no-area', `tube "${request.handle.name}" has no area, so it has no flux density; give the reluctance an area or read its flux`, [request.handle.name]);
        }
        return (y) => c.tubeFlux(y, b) / area;
      }
      case 'fieldStrength': {
        const b = this.checkHandle(request.handle, 'flux-tube').index;
        const length = c.tubes[b]!.length;
        if (!Number.isFinite(length)) {
          throw new InputError('no-length', `tube "${request.handle.name}" is a reluctance without a length, so it has no field strength; read its mmf instead`, [request.handle.name]);
        }
        return (y) => c.tubeMmf(b, c.tubeFlux(y, b)) / length;
      }
      case 'mmf': {
        const b = this.checkHandle(request.handle, 'flux-tube').index;
        return (y, t) => this.tubeDrop(b, y, t);
      }
      case 'eddyPower': {
        const b = this.checkHandle(request.handle, 'flux-tube').index;
        const re = c.tubes[b]!.eddyResistance;
        return (y, t) => {
          if (re === 0) return 0;
          const dphi = this.fluxDerivative(b, y, t);
          return re * dphi * dphi;
        };
      }
      case 'magneticPotential': {
        const k = this.checkHandle(request.handle, 'magnetic-node').index;
        const loops = c.loops;
        return (y, t) => {
          // Walk up the tree to the root, adding the net drop (tube drop - winding MMF) of each tube.
          let u = 0;
          for (let at = k; loops.parentTube[at]! >= 0; ) {
            const b = loops.parentTube[at]!;
            const tube = d.tubes[b]!;
            const drop = this.tubeDrop(b, y, t) - this.windingMmf(b, y);
            // u(from) - u(to) = drop. If `at` is the tube's `to` end, u(at) = u(parent) - drop.
            u += loops.parentIsTo[at] ? -drop : drop;
            at = loops.parentIsTo[at] ? tube.from : tube.to;
          }
          return u;
        };
      }
      case 'potential': {
        const k = this.checkHandle(request.handle, 'electric-node').index;
        const i = c.layout.potential[k]!;
        return (y) => (i < 0 ? 0 : y[i]!);
      }
      case 'voltage': {
        const e = this.elementIndex(request.handle);
        return (y) => this.elementVoltage(e, y);
      }
      case 'current': {
        const e = this.elementIndex(request.handle);
        return (y, t) => this.elementCurrent(e, y, t);
      }
      case 'power': {
        const e = this.elementIndex(request.handle);
        return (y, t) => this.elementVoltage(e, y) * this.elementCurrent(e, y, t);
      }
      case 'emf': {
        const e = this.checkHandle(request.handle, 'winding').index;
        const w = d.elements[e] as Extract<ElementDescription, { kind: 'winding' }>;
        const bi = c.layout.branchCurrent[e]!;
        return (y) => this.elementVoltage(e, y) - w.resistance * y[bi]!;
      }
      case 'copperLoss': {
        const e = this.checkHandle(request.handle, 'winding').index;
        const w = d.elements[e] as Extract<ElementDescription, { kind: 'winding' }>;
        const bi = c.layout.branchCurrent[e]!;
        return (y) => w.resistance * y[bi]! * y[bi]!;
      }
      case 'fluxLinkage': {
        const e = this.checkHandle(request.handle, 'winding').index;
        const w = d.elements[e] as Extract<ElementDescription, { kind: 'winding' }>;
        return (y) => w.orientation * w.turns * c.tubeFlux(y, w.tube);
      }
    }
  }

  /** dphi_b/dt from the state, for tubes whose flux derivative M y' = f determines (wound or eddy tubes); NaN otherwise. */
  fluxDerivative(b: number, y: Float64Array, t: number): number {
    const c = this.compiled;
    const u = new Float64Array(c.layout.size);
    for (const en of c.loops.tubeLoops[b]!) u[c.layout.loopOffset + en.loop] = en.sign;
    return this.applyFunctional(`dphi:${b}`, u, y, t);
  }

  /** Check that a handle names an element of the compiled network (and of the right builder, when known). */
  checkHandle<K extends AnyHandle['kind']>(handle: AnyHandle, kind: K): Extract<AnyHandle, { kind: K }> {
    const d = this.compiled.description;
    if (!handle || typeof handle !== 'object' || handle.kind !== kind) {
      throw new InputError('wrong-handle-kind', `expected a ${kind} handle, got ${describe(handle)}`, []);
    }
    const list = kind === 'electric-node' ? d.electricNodes
      : kind === 'magnetic-node' ? d.magneticNodes
      : kind === 'flux-tube' ? d.tubes
      : d.elements;
    const entry = list[handle.index];
    const sameNetwork = this.networkId === undefined || handle.network === this.networkId;
    if (!entry || entry.name !== handle.name || !sameNetwork) {
      throw new InputError(
        'foreign-handle',
        `${kind} "${handle.name}" is not part of the simulated network "${d.name}"; use handles of the network you simulated`,
        [handle.name],
      );
    }
    return handle as Extract<AnyHandle, { kind: K }>;
  }

  private elementIndex(element: TwoTerminal): number {
    const kinds = ['resistor', 'capacitor', 'inductor', 'voltage-source', 'current-source', 'switch', 'winding'];
    if (!element || typeof element !== 'object' || !kinds.includes(element.kind)) {
      throw new InputError('wrong-handle-kind', `expected a two-terminal element or winding handle, got ${describe(element)}`, []);
    }
    return this.checkHandle(element, element.kind).index;
  }

  private elementVoltage(e: number, y: Float64Array): number {
    const el = this.compiled.description.elements[e]!;
    const ip = this.compiled.layout.potential[el.plus]!;
    const im = this.compiled.layout.potential[el.minus]!;
    return (ip < 0 ? 0 : y[ip]!) - (im < 0 ? 0 : y[im]!);
  }

  private elementCurrent(e: number, y: Float64Array, t: number): number {
    const c = this.compiled;
    const el = c.description.elements[e]!;
    switch (el.kind) {
      case 'resistor':
        return this.elementVoltage(e, y) / el.resistance;
      case 'switch':
        return this.elementVoltage(e, y) / (c.inputs.switchClosed(e, t) ? el.onResistance : el.offResistance);
      case 'current-source':
        return c.inputs.sourceValue(e, t);
      case 'capacitor': {
        const u = new Float64Array(c.layout.size);
        const ip = c.layout.potential[el.plus]!;
        const im = c.layout.potential[el.minus]!;
        if (ip >= 0) u[ip] = el.capacitance;
        if (im >= 0) u[im] = -el.capacitance;
        return this.applyFunctional(`cap:${e}`, u, y, t);
      }
      case 'voltage-source':
      case 'inductor':
      case 'winding':
        return y[c.layout.branchCurrent[e]!]!;
    }
  }

  /** MMF of the windings on tube b (orientation * N * i summed), A. */
  private windingMmf(b: number, y: Float64Array): number {
    const c = this.compiled;
    let s = 0;
    c.description.elements.forEach((el, e) => {
      if (el.kind === 'winding' && el.tube === b) s += el.orientation * el.turns * y[c.layout.branchCurrent[e]!]!;
    });
    return s;
  }

  private tubeDrop(b: number, y: Float64Array, t: number): number {
    const c = this.compiled;
    const phi = c.tubeFlux(y, b);
    const re = c.tubes[b]!.eddyResistance;
    return c.tubeMmf(b, phi) + (re === 0 ? 0 : re * this.fluxDerivative(b, y, t));
  }

  private applyFunctional(key: string, u: Float64Array, y: Float64Array, t: number): number {
    const c = this.compiled;
    if (!this.functionals.has(key)) this.functionals.set(key, derivativeFunctional(c.mass, c.layout.size, u));
    const w = this.functionals.get(key);
    if (!w) return NaN;
    c.rhs(t, y, this.f);
    let s = 0;
    for (let i = 0; i < this.f.length; i++) s += w[i]! * this.f[i]!;
    return s;
  }
}

function describe(v: unknown): string {
  if (v && typeof v === 'object' && 'kind' in v) return `a ${String((v as { kind: unknown }).kind)}`;
  return v === undefined ? 'nothing' : typeof v;
}
