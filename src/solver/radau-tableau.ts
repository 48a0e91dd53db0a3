import { packedDoublesFrom } from './packed-doubles.js';

/**
 * Constants of the 3-stage Radau IIA method (order 5) and of its
 * implementation, after E. Hairer and G. Wanner, Solving Ordinary
 * Differential Equations II, 2nd ed., Springer 1996, sect. IV.8 ("Implementation
 * of implicit Runge-Kutta methods"), and the published radau5 code. The
 * numerical values of T, T^-1, E and P are those of SciPy's readable port
 * (scipy/integrate/_ivp/radau.py); test/solver/radau-tableau.test.ts checks
 * them against the Butcher tableau (Table IV.5.6 of the book).
 *
 * Local names follow the book: c (nodes), A (stage matrix), T and T^-1
 * (A^-1 = T Lambda T^-1, Lambda = diag(gamma, alpha - i beta block)), e (error
 * weights).
 *
 * @internal
 */
const S6 = Math.sqrt(6);

/** Collocation nodes c_i (Radau IIA, book Table IV.5.6). */
export const C1 = (4 - S6) / 10;
export const C2 = (4 + S6) / 10;
export const C3 = 1;

/**
 * Real eigenvalue gamma-hat of A^-1 (book eq. IV.8.16):
 * 3 + 3^(2/3) - 3^(1/3) ~ 3.6378. The real iteration matrix is (gamma/h) M - J.
 */
export const MU_REAL = 3 + 3 ** (2 / 3) - 3 ** (1 / 3);
/** Real part alpha-hat of the complex pair of eigenvalues of A^-1 (~2.6811). */
export const MU_COMPLEX_RE = 3 + 0.5 * (3 ** (1 / 3) - 3 ** (2 / 3));
/**
 * Imaginary part of the complex eigenvalue paired with W2 + i W3 under the
 * transformation T below: alpha - i beta, beta ~ 3.0504 (book eq. IV.8.16).
 * The complex iteration matrix is ((alpha - i beta)/h) M - J.
 */
export const MU_COMPLEX_IM = -0.5 * (3 ** (5 / 6) + 3 ** (7 / 6));

/** T (row-major 3x3): A^-1 = T Lambda T^-1 (book sect. IV.8, "transformation to block-diagonal form"). */
export const T: readonly number[] = packedDoublesFrom([
  0.09443876248897524, -0.14125529502095421, 0.03002919410514742,
  0.25021312296533332, 0.20412935229379994, -0.38294211275726192,
  1, 1, 0,
]);

/** T^-1 (row-major 3x3). */
export const TI: readonly number[] = packedDoublesFrom([
  4.17871859155190428, 0.32768282076106237, 0.52337644549944951,
  -4.17871859155190428, -0.32768282076106237, 0.47662355450055044,
  0.50287263494578682, -2.57192694985560522, 0.59603920482822492,
]);

/**
 * Error-estimate weights e_i/gamma0 (book eq. IV.8.19-8.20; radau5's DD1..DD3):
 * err = ((gamma0/h) M - J)^-1 (f(x0, y0) + M (e1 z1 + e2 z2 + e3 z3)/h).
 */
export const E1 = (-13 - 7 * S6) / 3;
export const E2 = (-13 + 7 * S6) / 3;
export const E3 = -1 / 3;

/**
 * Dense output (book sect. IV.8, "dense output"; SciPy's P): the collocation
 * polynomial u(x0 + s h) = y0 + sum_k Q_k s^(k+1), with Q = Z^T P (row-major
 * 3x3, rows: stages, columns: powers s, s^2, s^3). P is the inverse of the
 * Vandermonde matrix [c_i^(k+1)] transposed, so u passes through y0 + z_i at c_i.
 */
export const P: readonly number[] = packedDoublesFrom([
  13 / 3 + (7 * S6) / 3, -23 / 3 - (22 * S6) / 3, 10 / 3 + 5 * S6,
  13 / 3 - (7 * S6) / 3, -23 / 3 + (22 * S6) / 3, 10 / 3 - 5 * S6,
  1 / 3, -8 / 3, 10 / 3,
]);

/** Most simplified Newton iterations per step (radau5's NIT default 7). */
export const NEWTON_MAX_ITERATIONS = 7;

/** Safety factor of the step-size controller (radau5 default SAFE = 0.9). */
export const SAFETY = 0.9;

/** Smallest and largest step-size ratio hnew/hold (radau5 FACL = 5, FACR = 1/8: 0.2..8). */
export const MIN_STEP_RATIO = 0.2;
export const MAX_STEP_RATIO = 8;

/** Keep h (and the LU) when 1.0 <= hnew/hold <= 1.2 (radau5 QUOT1, QUOT2). */
export const KEEP_STEP_LOW = 1.0;
export const KEEP_STEP_HIGH = 1.2;

/**
 * Jacobian recomputation threshold on the Newton contraction rate (radau5
 * THET = 0.001): after an accepted step whose Newton iteration contracted
 * faster than this, the Jacobian is reused.
 */
export const JACOBIAN_RATE_THRESHOLD = 0.001;

/** Contraction rate at or above which the Newton iteration is declared divergent (radau5: 0.99). */
export const DIVERGENT_RATE = 0.99;

/** Consecutive singular iteration matrices tolerated before giving up (radau5: NSING >= 5). */
export const MAX_SINGULAR_RETRIES = 5;
