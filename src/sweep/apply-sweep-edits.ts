import { InputError } from '../errors.js';
import { clonePlain } from '../network/clone-plain.js';
import type { NetworkDescription } from '../network/description.js';
import { networkSchema } from './description-schema.js';
import { flattenIssues, formatPath } from './schema-error.js';
import type { SweepTarget, SweepValue } from './sweep-job.js';

/**
 * One change to a network description: set `target`'s field to `value`
 * (`null` removes an optional field).
 *
 * @example
 * ```ts
 * const edit: SweepEdit = { target: { tube: 'leg', field: 'initialFluxDensity' }, value: 0.8 };
 * ```
 */
export interface SweepEdit {
  readonly target: SweepTarget;
  readonly value: SweepValue;
}

/** Fields that hold an entry's identity or connections: a sweep cannot change them. */
const FIXED_FIELDS: Readonly<Record<'tubes' | 'elements', readonly string[]>> = {
  tubes: ['name', 'from', 'to'],
  elements: ['name', 'kind', 'plus', 'minus', 'tube'],
};

/** Human name of the target, for messages: `tube "leg"`, `voltage-source "mains"`. @internal */
export function targetLabel(description: NetworkDescription, target: SweepTarget): string {
  if ('tube' in target) return `tube "${target.tube}"`;
  const e = description.elements.find((x) => x.name === target.element);
  return `${e ? e.kind : 'element'} "${target.element}"`;
}

/** Position of the target's entry: which list, and where in it. Throws `'sweep-unknown-target'`. @internal */
export function locateTarget(description: NetworkDescription, target: SweepTarget): { list: 'tubes' | 'elements'; index: number } {
  const list = 'tube' in target ? 'tubes' : 'elements';
  const name = 'tube' in target ? target.tube : target.element;
  const entries: readonly { name: string }[] = description[list];
  const index = entries.findIndex((x) => x.name === name);
  if (index < 0) {
    const word = list === 'tubes' ? 'tube' : 'element';
    const known = entries.map((x) => `"${x.name}"`).join(', ') || 'none';
    throw new InputError(
      'sweep-unknown-target',
      `network "${description.name}" has no ${word} named "${name}" (${word}s: ${known}); check the name in the sweep target`,
      [name],
    );
  }
  return { list, index };
}

/** Split a field path `waveform.phase` / `toggleTimes.0` into keys; array positions become numbers. */
function fieldKeys(field: string, label: string): (string | number)[] {
  const parts = field.split('.');
  if (parts.some((p) => p === '')) {
    throw new InputError('sweep-unknown-field', `${label}: field path "${field}" has an empty part; write fields like "waveform.phase"`, [field]);
  }
  const reserved = parts.find((p) => p === '__proto__' || p === 'constructor' || p === 'prototype');
  if (reserved !== undefined) {
    throw new InputError('sweep-unknown-field', `${label}: field path "${field}" names "${reserved}", which is no field of a network entry`, [field]);
  }
  return parts.map((p) => (/^\d+$/.test(p) ? Number(p) : p));
}

function isPlainContainer(v: unknown): v is Record<string | number, unknown> {
  if (v === null || typeof v !== 'object') return false;
  if (Array.isArray(v)) return true;
  const proto = Object.getPrototypeOf(v);
  return (proto === Object.prototype || proto === null) && !('fieldStrength' in v);
}

/** Copy `container` with `keys` set to value (or removed for null), copying only the objects on the path. */
function setIn(container: unknown, keys: readonly (string | number)[], value: SweepValue, fail: (why: string, code?: string) => never, parent = 'the entry'): unknown {
  const [key, ...rest] = keys as [string | number, ...(string | number)[]];
  if (container === null || typeof container !== 'object') {
    fail(`${parent} is a ${container === null ? 'null' : typeof container}, which has no field "${String(key)}"`);
  }
  if (!isPlainContainer(container)) {
    fail(`${parent} is not plain data (a live material law or function cannot be edited; give a spec instead)`, 'sweep-fixed-field');
  }
  const copy = (Array.isArray(container) ? [...container] : { ...container }) as Record<string | number, unknown>;
  if (Array.isArray(container) && (typeof key !== 'number' || key >= container.length)) {
    fail(`position ${String(key)} is not in the list (length ${container.length})`);
  }
  if (rest.length === 0) {
    if (value === null) {
      if (Array.isArray(copy)) fail('null cannot remove a list position; set the whole list instead', 'sweep-bad-value');
      delete copy[key];
    } else {
      copy[key] = clonePlain(value);
    }
    return copy;
  }
  if (!(key in container)) fail(`the entry has no "${String(key)}"; check the field path (see the network description)`);
  copy[key] = setIn(container[key], rest, value, fail, `"${String(key)}"`);
  return copy;
}

/**
 * Apply edits to a copy of a network description and check the result's
 * shape and types. The input is not modified; only the objects on each
 * edited path are copied. Checked here: the target exists
 * (`'sweep-unknown-target'`), the field exists for that entry
 * (`'sweep-unknown-field'`), it is not an identity or connection field
 * (`'sweep-fixed-field'`), the value has the field's type
 * (`'sweep-bad-value'`). Value ranges (a negative resistance, unsorted
 * times) are checked when the network is rebuilt
 * ({@link networkFromDescription}).
 *
 * @example
 * ```ts
 * const variant = applySweepEdits(net.describe(), [
 *   { target: { tube: 'leg', field: 'initialFluxDensity' }, value: 0.8 },
 *   { target: { element: 'mains', field: 'waveform.phase' }, value: Math.PI / 2 },
 *   { target: { element: 'primary', field: 'resistance' }, value: 0.5 },
 * ]);
 * ```
 */
export function applySweepEdits(description: NetworkDescription, edits: readonly SweepEdit[]): NetworkDescription {
  let out: NetworkDescription = description;
  for (const edit of edits) {
    const label = targetLabel(description, edit.target);
    const { list, index } = locateTarget(description, edit.target);
    const keys = fieldKeys(edit.target.field, label);
    const fail = (why: string, code = 'sweep-unknown-field'): never => {
      throw new InputError(code, `${label} field "${edit.target.field}": ${why}`, [targetName(edit.target), edit.target.field]);
    };
    if (typeof keys[0] === 'string' && FIXED_FIELDS[list].includes(keys[0])) {
      fail(`"${keys[0]}" is the entry's identity or connection and cannot be swept; sweep a value field (build a second network for another topology)`, 'sweep-fixed-field');
    }
    const entries = [...out[list]] as unknown[];
    entries[index] = setIn(entries[index], keys, edit.value, fail);
    out = { ...out, [list]: entries };
  }
  if (edits.length > 0) checkEdited(out, edits);
  return out;
}

function targetName(target: SweepTarget): string {
  return 'tube' in target ? target.tube : target.element;
}

/** Re-check the shape of an edited description; blame the edit whose field a problem lies in. */
function checkEdited(edited: NetworkDescription, edits: readonly SweepEdit[]): void {
  const parsed = networkSchema.safeParse(edited);
  if (parsed.success) return;
  const issue = flattenIssues(parsed.error.issues)[0]!;
  const unknown = issue.unknownField;
  const where = [...issue.path];
  const blamed = edits.find((e) => {
    const { list, index } = locateTarget(edited, e.target);
    const editPath = [list, index, ...e.target.field.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p))];
    // The problem lies in the edited field, inside it, or in the object that holds it.
    const common = Math.min(where.length, editPath.length);
    return where.slice(0, common).every((k, i) => k === editPath[i]) && where.length >= editPath.length - 1;
  });
  const problem = unknown ? 'not a field of this entry; check the spelling (fields are case-sensitive)' : issue.message;
  const text = blamed
    ? `${targetLabel(edited, blamed.target)} field "${blamed.target.field}": ${problem}`
    : `${formatPath(where, edited)}: ${problem}`;
  throw new InputError(
    unknown ? 'sweep-unknown-field' : 'sweep-bad-value',
    text,
    blamed ? [targetName(blamed.target), blamed.target.field] : [formatPath(where, edited)],
  );
}
