import { describe, expect, it } from 'vitest';
import { createNetwork, seriesIntegral, seriesPeak, simulate, sine } from '../../src/index.js';

// One winding on a saturating core, switched at voltage zero: long solver steps while the flux ramps,
// strongly nonlinear current between them. Test data of our own.
function choke() {
  const net = createNetwork('choke');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const material = { kind: 'frohlich-kennelly', initialRelativePermeability: 4000, saturationPolarisation: 1.6 } as const;
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.2, area: 1e-3, material });
  net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-3, material });
  const a = net.node('a');
  net.voltageSource('mains', a, net.ground, sine({ amplitude: 100, frequency: 50 }));
  const coil = net.winding('coil', { tube: leg, turns: 150, resistance: 0.5, plus: a, minus: net.ground });
  return { net, leg, coil };
}

describe('SimulationResult.evaluator and copperLoss', () => {
  it('evaluates between steps as accurately as a run that stops there', () => {
    const { net, coil } = choke();
    const r = simulate(net, { stopTime: 0.04, rtol: 1e-8 });
    const at = r.evaluator({ quantity: 'current', handle: coil });
    const probe = Array.from({ length: 50 }, (_, k) => 0.0003 + k * 0.00079);
    const exact = simulate(net, { stopTime: 0.04, rtol: 1e-8, sampling: { times: probe, exact: true } });
    const ref = exact.current(coil);
    const scale = Math.max(...ref.map(Math.abs));
    let worst = 0;
    probe.forEach((t, k) => (worst = Math.max(worst, Math.abs(at(t) - ref[k]!))));
    expect(worst / scale).toBeLessThan(1e-5);
    // The dense evaluator refines the peak beyond the step samples (seriesPeak's golden section).
    const peak = seriesPeak(r.time, r.current(coil), { at });
    expect(peak.maxAbs).toBeGreaterThanOrEqual(Math.max(...r.current(coil).map(Math.abs)));
  });

  it('gives copper loss R i^2 whose integral is the energy audit\'s winding loss (Joule\'s law)', () => {
    const { net, coil } = choke();
    const r = simulate(net, { stopTime: 0.04, rtol: 1e-8 });
    const p = r.copperLoss(coil);
    const i = r.current(coil);
    p.forEach((x, k) => expect(x).toBeCloseTo(0.5 * i[k]! * i[k]!, 12));
    const energy = seriesIntegral(r.time, p, { at: r.evaluator({ quantity: 'copperLoss', handle: coil }) });
    expect(energy / r.energy().dissipated.windings).toBeCloseTo(1, 6);
  });
});
