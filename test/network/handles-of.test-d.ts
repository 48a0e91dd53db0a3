import { describe, expectTypeOf, it } from 'vitest';
import { handlesOf, type FluxTube, type NetworkDescription, type SimulationResult, type TwoTerminal, type VoltageSource, type Winding } from '../../src/index.js';

describe('handlesOf types', () => {
  it('gives typed handles, narrowed by the kind asked for', () => {
    const h = handlesOf({} as NetworkDescription);
    expectTypeOf(h.tube('leg')).toEqualTypeOf<FluxTube>();
    expectTypeOf(h.winding('primary')).toEqualTypeOf<Winding>();
    expectTypeOf(h.element('mains')).toEqualTypeOf<TwoTerminal>();
    expectTypeOf(h.element('mains', 'voltage-source')).toEqualTypeOf<VoltageSource>();
    const r = {} as SimulationResult;
    expectTypeOf(r.emf).toBeCallableWith(h.winding('primary'));
    // @ts-expect-error an element that may not be a winding has no emf
    r.emf(h.element('primary'));
    // @ts-expect-error a tube is not an element
    r.current(h.tube('leg'));
  });
});
