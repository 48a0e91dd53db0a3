import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import * as core from '../../src/index.js';
import * as report from '../../src/report/index.js';

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    return statSync(p).isDirectory() ? sourceFiles(p) : p.endsWith('.ts') ? [p] : [];
  });
}

describe('fluxstate/report entry point', () => {
  it('exports the report API', () => {
    for (const name of ['renderHtmlReport', 'renderSvgPlot', 'writeReport', 'decimateMinMax', 'niceTicks', 'DEFAULT_CAUTION']) {
      expect(report).toHaveProperty(name);
    }
  });

  it('is not reachable from the core import (no core file imports src/report)', () => {
    expect(core).not.toHaveProperty('renderHtmlReport');
    const outside = sourceFiles('src').filter((f) => !f.startsWith(join('src', 'report')));
    for (const file of outside) expect(readFileSync(file, 'utf8')).not.toMatch(/from\s+['"][^'"]*report\//);
  });
});
