import { elementKind } from '../elements/registry.js';
import type { NetworkDescription } from '../network/description.js';

/**
 * Steps per period of a sine source that a network with ideal diodes takes
 * at least. Why: a diode's event is seen when its margin changes sign
 * between two step ends; the solver's error control follows the states,
 * not the node potentials a sine source sets, so with a large capacitor
 * (a smooth state) it would step over the short conduction window of a
 * capacitor-input rectifier (measured: two peaks of three missed with
 * steps of 14 ms at 50 Hz). 40 steps per period resolve conduction windows
 * down to 9 degrees.
 */
export const SINE_STEPS_PER_PERIOD = 40;

/**
 * The largest step a run of a network with ideal diodes may take when the
 * user gave none: a period of the fastest sine source over
 * {@link SINE_STEPS_PER_PERIOD}; undefined when there is no sine source
 * (pulse and piecewise-linear sources are linear between their breakpoints,
 * which the run lands on, so the dense output follows them exactly).
 *
 * @example
 * ```ts
 * const maxStep = settings.maxStep ?? deviceStepCap(compiled.description);
 * ```
 */
export function deviceStepCap(d: NetworkDescription): number | undefined {
  let cap = Infinity;
  for (const e of d.elements) {
    const w = elementKind(e).waveform?.(e);
    if (w?.kind === 'sine' && w.frequency > 0) cap = Math.min(cap, 1 / (w.frequency * SINE_STEPS_PER_PERIOD));
  }
  return Number.isFinite(cap) ? cap : undefined;
}
