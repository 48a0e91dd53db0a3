import { expect } from 'vitest';

/** The IEEE-754 bit patterns of a Float64Array (so -0 and 0, and NaN payloads, differ). */
export function bits(a: Float64Array): bigint[] {
  return Array.from(new BigUint64Array(a.buffer, a.byteOffset, a.length));
}

/** Expect two Float64Arrays to be bit for bit the same, naming the series on failure. */
export function expectSameBits(a: Float64Array, b: Float64Array, what: string): void {
  expect(a.length, `${what}: length`).toBe(b.length);
  const x = bits(a);
  const y = bits(b);
  const first = x.findIndex((v, k) => v !== y[k]);
  expect(first, `${what}: first differing sample`).toBe(-1);
}

/**
 * Freeze an object graph in place (plain objects, arrays; functions are
 * left callable): used to prove that the library never writes into what a
 * caller hands it (a write to a frozen object throws in strict-mode code,
 * which every ES module is).
 */
export function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value) && !ArrayBuffer.isView(value)) {
    Object.freeze(value);
    for (const v of Object.values(value as object)) deepFreeze(v);
  }
  return value;
}
