import type { z } from 'zod';
import { InputError } from '../errors.js';

/** A zod issue reduced to what a message needs: where and what. @internal */
export interface FlatIssue {
  readonly path: readonly PropertyKey[];
  readonly message: string;
  /** The path names a field the schema does not know. */
  readonly unknownField: boolean;
}

/**
 * Flatten zod issues: an unrecognised key becomes an issue at the key's own
 * path; of a failed union, the branch that got furthest is kept (its issues
 * have the longest paths), so "material.relativePermeabilty: unknown field"
 * is reported rather than "invalid input".
 *
 * @internal
 */
export function flattenIssues(issues: readonly z.core.$ZodIssue[], prefix: readonly PropertyKey[] = []): FlatIssue[] {
  const out: FlatIssue[] = [];
  for (const issue of issues) {
    const path = [...prefix, ...issue.path];
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) out.push({ path: [...path, key], message: 'unknown field; check the spelling (fields are case-sensitive)', unknownField: true });
    } else if (issue.code === 'invalid_union' && issue.errors.length > 0) {
      const branches = issue.errors.map((b) => flattenIssues(b, path));
      const depth = (b: FlatIssue[]): number => Math.max(...b.map((i) => i.path.length));
      let best = branches[0]!;
      for (const b of branches) if (depth(b) > depth(best)) best = b;
      out.push(...best);
    } else {
      out.push({ path, message: issue.message, unknownField: false });
    }
  }
  return out;
}

/** Lists whose entries have names, and the word used for them in messages. */
const NAMED_LISTS: Readonly<Record<string, string>> = {
  tubes: 'tube',
  elements: 'element',
  electricNodes: 'node',
  magneticNodes: 'magnetic node',
  axes: 'axis',
  outputs: 'output',
};

/**
 * Render a path like `network.tubes[1] (tube "leg").law.length`: the field
 * by its position in the document, and the named entry it belongs to.
 *
 * @internal
 */
export function formatPath(path: readonly PropertyKey[], root: unknown): string {
  let text = '';
  let node: unknown = root;
  let parentKey: PropertyKey | undefined;
  for (const key of path) {
    if (typeof key === 'number') {
      text += `[${key}]`;
    } else {
      text += text === '' ? String(key) : `.${String(key)}`;
    }
    node = node !== null && typeof node === 'object' ? (node as Record<PropertyKey, unknown>)[key] : undefined;
    const word = typeof key === 'number' && typeof parentKey === 'string' ? NAMED_LISTS[parentKey] : undefined;
    const entryName = node !== null && typeof node === 'object' ? (node as { name?: unknown }).name : undefined;
    if (word !== undefined && typeof entryName === 'string') text += ` (${word} "${entryName}")`;
    parentKey = key;
  }
  return text === '' ? '(top level)' : text;
}

/**
 * Turn zod issues into an `InputError` with a stable code. The message lists
 * up to 8 problems, each with its field path and the named entry it belongs
 * to; `elements` holds the field paths.
 *
 * @internal
 */
export function schemaError(code: string, what: string, issues: readonly z.core.$ZodIssue[], root: unknown, prefix: readonly PropertyKey[] = []): InputError {
  const flat = flattenIssues(issues, prefix);
  const lines = flat.slice(0, 8).map((i) => `${formatPath(i.path, root)}: ${i.message}`);
  if (flat.length > 8) lines.push(`... and ${flat.length - 8} more`);
  const fields = [...new Set(flat.map((i) => formatPath(i.path, root)))];
  return new InputError(code, `${what}: ${lines.join('; ')}`, fields);
}
