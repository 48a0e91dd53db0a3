// The script of the HTML report, run in the browser after uPlot's. It reads
// the embedded JSON, builds one uPlot chart per figure and wires zoom (drag),
// reset (double-click), cursor read-out, legend toggles, cursor sync between
// plots sharing an x quantity, optional linked zoom, reference lines and
// resizing. All user text reaches the page through uPlot's textContent or
// canvas fillText, never as markup.
//
// `formatNumber` below is a copy of src/report/format-number.ts (this script
// cannot import); test/report/format-number.test.ts runs both on the same cases.
// Kept as plain ES2017 without template literals so it can live in a string.

/**
 * Browser-side script of the HTML report (plain JavaScript source text).
 *
 * @example
 * ```ts
 * const html = `<script>${REPORT_SCRIPT}</script>`;
 * ```
 */
export const REPORT_SCRIPT = String.raw`(function () {
  'use strict';
  var FONT = 'system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif';
  var AXIS = '#374151';
  var GRID = '#e8eaed';
  var SUP = { '-': '\u207B', '0': '\u2070', '1': '\u00B9', '2': '\u00B2', '3': '\u00B3', '4': '\u2074',
    '5': '\u2075', '6': '\u2076', '7': '\u2077', '8': '\u2078', '9': '\u2079' };

  function trimZeros(s) { return s.indexOf('.') < 0 ? s : s.replace(/\.?0+$/, ''); }

  function formatNumber(value, digits) {
    if (value === null || value === undefined) return '\u2013';
    if (isNaN(value)) return 'NaN';
    if (!isFinite(value)) return value > 0 ? '\u221E' : '-\u221E';
    if (value === 0) return '0';
    var rounded = Number(value.toPrecision(digits));
    var abs = Math.abs(rounded);
    if (abs >= 1e-3 && abs < 1e6) {
      var e = Math.floor(Math.log10(abs));
      return trimZeros(rounded.toFixed(Math.max(0, digits - 1 - e)));
    }
    var parts = rounded.toExponential(digits - 1).split('e');
    var exp = String(Number(parts[1]));
    var sup = '';
    for (var i = 0; i < exp.length; i++) sup += SUP[exp.charAt(i)] || exp.charAt(i);
    return trimZeros(parts[0]) + '\u00D710' + sup;
  }
  window.fluxstateFormatNumber = formatNumber;

  function withUnit(text, unit) { return unit ? text + '\u00A0' + unit : text; }

  // tick labels: decimals from the tick spacing, powers of ten for tiny/huge values
  function tickValues(u, splits, axisIdx, space, incr) {
    var maxAbs = 0;
    for (var i = 0; i < splits.length; i++) if (splits[i] != null) maxAbs = Math.max(maxAbs, Math.abs(splits[i]));
    if (maxAbs !== 0 && (maxAbs < 1e-3 || maxAbs >= 1e6)) {
      var d = Math.min(15, Math.max(1, Math.ceil(Math.log10(maxAbs / incr) + 1e-9) + 1));
      return splits.map(function (v) { return v == null ? '' : v === 0 ? '0' : formatNumber(v, d); });
    }
    var stepText = trimZeros(Number(incr.toPrecision(6)).toFixed(12));
    var dec = stepText.indexOf('.') < 0 ? 0 : stepText.length - stepText.indexOf('.') - 1;
    return splits.map(function (v) {
      if (v == null) return '';
      var s = v.toFixed(dec);
      return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
    });
  }

  // y axis width from its longest tick label (7 px per character at 12 px)
  function axisSize(u, values, axisIdx, cycleNum) {
    var longest = 0;
    if (values) for (var i = 0; i < values.length; i++) longest = Math.max(longest, String(values[i]).length);
    return Math.max(48, Math.ceil(longest * 7.2 + 22));
  }

  function alignedData(p) {
    var cols = new Array(p.series.length);
    var x;
    if (p.xGroups.length === 1) {
      var g = p.xGroups[0];
      x = g.x;
      g.columns.forEach(function (c) { cols[c.index] = c.values; });
    } else {
      // series on different time vectors: outer join on x; alignment holes are
      // undefined (spanned), true gaps stay null (uPlot.join, NULL_RETAIN)
      var tables = p.xGroups.map(function (g) {
        return [g.x].concat(g.columns.map(function (c) { return c.values; }));
      });
      var joined = uPlot.join(tables);
      x = joined[0];
      var k = 1;
      p.xGroups.forEach(function (g) { g.columns.forEach(function (c) { cols[c.index] = joined[k++]; }); });
    }
    return [x].concat(cols);
  }

  function yRange(p, axis) {
    return function (u, dataMin, dataMax) {
      var lo = dataMin, hi = dataMax;
      p.references.forEach(function (r) {
        if (r.axis !== axis) return;
        lo = lo == null ? r.value : Math.min(lo, r.value);
        hi = hi == null ? r.value : Math.max(hi, r.value);
      });
      if (lo == null || hi == null) { lo = 0; hi = 1; }
      return uPlot.rangeNum(lo, hi, 0.1, true);
    };
  }

  function drawReferences(p) {
    return function (u) {
      if (p.references.length === 0) return;
      var ctx = u.ctx, b = u.bbox, pr = uPlot.pxRatio;
      ctx.save();
      ctx.beginPath();
      ctx.rect(b.left, b.top, b.width, b.height);
      ctx.clip();
      p.references.forEach(function (r) {
        var y = Math.round(u.valToPos(r.value, 'y' + r.axis, true)) + 0.5;
        ctx.setLineDash([6 * pr, 4 * pr]);
        ctx.lineWidth = 1.25 * pr;
        ctx.strokeStyle = r.color;
        ctx.beginPath();
        ctx.moveTo(b.left, y);
        ctx.lineTo(b.left + b.width, y);
        ctx.stroke();
        ctx.setLineDash([]);
        ctx.font = '600 ' + Math.round(12 * pr) + 'px ' + FONT;
        ctx.textAlign = 'right';
        var below = y - b.top < 18 * pr;
        ctx.textBaseline = below ? 'top' : 'bottom';
        var tx = b.left + b.width - 6 * pr, ty = below ? y + 3 * pr : y - 3 * pr;
        ctx.lineWidth = 3 * pr;
        ctx.strokeStyle = 'rgba(255,255,255,0.92)';
        ctx.strokeText(r.label, tx, ty);
        ctx.fillStyle = r.color;
        ctx.fillText(r.label, tx, ty);
      });
      ctx.restore();
    };
  }

  var report = JSON.parse(document.getElementById('fluxstate-report-data').textContent);
  var linkBox = document.getElementById('link-zoom');
  var charts = [];
  var ready = false, syncing = false;

  function onScale(u, key) {
    if (key !== 'x' || !ready || syncing || !linkBox || !linkBox.checked) return;
    var me = null;
    for (var i = 0; i < charts.length; i++) if (charts[i].u === u) me = charts[i];
    if (!me) return;
    syncing = true;
    try {
      charts.forEach(function (c) {
        if (c !== me && c.key === me.key) c.u.setScale('x', { min: u.scales.x.min, max: u.scales.x.max });
      });
    } finally { syncing = false; }
  }

  function widthOf(el) { return Math.max(300, Math.floor(el.getBoundingClientRect().width)); }

  function makeChart(p, el) {
    var key = 'fluxstate|' + p.xLabel + '|' + p.xUnit;
    var axisFont = '12px ' + FONT, labelFont = '600 12.5px ' + FONT;
    var scales = { x: { time: false } };
    var series = [{
      label: p.xLabel,
      value: function (u, v) { return v == null ? '\u2013' : withUnit(formatNumber(v, 6), p.xUnit); }
    }];
    var axes = [{
      label: p.xUnit ? p.xLabel + ' (' + p.xUnit + ')' : p.xLabel,
      stroke: AXIS, font: axisFont, labelFont: labelFont, labelSize: 24,
      grid: { stroke: GRID, width: 1 }, ticks: { stroke: GRID, width: 1 },
      values: tickValues
    }];
    p.units.forEach(function (unit, k) {
      scales['y' + k] = { range: yRange(p, k) };
      axes.push({
        scale: 'y' + k, side: k === 0 ? 3 : 1, label: p.axisLabels[k],
        stroke: AXIS, font: axisFont, labelFont: labelFont, labelSize: 26,
        grid: { show: k === 0, stroke: GRID, width: 1 }, ticks: { stroke: GRID, width: 1 },
        values: tickValues, size: axisSize
      });
    });
    p.series.forEach(function (s) {
      series.push({
        label: s.label, scale: 'y' + s.axis, stroke: s.color, width: 1.5,
        points: { show: false },
        value: function (u, v) { return v == null ? '\u2013' : withUnit(formatNumber(v, 5), s.unit); }
      });
    });
    var opts = {
      width: widthOf(el), height: report.plotHeight,
      scales: scales, series: series, axes: axes,
      cursor: { drag: { x: true, y: false, setScale: true }, sync: { key: key }, focus: { prox: 24 } },
      focus: { alpha: 0.4 },
      legend: { live: true },
      hooks: { draw: [drawReferences(p)], setScale: [onScale] }
    };
    var u = new uPlot(opts, alignedData(p), el);
    return { u: u, el: el, key: key };
  }

  report.plots.forEach(function (p, i) {
    var el = document.querySelector('[data-plot-index="' + i + '"]');
    if (!el) return;
    try {
      charts.push(makeChart(p, el));
    } catch (err) {
      var box = document.createElement('div');
      box.className = 'plot-error';
      box.textContent = 'This plot could not be drawn: ' + (err && err.message ? err.message : String(err));
      el.appendChild(box);
      console.error(err);
    }
  });
  ready = true;
  // for scripted checks (test/report/browser.test.ts) and the browser console
  window.fluxstateCharts = charts.map(function (c) { return c.u; });

  var resizeTimer = 0;
  window.addEventListener('resize', function () {
    clearTimeout(resizeTimer);
    resizeTimer = setTimeout(function () {
      charts.forEach(function (c) { c.u.setSize({ width: widthOf(c.el), height: report.plotHeight }); });
    }, 100);
  });
  document.documentElement.setAttribute('data-plots-ready', String(charts.length));
})();
`;
