import type { ElementDescription, TubeLaw } from '../network/description.js';
import { airGapKind } from './air-gap.js';
import { capacitorKind } from './capacitor.js';
import { constantReluctanceKind } from './constant-reluctance.js';
import { currentSourceKind } from './current-source.js';
import { diodeKind } from './diode.js';
import type { ElementKind } from './element-kind.js';
import { hystereticTubeKind } from './hysteretic-tube.js';
import { inductorKind } from './inductor.js';
import { materialTubeKind } from './material-tube.js';
import { resistorKind } from './resistor.js';
import { switchKind } from './switch.js';
import type { TubeKind } from './tube-kind.js';
import { voltageSourceKind } from './voltage-source.js';
import { windingKind } from './winding.js';

/**
 * Every electric element kind, one entry each. The record is exhaustive
 * over `ElementDescription['kind']`: a kind added to the description union
 * without an entry here does not compile.
 *
 * @example
 * ```ts
 * ELEMENT_KINDS.resistor.noun; // 'resistor'
 * ```
 */
export const ELEMENT_KINDS: { readonly [K in ElementDescription['kind']]: ElementKind<Extract<ElementDescription, { kind: K }>> } = {
  resistor: resistorKind,
  capacitor: capacitorKind,
  inductor: inductorKind,
  'voltage-source': voltageSourceKind,
  'current-source': currentSourceKind,
  switch: switchKind,
  diode: diodeKind,
  winding: windingKind,
};

/**
 * Every flux-tube kind, exhaustive over `TubeLaw['kind']`.
 *
 * @example
 * ```ts
 * TUBE_KINDS['air-gap'].noun; // 'air gap'
 * ```
 */
export const TUBE_KINDS: { readonly [K in TubeLaw['kind']]: TubeKind<Extract<TubeLaw, { kind: K }>> } = {
  material: materialTubeKind,
  'air-gap': airGapKind,
  reluctance: constantReluctanceKind,
  hysteretic: hystereticTubeKind,
};

/**
 * The kind entry of an element (typed for its description).
 *
 * @example
 * ```ts
 * elementKind(d.elements[3]!).role; // 'inductive'
 * ```
 */
export function elementKind<D extends ElementDescription>(d: D): ElementKind<D> {
  return ELEMENT_KINDS[d.kind as D['kind']] as unknown as ElementKind<D>;
}

/**
 * The kind entry of a tube law.
 *
 * @example
 * ```ts
 * tubeKind(d.tubes[0]!.law).noun; // 'flux tube'
 * ```
 */
export function tubeKind<L extends TubeLaw>(law: L): TubeKind<L> {
  return TUBE_KINDS[law.kind as L['kind']] as unknown as TubeKind<L>;
}

/**
 * Whether a string names an element kind of the registry.
 *
 * @example
 * ```ts
 * isElementKind('diode'); // true: src/elements/diode.ts is registered
 * ```
 */
export function isElementKind(kind: unknown): kind is ElementDescription['kind'] {
  return typeof kind === 'string' && Object.prototype.hasOwnProperty.call(ELEMENT_KINDS, kind);
}

/**
 * Whether a string names a tube-law kind of the registry.
 *
 * @example
 * ```ts
 * isTubeKind('air-gap'); // true
 * ```
 */
export function isTubeKind(kind: unknown): kind is TubeLaw['kind'] {
  return typeof kind === 'string' && Object.prototype.hasOwnProperty.call(TUBE_KINDS, kind);
}
