/**
 * The element registry: every element and tube kind has one entry that
 * carries its checks, stamps and quantities, and the network formulation
 * built from those entries keeps its analytic Jacobian (checked against
 * finite differences, the usual oracle: Hairer and Wanner II, sect. IV.8,
 * radau5's increment) and its energy balance (conservation of energy).
 */
import { describe, expect, it } from 'vitest';
import { ELEMENT_KINDS, TUBE_KINDS, elementKind, isElementKind } from '../../src/elements/registry.js';
import { compileNetwork } from '../../src/formulation/compile-network.js';
import {
  FluxstateError, constant, createNetwork, demoMaterials, finiteDifferenceJacobian, simulate, sine, validateDescription,
} from '../../src/index.js';

/** A network with one element of every kind and one tube of every kind. */
function everyKind() {
  const net = createNetwork('every kind');
  const top = net.magneticNode('top');
  const bottom = net.magneticNode('bottom');
  const mid = net.magneticNode('mid');
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: 0.2, area: 4e-4, material: demoMaterials.grainOrientedSteel, eddyResistance: 50 });
  net.airGap('gap', { from: top, to: mid, length: 1e-3, area: 4e-4, fringingFactor: 1.1 });
  net.reluctance('return', { from: mid, to: bottom, reluctance: 1e5, area: 4e-4 });
  net.reluctance('leakage', { from: top, to: bottom, reluctance: 5e7 });
  const line = net.node('line');
  const a = net.node('a');
  const b = net.node('b');
  const sec = net.node('sec');
  net.voltageSource('mains', line, net.ground, sine({ amplitude: 100, frequency: 50 }));
  net.switch('breaker', line, a, { closed: true, schedule: [{ time: 4e-3, closed: false }] });
  net.resistor('snubber', a, net.ground, 2e3);
  net.inductor('line choke', a, b, 1e-3, { initialCurrent: 0 });
  const primary = net.winding('primary', { tube: leg, turns: 200, resistance: 0.5, plus: b, minus: net.ground });
  net.winding('secondary', { tube: leg, turns: 50, resistance: 0.1, plus: sec, minus: net.ground, orientation: -1 });
  net.capacitor('load cap', sec, net.ground, 1e-6, { initialVoltage: 0 });
  net.resistor('load', sec, net.ground, 10);
  net.currentSource('bias', sec, net.ground, constant(0.05));
  return { net, primary };
}

describe('element registry', () => {
  it('has one entry per element kind and per tube kind, each naming itself', () => {
    for (const [kind, entry] of Object.entries(ELEMENT_KINDS)) {
      expect(entry.kind).toBe(kind);
      expect(entry.noun.length).toBeGreaterThan(0);
    }
    for (const [kind, entry] of Object.entries(TUBE_KINDS)) expect(entry.kind).toBe(kind);
    expect(isElementKind('diode-that-does-not-exist')).toBe(false);
    expect(isElementKind('toString')).toBe(false);
  });

  it('compiles a network with every kind; the analytic Jacobian matches finite differences', () => {
    const c = compileNetwork(everyKind().net.describe());
    const n = c.layout.size;
    const y = Float64Array.from({ length: n }, (_, i) => 0.3 * Math.sin(1.7 * i + 0.4));
    for (const t of [1e-3, 6e-3]) {
      const f0 = new Float64Array(n);
      c.rhs(t, y, f0);
      const Ja = new Float64Array(n * n);
      c.jacobian(t, y, Ja);
      const Jfd = new Float64Array(n * n);
      finiteDifferenceJacobian(c.rhs, t, y, f0, Jfd);
      const scale = Math.max(...Ja.map(Math.abs));
      for (let k = 0; k < n * n; k++) expect(Math.abs(Ja[k]! - Jfd[k]!)).toBeLessThan(1e-6 * scale);
    }
  });

  it('every element reports a finite current and the energy audit of a run with every kind balances', () => {
    const { net } = everyKind();
    const r = simulate(net, { stopTime: 10e-3, rtol: 1e-7 });
    expect(r.status).toBe('success');
    for (const [k, e] of net.describe().elements.entries()) {
      const handle = { kind: e.kind, name: e.name, index: k, network: net.id } as Parameters<typeof r.current>[0];
      for (const x of r.current(handle)) expect(Number.isFinite(x)).toBe(true);
    }
    const audit = r.energy();
    expect(audit.dissipated.resistors).toBeGreaterThan(0);
    expect(audit.dissipated.windings).toBeGreaterThan(0);
    expect(audit.dissipated.eddy).toBeGreaterThan(0);
    // Conservation of energy: source energy = dissipated + change of stored energy (audit accuracy 5e-3, docs/architecture.md).
    expect(audit.relativeError).toBeLessThan(5e-3);
  });

  it('the builder and the plain-description replay check an element by the same rules and codes', () => {
    const d = everyKind().net.describe();
    expect(validateDescription(d)).toEqual(d);
    const broken = { ...d, elements: d.elements.map((e) => (e.kind === 'resistor' ? { ...e, resistance: -1 } : e)) };
    let replayCode = '';
    try {
      validateDescription(broken);
    } catch (e) {
      replayCode = (e as FluxstateError).code;
    }
    const net = createNetwork('y');
    const p = net.node('p');
    let builderCode = '';
    try {
      net.resistor('r', p, net.ground, -1);
    } catch (e) {
      builderCode = (e as FluxstateError).code;
    }
    expect(replayCode).toBe('non-positive-value');
    expect(builderCode).toBe(replayCode);
  });

  it('refuses an unknown element kind in a description, listing the kinds the registry knows', () => {
    const d = everyKind().net.describe();
    const alien = { ...d, elements: [...d.elements, { kind: 'flux-capacitor', name: 'x', plus: 1, minus: 0 }] } as unknown as typeof d;
    expect(() => validateDescription(alien)).toThrow(/kind "flux-capacitor"; use 'resistor', 'capacitor', .* or 'winding'/);
  });

  it('asks each element its role: the kind entry, not a switch, decides topology and index', () => {
    const d = everyKind().net.describe();
    const roles = d.elements.map((e) => elementKind(e).role);
    expect(roles).toContain('inductive');
    expect(roles).toContain('capacitive');
    expect(roles).toContain('voltage-source');
    expect(roles).toContain('current-source');
    expect(roles).toContain('conductive');
  });
});
