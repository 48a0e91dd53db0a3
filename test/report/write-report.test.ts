import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_CAUTION, renderHtmlReport, writeReport, type ReportData } from '../../src/report/index.js';

const dir = mkdtempSync(join(tmpdir(), 'fluxstate-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('writeReport', () => {
  it('creates missing folders, writes the rendered HTML and returns the absolute path', () => {
    // Synthetic test data.
    const data: ReportData = {
      title: 'Synthetic test data',
      sections: [{ title: 's', plots: [{ title: 'p', series: [{ label: 'a', unit: 'V', t: [0, 1], values: [0, 1] }] }] }],
    };
    const target = join(dir, 'a', 'b', 'report.html');
    const written = writeReport(target, data);
    expect(written).toBe(target);
    expect(existsSync(target)).toBe(true);
    const html = readFileSync(target, 'utf8');
    expect(html).toBe(renderHtmlReport(data));
    expect(html).toContain(DEFAULT_CAUTION);
  });
});
