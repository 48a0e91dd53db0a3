import { describe, expect, it } from 'vitest';
import { createNetwork, demoMaterials, FluxstateError, InputError, mm, mm2, seriesPeak, simulate, sine, worstCase } from '../../../src/index.js';

// References:
// - Brent's method (R. P. Brent, Algorithms for Minimization without Derivatives, 1973, ch. 5): converges to
//   the optimum of a unimodal function within the tolerance asked. Checked here against closed-form optima
//   (derived) and against fine grids (the brute-force answer, which needs no theory).
// - Inrush physics (common practice, e.g. transformer textbooks on energisation): the first-cycle inrush peak is
//   largest when the supply is switched at a voltage zero whose half-cycle drives flux the same way as the
//   remanence, and it grows with that remanence.

describe('worstCase on closed-form functions', () => {
  it('finds an interior maximum of a smooth function of two parameters to its tolerances', () => {
    // Maximum of 3 - (x - 0.3)^2 - 2 (y + 0.1)^2 + 0.5 (x - 0.3)(y + 0.1) is at x = 0.3, y = -0.1 (derived:
    // the quadratic form is negative definite, gradient zero there).
    const f = ({ x, y }: Readonly<Record<string, number>>) => 3 - (x! - 0.3) ** 2 - 2 * (y! + 0.1) ** 2 + 0.5 * (x! - 0.3) * (y! + 0.1);
    const w = worstCase({
      goal: 'maximum',
      parameters: [
        { name: 'x', min: -1, max: 1, tolerance: 1e-4 },
        { name: 'y', min: -1, max: 1, tolerance: 1e-4 },
      ],
      evaluate: f,
    });
    expect(w.values.x).toBeCloseTo(0.3, 3);
    expect(w.values.y).toBeCloseTo(-0.1, 3);
    expect(w.objective).toBeCloseTo(3, 7);
    expect(w.converged).toBe(true);
    expect(w.history.length).toBe(w.evaluations);
    // A grid at the same resolution would need 2e4 x 2e4 points; the search needs a few dozen.
    expect(w.evaluations).toBeLessThan(200);
  });

  it('finds the global minimum among two dips when the scan brackets it, and a minimum at a bound', () => {
    // cos(x) + 0.6 cos(3x) on [0, 2 pi]: global minimum near x = pi (value -1.6), local ones near 1.1 and 5.2.
    const f = ({ x }: Readonly<Record<string, number>>) => Math.cos(x!) + 0.6 * Math.cos(3 * x!);
    const w = worstCase({ goal: 'minimum', parameters: [{ name: 'x', min: 0, max: 2 * Math.PI, tolerance: 1e-6, gridPoints: 13 }], evaluate: f });
    expect(w.values.x).toBeCloseTo(Math.PI, 4);
    expect(w.objective).toBeCloseTo(-1.6, 9);
    // Against a fine grid: the search is at least as bad as every grid point (minimum goal).
    for (let i = 0; i <= 10000; i++) expect(w.objective).toBeLessThanOrEqual(f({ x: (2 * Math.PI * i) / 10000 }) + 1e-12);
    const edge = worstCase({ goal: 'minimum', parameters: [{ name: 'r', min: -0.8, max: 0.8, tolerance: 1e-3 }], evaluate: ({ r }) => 2 * r! + 1 });
    expect(edge.values.r).toBe(-0.8);
    expect(edge.objective).toBeCloseTo(-0.6, 12);
  });

  it('stops at the evaluation budget with the best case so far, not converged', () => {
    const w = worstCase({
      goal: 'maximum',
      parameters: [{ name: 'x', min: 0, max: 1, tolerance: 1e-12 }, { name: 'y', min: 0, max: 1, tolerance: 1e-12 }],
      evaluate: ({ x, y }) => -((x! - 0.7) ** 2) - (y! - 0.2) ** 2,
      maxEvaluations: 12,
    });
    expect(w.evaluations).toBe(12);
    expect(w.converged).toBe(false);
    expect(w.objective).toBe(Math.max(...w.history.map((h) => h.objective)));
  });

  it('refuses bad options and reports a case that cannot be computed', () => {
    const ok = { goal: 'maximum' as const, parameters: [{ name: 'x', min: 0, max: 1 }], evaluate: () => 1 };
    expect(() => worstCase({ ...ok, goal: 'largest' as 'maximum' })).toThrow(InputError);
    expect(() => worstCase({ ...ok, parameters: [{ name: 'x', min: 1, max: 0 }] })).toThrow(/range/);
    expect(() => worstCase({ ...ok, parameters: [{ name: 'x', min: 0, max: 1 }, { name: 'x', min: 0, max: 1 }] })).toThrow(/used once/);
    expect(() => worstCase({ ...ok, parameters: [{ name: 'x', min: 0, max: 1, gridPoints: 2 }] })).toThrow(/gridPoints/);
    expect(() => worstCase({ ...ok, evaluate: ({ x }) => (x! > 0.6 ? Number.NaN : x!) })).toThrow(
      expect.objectContaining({ code: 'worst-case-evaluation-failed' }),
    );
    expect(() => worstCase({ ...ok, evaluate: () => { throw new Error('no convergence'); } })).toThrow(/evaluate threw at \{"x":0\}: no convergence/);
    expect(() => worstCase({ ...ok, evaluate: () => { throw new Error('x'); } })).toThrow(FluxstateError);
  });
});

describe('worstCase on an inrush study run with simulate', () => {
  /** First-cycle inrush peak of a small transformer switched at `angle` degrees with remanence `br` T. */
  function inrushPeak(angle: number, br: number): number {
    const net = createNetwork('inrush');
    const bottom = net.magneticNode('bottom');
    const top = net.magneticNode('top');
    const steel = demoMaterials.grainOrientedSteel;
    const leg = net.fluxTube('wound leg', { from: bottom, to: top, length: mm(150), area: mm2(900), material: steel, initialFluxDensity: br });
    net.fluxTube('rest of core', { from: top, to: bottom, length: mm(350), area: mm2(900), material: steel, initialFluxDensity: br });
    const line = net.node('line');
    net.voltageSource('mains', line, net.ground, sine({ amplitude: 230 * Math.SQRT2, frequency: 50, phase: (angle * Math.PI) / 180 }));
    const primary = net.winding('primary', { tube: leg, turns: 820, resistance: 2.5, plus: line, minus: net.ground });
    const result = simulate(net, { stopTime: 0.02 });
    if (result.status !== 'success') return Number.NaN;
    return seriesPeak(result.time, result.current(primary)).maxAbs;
  }

  it('finds the largest inrush peak over angle and remanence; a 2.5-degree grid finds nothing larger', () => {
    const w = worstCase({
      goal: 'maximum',
      parameters: [
        { name: 'angle', min: -90, max: 90, tolerance: 0.5 },
        { name: 'remanence', min: -0.8, max: 0.8, tolerance: 0.01, gridPoints: 5 },
      ],
      evaluate: ({ angle, remanence }) => inrushPeak(angle!, remanence!),
    });
    // Common practice: positive remanence, switched near the rising voltage zero.
    expect(w.values.remanence).toBeCloseTo(0.8, 2);
    expect(Math.abs(w.values.angle!)).toBeLessThan(15);
    // The brute-force check at the worst remanence: no grid angle gives a larger peak (beyond 0.5 %), and the
    // grid's best angle is within one grid step of the search's.
    const grid = Array.from({ length: 73 }, (_, i) => -90 + 2.5 * i);
    const peaks = grid.map((a) => inrushPeak(a, 0.8));
    const iBest = peaks.indexOf(Math.max(...peaks));
    expect(w.objective).toBeGreaterThanOrEqual(peaks[iBest]! * 0.995);
    expect(Math.abs(grid[iBest]! - w.values.angle!)).toBeLessThanOrEqual(2.5);
    expect(w.evaluations).toBeLessThan(73);
  }, 120_000);
});
