// A small XML well-formedness check for test use (no XML parser is installed).
// Rules from Extensible Markup Language (XML) 1.0, Fifth Edition, W3C
// Recommendation 26 Nov 2008: sect. 2.1 (one root element, proper nesting),
// 2.3 (Name production, simplified to ASCII letters, digits, '_', ':', '-', '.'),
// 2.4 (no literal '<' or unescaped '&' in character data), 3.1 (start/end/
// empty-element tags, quoted attribute values without '<', unique attribute
// names), 4.1 and 4.6 (character references and the predefined entities).
// Section numbers from memory. DTDs and processing instructions other than the
// XML declaration are not
// accepted: our SVG never uses them.

const NAME = '[A-Za-z_:][-A-Za-z0-9_:.]*';
const REFERENCE = /&(?:amp|lt|gt|quot|apos|#[0-9]+|#x[0-9A-Fa-f]+);/y;

/** Text or attribute value: '<' forbidden, '&' only as a reference. Returns an error or null. */
function checkChars(text: string, where: string, forbidLt: boolean): string | null {
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '<' && forbidLt) return `literal '<' in ${where}`;
    if (c === '&') {
      REFERENCE.lastIndex = i;
      if (!REFERENCE.test(text)) return `bare '&' in ${where} at ${JSON.stringify(text.slice(i, i + 12))}`;
    }
  }
  return null;
}

/** Returns null when `xml` is well-formed, else a description of the first problem found. */
export function xmlWellFormedError(xml: string): string | null {
  const tagRe = new RegExp(
    `<(?:(!--[\\s\\S]*?--)|(\\?xml[^?]*\\?)|/(${NAME})\\s*|(${NAME})((?:\\s+${NAME}\\s*=\\s*(?:"[^"]*"|'[^']*'))*)\\s*(/?))>`,
    'y',
  );
  const attrRe = new RegExp(`(${NAME})\\s*=\\s*(?:"([^"]*)"|'([^']*)')`, 'g');
  const stack: string[] = [];
  let roots = 0;
  let i = 0;
  while (i < xml.length) {
    const lt = xml.indexOf('<', i);
    const text = xml.slice(i, lt < 0 ? xml.length : lt);
    if (text !== '') {
      if (stack.length === 0 && text.trim() !== '') return `text outside the root element: ${JSON.stringify(text.slice(0, 30))}`;
      const err = checkChars(text, 'character data', true);
      if (err) return err;
    }
    if (lt < 0) break;
    tagRe.lastIndex = lt;
    const m = tagRe.exec(xml);
    if (!m) return `malformed markup at ${lt}: ${JSON.stringify(xml.slice(lt, lt + 40))}`;
    i = tagRe.lastIndex;
    const [, comment, decl, endName, startName, attrs, selfClose] = m;
    if (comment !== undefined) {
      if (comment.slice(3, -2).includes('--')) return "'--' inside a comment";
      continue;
    }
    if (decl !== undefined) {
      if (lt !== 0) return 'XML declaration not at the start';
      continue;
    }
    if (endName !== undefined) {
      const open = stack.pop();
      if (open !== endName) return `</${endName}> closes <${open ?? 'nothing'}>`;
      continue;
    }
    if (startName === undefined) return `unrecognised markup at ${lt}`;
    if (stack.length === 0) {
      roots++;
      if (roots > 1) return `second root element <${startName}>`;
    }
    const seen = new Set<string>();
    for (const a of (attrs ?? '').matchAll(attrRe)) {
      const name = a[1] as string;
      if (seen.has(name)) return `attribute ${name} repeated on <${startName}>`;
      seen.add(name);
      const err = checkChars(a[2] ?? a[3] ?? '', `attribute ${name} of <${startName}>`, true);
      if (err) return err;
    }
    if (selfClose !== '/') stack.push(startName);
  }
  if (stack.length > 0) return `unclosed <${stack[stack.length - 1]}>`;
  if (roots !== 1) return 'no root element';
  return null;
}
