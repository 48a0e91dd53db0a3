import { describe, expect, it } from 'vitest';
import { bipolarSquare, createNetwork, simulate } from '../../src/index.js';

describe('simulate: switching instants', () => {
  it('lands on every breakpoint when maxStep divides the switching intervals evenly', () => {
    // Regression: steps of exactly maxStep adding up to a breakpoint used to leave a sliver of a few
    // ulp, which ended the run with step-size underflow.
    const net = createNetwork('bipolar drive');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const material = { kind: 'linear', relativePermeability: 2000 } as const;
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.05, area: 1e-4, material });
    net.fluxTube('yoke', { from: m2, to: m1, length: 0.05, area: 1e-4, material });
    const a = net.node('a');
    const T = 10e-6;
    net.voltageSource('v', a, net.ground, bipolarSquare({ amplitude: 48, period: T, deadTime: 0.5e-6 }));
    const w = net.winding('w', { tube: leg, turns: 10, resistance: 0.1, plus: a, minus: net.ground });
    for (const divisions of [10, 20, 40]) {
      const r = simulate(net, { stopTime: 5 * T, maxStep: T / divisions });
      expect(r.status).toBe('success');
      // The run completes with finite values and no step longer than maxStep (beyond round-off).
      expect(r.fluxLinkage(w).every(Number.isFinite)).toBe(true);
      for (let k = 1; k < r.time.length; k++) expect(r.time[k]! - r.time[k - 1]!).toBeLessThanOrEqual((T / divisions) * (1 + 1e-8));
    }
  });
});
