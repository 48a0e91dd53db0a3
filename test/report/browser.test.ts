// Opens a rendered report in headless Chromium (Debian's package, driven by
// playwright-core; no browser is downloaded) and checks what a person would
// see: every plot drawn, legends complete, no script errors, no network
// access, user text inert, zoom / reset / linked zoom / cursor read-out
// working, the caution visible. Saves a screenshot to out/report-browser.png.
import { existsSync, mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_CAUTION, formatNumber, renderSvgPlot, writeReport, type ReportData } from '../../src/report/index.js';
import { HOSTILE, hostileReport } from './hostile-report.js';

const CANDIDATES = [process.env.FLUXSTATE_CHROMIUM, '/usr/bin/chromium', '/usr/bin/chromium-browser'];
const executablePath = CANDIDATES.find((p): p is string => !!p && existsSync(p));
const SKIP_REASON =
  'SKIPPED: no Chromium found (looked for $FLUXSTATE_CHROMIUM, /usr/bin/chromium, /usr/bin/chromium-browser); install the Debian package "chromium" (.ci/run does) to run it';
if (!executablePath) console.warn(`test/report/browser.test.ts ${SKIP_REASON}`);
/** In CI (CI=true or 1, as CI services and .ci/run set it) a missing browser is a failure, not a skip. */
const IN_CI = process.env.CI === 'true' || process.env.CI === '1';

describe('browser test setup', () => {
  it.runIf(IN_CI)('finds Chromium in CI (a missing browser must not pass as a skipped test)', () => {
    expect(executablePath, SKIP_REASON.replace('SKIPPED: ', '')).toBeDefined();
  });
});

// The project compiles without the DOM library; these are the few browser
// shapes the page-side callbacks below use.
interface PageCanvas {
  width: number;
  height: number;
  getContext(kind: '2d'): { getImageData(x: number, y: number, w: number, h: number): { data: ArrayLike<number> } } | null;
}
interface PageGlobals {
  __injected?: number;
  fluxstateCharts: { scales: { x: { min: number; max: number } } }[];
  fluxstateFormatNumber: (v: number, d: number) => string;
  DOMParser: new () => {
    parseFromString(text: string, type: string): {
      documentElement: { nodeName: string };
      getElementsByTagName(name: string): { length: number };
      querySelectorAll(selector: string): { length: number };
    };
  };
}

const EVIL_LABEL = '<img src=x onerror="window.__injected=1">offset sine';
const EVIL_TITLE = '<script>window.__injected=2</script>Sine on a coarse grid';

/** Synthetic test data: sine and offset sine (closed form, not a simulation). */
function syntheticData(): ReportData {
  const n = 20_001; // above 4 x 2000 buckets: exercises display decimation
  const t = Float64Array.from({ length: n }, (_, i) => (i * 0.1) / (n - 1));
  const sine = t.map((x) => Math.sin(2 * Math.PI * 50 * x));
  const offset = t.map((x) => 0.4 + 0.8 * Math.sin(2 * Math.PI * 50 * x - 1));
  const tc = Float64Array.from({ length: 101 }, (_, i) => i * 0.001); // a different, coarse time vector
  return {
    title: 'Browser test report (synthetic test data)',
    subtitle: 'Sine and offset sine: synthetic test data, not a simulation.',
    info: [{ label: 'Data', value: 'synthetic (test/report/browser.test.ts)' }],
    sections: [
      {
        title: 'Synthetic waveforms',
        description: 'Synthetic test data.',
        plots: [
          {
            title: 'Sine and offset sine (synthetic)',
            series: [
              { label: 'sine', quantity: 'Flux density', unit: 'T', t, values: sine },
              { label: EVIL_LABEL, quantity: 'Flux density', unit: 'T', t, values: offset },
            ],
            references: [
              { label: '+B_sat', value: 1.2, unit: 'T' },
              { label: '-B_sat', value: -1.2, unit: 'T' },
            ],
          },
          {
            title: EVIL_TITLE,
            series: [
              { label: 'sine, coarse', quantity: 'Current', unit: 'A', t: tc, values: tc.map((x) => 3 * Math.sin(2 * Math.PI * 50 * x)) },
              { label: 'sine, fine', quantity: 'Current', unit: 'A', t, values: sine.map((v) => 2 * v) },
              { label: 'offset sine', quantity: 'Voltage', unit: 'V', t, values: offset.map((v) => 100 * v) },
            ],
          },
        ],
        metrics: [{ title: 'Synthetic figures', rows: [{ name: 'Peak of sine', value: 1, unit: 'T', status: 'ok' }] }],
        network: { rows: [{ element: 'src', kind: 'voltage source', parameters: [{ name: 'amplitude', value: 100, unit: 'V' }] }] },
      },
    ],
  };
}

describe.skipIf(!executablePath)(
  executablePath ? 'renderHtmlReport in headless Chromium' : `renderHtmlReport in headless Chromium (${SKIP_REASON})`,
  () => {
    let browser: Browser;
    let page: Page;
    const problems: string[] = [];
    const requests: string[] = [];
    const file = resolve('out', 'report-test', 'browser-report.html');
    const data = syntheticData();

    beforeAll(async () => {
      writeReport(file, data);
      // playwright-core gives each launch a fresh temporary profile (user-data-dir)
      browser = await chromium.launch({
        executablePath,
        args: [
          '--headless',
          '--no-sandbox',
          '--disable-gpu',
          '--disable-quic',
          '--no-first-run',
          '--disable-background-networking',
          '--disable-component-update',
          '--disable-sync',
        ],
      });
      page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
      page.on('console', (m) => {
        if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`);
      });
      page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
      page.on('dialog', (d) => {
        problems.push(`dialog: ${d.message()}`);
        void d.dismiss();
      });
      page.on('request', (r) => requests.push(r.url()));
      await page.goto(pathToFileURL(file).href);
      await page.waitForSelector('html[data-plots-ready]', { timeout: 10_000 });
    });

    afterAll(async () => {
      await browser?.close();
    });

    it('draws every plot: one canvas each with the series in its colour, no errors, no network', async () => {
      expect(await page.getAttribute('html', 'data-plots-ready')).toBe('2');
      const canvases = await page.$$eval('.plot-area', (areas) => areas.map((a) => a.querySelectorAll('canvas').length));
      expect(canvases).toEqual([1, 1]);
      // the first series' colour (#0072B2 = rgb(0, 114, 178)) is painted on each canvas
      const painted = await page.$$eval('.plot-area canvas', (list) =>
        list.map((c) => {
          const canvas = c as unknown as PageCanvas;
          const px = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
          let hits = 0;
          for (let i = 0; i < px.length; i += 4) {
            if (Math.abs(px[i]! - 0) < 40 && Math.abs(px[i + 1]! - 114) < 40 && Math.abs(px[i + 2]! - 178) < 40) hits++;
          }
          return hits;
        }),
      );
      for (const hits of painted) expect(hits).toBeGreaterThan(200);
      expect(problems).toEqual([]);
      expect(requests.every((u) => u.startsWith('file://'))).toBe(true);
    });

    it('shows a legend with one entry per series (plus x) in each plot, with user text as plain text', async () => {
      const legends = await page.$$eval('.plot-area', (areas) => areas.map((a) => a.querySelectorAll('.u-legend tr.u-series').length));
      expect(legends).toEqual([2 + 1, 3 + 1]);
      const labels = await page.$$eval('.plot-area .u-legend .u-label', (els) => els.map((e) => e.textContent));
      expect(labels).toContain(EVIL_LABEL);
      expect(await page.textContent('#plot-1-2 h3')).toBe(EVIL_TITLE);
      expect(await page.evaluate(() => (globalThis as unknown as PageGlobals).__injected)).toBeUndefined();
      expect(await page.$$eval('img', (imgs) => imgs.length)).toBe(0);
    });

    it('shows the caution prominently', async () => {
      expect((await page.textContent('.caution .caution-text'))?.trim()).toBe(DEFAULT_CAUTION);
      expect(await page.isVisible('.caution')).toBe(true);
      const box = await page.locator('.caution').boundingBox();
      expect(box!.y).toBeLessThan(400); // above the first plot, in the first screen
    });

    it('reads out values at the cursor, zooms by drag (linked), and resets on double-click', async () => {
      const over = page.locator('#plot-1-1 .u-over');
      const box = (await over.boundingBox())!;
      await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.5);
      const readout = await page.$$eval('#plot-1-1 .u-legend .u-value', (els) => els.map((e) => e.textContent ?? ''));
      expect(readout[0]).toMatch(/^0\.0\d+\u00A0s$/); // time near 0.05 s
      expect(readout[1]).toMatch(/^-?[\d.]+(\u00D710[\u207B\u2070-\u2079\u00B9\u00B2\u00B3]+)?\u00A0T$/);

      const scales = (): Promise<[number, number][]> =>
        page.evaluate(() =>
          (globalThis as unknown as PageGlobals).fluxstateCharts.map((u) => [u.scales.x.min, u.scales.x.max] as [number, number]),
        );
      const full = await scales();
      expect(full[0]![0]).toBeCloseTo(0, 9);
      expect(full[0]![1]).toBeCloseTo(0.1, 9);
      await page.mouse.move(box.x + box.width * 0.2, box.y + box.height * 0.5);
      await page.mouse.down();
      await page.mouse.move(box.x + box.width * 0.4, box.y + box.height * 0.5, { steps: 5 });
      await page.mouse.up();
      const zoomed = await scales();
      expect(zoomed[0]![0]).toBeCloseTo(0.02, 2);
      expect(zoomed[0]![1]).toBeCloseTo(0.04, 2);
      expect(zoomed[1]).toEqual(zoomed[0]); // the other plot with a time axis follows
      await page.mouse.dblclick(box.x + box.width * 0.5, box.y + box.height * 0.5);
      const reset = await scales();
      expect(reset[0]![0]).toBeCloseTo(0, 9);
      expect(reset[0]![1]).toBeCloseTo(0.1, 9);
      expect(problems).toEqual([]);
    });

    it('toggles a series from its legend entry', async () => {
      const entry = page.locator('#plot-1-1 .u-legend tr.u-series').nth(1);
      await entry.locator('th').click();
      expect(await entry.getAttribute('class')).toContain('u-off');
      await entry.locator('th').click();
      expect(await entry.getAttribute('class')).not.toContain('u-off');
    });

    it('formats numbers in the page exactly as formatNumber does in Node', async () => {
      const cases: [number, number][] = [
        [41.234, 3],
        [1.5e-6, 4],
        [-2.5e7, 3],
        [999.96, 4],
        [0.001234, 3],
      ];
      const inPage = await page.evaluate(
        (cs) => cs.map(([v, d]) => (globalThis as unknown as PageGlobals).fluxstateFormatNumber(v, d)),
        cases,
      );
      expect(inPage).toEqual(cases.map(([v, d]) => formatNumber(v, d)));
    });

    it('parses renderSvgPlot output with the browser XML parser and finds one path per series', async () => {
      const group = data.sections[0]!.plots![1]!;
      const svg = renderSvgPlot(group);
      const result = await page.evaluate((text) => {
        const doc = new (globalThis as unknown as PageGlobals).DOMParser().parseFromString(text, 'image/svg+xml');
        return {
          errors: doc.getElementsByTagName('parsererror').length,
          root: doc.documentElement.nodeName,
          paths: doc.querySelectorAll('path.series-line').length,
          scripts: doc.getElementsByTagName('script').length,
        };
      }, svg);
      expect(result).toEqual({ errors: 0, root: 'svg', paths: 3, scripts: 0 });
    });

    it('saves a full-page screenshot to out/report-browser.png', async () => {
      mkdirSync('out', { recursive: true });
      const png = resolve('out', 'report-browser.png');
      await page.mouse.move(0, 0);
      await page.screenshot({ path: png, fullPage: true });
      expect(existsSync(png)).toBe(true);
    });
  },
);

describe.skipIf(!executablePath)('renderHtmlReport in headless Chromium: a hostile string in every field of the data', () => {
  let browser: Browser;
  let page: Page;
  const problems: string[] = [];
  const requests: string[] = [];
  const file = resolve('out', 'report-test', 'hostile-report.html');

  beforeAll(async () => {
    writeReport(file, hostileReport());
    browser = await chromium.launch({
      executablePath,
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
    page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
    page.on('dialog', (d) => {
      problems.push(`dialog: ${d.message()}`);
      void d.dismiss();
    });
    page.on('framenavigated', (f) => {
      if (f === page.mainFrame() && f.url() !== pathToFileURL(file).href) problems.push(`navigated to ${f.url()}`);
    });
    page.on('request', (r) => requests.push(r.url()));
    await page.goto(pathToFileURL(file).href);
    await page.waitForSelector('html[data-plots-ready]', { timeout: 10_000 });
    // Give a meta refresh or a deferred handler the chance to fire, then hover and focus everything.
    await page.waitForTimeout(300);
    await page.mouse.move(300, 300);
    await page.keyboard.press('Tab');
    await page.keyboard.press('Tab');
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('runs nothing from the data: no handler fired, no element injected, no navigation, no request', async () => {
    expect(await page.evaluate(() => (globalThis as unknown as PageGlobals).__injected)).toBeUndefined();
    expect(await page.$$eval('img, svg, iframe, object, embed, style:not(head style)', (els) => els.length)).toBe(0);
    expect(await page.$$eval('a', (as) => as.map((a) => a.getAttribute('href')))).toEqual(['#section-1']);
    expect(await page.$$eval('meta[http-equiv="refresh"]', (els) => els.length)).toBe(0);
    expect(await page.$$eval('[onerror], [onload], [onmouseover], [onfocus], [autofocus]', (els) => els.length)).toBe(0);
    expect(await page.$$eval('script', (els) => els.length)).toBe(3);
    expect(page.url()).toBe(pathToFileURL(file).href);
    expect(problems).toEqual([]);
    expect(requests.every((u) => u.startsWith('file://'))).toBe(true);
    expect(await page.getAttribute('html', 'data-plots-ready')).toBe('1');
  });

  it('shows every string as plain text (page text without the scripts, plus the page title)', async () => {
    const text = await page.evaluate(() => {
      const doc = (globalThis as unknown as { document: { title: string; body: { cloneNode(deep: boolean): { querySelectorAll(s: string): { forEach(f: (e: { remove(): void }) => void): void }; textContent: string | null } } } }).document;
      const body = doc.body.cloneNode(true);
      body.querySelectorAll('script').forEach((s) => s.remove());
      return `${doc.title}\n${body.textContent ?? ''}`;
    });
    // Each string appears verbatim as text, except the quantities: they title the y axes, which uPlot paints on
    // the canvas (inert); there they are the axis labels given to the chart.
    const axisLabels = await page.evaluate(() =>
      (globalThis as unknown as { fluxstateCharts: { axes: { label?: string }[] }[] }).fluxstateCharts.flatMap((u) => u.axes.map((a) => a.label ?? '')),
    );
    const missing = HOSTILE.filter((s) => !text.includes(s));
    expect(missing.map((s) => s.replace(/^.*(quantity \d)$/, '$1'))).toEqual(['quantity 1', 'quantity 2']);
    for (const s of missing) expect(axisLabels.some((label) => label.includes(s)), s).toBe(true);
  });
});

describe.skipIf(!executablePath)('resultReport in headless Chromium on a laptop screen (1366 x 768)', () => {
  it('shows the whole first plot in the first screen, its time axis in ms', async () => {
    const { createNetwork, demoMaterials, mm, mm2, simulate, sine } = await import('../../src/index.js');
    const { resultReport } = await import('../../src/report/index.js');
    const net = createNetwork('first transformer');
    const bottom = net.magneticNode('bottom');
    const top = net.magneticNode('top');
    const steel = demoMaterials.grainOrientedSteel;
    const leg = net.fluxTube('wound leg', { from: bottom, to: top, length: mm(150), area: mm2(900), material: steel });
    net.fluxTube('rest of core', { from: top, to: bottom, length: mm(350), area: mm2(900), material: steel });
    const line = net.node('line');
    net.voltageSource('mains', line, net.ground, sine({ amplitude: 325, frequency: 50, phase: Math.PI / 2 }));
    net.winding('primary', { tube: leg, turns: 820, resistance: 2.5, plus: line, minus: net.ground });
    const file = resolve('out', 'report-test', 'laptop-report.html');
    writeReport(file, resultReport(simulate(net, { stopTime: 0.1 }), { title: 'First transformer', subtitle: 'Invented design' }));
    const browser = await chromium.launch({ executablePath, args: ['--headless', '--no-sandbox', '--disable-gpu'] });
    try {
      const page = await browser.newPage({ viewport: { width: 1366, height: 768 } });
      await page.goto(pathToFileURL(file).href);
      await page.waitForSelector('html[data-plots-ready]', { timeout: 10_000 });
      const plot = (await page.locator('.plot-area').first().boundingBox())!;
      expect(plot.y + plot.height).toBeLessThanOrEqual(768);
      const caution = (await page.locator('.caution').boundingBox())!;
      expect(caution.y + caution.height).toBeLessThan(plot.y); // the caution still comes first
      const axis = await page.evaluate(() => (globalThis as unknown as { fluxstateCharts: { axes: { label?: string }[] }[] }).fluxstateCharts[0]!.axes[0]!.label);
      expect(axis).toBe('Time (ms)');
    } finally {
      await browser.close();
    }
  });
});
