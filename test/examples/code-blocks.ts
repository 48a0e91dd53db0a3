// Helpers for the examples test: TypeScript code blocks of Markdown pages, and the import
// paths that differ between the documentation ('fluxstate') and the examples ('../src/...').

/** The fenced code blocks of a Markdown text whose info string is exactly `lang`, in order. */
export function codeBlocks(markdown: string, lang = 'ts'): string[] {
  const blocks: string[] = [];
  const fence = /^```(\S*)[^\n]*\n([\s\S]*?)^```[ \t]*$/gm;
  for (let m = fence.exec(markdown); m !== null; m = fence.exec(markdown)) {
    if (m[1] === lang) blocks.push(m[2]!);
  }
  return blocks;
}

/**
 * Rewrite the package imports of documentation code (`'fluxstate'`,
 * `'fluxstate/report'`) to paths of the sources, given as `index` and
 * `report` (what goes between the quotes).
 */
export function mapPackageImports(code: string, paths: { readonly index: string; readonly report: string }): string {
  return code
    .replace(/from 'fluxstate'/g, `from '${paths.index}'`)
    .replace(/from 'fluxstate\/report'/g, `from '${paths.report}'`);
}

/** An example file without its leading comment lines (`//`) and the blank lines after them. */
export function withoutLeadingComments(source: string): string {
  const lines = source.split('\n');
  let k = 0;
  while (k < lines.length && (lines[k]!.startsWith('//') || lines[k]!.trim() === '')) k++;
  return lines.slice(k).join('\n');
}

/**
 * The `text` code blocks placed right after a `<!-- output -->` line (or
 * `<!-- output of <what> -->` with `of` given): output a page shows.
 */
export function outputBlocks(markdown: string, of?: string): string[] {
  const marker = of === undefined ? 'output' : `output of ${of}`;
  const escaped = marker.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
  const marked = new RegExp(`^<!-- ${escaped} -->[ \\t]*\\n\`\`\`text[^\\n]*\\n([\\s\\S]*?)^\`\`\`[ \\t]*$`, 'gm');
  const blocks: string[] = [];
  for (let m = marked.exec(markdown); m !== null; m = marked.exec(markdown)) blocks.push(m[1]!);
  return blocks;
}
