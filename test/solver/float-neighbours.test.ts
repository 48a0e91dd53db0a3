import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { nextDown, nextUp } from '../../src/solver/float-neighbours.js';

/**
 * Reference: IEEE 754-2019 sect. 3.4 (binary interchange format): finite
 * doubles of one sign are ordered like their bit patterns read as integers,
 * so the next double away from zero is the pattern plus one (derived). Here
 * that definition is written with BigInt, independently of the kernel.
 */
function nextUpByBits(x: number): number {
  if (x === 0) return Number.MIN_VALUE;
  const f = Float64Array.of(x);
  const b = new BigInt64Array(f.buffer);
  b[0] = b[0]! + (x > 0 ? 1n : -1n);
  return f[0]!;
}

describe('nextUp / nextDown', () => {
  it('agree with the bit-pattern definition on random doubles (all exponents, both signs)', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        expect(Object.is(nextUp(x), nextUpByBits(x))).toBe(true);
        expect(Object.is(nextDown(x), -nextUpByBits(-x))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it('cross a carry between the 32-bit words and the special values correctly', () => {
    // Number.EPSILON is the gap above 1 (ECMA-262, Number.EPSILON); below 1 the gap halves.
    expect(nextUp(1)).toBe(1 + Number.EPSILON);
    expect(nextDown(1)).toBe(1 - Number.EPSILON / 2);
    expect(nextUp(0)).toBe(Number.MIN_VALUE);
    expect(nextDown(0)).toBe(-Number.MIN_VALUE);
    expect(nextUp(Number.MAX_VALUE)).toBe(Infinity);
    expect(nextUp(-Infinity)).toBe(-Number.MAX_VALUE);
    expect(nextUp(Infinity)).toBe(Infinity);
    expect(Number.isNaN(nextUp(NaN))).toBe(true);
    // 2^32 - 1 in the low word: the carry goes to the high word.
    const f = new Float64Array(1);
    const w = new Uint32Array(f.buffer);
    const low = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1 ? 0 : 1;
    f[0] = 3.5;
    w[low] = 0xffffffff;
    const x = f[0]!;
    expect(nextUp(x)).toBe(nextUpByBits(x));
    expect(nextDown(nextUp(x))).toBe(x);
  });
});
