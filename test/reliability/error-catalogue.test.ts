/**
 * docs/errors.md is the catalogue of every error code and numerical status.
 * This test keeps it honest against the code: every `code` passed to an
 * error constructor in src/ has an entry (and every entry still has a raise
 * site), each entry names the class the code is raised with, each entry's
 * test files exist and mention the code, each code with a scenario in
 * error-triggers.ts is really raised by it (the others are listed there and
 * may only become fewer), and the statuses documented are exactly the
 * members of `DaeStatus`.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { FluxstateError } from '../../src/index.js';
import { scanErrorCodes } from './error-codes.js';
import { TRIGGERS, UNTRIGGERED } from './error-triggers.js';

const root = join(import.meta.dirname, '..', '..');
const doc = readFileSync(join(root, 'docs', 'errors.md'), 'utf8');
const scan = scanErrorCodes(join(root, 'src'), root);

interface Entry {
  readonly code: string;
  readonly errorClass: string;
  readonly tests: readonly string[];
}

/** Entries: a `### \`code\`` heading, then a line `Class · raised by ... · tests: \`file\`, ...`. */
function entries(): Entry[] {
  const out: Entry[] = [];
  const lines = doc.split('\n');
  lines.forEach((line, k) => {
    const m = /^### `([a-z0-9-]+)`\s*$/.exec(line);
    if (!m) return;
    const meta = lines[k + 1] ?? '';
    const cls = /^(InputError|TopologyError|FluxstateError) ·/.exec(meta);
    const tests = /tests: (.*)$/.exec(meta);
    out.push({
      code: m[1]!,
      errorClass: cls?.[1] ?? '(missing)',
      tests: tests ? [...tests[1]!.matchAll(/`([^`]+)`/g)].map((x) => x[1]!) : [],
    });
  });
  return out;
}

describe('docs/errors.md', () => {
  it('every error code in src/ is resolved statically (no computed codes)', () => {
    expect(scan.unresolved).toEqual([]);
    expect(scan.sites.length).toBeGreaterThan(100);
  });

  it('has an entry for every code raised in src/, and no entry without a raise site', () => {
    const inSource = new Set(scan.sites.map((s) => s.code));
    const inDoc = new Set(entries().map((e) => e.code));
    expect([...inSource].filter((c) => !inDoc.has(c)).sort()).toEqual([]);
    expect([...inDoc].filter((c) => !inSource.has(c)).sort()).toEqual([]);
  });

  it('names, for each entry, the class the code is raised with', () => {
    const byCode = new Map<string, Set<string>>();
    for (const s of scan.sites) byCode.set(s.code, new Set([...(byCode.get(s.code) ?? []), s.errorClass]));
    for (const e of entries()) {
      const classes = byCode.get(e.code);
      expect(classes, e.code).toBeDefined();
      expect([...classes!], `${e.code} is raised as ${[...classes!].join(', ')}`).toEqual([e.errorClass]);
    }
  });

  it('lists, for each entry, test files that exist and trigger the code', () => {
    for (const e of entries()) {
      expect(e.tests.length, `${e.code}: no test listed`).toBeGreaterThan(0);
      for (const file of e.tests) {
        const path = join(root, file);
        expect(existsSync(path), `${e.code}: ${file} does not exist`).toBe(true);
        expect(readFileSync(path, 'utf8').includes(`'${e.code}'`), `${e.code}: ${file} does not mention '${e.code}'`).toBe(true);
      }
    }
  });

  it('triggers each code of its scenario table through the public API (the code thrown is the code documented)', () => {
    const raised: Record<string, string> = {};
    for (const [code, trigger] of Object.entries(TRIGGERS)) {
      try {
        trigger();
        raised[code] = '(returned)';
      } catch (e) {
        raised[code] = e instanceof FluxstateError ? e.code : `(${e instanceof Error ? e.name : 'non-error'})`;
      }
    }
    expect(raised).toEqual(Object.fromEntries(Object.keys(TRIGGERS).map((c) => [c, c])));
  });

  it('has a trigger for every documented code, except those listed as not yet triggered (a list that only shrinks)', () => {
    const documented = new Set(entries().map((e) => e.code));
    const triggered = new Set(Object.keys(TRIGGERS));
    expect([...triggered].filter((c) => !documented.has(c)).sort()).toEqual([]);
    expect(UNTRIGGERED.filter((c) => triggered.has(c)).sort()).toEqual([]);
    expect(UNTRIGGERED.filter((c) => !documented.has(c)).sort()).toEqual([]);
    expect([...documented].filter((c) => !triggered.has(c) && !UNTRIGGERED.includes(c)).sort()).toEqual([]);
  });

  it('documents exactly the numerical statuses of DaeStatus', () => {
    const types = readFileSync(join(root, 'src', 'solver', 'types.ts'), 'utf8');
    const union = /export type DaeStatus =([^;]*);/.exec(types)![1]!;
    const statuses = [...union.matchAll(/'([a-z-]+)'/g)].map((m) => m[1]!).sort();
    const documented = [...doc.matchAll(/^### Status `([a-z-]+)`\s*$/gm)].map((m) => m[1]!).sort();
    expect(statuses.length).toBeGreaterThan(5);
    expect(documented).toEqual(statuses);
  });
});
