import type { InputView } from '../elements/element-kind.js';
import { elementKind } from '../elements/registry.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';

/** An inductive current that a jump left without a closed path, and the devices that opened it. */
export interface CutInductiveCurrent {
  /** The inductors or windings whose current has nowhere to go. */
  readonly inductive: readonly string[];
  /** The switches and diodes that stopped conducting at the jump (or every blocking device when none did). */
  readonly devices: readonly string[];
  /** In engineering words, with the fix. */
  readonly message: string;
}

/** A current below this many absolute tolerances counts as zero (a diode that turned off at its zero crossing). */
const CURRENT_FLOOR_ATOL = 100;
/** ... or below this fraction of the largest inductive current before the jump. */
const CURRENT_FLOOR_RELATIVE = 1e-6;
/**
 * ... or below what the off-state conductances of the devices that do not
 * conduct carry at this many times the largest node voltage before the jump:
 * such a current is their leakage (an open switch's 1e-7 S at 39 V is 3.9 uA
 * in a flyback's primary), not a cut one, which would need I/G_off, megavolts.
 * Our choice: a factor 10 covers the reflected voltages a turn-off adds.
 */
const LEAKAGE_VOLTAGE_FACTOR = 10;

/**
 * Finds, after a jump (a gate edge, a diode turning off), an inductive
 * current that the new device states leave with no closed path: an
 * inductor whose terminals are no longer joined by conducting elements
 * (resistors, capacitors, sources, closed switches, conducting diodes,
 * other inductive elements; a switch or diode with a capacitance always
 * conducts), or a winding whose current cannot pass to another winding
 * of the same magnetic loops (the flux linked only with it, such as its
 * leakage flux, would have to collapse). Without this check the current
 * would be forced through the off-conductance: a voltage of I/G_off
 * (megavolts), then a solver failure far from the cause.
 *
 * Structural (union-find over the conducting elements), then the
 * current each path-less element still carries once the algebraic
 * equations are solved with the new states: an inductor keeps its
 * current; a winding keeps the part of its MMF that no other winding can
 * take over (its leakage flux), which the solve finds by itself. Buffers
 * are allocated once.
 *
 * @example
 * ```ts
 * const check = freewheelCheck(compiled, 1e-6);
 * const cut = check(t, yBefore, ySettled, before, after);
 * if (cut) console.error(cut.message);
 * ```
 */
export function freewheelCheck(
  compiled: CompiledNetwork,
  atol: number | Float64Array,
): (t: number, yBefore: Float64Array, ySettled: Float64Array, before: InputView, after: InputView) => CutInductiveCurrent | undefined {
  const d = compiled.description;
  const els = d.elements;
  const inductive = els.flatMap((e, k) => (elementKind(e).role === 'inductive' ? [k] : []));
  const switching = els.flatMap((_e, k) => (compiled.elements[k]!.conducting ? [k] : []));
  const parent = new Int32Array(d.electricNodes.length);
  const conducting = new Uint8Array(els.length);
  const atolOf = (i: number): number => (typeof atol === 'number' ? atol : atol[i]!);
  const potentials = compiled.layout.kinds.flatMap((kind, i) => (kind === 'potential' ? [i] : []));

  const find = (a: number): number => {
    while (parent[a] !== a) {
      parent[a] = parent[parent[a]!]!;
      a = parent[a]!;
    }
    return a;
  };
  /** Whether the terminals of element `skip` are joined by the other conducting elements. */
  const hasPath = (skip: number): boolean => {
    for (let i = 0; i < parent.length; i++) parent[i] = i;
    for (let k = 0; k < els.length; k++) {
      if (k === skip || !conducting[k]) continue;
      const a = find(els[k]!.plus);
      const b = find(els[k]!.minus);
      if (a !== b) parent[a] = b;
    }
    return find(els[skip]!.plus) === find(els[skip]!.minus);
  };

  return (t, yBefore, ySettled, before, after) => {
    if (inductive.length === 0 || switching.length === 0) return undefined;
    for (let k = 0; k < els.length; k++) {
      const role = elementKind(els[k]!).role;
      conducting[k] = role !== 'current-source' && (compiled.elements[k]!.conducting?.(t, after) ?? true) ? 1 : 0;
    }
    let largest = 0;
    for (const k of inductive) {
      const j = compiled.layout.branchCurrent[k]!;
      if (j >= 0) largest = Math.max(largest, Math.abs(yBefore[j]!));
    }
    // The leakage the blocking devices can carry at the circuit's own voltages (see LEAKAGE_VOLTAGE_FACTOR).
    let voltage = 0;
    for (const i of potentials) voltage = Math.max(voltage, Math.abs(yBefore[i]!));
    let offConductance = 0;
    for (const k of switching) if (!conducting[k]) offConductance += compiled.elements[k]!.offConductance ?? 0;
    const leakage = LEAKAGE_VOLTAGE_FACTOR * voltage * offConductance;
    const cut: number[] = [];
    for (const k of inductive) {
      const j = compiled.layout.branchCurrent[k]!;
      if (j < 0 || hasPath(k)) continue;
      // The settled current: what the flux (a winding) or the state (an inductor) still demands of the element.
      if (Math.abs(ySettled[j]!) > Math.max(CURRENT_FLOOR_ATOL * atolOf(j), CURRENT_FLOOR_RELATIVE * largest, leakage)) cut.push(k);
    }
    if (cut.length === 0) return undefined;
    const opened = switching.filter((k) => (compiled.elements[k]!.conducting!(t, before) && !conducting[k]));
    const devices = opened.length > 0 ? opened : switching.filter((k) => !conducting[k]);
    const label = (k: number): string => `${elementKind(els[k]!).noun} "${els[k]!.name}"`;
    const who = devices.map(label).join(' and ');
    const message =
      `${who || 'a device'} opened the current of ${cut.map(label).join(' and ')} with no freewheeling path at t = ${t} s: ` +
      "add a diode, a snubber or the switch's capacitance";
    return { inductive: cut.map((k) => els[k]!.name), devices: devices.map((k) => els[k]!.name), message };
  };
}
