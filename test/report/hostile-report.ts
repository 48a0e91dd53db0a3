/**
 * Report data with a hostile string in every text field (test fixture; the
 * numbers are synthetic, not a simulation). Each payload tries a different
 * way out of the text: a tag with an event handler, a closing script tag, a
 * link, a meta refresh, an attribute break-out, a javascript: URL, an HTML
 * comment, and control characters. `HOSTILE` lists what each field holds, so
 * a test can look for every one of them as plain text.
 */
import type { ReportData } from '../../src/report/index.js';

const PAYLOADS = [
  '<img src=x onerror="window.__injected=1">',
  '</script><script>window.__injected=2</script>',
  '<a href="https://example.invalid/phish">click</a>',
  '<meta http-equiv="refresh" content="0;url=https://example.invalid/">',
  '" onmouseover="window.__injected=3" x="',
  "' autofocus onfocus='window.__injected=4' x='",
  'javascript:window.__injected=5',
  '<!-- <style>body{display:none}</style> -->',
  '<svg onload="window.__injected=6"></svg>',
  '&lt;already escaped&gt; & ampersand',
];

let next = 0;
/** A distinct hostile string per field: a payload with the field's name, so a test can find each. */
export const HOSTILE: string[] = [];
function evil(field: string): string {
  const text = `${PAYLOADS[next++ % PAYLOADS.length]}${field}`;
  HOSTILE.push(text);
  return text;
}

/** The data; call once per test file (HOSTILE accumulates the strings used). */
export function hostileReport(): ReportData {
  const n = 2001;
  const t = Float64Array.from({ length: n }, (_, i) => (i * 0.04) / (n - 1));
  const sine = t.map((x) => Math.sin(2 * Math.PI * 50 * x));
  const unitA = evil('unit A');
  const unitB = evil('unit B');
  return {
    title: evil('title'),
    subtitle: evil('subtitle'),
    caution: evil('caution'),
    generatedAt: evil('generated at'),
    info: [{ label: evil('info label'), value: evil('info value') }],
    sections: [
      {
        title: evil('section title'),
        description: evil('section description'),
        plots: [
          {
            title: evil('plot title'),
            description: evil('plot description'),
            xLabel: evil('x label'),
            xUnit: evil('x unit'),
            series: [
              { label: evil('series label 1'), quantity: evil('quantity 1'), unit: unitA, t, values: sine },
              { label: evil('series label 2'), quantity: evil('quantity 2'), unit: unitB, t, values: sine.map((v) => 3 * v) },
            ],
            references: [{ label: evil('reference label'), value: 0.8, unit: unitA }],
          },
        ],
        metrics: [
          {
            title: evil('metric table title'),
            rows: [
              { name: evil('metric name'), value: evil('metric value'), unit: evil('metric unit'), note: evil('metric note'), status: 'alert' },
              { name: evil('metric name 2'), value: 1.25, unit: evil('metric unit 2'), status: 'ok' },
            ],
          },
        ],
        network: {
          title: evil('network title'),
          rows: [
            {
              element: evil('element'),
              kind: evil('kind'),
              connections: evil('connections'),
              note: evil('element note'),
              parameters: [
                { name: evil('parameter name'), value: evil('parameter value'), unit: evil('parameter unit') },
                { name: evil('parameter name 2'), value: 325.2691193458119, unit: evil('parameter unit 2') },
              ],
            },
          ],
        },
      },
    ],
  };
}
