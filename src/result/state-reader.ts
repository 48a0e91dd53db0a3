import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import { derivativeFunctional } from '../formulation/derivative-functional.js';
import type { InputView, RateReader } from '../elements/element-kind.js';
import { elementKind, isElementKind } from '../elements/registry.js';
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
export class StateReader implements RateReader {
  private readonly functionals = new Map<string, Float64Array | undefined>();
  private readonly f: Float64Array;
  private readonly u: Float64Array;
  /** The inputs quantities are evaluated with. */
  private readonly inputs: InputView;

  constructor(
    private readonly compiled: CompiledNetwork,
    private readonly networkId: number | undefined,
  ) {
    this.f = new Float64Array(compiled.layout.size);
    this.u = new Float64Array(compiled.layout.size);
    this.inputs = compiled.inputs;
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
        return (y) => c.tubeMmf(b, c.tubeFlux(y, b), y) / length;
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
            const drop = this.tubeDrop(b, y, t) - this.windingMmf(b, y, t);
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
      case 'emf':
      case 'copperLoss':
      case 'fluxLinkage': {
        const e = this.checkHandle(request.handle, 'winding').index;
        const read = c.elements[e]!.extra?.[request.quantity];
        if (!read) {
          throw new InputError('wrong-handle-kind', `${request.handle.name} has no ${request.quantity}; read it from a winding`, [request.handle.name]);
        }
        return (y, t) => read(t, y);
      }
    }
  }

  /** dphi_b/dt from the state, for tubes whose flux derivative M y' = f determines (wound or eddy tubes); NaN otherwise. */
  fluxDerivative(b: number, y: Float64Array, t: number): number {
    const c = this.compiled;
    return this.rate(`dphi:${b}`, (u) => {
      for (const en of c.loops.tubeLoops[b]!) u[c.layout.loopOffset + en.loop] = en.sign;
    }, t, y, this.inputs);
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
    if (!element || typeof element !== 'object' || !isElementKind(element.kind)) {
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
    return this.compiled.elements[e]!.current(t, y, this.inputs, this);
  }

  /** MMF of the windings on tube b (orientation * N * i summed), A. */
  private windingMmf(b: number, y: Float64Array, t: number): number {
    const c = this.compiled;
    let s = 0;
    c.description.elements.forEach((el, e) => {
      const linked = elementKind(el).linkedFlux?.(el);
      if (linked !== undefined && linked.tube === b) s += linked.turns * this.elementCurrent(e, y, t);
    });
    return s;
  }

  private tubeDrop(b: number, y: Float64Array, t: number): number {
    const c = this.compiled;
    const phi = c.tubeFlux(y, b);
    const re = c.tubes[b]!.eddyResistance;
    return c.tubeMmf(b, phi, y) + (re === 0 ? 0 : re * this.fluxDerivative(b, y, t));
  }

  /** u^T y' at (t, y) for the u that `fill` writes (see {@link RateReader}); NaN when M y' = f does not fix it. */
  rate(key: string, fill: (u: Float64Array) => void, t: number, y: Float64Array, inputs: InputView): number {
    const c = this.compiled;
    if (!this.functionals.has(key)) {
      this.u.fill(0);
      fill(this.u);
      this.functionals.set(key, derivativeFunctional(c.mass, c.layout.size, this.u));
    }
    const w = this.functionals.get(key);
    if (!w) return NaN;
    c.evaluate(t, y, inputs, this.f);
    let s = 0;
    for (let i = 0; i < this.f.length; i++) s += w[i]! * this.f[i]!;
    return s;
  }
}

function describe(v: unknown): string {
  if (v && typeof v === 'object' && 'kind' in v) return `a ${String((v as { kind: unknown }).kind)}`;
  return v === undefined ? 'nothing' : typeof v;
}
