import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/index.js';
import { DEFAULT_CAUTION, renderHtmlReport, type ReportData } from '../../src/report/index.js';
import { HOSTILE, hostileReport } from './hostile-report.js';

// Synthetic test data: sine and offset sine (not a simulation).
function syntheticReport(n = 1001): ReportData {
  const t = Float64Array.from({ length: n }, (_, i) => (i * 0.04) / (n - 1));
  return {
    title: 'Synthetic test data',
    sections: [
      {
        title: 'Waveforms',
        plots: [
          {
            title: 'Sine and offset sine',
            series: [
              { label: 'sine', unit: 'V', t, values: t.map((x) => Math.sin(2 * Math.PI * 50 * x)) },
              { label: 'offset sine', unit: 'V', t, values: t.map((x) => 0.5 + Math.sin(2 * Math.PI * 50 * x)) },
            ],
            references: [{ label: 'limit', value: 1.2 }],
          },
        ],
        metrics: [{ title: 'Figures', rows: [{ name: 'Peak', value: 1.5, unit: 'V', status: 'warning' }] }],
        network: { rows: [{ element: 'R1', kind: 'resistor', parameters: [{ name: 'R', value: 10, unit: 'ohm' }] }] },
      },
    ],
  };
}

interface EmbeddedPlot {
  series: { label: string }[];
  xGroups: { x: (number | null)[]; columns: { index: number; values: (number | null)[] }[] }[];
}

function embedded(html: string): { plotHeight: number; plots: EmbeddedPlot[] } {
  const m = /<script type="application\/json" id="fluxstate-report-data">([\s\S]*?)<\/script>/.exec(html);
  expect(m).not.toBeNull();
  return JSON.parse(m![1]!) as { plotHeight: number; plots: EmbeddedPlot[] };
}

const scripts = (html: string): string[] => [...html.matchAll(/<script>([\s\S]*?)<\/script>/g)].map((m) => m[1]!);

describe('renderHtmlReport', () => {
  it('is self-contained: uPlot inlined, nothing referenced over the network, a CSP forbidding it', () => {
    const html = renderHtmlReport(syntheticReport());
    const require = createRequire(import.meta.url);
    const uplotJs = readFileSync(require.resolve('uplot/dist/uPlot.iife.min.js'), 'utf8');
    expect(html).toContain(uplotJs.slice(0, 200));
    expect(html).toContain('Permission is hereby granted'); // uPlot's MIT licence travels with its code
    expect(html).not.toMatch(/<(?:link|img|iframe)\b/i);
    expect(html).not.toMatch(/\s(?:src|href)\s*=\s*["']?(?:https?:)?\/\//i);
    const csp = /http-equiv="Content-Security-Policy" content="([^"]*)"/.exec(html)![1]!;
    expect(csp).toContain("default-src 'none'");
    // each inline script is allowed by its SHA-256 hash (W3C Content Security Policy Level 2,
    // hash-source; section number from memory: 4.2.4)
    for (const body of scripts(html)) {
      const hash = createHash('sha256').update(body, 'utf8').digest('base64');
      expect(csp).toContain(`'sha256-${hash}'`);
    }
  });

  it('prints the default caution at the top and at the foot, and never an empty one', () => {
    const html = renderHtmlReport(syntheticReport());
    expect(html.split(DEFAULT_CAUTION).length - 1).toBe(2);
    expect(html.indexOf(DEFAULT_CAUTION)).toBeLessThan(html.indexOf('<main>'));
    const blank = renderHtmlReport({ ...syntheticReport(), caution: '   ' });
    expect(blank).toContain(DEFAULT_CAUTION);
    const custom = renderHtmlReport({ ...syntheticReport(), caution: 'Model estimate only: codes govern.' });
    expect(custom).toContain('Model estimate only: codes govern.');
  });

  it('renders user text inert: names like <script> appear escaped, and only the page\'s own scripts exist', () => {
    const data = syntheticReport(20);
    const section = data.sections[0]!;
    const group = section.plots![0]!;
    const evil = '<script>alert(1)</script>';
    const html = renderHtmlReport({
      ...data,
      title: evil,
      subtitle: '<img src=x onerror=alert(2)>',
      sections: [
        {
          ...section,
          title: evil,
          plots: [{ ...group, title: evil, series: [{ ...group.series[0]!, label: `</script>${evil}` }] }],
          metrics: [{ title: evil, rows: [{ name: evil, value: evil, unit: evil, note: evil }] }],
          network: { rows: [{ element: evil, kind: evil, parameters: [{ name: evil, value: evil, unit: evil }] }] },
        },
      ],
    });
    expect(html).not.toContain('<script>alert');
    expect(html).not.toContain('<img');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    // exactly the three script elements we write: data (JSON), uPlot, the report script
    expect((html.match(/<script\b/gi) ?? []).length).toBe(3);
    expect((html.match(/<\/script/gi) ?? []).length).toBe(3);
    // the JSON still carries the label verbatim for the legend (set as text by uPlot)
    expect(embedded(html).plots[0]!.series[0]!.label).toBe(`</script>${evil}`);
  });

  it('escapes every string of the report data (a hostile string in every field): no element of ours is added', () => {
    const data = hostileReport();
    const html = renderHtmlReport(data);
    for (const text of HOSTILE) {
      const escaped = text
        .replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
      // Every string appears in the page escaped (element text), or only in the JSON data (axis labels, drawn by
      // the page's script as text), where the script-safe serialisation keeps it inert.
      const inData = JSON.stringify(embedded(html)).includes(JSON.stringify(text).slice(1, -1));
      expect(html.includes(escaped) || inData, text).toBe(true);
    }
    const outsideData = html.replace(/<script type="application\/json" id="fluxstate-report-data">[\s\S]*?<\/script>/, '');
    // No tag of the page carries anything from the payloads (no injected attribute, link or element).
    const tags = [...outsideData.matchAll(/<[a-zA-Z][^>]*>/g)].map((m) => m[0]);
    expect(tags.filter((tag) => /__injected|example\.invalid|javascript:|^<(img|svg)\b/i.test(tag))).toEqual([]);
    expect(outsideData).not.toContain('<!--');
    expect(tags.filter((tag) => /^<style\b/i.test(tag))).toEqual(['<style>', '<style>']); // uPlot's and ours
    expect((outsideData.match(/<meta\b/gi) ?? []).length).toBe(4); // charset, CSP, viewport, generator: ours only
    expect((html.match(/<script\b/gi) ?? []).length).toBe(3);
    expect((outsideData.match(/<a\b/gi) ?? []).length).toBe(1); // the contents link to the one section
  });

  it('refuses a metric status other than ok, warning or alert (it becomes a class name and a word)', () => {
    const data = syntheticReport(20);
    const section = data.sections[0]!;
    const bad = (status: unknown) =>
      renderHtmlReport({ ...data, sections: [{ ...section, metrics: [{ rows: [{ name: 'Peak', value: 1, status: status as 'ok' }] }] }] });
    expect(() => bad('ok"><a href="https://example.invalid">x</a>')).toThrow(expect.objectContaining({ code: 'report-bad-option' }));
    expect(() => bad('constructor')).toThrow(/status "constructor" is not one of 'ok', 'warning', 'alert'/);
    expect(() => bad('warning')).not.toThrow();
    const notText = (field: Record<string, unknown>) =>
      renderHtmlReport({ ...data, sections: [{ ...section, metrics: [{ rows: [{ name: 'Peak', value: 1, ...field }] }] }] });
    expect(() => notText({ note: { toString: () => '<b>' } })).toThrow(expect.objectContaining({ code: 'report-bad-text' }));
    expect(() => notText({ unit: 5 })).toThrow(expect.objectContaining({ code: 'report-bad-text' }));
  });

  it('embeds plot data rounded to 7 significant digits', () => {
    const t = [0, 0.1, 0.2];
    const html = renderHtmlReport({
      title: 'r',
      sections: [{ title: 's', plots: [{ title: 'p', series: [{ label: 'a', unit: 'A', t, values: [Math.PI, -Math.E * 1e-5, 1 / 3] }] }] }],
    });
    const values = embedded(html).plots[0]!.xGroups[0]!.columns[0]!.values;
    expect(values).toEqual([3.141593, -0.00002718282, 0.3333333]);
  });

  it('keeps time resolution relative to the span: a 1 ms window at t = 1000 s stays distinct', () => {
    const t = [1000, 1000.0005, 1000.001];
    const html = renderHtmlReport({
      title: 'r',
      sections: [{ title: 's', plots: [{ title: 'p', series: [{ label: 'a', unit: 'A', t, values: [1, 2, 3] }] }] }],
    });
    expect(embedded(html).plots[0]!.xGroups[0]!.x).toEqual(t);
  });

  it('decimates long series for display and keeps the peak', () => {
    const n = 100_000;
    const t = Float64Array.from({ length: n }, (_, i) => i * 1e-5);
    const v = t.map((x) => Math.sin(2 * Math.PI * 50 * x));
    v[54_321] = 7.5;
    const html = renderHtmlReport(
      { title: 'r', sections: [{ title: 's', plots: [{ title: 'p', series: [{ label: 'a', unit: 'A', t, values: v }] }] }] },
      { displayBuckets: 1000 },
    );
    const g = embedded(html).plots[0]!.xGroups[0]!;
    expect(g.x.length).toBeLessThanOrEqual(5 * 1000);
    expect(Math.max(...(g.columns[0]!.values as number[]))).toBe(7.5);
    expect(html).toContain('Shown: ');
    expect(html).toContain('of 100,000 samples');
  });

  it('stores a time vector shared by several series once, and separate ones separately', () => {
    const t = [0, 1, 2];
    const t2 = [0, 0.5, 1, 1.5, 2];
    const html = renderHtmlReport({
      title: 'r',
      sections: [
        {
          title: 's',
          plots: [
            {
              title: 'p',
              series: [
                { label: 'a', unit: 'A', t, values: [1, 2, 3] },
                { label: 'b', unit: 'A', t: [...t], values: [3, 2, 1] },
                { label: 'c', unit: 'A', t: t2, values: [0, 0, 0, 0, 0] },
              ],
            },
          ],
        },
      ],
    });
    const groups = embedded(html).plots[0]!.xGroups;
    expect(groups.length).toBe(2);
    expect(groups[0]!.columns.map((c) => c.index)).toEqual([0, 1]);
    expect(groups[1]!.columns.map((c) => c.index)).toEqual([2]);
  });

  it('lists metrics and network elements with their units and status in words', () => {
    const html = renderHtmlReport(syntheticReport());
    expect(html).toMatch(/<td>Peak<\/td><td class="num">1\.5<\/td><td class="unit">V<\/td>/);
    expect(html).toContain('<span class="badge badge-warning">Warning</span>');
    expect(html).toContain('<span class="pname">R</span> = 10 ohm');
  });

  it('gives the same bytes for the same data when no date is given', () => {
    expect(renderHtmlReport(syntheticReport())).toBe(renderHtmlReport(syntheticReport()));
    const dated = renderHtmlReport({ ...syntheticReport(), generatedAt: new Date(Date.UTC(2024, 2, 1, 8, 30)) });
    expect(dated).toContain('<dt>Generated</dt><dd>2024-03-01 08:30 UTC</dd>');
  });

  it('rejects bad options and malformed data with typed errors', () => {
    expect(() => renderHtmlReport(syntheticReport(), { significantDigits: 2 })).toThrow(InputError);
    expect(() => renderHtmlReport(syntheticReport(), { displayBuckets: 1.5 })).toThrow(/displayBuckets/);
    expect(() => renderHtmlReport({ title: 'r', sections: [{ title: 's', metrics: [{ rows: [{ name: 'x', value: 1, digits: 0 }] }] }] })).toThrow(
      expect.objectContaining({ code: 'report-bad-option', elements: ['x'] }),
    );
    expect(() => renderHtmlReport({ title: 42 as unknown as string, sections: [] })).toThrow(
      expect.objectContaining({ code: 'report-bad-text' }),
    );
  });

  it('does not modify its input', () => {
    const data = syntheticReport(100);
    const before = JSON.stringify(data, (_, v: unknown) => (ArrayBuffer.isView(v) ? Array.from(v as Float64Array) : v));
    renderHtmlReport(data);
    expect(JSON.stringify(data, (_, v: unknown) => (ArrayBuffer.isView(v) ? Array.from(v as Float64Array) : v))).toBe(before);
  });
});
