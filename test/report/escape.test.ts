import { describe, expect, it } from 'vitest';
import { escapeMarkup, jsonForScript } from '../../src/report/escape.js';

// Rules: HTML Living Standard, sect. 13.1.2.6 (restrictions on the contents of
// script elements: no "</script" and no "<!--"); XML 1.0 (5th ed.), sect. 2.2
// (allowed characters) and 2.4 (character data: '<' and '&' escaped).
// Section numbers from memory.

describe('escapeMarkup', () => {
  it('escapes the five markup characters', () => {
    expect(escapeMarkup(`<a href="x" title='y'>R&D</a>`)).toBe('&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;R&amp;D&lt;/a&gt;');
  });

  it('replaces characters XML forbids (C0 controls, lone surrogates) and keeps tab, newline and astral characters', () => {
    expect(escapeMarkup('a\u0000b\u0007c\tline\n')).toBe('a\uFFFDb\uFFFDc\tline\n');
    expect(escapeMarkup('x\uD800y')).toBe('x\uFFFDy');
    expect(escapeMarkup('\uD83D\uDE00 ok')).toBe('\uD83D\uDE00 ok');
  });
});

describe('jsonForScript', () => {
  it('never lets "</script" or "<!--" appear, and parses back to the same value', () => {
    const value = { label: '</script><!-- & \u2028 \u2029', n: [1.5, null] };
    const text = jsonForScript(value);
    expect(text).not.toMatch(/<\/script|<!--/i);
    expect(text).not.toMatch(/[<>&\u2028\u2029]/);
    expect(JSON.parse(text)).toEqual(value);
  });
});
