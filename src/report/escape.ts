// Escaping of user text for HTML/SVG and of JSON embedded in an HTML page.
// Every string that reaches markup passes through one of these functions.

const MARKUP_ENTITIES: Readonly<Record<string, string>> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/**
 * Escape text for HTML or XML element content and (double- or single-quoted)
 * attribute values. Characters not allowed in XML 1.0 (C0 controls other than
 * tab, newline and carriage return; lone surrogates) are replaced by U+FFFD so
 * that SVG output always parses.
 *
 * @example
 * ```ts
 * escapeMarkup('<script>alert("x")</script>'); // "&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;"
 * ```
 */
export function escapeMarkup(text: string): string {
  return text
    .replace(/[&<>"']/g, (c) => MARKUP_ENTITIES[c] ?? c)
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '\uFFFD');
}

/**
 * Serialise a value as JSON that is safe inside an HTML `<script>` element:
 * `<`, `>`, `&` and the line separators U+2028/U+2029 are written as `\u`
 * escapes, so no `</script>` or `<!--` can ever appear in the text.
 *
 * @example
 * ```ts
 * jsonForScript({ label: '</script>' }); // '{"label":"\\u003c/script\\u003e"}'
 * ```
 */
export function jsonForScript(value: unknown): string {
  return JSON.stringify(value).replace(/[<>&\u2028\u2029]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}
