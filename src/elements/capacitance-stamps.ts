import type { InputView, RateReader } from './element-kind.js';
import type { StampTarget } from './stamp-target.js';

/**
 * Stamp a capacitance c between node potentials p and q into the mass matrix.
 *
 * @example
 * ```ts
 * stampCapacitance(M, p, q, 100e-12); // a capacitor, or a switch's or a diode's own capacitance
 * ```
 */
export function stampCapacitance(M: StampTarget, p: number, q: number, c: number): void {
  M.add(p, p, c);
  M.add(p, q, -c);
  M.add(q, p, -c);
  M.add(q, q, c);
}

/**
 * The current C d(v_p - v_q)/dt of a capacitance between two nodes, read
 * from the state through M y' = f (see {@link RateReader}).
 *
 * @example
 * ```ts
 * const i = capacitorCurrent(rates, 'switch:4', p, q, 100e-12, t, y, inputs);
 * ```
 */
export function capacitorCurrent(rates: RateReader, key: string, p: number, q: number, c: number, t: number, y: Float64Array, inputs: InputView): number {
  return rates.rate(key, (u) => {
    if (p >= 0) u[p] = c;
    if (q >= 0) u[q] = -c;
  }, t, y, inputs);
}
