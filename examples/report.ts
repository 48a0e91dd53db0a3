// Renders an HTML report and two SVG plots from SYNTHETIC data (closed-form
// curves, no simulation) into out/report-example/. It shows the ReportData
// shape an adapter produces; the numbers describe no real device.
//
//   npx tsx examples/report.ts
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { renderSvgPlot, writeReport, type PlotGroup, type ReportData } from '../src/report/index.js';

const f = 50; // Hz
const w = 2 * Math.PI * f;
const n = 40_001; // 0.2 s at 5 us: long enough to exercise display decimation
const t = new Float64Array(n);
const flux = new Float64Array(n);
const bLeg = new Float64Array(n);
const current = new Float64Array(n);
const voltage = new Float64Array(n);
const tau = 0.06; // s, invented decay of the synthetic DC offset
const area = 1.1e-3; // m^2, invented
for (let i = 0; i < n; i++) {
  const ti = i * 5e-6;
  t[i] = ti;
  voltage[i] = 325 * Math.sin(w * ti);
  // synthetic flux linkage with a decaying offset, as after switching at a voltage zero
  const phi = 1.45e-3 * (1 - Math.cos(w * ti)) * Math.exp(-ti / tau) + 1.45e-3 * -Math.cos(w * ti) * (1 - Math.exp(-ti / tau));
  flux[i] = phi;
  bLeg[i] = phi / area;
  // a made-up steep curve standing in for a saturating magnetising current
  current[i] = (0.4 * Math.sinh(2.4 * (phi / area))) / Math.sinh(2.4);
}

const B_SAT = 1.6; // T, invented
const fluxGroup: PlotGroup = {
  title: 'Flux density in the core leg (synthetic)',
  description: 'Closed-form curve with a decaying DC offset; not a simulation result.',
  series: [{ label: 'B leg', quantity: 'Flux density', unit: 'T', t, values: bLeg }],
  references: [
    { label: '+B_sat', value: B_SAT, unit: 'T' },
    { label: '-B_sat', value: -B_SAT, unit: 'T' },
  ],
};
const currentGroup: PlotGroup = {
  title: 'Winding current and terminal voltage (synthetic)',
  series: [
    { label: 'i primary', quantity: 'Current', unit: 'A', t, values: current },
    { label: 'v primary', quantity: 'Voltage', unit: 'V', t, values: voltage },
  ],
};

let peakB = 0;
let peakI = 0;
for (let i = 0; i < n; i++) {
  peakB = Math.max(peakB, Math.abs(bLeg[i] ?? 0));
  peakI = Math.max(peakI, Math.abs(current[i] ?? 0));
}

const data: ReportData = {
  title: 'Report example: energisation (synthetic data)',
  subtitle: 'All curves are closed-form synthetic test data, not results of a simulation.',
  generatedAt: new Date(),
  info: [
    { label: 'Data', value: 'synthetic, examples/report.ts' },
    { label: 'Samples', value: `${n} per series, 5 us spacing` },
  ],
  sections: [
    {
      title: 'Waveforms',
      description: 'Drag across a plot to zoom; the two plots zoom together.',
      plots: [fluxGroup, currentGroup],
    },
    {
      title: 'Key figures',
      metrics: [
        {
          title: 'Saturation and inrush (synthetic)',
          rows: [
            {
              name: 'Peak |B|, leg',
              value: peakB,
              unit: 'T',
              status: peakB > B_SAT ? 'alert' : 'ok',
              note: `B_sat = ${B_SAT} T (invented)`,
            },
            { name: 'Margin to B_sat', value: B_SAT - peakB, unit: 'T' },
            { name: 'Peak |i|, primary', value: peakI, unit: 'A', digits: 3 },
          ],
        },
      ],
    },
    {
      title: 'Network',
      network: {
        title: 'Elements (invented values)',
        rows: [
          {
            element: 'mains',
            kind: 'voltage source',
            connections: 'a -> gnd',
            parameters: [
              { name: 'amplitude', value: 325, unit: 'V' },
              { name: 'frequency', value: 50, unit: 'Hz' },
            ],
          },
          {
            element: 'P1',
            kind: 'winding',
            connections: 'a -> gnd, on leg',
            parameters: [
              { name: 'turns', value: 400 },
              { name: 'resistance', value: 0.8, unit: '\u03A9' },
            ],
          },
          {
            element: 'leg',
            kind: 'flux tube',
            parameters: [
              { name: 'length', value: 0.32, unit: 'm' },
              { name: 'area', value: area, unit: 'm\u00B2' },
            ],
          },
        ],
      },
    },
  ],
};

const dir = join('out', 'report-example');
const file = writeReport(join(dir, 'report.html'), data);
writeFileSync(join(dir, 'flux.svg'), renderSvgPlot(fluxGroup));
writeFileSync(join(dir, 'current.svg'), renderSvgPlot(currentGroup, { width: 640, height: 360 }));
console.log(`report: ${file}`);
console.log(`svg:    ${join(dir, 'flux.svg')}, ${join(dir, 'current.svg')}`);
