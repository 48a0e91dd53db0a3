import { describe, expect, it } from 'vitest';
import { createNetwork, resultCoreLoss, simulate, sine } from '../../src/index.js';

describe('resultCoreLoss', () => {
  it('gives the Steinmetz loss k f^alpha B_peak^beta V for the sinusoidal flux of a simulated core', () => {
    // Steinmetz equation for sinusoidal flux (REFERENCES.md section 4) and the iGSE's identity with it
    // on a sine (Venkatachalam et al., COMPEL 2002). An ideal winding switched at the voltage peak
    // gives a pure sine flux of amplitude V/(N w A) in both tubes. Coefficients and core: our own.
    const [V, f, N, A] = [50, 1000, 20, 2e-4];
    const w = 2 * Math.PI * f;
    const net = createNetwork('sine core');
    const m1 = net.magneticNode('m1');
    const m2 = net.magneticNode('m2');
    const material = { kind: 'linear', relativePermeability: 2000 } as const;
    const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.04, area: A, material });
    const yoke = net.fluxTube('yoke', { from: m2, to: m1, length: 0.06, area: A, material });
    const a = net.node('a');
    net.voltageSource('drive', a, net.ground, sine({ amplitude: V, frequency: f, phase: Math.PI / 2 }));
    net.winding('coil', { tube: leg, turns: N, plus: a, minus: net.ground });
    const r = simulate(net, { stopTime: 1 / f, rtol: 1e-9, sampling: { interval: 1 / (4000 * f), exact: true } });
    const coefficients = { k: 3.2, alpha: 1.45, beta: 2.6 };
    const loss = resultCoreLoss(r, { period: 1 / f, coefficients });
    const bPeak = V / (N * w * A);
    const density = coefficients.k * f ** coefficients.alpha * bPeak ** coefficients.beta;
    expect(loss.tubes.map((t) => t.name)).toEqual(['leg', 'yoke']);
    expect(loss.total / (density * A * (0.04 + 0.06))).toBeCloseTo(1, 5);
    // Per-tube selection with its own coefficients.
    const one = resultCoreLoss(r, { period: 1 / f, tubes: [{ tube: yoke, coefficients: { ...coefficients, k: 6.4 } }] });
    expect(one.total / (2 * density * A * 0.06)).toBeCloseTo(1, 5);
    expect(leg.name).toBe('leg');
  });
});
