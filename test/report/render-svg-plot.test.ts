import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/index.js';
import { renderSvgPlot, SHORT_CAUTION, type PlotGroup } from '../../src/report/index.js';
import { xmlWellFormedError } from './xml-well-formed.js';

// Synthetic test data: sine and offset sine, 50 Hz, 0.1 s.
function synthetic(n = 2001): PlotGroup {
  const t = Float64Array.from({ length: n }, (_, i) => (i * 0.1) / (n - 1));
  return {
    title: 'Synthetic test data',
    series: [
      { label: 'sine', unit: 'T', quantity: 'Flux density', t, values: t.map((x) => Math.sin(2 * Math.PI * 50 * x)) },
      { label: 'offset sine', unit: 'T', t, values: t.map((x) => 0.5 + Math.sin(2 * Math.PI * 50 * x)) },
    ],
    references: [
      { label: '+B_sat', value: 1.6 },
      { label: '-B_sat', value: -1.6 },
    ],
  };
}

const count = (text: string, re: RegExp): number => (text.match(re) ?? []).length;

describe('xmlWellFormedError (the test helper itself)', () => {
  it('accepts well-formed XML and rejects the classic faults (XML 1.0, sects. 2.1, 2.4, 3.1)', () => {
    expect(xmlWellFormedError('<a x="1"><b/>t &amp; &#60; &#x3C;</a>')).toBeNull();
    expect(xmlWellFormedError('<a><b></a></b>')).not.toBeNull();
    expect(xmlWellFormedError('<a>x < y</a>')).not.toBeNull();
    expect(xmlWellFormedError('<a>R&D</a>')).not.toBeNull();
    expect(xmlWellFormedError('<a x=1/>')).not.toBeNull();
    expect(xmlWellFormedError('<a x="1" x="2"/>')).not.toBeNull();
    expect(xmlWellFormedError('<a/><b/>')).not.toBeNull();
    expect(xmlWellFormedError('<a>')).not.toBeNull();
  });
});

describe('renderSvgPlot', () => {
  it('gives a well-formed SVG document with one <path> per series', () => {
    const svg = renderSvgPlot(synthetic());
    expect(xmlWellFormedError(svg)).toBeNull();
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(count(svg, /<path\b/g)).toBe(2);
    expect(count(svg, /<path class="series-line"/g)).toBe(2);
    expect(svg).not.toMatch(/<script/i);
  });

  it('draws axes with nice tick labels and axis titles with units', () => {
    const svg = renderSvgPlot(synthetic(), { cautionText: false });
    // x: 0..0.1 s, tight: ticks at multiples of 0.02 (Heckbert 1990 with 7 ticks aimed for the 720 px width)
    for (const label of ['0.00', '0.02', '0.04', '0.06', '0.08', '0.10']) expect(svg).toContain(`>${label}</text>`);
    // y: data -1..1.5 and reference lines -1.6..1.6 -> loose range -2..2 step 1
    for (const label of ['-2', '-1', '0', '1', '2']) expect(svg).toContain(`>${label}</text>`);
    expect(svg).toContain('>Time (s)</text>');
    expect(svg).toContain('>Flux density (T)</text>');
  });

  it('draws each reference line dashed, with its label, at the right height', () => {
    const svg = renderSvgPlot(synthetic());
    const dashed = [...svg.matchAll(/<line [^>]*stroke-dasharray="6 4"[^>]*\/>/g)].map((m) => m[0]);
    expect(dashed.length).toBe(4); // two in the plot, two in the legend
    expect(svg).toContain('>+B_sat</text>');
    expect(svg).toContain('>+B_sat = 1.6 T</text>');
    // +1.6 on a -2..2 axis sits 10 % of the plot height below the top edge
    const frame = /<rect x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)" fill="none"/.exec(svg);
    expect(frame).not.toBeNull();
    const top = Number(frame![2]);
    const h = Number(frame![4]);
    const y1 = Number(/y1="([\d.]+)"/.exec(dashed[0]!)![1]);
    expect(y1).toBeCloseTo(top + 0.1 * h, 1);
  });

  it('keeps a one-sample peak of a long series in the drawn path', () => {
    const n = 200_000;
    const t = Float64Array.from({ length: n }, (_, i) => i * 1e-6);
    const v = t.map((x) => Math.sin(2 * Math.PI * 50 * x));
    v[123_457] = 10; // the highest point: must touch the top of the loose range 0..10
    const svg = renderSvgPlot({ title: 'spike', series: [{ label: 'v', unit: 'V', t, values: v }] }, { height: 400 });
    const d = /<path class="series-line" d="([^"]*)"/.exec(svg)![1]!;
    const ys = [...d.matchAll(/[ML][\d.]+ ([\d.]+)/g)].map((m) => Number(m[1]));
    const frame = /<rect x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)" fill="none"/.exec(svg)!;
    expect(Math.min(...ys)).toBeCloseTo(Number(frame[2]), 1); // y grows downwards: the top edge
    expect(ys.length).toBeLessThan(5 * 720); // decimated to about the pixel width
  });

  it('renders user text inert: a series named <script> is escaped text, not markup', () => {
    const g = synthetic(50);
    const evil: PlotGroup = {
      ...g,
      title: '<script>alert(1)</script>',
      series: [{ ...g.series[0]!, label: '"><script>alert(2)</script>' }],
    };
    const svg = renderSvgPlot(evil);
    expect(xmlWellFormedError(svg)).toBeNull();
    expect(svg).not.toMatch(/<script/i);
    expect(svg).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(svg).toContain('&quot;&gt;&lt;script&gt;alert(2)');
  });

  it('uses a right axis for a second unit and refuses a third, naming the plot', () => {
    const g = synthetic(50);
    const t = g.series[0]!.t;
    const two = renderSvgPlot({ ...g, series: [...g.series, { label: 'i', unit: 'A', quantity: 'Current', t, values: t }] });
    expect(two).toContain('>Current (A)</text>');
    expect(count(two, /<path\b/g)).toBe(3);
    const three = { ...g, series: [...g.series, { label: 'i', unit: 'A', t, values: t }, { label: 'v', unit: 'V', t, values: t }] };
    expect(() => renderSvgPlot(three)).toThrow(InputError);
    expect(() => renderSvgPlot(three)).toThrow(/Synthetic test data.*split/);
  });

  it('carries the caution: visible by default, always in <desc>', () => {
    expect(renderSvgPlot(synthetic(50))).toContain(`>${SHORT_CAUTION}</text>`);
    const quiet = renderSvgPlot(synthetic(50), { cautionText: false });
    expect(quiet).not.toContain(`>${SHORT_CAUTION}</text>`);
    expect(/<desc[^>]*>[^<]*verify against measurements/.test(quiet)).toBe(true);
  });

  it('draws a non-finite value as a break in the path', () => {
    const t = [0, 1, 2, 3, 4];
    const svg = renderSvgPlot({ title: 'gap', series: [{ label: 'v', unit: 'V', t, values: [0, 1, NaN, 1, 0] }] });
    const d = /<path class="series-line" d="([^"]*)"/.exec(svg)![1]!;
    expect(count(d, /M/g)).toBe(2);
  });

  it('rejects malformed series with typed errors naming the series', () => {
    const base = { title: 'p', series: [] as PlotGroup['series'] };
    expect(() => renderSvgPlot(base)).toThrow(expect.objectContaining({ code: 'report-no-series' }));
    const s = { label: 'i1', unit: 'A' };
    expect(() => renderSvgPlot({ ...base, series: [{ ...s, t: [0, 1], values: [1] }] })).toThrow(
      expect.objectContaining({ code: 'report-series-length', elements: ['i1'] }),
    );
    expect(() => renderSvgPlot({ ...base, series: [{ ...s, t: [0, 2, 1], values: [1, 2, 3] }] })).toThrow(
      expect.objectContaining({ code: 'report-time-not-sorted' }),
    );
    expect(() => renderSvgPlot({ ...base, series: [{ ...s, t: [0, NaN], values: [1, 2] }] })).toThrow(
      expect.objectContaining({ code: 'report-time-not-finite' }),
    );
    expect(() => renderSvgPlot({ ...base, series: [{ ...s, t: [0], values: [1], color: 'red" onload="x' }] })).toThrow(
      expect.objectContaining({ code: 'report-bad-color' }),
    );
    expect(() =>
      renderSvgPlot({ ...base, series: [{ ...s, t: [0], values: [1] }], references: [{ label: 'r', value: 1, unit: 'T' }] }),
    ).toThrow(expect.objectContaining({ code: 'report-bad-reference' }));
    expect(() => renderSvgPlot({ ...base, series: [{ ...s, t: [0], values: [1] }] }, { width: 10 })).toThrow(
      expect.objectContaining({ code: 'report-bad-option' }),
    );
  });
});
