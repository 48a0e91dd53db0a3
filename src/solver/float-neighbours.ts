/**
 * The neighbouring doubles of a number, without allocating: the bits of x are
 * stepped through one Float64Array/Uint32Array pair kept for the module's
 * life (IEEE 754 doubles are ordered like their bit patterns within a sign,
 * so the next double in magnitude is the bit pattern plus one). Breakpoint
 * handling asks for these on every evaluation near an edge, so they must not
 * allocate (a BigInt per call did).
 */

const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);
/** Index of the low 32-bit word of a double in `words` (0 on little-endian machines). */
const LOW = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1 ? 0 : 1;
const HIGH = 1 - LOW;
/**
 * The smallest positive double (Number.MIN_VALUE) as a module constant: the x = 0 branch runs only at a
 * run's start, and a property read there has no type feedback when V8 optimises a caller made hot by
 * the restarts, so the next run's start would throw that optimised code away (docs/solver.md).
 */
const SMALLEST_SUBNORMAL = 5e-324;
const NEGATIVE_SMALLEST_SUBNORMAL = -5e-324;

/** The double of next larger magnitude after x (x finite, non-zero, or -Infinity). */
function awayFromZero(x: number): number {
  bits[0] = x;
  if (words[LOW] === 0xffffffff) {
    words[LOW] = 0;
    words[HIGH] = words[HIGH]! + 1;
  } else {
    words[LOW] = words[LOW]! + 1;
  }
  return bits[0]!;
}

/** The double of next smaller magnitude before x (x non-zero). */
function towardZero(x: number): number {
  bits[0] = x;
  if (words[LOW] === 0) {
    words[LOW] = 0xffffffff;
    words[HIGH] = words[HIGH]! - 1;
  } else {
    words[LOW] = words[LOW]! - 1;
  }
  return bits[0]!;
}

/**
 * The smallest double above x. NaN and +Infinity are returned unchanged.
 *
 * @example
 * ```ts
 * nextUp(1) === 1 + Number.EPSILON; // true
 * nextUp(0) === Number.MIN_VALUE;   // true
 * ```
 */
export function nextUp(x: number): number {
  if (x !== x || x === Infinity) return x;
  if (x === 0) return SMALLEST_SUBNORMAL;
  return x > 0 ? awayFromZero(x) : towardZero(x);
}

/**
 * The largest double below x. NaN and -Infinity are returned unchanged.
 *
 * @example
 * ```ts
 * nextDown(1) === 1 - Number.EPSILON / 2; // true
 * ```
 */
export function nextDown(x: number): number {
  if (x !== x || x === -Infinity) return x;
  if (x === 0) return NEGATIVE_SMALLEST_SUBNORMAL;
  return x > 0 ? towardZero(x) : awayFromZero(x);
}
