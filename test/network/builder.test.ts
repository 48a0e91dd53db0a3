import { describe, expect, it } from 'vitest';
import { createNetwork, InputError, sine, constant } from '../../src/index.js';
import type { FluxTube } from '../../src/index.js';

const material = { kind: 'linear', relativePermeability: 1000 } as const;

function core() {
  const net = createNetwork('builder test');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material });
  return { net, m1, m2, leg };
}

function codeOf(fn: () => unknown): { code: string; elements: readonly string[]; message: string } {
  try {
    fn();
  } catch (e) {
    if (e instanceof InputError) return { code: e.code, elements: e.elements, message: e.message };
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('NetworkBuilder: each call checks its own arguments and names the element', () => {
  it('refuses a duplicate name', () => {
    const { net, m1, m2 } = core();
    const e = codeOf(() => net.fluxTube('leg', { from: m2, to: m1, length: 0.1, area: 1e-4, material }));
    expect(e.code).toBe('duplicate-name');
    expect(e.elements).toContain('leg');
    const a = net.node('a');
    net.resistor('r', a, net.ground, 1);
    expect(codeOf(() => net.resistor('r', a, net.ground, 2)).code).toBe('duplicate-name');
    expect(codeOf(() => net.node('a')).code).toBe('duplicate-name');
  });

  it('refuses non-positive geometry', () => {
    const { net, m1, m2 } = core();
    for (const [length, area] of [[0, 1e-4], [-1, 1e-4], [0.1, 0], [0.1, Number.NaN], [Infinity, 1e-4]]) {
      const e = codeOf(() => net.fluxTube(`t${String(length)}${String(area)}`, { from: m2, to: m1, length: length!, area: area!, material }));
      expect(e.code).toBe('non-positive-value');
      expect(e.message).toMatch(/tube "t/);
    }
    expect(codeOf(() => net.airGap('g', { from: m2, to: m1, length: -1e-3, area: 1e-4 })).elements).toEqual(['g']);
    expect(codeOf(() => net.reluctance('leak', { from: m2, to: m1, reluctance: 0 })).code).toBe('non-positive-value');
  });

  it('refuses zero turns and a negative winding resistance', () => {
    const { net, leg } = core();
    const a = net.node('a');
    const e = codeOf(() => net.winding('w', { tube: leg, turns: 0, plus: a, minus: net.ground }));
    expect(e.code).toBe('non-positive-value');
    expect(e.message).toMatch(/winding "w" turns/);
    expect(codeOf(() => net.winding('w2', { tube: leg, turns: 10, resistance: -1, plus: a, minus: net.ground })).code).toBe('negative-value');
  });

  it('refuses a handle of another network, and a handle of the wrong kind at run time', () => {
    const { net } = core();
    const other = core();
    const a = net.node('a');
    const e = codeOf(() => net.winding('w', { tube: other.leg, turns: 10, plus: a, minus: net.ground }));
    expect(e.code).toBe('foreign-handle');
    expect(e.elements).toContain('w');
    const notATube = a as unknown as FluxTube;
    expect(codeOf(() => net.winding('w3', { tube: notATube, turns: 10, plus: a, minus: net.ground })).code).toBe('wrong-handle-kind');
  });

  it('refuses an element with both terminals on one node and a tube from a node to itself', () => {
    const { net, m1 } = core();
    const a = net.node('a');
    expect(codeOf(() => net.resistor('r', a, a, 1)).code).toBe('shorted-element');
    expect(codeOf(() => net.airGap('g', { from: m1, to: m1, length: 1e-3, area: 1e-4 })).code).toBe('tube-self-loop');
  });

  it('refuses bad waveforms at the source that carries them', () => {
    const { net } = core();
    const a = net.node('a');
    const e = codeOf(() => net.voltageSource('mains', a, net.ground, sine({ amplitude: 1, frequency: -50 })));
    expect(e.code).toBe('bad-waveform');
    expect(e.message).toMatch(/mains/);
    expect(codeOf(() => net.currentSource('bias', a, net.ground, constant(Number.NaN))).message).toMatch(/bias/);
  });

  it('refuses an unsorted switch schedule and inverted resistances', () => {
    const { net } = core();
    const a = net.node('a');
    expect(codeOf(() => net.switch('s', a, net.ground, { schedule: [{ time: 2, closed: true }, { time: 1, closed: false }] })).code).toBe('unsorted-schedule');
    expect(codeOf(() => net.switch('s2', a, net.ground, { onResistance: 10, offResistance: 1 })).code).toBe('bad-switch-resistance');
  });

  it('never shares or freezes the caller objects, and describes itself as frozen plain data', () => {
    const { net, m1, m2 } = core();
    const mat = { kind: 'linear', relativePermeability: 500 } as { kind: 'linear'; relativePermeability: number };
    net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material: mat });
    const wave = { kind: 'sine', amplitude: 1, frequency: 50 } as const;
    const a = net.node('a');
    net.voltageSource('v', a, net.ground, wave);
    expect(Object.isFrozen(mat)).toBe(false);
    expect(Object.isFrozen(wave)).toBe(false);
    mat.relativePermeability = 1;
    const d = net.describe();
    const yoke = d.tubes[1]!;
    expect(yoke.law.kind === 'material' && (yoke.law.material as { relativePermeability: number }).relativePermeability).toBe(500);
    expect(Object.isFrozen(d.tubes[1]!.law)).toBe(true);
    expect(JSON.parse(JSON.stringify(d))).toEqual(d);
  });
});
