// uPlot's browser build, stylesheet and licence, read from node_modules at
// render time so the report inlines them and opens offline.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

/**
 * The uPlot files a report inlines.
 *
 * @example
 * ```ts
 * const { version } = loadUplotAssets(); // "1.6.32"
 * ```
 */
export interface UplotAssets {
  /** Minified IIFE build (defines the global `uPlot`). */
  readonly js: string;
  /** Minified stylesheet. */
  readonly css: string;
  /** MIT licence text (must travel with the code). */
  readonly license: string;
  readonly version: string;
}

let cached: UplotAssets | undefined;

/**
 * Read uPlot's IIFE build, CSS, licence and version (once per process).
 *
 * @example
 * ```ts
 * const { js, css } = loadUplotAssets();
 * ```
 */
export function loadUplotAssets(): UplotAssets {
  if (cached) return cached;
  const require = createRequire(import.meta.url);
  const read = (file: string): string => readFileSync(require.resolve(`uplot/${file}`), 'utf8');
  const version = (JSON.parse(read('package.json')) as { version: string }).version;
  cached = Object.freeze({
    js: read('dist/uPlot.iife.min.js'),
    css: read('dist/uPlot.min.css'),
    license: read('LICENSE'),
    version,
  });
  return cached;
}
