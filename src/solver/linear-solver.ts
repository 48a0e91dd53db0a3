/**
 * The solver's own tiny linear-algebra interface: factor once, solve many
 * right-hand sides, report a near-singular pivot. The integrator talks only
 * to these interfaces, so the kernel behind them (flat typed-array LU,
 * ml-matrix, later a sparse LU) is chosen once at construction.
 */

/**
 * Factor-and-solve for a real dense system A x = b, A row-major n*n.
 *
 * @example
 * ```ts
 * const lu = createDenseLu(2);
 * const bad = lu.factor(Float64Array.of(4, 1, 2, 3)); // -1: well conditioned
 * const b = Float64Array.of(1, 2);
 * lu.solve(b); // b now holds x
 * ```
 */
export interface RealLinearSolver {
  /** Order n of the system. */
  readonly size: number;
  /**
   * Factor A (not modified). Returns -1 when every pivot is acceptable,
   * otherwise the column (unknown index) of the first pivot that is zero or
   * negligible in the equilibrated matrix (below 64 n eps); the
   * factorisation must not be used then.
   */
  factor(a: Float64Array): number;
  /** Solve A x = b with the last good factorisation; b is overwritten with x. */
  solve(b: Float64Array): void;
}

/**
 * Factor-and-solve for a complex dense system A x = b with A = re + i im
 * (row-major n*n each).
 *
 * @example
 * ```ts
 * const lu = createComplexLu(1);
 * lu.factor(Float64Array.of(1), Float64Array.of(1)); // A = 1 + i
 * const re = Float64Array.of(2), im = Float64Array.of(0);
 * lu.solve(re, im); // x = 1 - i
 * ```
 */
export interface ComplexLinearSolver {
  readonly size: number;
  /** Factor A = re + i im. Returns -1 or the column of the first bad pivot, as {@link RealLinearSolver.factor}. */
  factor(re: Float64Array, im: Float64Array): number;
  /** Solve in place: (bRe, bIm) is overwritten with x. */
  solve(bRe: Float64Array, bIm: Float64Array): void;
}

/**
 * The kernels factor the equilibrated matrix D_r A D_c (rows, then columns,
 * scaled by powers of two to a largest entry of about 1, as LAPACK's
 * xGEEQU; Golub and Van Loan, Matrix Computations, sect. 3.5.2), which keeps
 * badly scaled circuits (farads next to siemens next to webers) accurate. A
 * pivot |u_kk| <= PIVOT_RELATIVE_TOLERANCE * n of the equilibrated matrix is
 * treated as singular: exact zero pivots are only the extreme case; a
 * floating sub-network or an unconstrained unknown leaves a pivot at
 * round-off level, which this catches.
 */
export const PIVOT_RELATIVE_TOLERANCE = 64 * Number.EPSILON;

/**
 * Row and column equilibration factors (powers of two) of the n x n matrix
 * with entry magnitudes abs(i, j): rowScale_i ~ 1/max_j |a_ij|, then
 * colScale_j ~ 1/max_i |rowScale_i a_ij|. A zero row or column gets 1.
 * Returns the column of the first non-finite entry, or -1.
 *
 * @internal
 */
export function equilibrationScales(
  n: number,
  abs: (i: number, j: number) => number,
  rowScale: Float64Array,
  colScale: Float64Array,
): number {
  for (let i = 0; i < n; i++) {
    let m = 0;
    for (let j = 0; j < n; j++) {
      const v = abs(i, j);
      if (!Number.isFinite(v)) return j;
      if (v > m) m = v;
    }
    rowScale[i] = powerOfTwoInverse(m);
  }
  for (let j = 0; j < n; j++) {
    let m = 0;
    for (let i = 0; i < n; i++) m = Math.max(m, rowScale[i]! * abs(i, j));
    colScale[j] = powerOfTwoInverse(m);
  }
  return -1;
}

const scaleBits = new Float64Array(1);
const scaleWords = new Uint32Array(scaleBits.buffer);
/** Index of the high 32-bit word of a double (1 on little-endian machines). */
const HIGH = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1 ? 1 : 0;
/** The 20 significand bits of sqrt 2 in the high word: the band near sqrt 2 lies inside this bucket. */
const SQRT2_HIGH_SIGNIFICAND = 0x6a09e;
/** 2^-e for e = -1022 .. 1024 at index e + 1022 (exact powers of two; 2^-1024 is subnormal). */
const INVERSE_POWERS = Float64Array.from({ length: 2047 }, (_, k) => 2 ** -(k - 1022));

/**
 * 2^-round(log2 m), or 1 for a zero or non-finite m (@internal). Read from the bits of m
 * (round(log2 m) = exponent + 1 when the significand is >= sqrt 2), since
 * Math.log2 and a power per row and column cost more than the elimination
 * for small systems; the high word alone decides unless its significand bits
 * are those of sqrt 2 (1 case in 2^20), where the exact comparison (and,
 * within 1e-9 of sqrt 2, the original formula) decides; subnormal m uses the
 * formula too. So the result is the same as 2 ** -Math.round(Math.log2(m))
 * everywhere, with one write and one read of the bits in the common case.
 */
export function powerOfTwoInverse(m: number): number {
  if (!(m > 0) || m === Infinity) return 1;
  scaleBits[0] = m;
  const high = scaleWords[HIGH]!;
  const biased = high >>> 20;
  const significand = high & 0xfffff;
  if (biased === 0 || significand === SQRT2_HIGH_SIGNIFICAND) return powerOfTwoInverseNearSqrt2(m);
  return INVERSE_POWERS[biased - 1023 + (significand > SQRT2_HIGH_SIGNIFICAND ? 1 : 0) + 1022]!;
}

/** The rare cases of {@link powerOfTwoInverse}: subnormal m, or a significand in the bucket of sqrt 2. */
function powerOfTwoInverseNearSqrt2(m: number): number {
  scaleBits[0] = m;
  const high = scaleWords[HIGH]!;
  const biased = (high >>> 20) & 0x7ff;
  if (biased === 0) return 2 ** -Math.round(Math.log2(m));
  scaleWords[HIGH] = (high & 0x000fffff) | 0x3ff00000;
  const significand = scaleBits[0]!;
  if (Math.abs(significand - Math.SQRT2) < 1e-9) return 2 ** -Math.round(Math.log2(m));
  const e = biased - 1023 + (significand >= Math.SQRT2 ? 1 : 0);
  return INVERSE_POWERS[e + 1022]!;
}
