import { describe, expect, it } from 'vitest';
import { copyEntries, zeroEntries } from '../../src/solver/small-array-copy.js';

/**
 * The loops must give what the builtins give, entry for entry: the
 * reference is the builtins themselves, %TypedArray%.prototype.set
 * (ECMAScript 2024, sect. 23.2.3.26: each source element is read and written
 * at targetOffset + k) and %TypedArray%.prototype.fill (sect. 23.2.3.9: the
 * value at every index in [start, end)). Compared with Object.is, so -0
 * against +0 and NaN count (common practice for bit-exact checks).
 */
const special = [0, -0, 1, -1.5, Number.MIN_VALUE, -Number.MAX_VALUE, Infinity, -Infinity, NaN, 1e-300, 2 ** 53 + 2];

/** A deterministic mix of special and ordinary values (a linear congruential sequence, common practice). */
function sample(length: number, seed: number): Float64Array {
  const out = new Float64Array(length);
  let s = seed;
  for (let i = 0; i < length; i++) {
    s = (1103515245 * s + 12345) % 2147483648;
    out[i] = s % 3 === 0 ? special[s % special.length]! : (s / 2147483648 - 0.5) * 10 ** ((s % 41) - 20);
  }
  return out;
}

function sameEntries(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

describe('copyEntries and zeroEntries (loops in place of set and fill)', () => {
  it('copyEntries writes what set writes, at offset 0 and inside, into views of one buffer too', () => {
    for (const [length, extra, at] of [[0, 3, 0], [1, 0, 0], [4, 0, 0], [4, 5, 3], [12, 2, 1], [37, 7, 7]] as const) {
      const from = sample(length, 7 * length + at + 1);
      const before = sample(length + extra, 11 * length + 3);
      const byLoop = before.slice();
      const byBuiltin = before.slice();
      copyEntries(from, byLoop, at);
      byBuiltin.set(from, at);
      expect(sameEntries(byLoop, byBuiltin)).toBe(true);
    }
    // Views on one buffer, as the integrator's work arrays are: source and target do not overlap.
    const chunk = sample(40, 5);
    const viaLoop = chunk.slice();
    const viaSet = chunk.slice();
    copyEntries(viaLoop.subarray(0, 12), viaLoop.subarray(20, 32));
    viaSet.subarray(20, 32).set(viaSet.subarray(0, 12));
    expect(sameEntries(viaLoop, viaSet)).toBe(true);
  });

  it('zeroEntries writes what fill(0) writes over the whole array and over a range', () => {
    for (const [length, start, end] of [[0, 0, 0], [4, 0, 4], [16, 4, 8], [9, 3, 3], [25, 0, 24]] as const) {
      const before = sample(length, 13 * length + start);
      const byLoop = before.slice();
      const byBuiltin = before.slice();
      zeroEntries(byLoop, start, end);
      byBuiltin.fill(0, start, end);
      expect(sameEntries(byLoop, byBuiltin)).toBe(true);
      const whole = before.slice();
      zeroEntries(whole);
      expect(sameEntries(whole, before.slice().fill(0))).toBe(true);
    }
  });
});
