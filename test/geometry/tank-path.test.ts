import { describe, expect, it } from 'vitest';
import {
  addCoreLayout, createNetwork, fiveLimbLayout, inductanceMatrix, InputError, mm, threeLimbLayout, zeroSequenceReluctance,
} from '../../src/index.js';

// References (derived from the magnetic circuit): with the three phase windings (N turns) carrying the same current
// i, the limb fluxes are in phase and must all return outside the iron of a three-limb core. Without a return path
// they cannot flow at all: the zero-sequence inductance L0 = (lambda_a + lambda_b + lambda_c) / (3 i) is zero.
// With a tank path of total reluctance R0 and near-ideal iron, every limb drives N i across the yokes, the return
// carries N i / R0 = the three limb fluxes together, so L0 = N^2 / (3 R0), i.e. X0 = omega N^2 / (3 R0).
// (Flux linkages at a bias of 1 A in each phase: no cancellation of large matrix entries.)

const dims = { limbWidth: mm(80), yokeHeight: mm(80), depth: mm(80), windowWidth: mm(90), windowHeight: mm(250) };
const N = 100;

function zeroSequenceInductance(layout: ReturnType<typeof threeLimbLayout>): { l0: number; laa: number } {
  const net = createNetwork('three-phase core');
  const core = addCoreLayout(net, layout, { material: { kind: 'linear', relativePermeability: 1e6 } });
  for (const limb of ['a', 'b', 'c']) {
    net.winding(`phase ${limb}`, { tube: core.windingTube(limb), turns: N, plus: net.node(limb), minus: net.ground });
  }
  const m = inductanceMatrix(net, ['phase a', 'phase b', 'phase c'], { bias: [1, 1, 1] });
  return { l0: (m.fluxLinkage[0]! + m.fluxLinkage[1]! + m.fluxLinkage[2]!) / 3, laa: m.inductance[0]![0]! };
}

describe('zero-sequence (tank) path of three- and five-limb layouts', () => {
  it('adds one tank path per phase limb, in parallel making the given reluctance', () => {
    const layout = threeLimbLayout({ ...dims, zeroSequence: { reluctance: 2e6 } });
    const tank = layout.paths.filter((p) => p.kind === 'tank');
    expect(tank.map((p) => `${p.name}:${p.from}->${p.to}`)).toEqual(['tank-a:bottom-a->top-a', 'tank-b:bottom-b->top-b', 'tank-c:bottom-c->top-c']);
    expect(1 / tank.reduce((s, p) => s + 1 / (p.kind === 'tank' ? p.reluctance : Infinity), 0)).toBeCloseTo(2e6, 6);
    expect(Object.isFrozen(layout.paths)).toBe(true);
    expect(threeLimbLayout(dims).paths.some((p) => p.kind === 'tank')).toBe(false);
    const five = fiveLimbLayout({ ...dims, returnLimbWidth: mm(45), zeroSequence: { reluctance: 2e6 } });
    expect(five.paths.filter((p) => p.kind === 'tank').map((p) => p.name)).toEqual(['tank-a', 'tank-b', 'tank-c']);
  });

  it('without it a three-limb core has no zero-sequence inductance; with it L0 = N^2 / (3 R0)', () => {
    const without = zeroSequenceInductance(threeLimbLayout(dims));
    expect(Math.abs(without.l0)).toBeLessThan(1e-9 * without.laa);
    const r0 = 2e6;
    const withTank = zeroSequenceInductance(threeLimbLayout({ ...dims, zeroSequence: { reluctance: r0 } }));
    expect(withTank.l0 / ((N * N) / (3 * r0))).toBeCloseTo(1, 4); // iron reluctance ~30 A/Wb against 6e6
  });

  it('zeroSequenceReluctance inverts X0 = omega N^2 / (3 R0) and refuses non-positive input', () => {
    const r0 = zeroSequenceReluctance({ turns: 28, frequency: 50, reactance: 0.127 });
    expect((2 * Math.PI * 50 * 28 * 28) / (3 * r0)).toBeCloseTo(0.127, 12);
    expect(() => zeroSequenceReluctance({ turns: 28, frequency: 50, reactance: 0 })).toThrow(InputError);
    expect(() => threeLimbLayout({ ...dims, zeroSequence: { reluctance: -1 } })).toThrow(/zeroSequence\.reluctance = -1/);
  });
});
