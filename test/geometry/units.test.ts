import { describe, expect, it } from 'vitest';
import { mm, mm2 } from '../../src/index.js';

describe('mm and mm2', () => {
  it('convert millimetres to metres and square millimetres to square metres (SI definitions)', () => {
    expect(mm(1)).toBe(1e-3);
    expect(mm(87.5)).toBeCloseTo(0.0875, 15);
    expect(mm2(1)).toBe(1e-6);
    expect(mm2(250)).toBeCloseTo(2.5e-4, 18);
  });
});
