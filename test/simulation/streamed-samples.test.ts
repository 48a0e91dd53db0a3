/**
 * Memory that follows the sampling (issue 14): with keepSteps: false a run
 * keeps only its samples, each computed as the run goes from the step that
 * contains it; the samples are the same numbers as with every step kept, and
 * what needs every step refuses instead of answering over part of the run.
 */
import { describe, expect, it } from 'vitest';
import { constant, createNetwork, MU0, pulse, simulate, type WaveformSpec } from '../../src/index.js';

// A winding on a linear core in series with its resistance, switched onto 10 V: an RL circuit with
// L = N^2 / R_m (magnetic circuit law, R_m = l / (mu0 mu_r A)); test values of our own. Its step response
// i(t) = (V/R)(1 - exp(-t R / L)) is the first-order RL solution of any circuits textbook (for instance
// Alexander and Sadiku, Fundamentals of Electric Circuits, sect. 7.6).
const N = 100;
const AREA = 1e-3;
const MUR = 2000;
const PATH = 0.3;
const L = (N * N) / (PATH / (MU0 * MUR * AREA));
const R = 2;
const V = 10;

function rl(drive: WaveformSpec = constant(V)) {
  const net = createNetwork('rl step');
  const [top, bottom] = [net.magneticNode('top'), net.magneticNode('bottom')];
  const material = { kind: 'linear', relativePermeability: MUR } as const;
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: PATH / 2, area: AREA, material });
  net.fluxTube('yoke', { from: top, to: bottom, length: PATH / 2, area: AREA, material });
  const a = net.node('a');
  const source = net.voltageSource('drive', a, net.ground, drive);
  const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: a, minus: net.ground });
  return { net, leg, coil, source };
}

describe('keepSteps: false (samples streamed, steps dropped)', () => {
  const { net, coil } = rl();
  const options = { stopTime: 0.03, rtol: 1e-8, sampling: { interval: 1e-3 } } as const;
  const kept = simulate(net, options);
  const streamed = simulate(net, { ...options, keepSteps: false });

  it('gives the same samples, bit for bit, as keeping every step', () => {
    expect(streamed.status).toBe('success');
    expect(streamed.stats).toEqual(kept.stats);
    expect(Array.from(streamed.time)).toEqual(Array.from(kept.time));
    expect(Array.from(streamed.current(coil))).toEqual(Array.from(kept.current(coil)));
  });

  it('follows the RL step response at the samples', () => {
    const tau = L / R;
    const i = streamed.current(coil);
    streamed.time.forEach((t, k) => {
      // Samples come from the third-order dense output between steps: 1e-6 of the final current.
      expect(Math.abs(i[k]! - (V / R) * (1 - Math.exp(-t / tau)))).toBeLessThan(1e-6 * (V / R));
    });
  });

  it("refuses the energy audit and the evaluator ('steps-not-kept') instead of answering over part of the run", () => {
    expect(() => streamed.energy()).toThrow(expect.objectContaining({ code: 'steps-not-kept' }));
    expect(() => streamed.evaluator({ quantity: 'current', handle: coil })).toThrow(/keepSteps: true/);
    expect(kept.energy().relativeError).toBeLessThan(1e-6);
  });

  it("refuses a keepSteps that is not a boolean ('bad-option')", () => {
    expect(() => simulate(net, { stopTime: 0.01, keepSteps: 'no' as unknown as boolean })).toThrow(expect.objectContaining({ code: 'bad-option' }));
  });
});

describe('keepSteps: false across many input edges', () => {
  it('reads every sample with the inputs of its own interval (those of intervals without samples are released)', () => {
    // A square drive with 40 edges in 2 ms against a grid of 1e-4 s: most intervals hold no sample.
    const { net, coil, source } = rl(pulse({ low: -V, high: V, period: 1e-4, duty: 0.3 }));
    const options = { stopTime: 2e-3, sampling: { interval: 1e-4 } } as const;
    const kept = simulate(net, options);
    const streamed = simulate(net, { ...options, keepSteps: false });
    expect(streamed.status).toBe('success');
    expect(Array.from(streamed.time)).toEqual(Array.from(kept.time));
    for (const read of [(r: typeof kept) => r.voltage(source), (r: typeof kept) => r.power(source), (r: typeof kept) => r.current(coil)]) {
      expect(Array.from(read(streamed))).toEqual(Array.from(read(kept)));
    }
  });
});
