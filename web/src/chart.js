// Hedgeleaf page: small line charts drawn as SVG (no library).
//
// Colours come from classes in style.css (CSP allows no inline styles); text
// is set with textContent only. The drawing is hidden from screen readers; its
// text alternative is the legend and a folded table of the figures it plots
// (chartData), inside the host, which is labelled (role "figure").
import { fillTable, make, makeSvg, scrollRegion } from './dom.js';
import { formatNumber } from './format.js';

/** About `count` round tick values covering [lo, hi]. */
export function ticks(lo, hi, count = 5) {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? raw;
  const out = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Number(v.toPrecision(12)));
  return out;
}

/** Decimals that write the tick step exactly (0 for 20, 1 for 2.5, 2 for 0.25), so every tick reads right. */
function digitsFor(values) {
  if (values.length < 2) return 2;
  const step = Math.abs(values[1] - values[0]);
  for (let digits = 0; digits < 8; digits += 1) {
    const scaled = step * 10 ** digits;
    if (Math.abs(scaled - Math.round(scaled)) < 1e-6 * Math.max(1, scaled)) return digits;
  }
  return 8;
}

/**
 * Draw a chart into `host`.
 * series: [{points: [[x, y], ...], kind: "value"|"payoff"|"portfolio"|..., label, dots?}]
 * marks:  [{x, label, kind}] vertical markers (e.g. break-even, spot)
 */
export function drawChart(host, { series, marks = [], xLabel = '', yLabel = '', height = 280 }) {
  const width = 640;
  const pad = { left: 64, right: 16, top: 14, bottom: 44 };
  const xs = series.flatMap((s) => s.points.map((p) => p[0])).concat(marks.map((m) => m.x));
  const ys = series.flatMap((s) => s.points.map((p) => p[1]));
  const svg = makeSvg('svg', {
    viewBox: `0 0 ${width} ${height}`,
    class: 'chart-svg',
    focusable: 'false',
    'aria-hidden': 'true',
  });
  if (xs.length === 0 || ys.length === 0) {
    host.replaceChildren(svg);
    return;
  }
  let [x0, x1] = [Math.min(...xs), Math.max(...xs)];
  let [y0, y1] = [Math.min(...ys, 0), Math.max(...ys, 0)];
  if (x1 === x0) [x0, x1] = [x0 - 1, x1 + 1];
  if (y1 === y0) [y0, y1] = [y0 - 1, y1 + 1];
  const margin = (y1 - y0) * 0.06;
  y0 -= margin;
  y1 += margin;
  const sx = (x) => pad.left + ((x - x0) / (x1 - x0)) * (width - pad.left - pad.right);
  const sy = (y) => height - pad.bottom - ((y - y0) / (y1 - y0)) * (height - pad.top - pad.bottom);

  const grid = makeSvg('g', { class: 'chart-grid' });
  const yTicks = ticks(y0, y1, 5);
  const yDigits = digitsFor(yTicks);
  for (const t of yTicks) {
    grid.append(
      makeSvg('line', { x1: pad.left, x2: width - pad.right, y1: sy(t), y2: sy(t), class: t === 0 ? 'zero' : '' }),
    );
    grid.append(makeSvg('text', { x: pad.left - 6, y: sy(t) + 4, 'text-anchor': 'end' }, formatNumber(t, yDigits)));
  }
  const xTicks = ticks(x0, x1, 6);
  const xDigits = digitsFor(xTicks);
  for (const t of xTicks) {
    grid.append(makeSvg('line', { x1: sx(t), x2: sx(t), y1: pad.top, y2: height - pad.bottom, class: 'vertical' }));
    grid.append(
      makeSvg('text', { x: sx(t), y: height - pad.bottom + 16, 'text-anchor': 'middle' }, formatNumber(t, xDigits)),
    );
  }
  grid.append(
    makeSvg(
      'text',
      { x: (pad.left + width - pad.right) / 2, y: height - 6, 'text-anchor': 'middle', class: 'axis-label' },
      xLabel,
    ),
  );
  grid.append(
    makeSvg(
      'text',
      {
        x: 12,
        y: (pad.top + height - pad.bottom) / 2,
        'text-anchor': 'middle',
        class: 'axis-label',
        transform: `rotate(-90 12 ${(pad.top + height - pad.bottom) / 2})`,
      },
      yLabel,
    ),
  );
  svg.append(grid);

  for (const mark of marks) {
    const g = makeSvg('g', { class: `chart-mark ${mark.kind || ''}` });
    g.append(makeSvg('line', { x1: sx(mark.x), x2: sx(mark.x), y1: pad.top, y2: height - pad.bottom }));
    g.append(makeSvg('text', { x: sx(mark.x) + 4, y: pad.top + 10 + (mark.row || 0) * 13 }, mark.label));
    svg.append(g);
  }
  for (const s of series) {
    if (s.points.length === 0) continue;
    const d = s.points.map((p, i) => `${i ? 'L' : 'M'}${sx(p[0]).toFixed(1)},${sy(p[1]).toFixed(1)}`).join('');
    const g = makeSvg('g', { class: `chart-series ${s.kind}` });
    g.append(makeSvg('path', { d }));
    if (s.dots) {
      // every dot in one path (a circle of radius 3 is two arcs): one node, not one per point
      const dots = s.points
        .map((p) => `M${(sx(p[0]) - 3).toFixed(1)},${sy(p[1]).toFixed(1)}a3,3 0 1,0 6,0a3,3 0 1,0 -6,0`)
        .join('');
      g.append(makeSvg('path', { d: dots, class: 'dots' }));
    }
    svg.append(g);
  }
  const items = [
    ...series.filter((s) => s.label).map((s) => [`legend-item ${s.kind}`, s.label]),
    ...marks.filter((m) => m.legend).map((m) => [`legend-item mark ${m.kind}`, m.legend]),
  ];
  // a recompute replaces the drawing only; the legend (when unchanged) and the table stay
  const old = host.querySelector(':scope > svg');
  let legend = host.querySelector(':scope > .chart-legend');
  const data = host.querySelector(':scope > details.chart-data') ?? make('details', { className: 'chart-data' });
  if (!old || !legend) host.replaceChildren(svg, (legend = make('p', { className: 'chart-legend' })), data);
  else old.replaceWith(svg);
  const key = JSON.stringify(items);
  if (legend.itemsKey !== key) {
    legend.replaceChildren(...items.map(([className, text]) => make('span', { className, text })));
    legend.itemsKey = key;
  }
  chartData(data, { series, marks, xLabel, name: host.getAttribute('aria-label') || yLabel });
}

/** Up to 4 decimals below 10, else 2: as the page's tables show such figures. */
const figure = (v) => (Number.isFinite(v) ? formatNumber(v, Math.abs(v) < 10 ? 4 : 2) : '–');

/**
 * The chart's figures as a table in a folded <details> (`details`, reused): one row per
 * x, one column per series, the marks in the caption. `name` names the chart (its
 * scrolling table is a region of that name). The table is filled (in place) only while
 * the details are open, so that a recompute does not write figures nobody sees.
 */
function chartData(details, figures) {
  details.figures = figures;
  if (!details.firstChild) {
    details.append(
      make('summary', { text: 'The figures in this chart' }),
      scrollRegion(`Figures: ${figures.name}`, make('table', { className: 'figures' })),
    );
    details.addEventListener('toggle', () => details.open && fillChartData(details));
  }
  if (details.open) fillChartData(details);
  return details;
}

function fillChartData(details) {
  const { series, marks, xLabel } = details.figures;
  const plotted = series.filter((s) => s.points.length);
  const xs = [...new Set(plotted.flatMap((s) => s.points.map((p) => p[0])))].sort((a, b) => a - b);
  const byX = plotted.map((s) => new Map(s.points));
  const rows = xs.map((x) => [figure(x), ...byX.map((m) => (m.has(x) ? figure(m.get(x)) : ''))]);
  const table = details.querySelector('table');
  const caption = marks.length ? `Marked: ${marks.map((m) => m.label).join('; ')}` : 'Chart figures';
  fillTable(table, [xLabel || 'x', ...plotted.map((s) => s.label || s.kind)], rows, caption);
  if (table.caption.textContent !== caption) table.caption.textContent = caption;
}
