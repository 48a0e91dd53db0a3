import { describe, expect, it } from 'vitest';
import { applySweepEdits } from '../../src/sweep/index.js';
import { rlDescription } from './rl-network.js';

describe('applySweepEdits', () => {
  it('sets fields by element name and path on a copy, leaving the input as it was', () => {
    const base = rlDescription();
    const before = JSON.stringify(base);
    const out = applySweepEdits(base, [
      { target: { tube: 'leg', field: 'initialFluxDensity' }, value: 0.8 },
      { target: { element: 'mains', field: 'waveform.phase' }, value: 1.57 },
      { target: { element: 'coil', field: 'resistance' }, value: 0.5 },
      { target: { tube: 'yoke', field: 'law.material.relativePermeability' }, value: 3000 },
    ]);
    expect(JSON.stringify(base)).toBe(before);
    expect(out.tubes[0]!.initialFluxDensity).toBe(0.8);
    expect(out.elements[0]).toMatchObject({ waveform: { kind: 'sine', phase: 1.57, amplitude: 100 } });
    expect(out.elements[1]).toMatchObject({ kind: 'winding', resistance: 0.5 });
    expect(out.tubes[1]!.law).toMatchObject({ material: { relativePermeability: 3000 } });
    // Only the objects on edited paths are copied.
    expect(out.electricNodes).toBe(base.electricNodes);
  });

  it('replaces a whole spec, and removes an optional field with null', () => {
    const base = applySweepEdits(rlDescription(), [{ target: { tube: 'leg', field: 'initialFluxDensity' }, value: 0.5 }]);
    const out = applySweepEdits(base, [
      { target: { element: 'mains', field: 'waveform' }, value: { kind: 'constant', value: 12 } },
      { target: { tube: 'leg', field: 'initialFluxDensity' }, value: null },
    ]);
    expect(out.elements[0]).toMatchObject({ waveform: { kind: 'constant', value: 12 } });
    expect('initialFluxDensity' in out.tubes[0]!).toBe(false);
  });

  it('throws InputError naming the unknown element, the unknown field, the fixed field, or the bad value', () => {
    const d = rlDescription();
    expect(() => applySweepEdits(d, [{ target: { tube: 'core', field: 'initialFlux' }, value: 0 }])).toThrow(
      expect.objectContaining({ code: 'sweep-unknown-target', elements: ['core'], message: expect.stringMatching(/no tube named "core" \(tubes: "leg", "yoke"\)/) }),
    );
    expect(() => applySweepEdits(d, [{ target: { element: 'coil', field: 'resistence' }, value: 1 }])).toThrow(
      expect.objectContaining({ code: 'sweep-unknown-field', elements: ['coil', 'resistence'] }),
    );
    expect(() => applySweepEdits(d, [{ target: { tube: 'leg', field: 'from' }, value: 1 }])).toThrow(expect.objectContaining({ code: 'sweep-fixed-field' }));
    expect(() => applySweepEdits(d, [{ target: { element: 'coil', field: 'orientation' }, value: 2 }])).toThrow(
      expect.objectContaining({ code: 'sweep-bad-value', message: expect.stringMatching(/winding "coil" field "orientation"/) }),
    );
    expect(() => applySweepEdits(d, [{ target: { element: 'coil', field: 'resistance.value' }, value: 1 }])).toThrow(expect.objectContaining({ code: 'sweep-unknown-field' }));
  });
});
