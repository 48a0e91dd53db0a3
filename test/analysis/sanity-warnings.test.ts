import { describe, expect, it } from 'vitest';
import { createNetwork, demoMaterials, mm, mm2, resultSanityWarnings, sanityWarnings, simulate, sine } from '../../src/index.js';

// The limits are common practice (largest power-transformer cores: paths of a few metres, limbs under 1 m^2;
// saturation of the best Fe-Co alloys about 2.4 T; from memory). The cases are the unit slips an engineer
// makes: a core described in metres where millimetres were meant, which runs to "success".

function transformer(length: number, area: number, turns = 820, linear = false) {
  const net = createNetwork('unit slip');
  const bottom = net.magneticNode('bottom');
  const top = net.magneticNode('top');
  const steel = linear ? { kind: 'linear' as const, relativePermeability: 3000 } : demoMaterials.grainOrientedSteel;
  const leg = net.fluxTube('wound leg', { from: bottom, to: top, length, area, material: steel });
  net.fluxTube('rest of core', { from: top, to: bottom, length: 2 * length, area, material: steel });
  const line = net.node('line');
  net.voltageSource('mains', line, net.ground, sine({ amplitude: 325, frequency: 50 }));
  net.winding('primary', { tube: leg, turns, resistance: 2.5, plus: line, minus: net.ground });
  return net;
}

describe('sanityWarnings', () => {
  it('names each tube given in metres for millimetres, and the fix', () => {
    const w = sanityWarnings(transformer(150, 900).describe());
    expect(w.map((x) => `${x.element}/${x.quantity}`)).toEqual(['wound leg/length', 'wound leg/area', 'rest of core/length', 'rest of core/area']);
    expect(w[0]!.message).toBe('tube "wound leg": magnetic path length 150 m is longer than 10 m; was it given in millimetres? write mm(150)');
    expect(w[1]!.message).toMatch(/cross-section 900 m\^2 is larger than 1 m\^2; was it given in mm\^2\? write mm2\(900\)/);
    expect(sanityWarnings(transformer(mm(150), mm2(900)).describe())).toEqual([]);
  });

  it('flags material values outside practical ranges', () => {
    const net = createNetwork('materials');
    const a = net.magneticNode('a');
    const b = net.magneticNode('b');
    net.fluxTube('absolute mu', { from: a, to: b, length: 0.1, area: 1e-4, material: { kind: 'linear', relativePermeability: 4 * Math.PI * 1e-7 * 3000 } });
    net.fluxTube('gauss', { from: b, to: a, length: 0.1, area: 1e-4, material: { kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: 16000 } });
    const w = sanityWarnings(net.describe());
    expect(w.map((x) => `${x.element}/${x.quantity}`)).toEqual(['absolute mu/relative permeability', 'gauss/saturation']);
    expect(w[1]!.message).toMatch(/tesla/);
  });

  it('adds the flux density a run reached above 3 T (area too small by a slip), naming the tube and time', () => {
    // 325 V peak, 50 Hz, 20 turns on 9 cm^2 of a linear (never saturating) material: the volt-seconds ask for
    // tens of tesla, which the model delivers without complaint.
    const r = simulate(transformer(mm(150), mm2(900), 20, true), { stopTime: 0.02 });
    expect(r.status).toBe('success');
    const w = resultSanityWarnings(r);
    expect(w.some((x) => x.element === 'wound leg' && x.quantity === 'flux density' && x.value > 3)).toBe(true);
    expect(w.find((x) => x.quantity === 'flux density')!.message).toMatch(/^tube "wound leg": \|B\| reaches \d+\.\d+ T at t = /);
    const fine = simulate(transformer(mm(150), mm2(900)), { stopTime: 0.02 });
    expect(resultSanityWarnings(fine)).toEqual([]);
  });

  it('puts the model warnings on the result of simulate, so a unit slip is seen without asking', () => {
    const slip = simulate(transformer(150, 900), { stopTime: 0.002 });
    expect(slip.warnings).toContain('tube "wound leg": magnetic path length 150 m is longer than 10 m; was it given in millimetres? write mm(150)');
    const fine = simulate(transformer(mm(150), mm2(900)), { stopTime: 0.002 });
    expect(fine.warnings.some((w) => /longer than|larger than/.test(w))).toBe(false);
  });
});
