// Static SVG of one plot group, for documents: no dependencies, no script.
// Axes with nice ticks (Heckbert 1990, see nice-ticks.ts), a left and an
// optional right y axis, one <path> per series (decimated min/max per pixel
// column, see decimate.ts), dashed reference lines with labels, a legend and
// a one-line caution.
import { InputError } from '../errors.js';
import { escapeMarkup } from './escape.js';
import { formatNumber, formatTicks } from './format-number.js';
import { niceTicks, type NiceTicks } from './nice-ticks.js';
import { isSafeColor } from './palette.js';
import { preparePlot, type PreparedPlot } from './prepare-plot.js';
import { SHORT_CAUTION, type PlotGroup } from './report-data.js';
import { validatePlotGroup } from './validate-report-data.js';

/**
 * Options of {@link renderSvgPlot}.
 *
 * @example
 * ```ts
 * const options: SvgPlotOptions = { width: 640, height: 360, fontSize: 11, cautionText: false };
 * ```
 */
export interface SvgPlotOptions {
  /** Width in px (user units). Default 720. */
  readonly width?: number;
  /** Height in px. Default 420. */
  readonly height?: number;
  /** Font size of tick labels in px; titles scale from it. Default 12. */
  readonly fontSize?: number;
  /** CSS font-family list. Default a system sans-serif stack. */
  readonly fontFamily?: string;
  /** Draw the group's title at the top. Default true. */
  readonly showTitle?: boolean;
  /**
   * One-line caution at the bottom. Default {@link SHORT_CAUTION}. `false`
   * hides it: do that only when the document around the figure carries the
   * caution. The caution is always kept in the SVG's `<desc>`.
   */
  readonly cautionText?: string | false;
  /** Prefix of the element ids (clip path, title), to keep ids unique when several SVGs are inlined in one page. Default derived from the group. */
  readonly idPrefix?: string;
  /** Background fill, a CSS colour or `'none'`. Default `'#ffffff'`. */
  readonly background?: string;
}

const DEFAULT_FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif";
const AXIS_COLOR = '#374151';
const GRID_COLOR = '#e5e7eb';
const MUTED_COLOR = '#6b7280';

/** Approximate advance width of a text in a sans-serif font (no font metrics without a browser). */
function textWidth(text: string, fontSize: number): number {
  return [...text].length * fontSize * 0.56;
}

/** Coordinates with 2 decimals: 1/100 px is below any renderer's resolution. */
function px(v: number): string {
  return (Math.round(v * 100) / 100).toString();
}

/** FNV-1a 32-bit hash (Fowler, Noll, Vo; common practice) for default element ids. */
function fnv1a(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}

function checkOptions(o: SvgPlotOptions): void {
  const positive = (v: number | undefined, name: string, min: number): void => {
    if (v !== undefined && !(Number.isFinite(v) && v >= min)) {
      throw new InputError('report-bad-option', `renderSvgPlot: ${name} ${v} must be a number >= ${min}`, [name]);
    }
  };
  positive(o.width, 'width', 120);
  positive(o.height, 'height', 100);
  positive(o.fontSize, 'fontSize', 4);
  if (o.background !== undefined && o.background !== 'none' && !isSafeColor(o.background)) {
    throw new InputError('report-bad-color', `renderSvgPlot: background "${o.background}" is not a CSS colour we accept`, [
      'background',
    ]);
  }
  if (o.idPrefix !== undefined && !/^[A-Za-z][\w-]*$/.test(o.idPrefix)) {
    throw new InputError('report-bad-option', `renderSvgPlot: idPrefix "${o.idPrefix}" must be a letter then letters, digits, - or _`, [
      'idPrefix',
    ]);
  }
}

interface LegendItem {
  readonly text: string;
  readonly color: string;
  readonly dashed: boolean;
}

function legendItems(plot: PreparedPlot): LegendItem[] {
  const items: LegendItem[] = plot.series.map((s) => ({
    text: s.unit ? `${s.label} (${s.unit})` : s.label,
    color: s.color,
    dashed: false,
  }));
  for (const r of plot.references) {
    const unit = plot.units[r.axis] ?? '';
    items.push({ text: `${r.label} = ${formatNumber(r.value)}${unit ? ` ${unit}` : ''}`, color: r.color, dashed: true });
  }
  return items;
}

/** Lay legend items out in rows no wider than `width`. */
function legendRows(items: readonly LegendItem[], width: number, fontSize: number): LegendItem[][] {
  const rows: LegendItem[][] = [];
  let row: LegendItem[] = [];
  let used = 0;
  for (const item of items) {
    const w = 26 + textWidth(item.text, fontSize) + 18;
    if (row.length > 0 && used + w > width) {
      rows.push(row);
      row = [];
      used = 0;
    }
    row.push(item);
    used += w;
  }
  if (row.length > 0) rows.push(row);
  return rows;
}

function yTicks(range: [number, number] | null, count: number): NiceTicks {
  return range === null ? niceTicks(0, 1, count) : niceTicks(range[0], range[1], count);
}

/**
 * Static SVG (a complete `<svg>` document, XML well-formed, no script) of a
 * plot group, for reports, papers and slides: a frame with nice ticks at
 * 1, 2 or 5 times a power of ten (Heckbert 1990), axis titles with units, a
 * left and (for a second unit) a right y axis, one `<path>` per series, the
 * reference lines dashed with their label, a legend and a one-line caution.
 * Long series are decimated per pixel column with the min/max method, so
 * peaks stay. All text is escaped.
 *
 * @throws InputError when the group is malformed (see `validatePlotGroup`) or an option is out of range.
 *
 * @example
 * ```ts
 * import { writeFileSync } from 'node:fs';
 * import { renderSvgPlot } from 'fluxstate/report';
 * writeFileSync('out/flux.svg', renderSvgPlot(fluxGroup, { width: 640, height: 360 }));
 * ```
 */
export function renderSvgPlot(group: PlotGroup, options: SvgPlotOptions = {}): string {
  validatePlotGroup(group);
  checkOptions(options);
  const width = options.width ?? 720;
  const height = options.height ?? 420;
  const fs = options.fontSize ?? 12;
  const font = options.fontFamily ?? DEFAULT_FONT;
  const showTitle = options.showTitle ?? true;
  const caution = options.cautionText === false ? '' : (options.cautionText ?? SHORT_CAUTION);
  const id = options.idPrefix ?? `fs-${fnv1a(group.title + group.series.map((s) => s.label).join('|'))}`;
  const background = options.background ?? '#ffffff';

  const plot = preparePlot(group, { buckets: Math.ceil(width) });
  const twoAxes = plot.units.length === 2;
  const pad = 12;
  const titleSize = Math.round(fs * 1.25);
  const axisTitleSize = fs;

  // vertical layout
  const top = pad + (showTitle ? titleSize + 10 : 4);
  const items = legendItems(plot);
  const rows = legendRows(items, width - 2 * pad, fs);
  const lineH = fs + 8;
  const cautionH = caution ? fs + 6 : 0;
  const bottomBlock = pad + cautionH + rows.length * lineH + 6 + (axisTitleSize + 8) + (fs + 8);
  const plotH = Math.max(40, height - top - bottomBlock);

  // y ticks decide the margins (label widths)
  const yCount = Math.max(3, Math.round(plotH / 55));
  const ticksY = plot.units.map((_, a) => yTicks(plot.yRanges[a] ?? null, yCount));
  const labelsY = ticksY.map((t) => formatTicks(t.values, t.step));
  const labelW = (a: number): number => Math.max(0, ...(labelsY[a] ?? []).map((s) => textWidth(s, fs)));
  const left = pad + axisTitleSize + 10 + labelW(0) + 8;
  const right = twoAxes ? pad + axisTitleSize + 10 + labelW(1) + 8 : pad + 8;
  const plotW = Math.max(40, width - left - right);

  const [x0, x1] = plot.xRange;
  const ticksX = niceTicks(x0, x1, Math.max(3, Math.round(plotW / 110)), 'tight');
  const labelsX = formatTicks(ticksX.values, ticksX.step);
  const xMin = ticksX.min;
  const xMax = ticksX.max;
  const sx = (v: number): number => left + ((v - xMin) / (xMax - xMin)) * plotW;
  const sy = (v: number, axis: number): number => {
    const t = ticksY[axis] as NiceTicks;
    return top + plotH - ((v - t.min) / (t.max - t.min)) * plotH;
  };

  const out: string[] = [];
  const labelledBy = `${id}-title ${id}-desc`;
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${px(width)}" height="${px(height)}" viewBox="0 0 ${px(width)} ${px(height)}" ` +
      `font-family="${escapeMarkup(font)}" font-size="${px(fs)}" role="img" aria-labelledby="${labelledBy}">`,
  );
  out.push(`<title id="${id}-title">${escapeMarkup(plot.title)}</title>`);
  const descParts = [
    `Series: ${plot.series.map((s) => `${s.label} (${s.unit || 'dimensionless'}) from ${s.min === null ? 'n/a' : formatNumber(s.min)} to ${s.max === null ? 'n/a' : formatNumber(s.max)}`).join('; ')}.`,
    plot.references.length > 0 ? `Reference lines: ${plot.references.map((r) => `${r.label} = ${formatNumber(r.value)}`).join('; ')}.` : '',
    caution || SHORT_CAUTION,
  ];
  out.push(`<desc id="${id}-desc">${escapeMarkup(descParts.filter(Boolean).join(' '))}</desc>`);
  out.push(
    `<defs><clipPath id="${id}-clip"><rect x="${px(left)}" y="${px(top)}" width="${px(plotW)}" height="${px(plotH)}"/></clipPath></defs>`,
  );
  if (background !== 'none') out.push(`<rect width="100%" height="100%" fill="${escapeMarkup(background)}"/>`);
  if (showTitle) {
    out.push(
      `<text x="${px(pad)}" y="${px(pad + titleSize)}" font-size="${px(titleSize)}" font-weight="600" fill="#111827">${escapeMarkup(plot.title)}</text>`,
    );
  }

  // grid (x and left axis): <line> elements, so that <path> is used by series only
  const line = (xa: number, ya: number, xb: number, yb: number, extra = ''): string =>
    `<line x1="${px(xa)}" y1="${px(ya)}" x2="${px(xb)}" y2="${px(yb)}"${extra}/>`;
  out.push(`<g class="grid" stroke="${GRID_COLOR}" stroke-width="1">`);
  for (const v of ticksX.values) out.push(line(sx(v), top, sx(v), top + plotH));
  for (const v of (ticksY[0] as NiceTicks).values) out.push(line(left, sy(v, 0), left + plotW, sy(v, 0)));
  out.push('</g>');

  // axes: frame, ticks, tick labels, titles
  out.push(`<g class="axes" fill="${AXIS_COLOR}" stroke="none">`);
  out.push(
    `<rect x="${px(left)}" y="${px(top)}" width="${px(plotW)}" height="${px(plotH)}" fill="none" stroke="${AXIS_COLOR}" stroke-width="1"/>`,
  );
  const tick = 5;
  ticksX.values.forEach((v, k) => {
    const x = sx(v);
    out.push(line(x, top + plotH, x, top + plotH + tick, ` stroke="${AXIS_COLOR}"`));
    out.push(`<text x="${px(x)}" y="${px(top + plotH + tick + fs)}" text-anchor="middle">${escapeMarkup(labelsX[k] ?? '')}</text>`);
  });
  const xTitle = plot.xUnit ? `${plot.xLabel} (${plot.xUnit})` : plot.xLabel;
  out.push(
    `<text x="${px(left + plotW / 2)}" y="${px(top + plotH + tick + fs + 8 + axisTitleSize)}" text-anchor="middle" font-weight="600">${escapeMarkup(xTitle)}</text>`,
  );
  plot.units.forEach((_, axis) => {
    const t = ticksY[axis] as NiceTicks;
    const labels = labelsY[axis] ?? [];
    const onLeft = axis === 0;
    const xEdge = onLeft ? left : left + plotW;
    const dir = onLeft ? -1 : 1;
    t.values.forEach((v, k) => {
      const y = sy(v, axis);
      out.push(line(xEdge, y, xEdge + dir * tick, y, ` stroke="${AXIS_COLOR}"`));
      out.push(
        `<text x="${px(xEdge + dir * (tick + 3))}" y="${px(y + fs * 0.35)}" text-anchor="${onLeft ? 'end' : 'start'}">${escapeMarkup(labels[k] ?? '')}</text>`,
      );
    });
    const xt = onLeft ? pad + axisTitleSize * 0.8 : width - pad - axisTitleSize * 0.2;
    const yt = top + plotH / 2;
    out.push(
      `<text x="${px(xt)}" y="${px(yt)}" text-anchor="middle" font-weight="600" transform="rotate(-90 ${px(xt)} ${px(yt)})">${escapeMarkup(plot.axisLabels[axis] ?? '')}</text>`,
    );
  });
  out.push('</g>');

  // series: one <path> each; a non-finite value starts a new sub-path
  out.push(`<g class="series" clip-path="url(#${id}-clip)" fill="none" stroke-width="1.5" stroke-linejoin="round" stroke-linecap="round">`);
  plot.series.forEach((s, k) => {
    const group = plot.xGroups.find((g) => g.columns.some((c) => c.index === k));
    const column = group?.columns.find((c) => c.index === k);
    let d = '';
    let pen = false;
    if (group && column) {
      for (let i = 0; i < group.x.length; i++) {
        const xv = group.x[i];
        const yv = column.values[i];
        if (xv === null || xv === undefined || yv === null || yv === undefined) {
          pen = false;
          continue;
        }
        d += `${pen ? 'L' : 'M'}${px(sx(xv))} ${px(sy(yv, s.axis))}`;
        pen = true;
      }
    }
    out.push(`<path class="series-line" d="${d}" stroke="${escapeMarkup(s.color)}"><title>${escapeMarkup(s.label)}</title></path>`);
  });
  out.push('</g>');

  // reference lines, dashed, label at the right end (below the line when too close to the top)
  if (plot.references.length > 0) {
    out.push('<g class="references">');
    for (const r of plot.references) {
      const y = sy(r.value, r.axis);
      const color = escapeMarkup(r.color);
      out.push(line(left, y, left + plotW, y, ` stroke="${color}" stroke-width="1.25" stroke-dasharray="6 4"`));
      const ty = y - top < fs + 4 ? y + fs + 2 : y - 4;
      out.push(
        `<text x="${px(left + plotW - 4)}" y="${px(ty)}" text-anchor="end" fill="${color}" stroke="#ffffff" stroke-width="3" paint-order="stroke">${escapeMarkup(r.label)}</text>`,
      );
    }
    out.push('</g>');
  }

  // legend rows under the x axis title
  let ly = top + plotH + tick + fs + 8 + axisTitleSize + 8;
  out.push(`<g class="legend" fill="${AXIS_COLOR}">`);
  for (const row of rows) {
    ly += lineH;
    let lx = pad;
    for (const item of row) {
      const color = escapeMarkup(item.color);
      const dash = item.dashed ? ' stroke-dasharray="6 4"' : '';
      out.push(line(lx, ly - fs * 0.35, lx + 22, ly - fs * 0.35, ` stroke="${color}" stroke-width="${item.dashed ? 1.25 : 2}"${dash}`));
      out.push(`<text x="${px(lx + 26)}" y="${px(ly)}">${escapeMarkup(item.text)}</text>`);
      lx += 26 + textWidth(item.text, fs) + 18;
    }
  }
  out.push('</g>');

  if (caution) {
    out.push(
      `<text class="caution" x="${px(pad)}" y="${px(height - pad)}" font-size="${px(Math.max(8, fs * 0.85))}" fill="${MUTED_COLOR}">${escapeMarkup(caution)}</text>`,
    );
  }
  out.push('</svg>');
  return out.join('\n');
}
