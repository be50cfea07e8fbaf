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

/** A drawing as data: an SVG element's tag, attributes (as text), text and children. */
function shape(tag, attrs = {}, children = [], text = undefined) {
  const texts = {};
  for (const [key, value] of Object.entries(attrs)) texts[key] = String(value);
  return { tag, attrs: texts, children, text };
}

/** The SVG elements `spec` describes. */
function build(spec) {
  const node = makeSvg(spec.tag, spec.attrs, spec.text);
  for (const child of spec.children) node.append(build(child));
  return node;
}

/**
 * Make `node`, drawn from `old`, show `spec`: only what differs is written (a spot edit moves
 * the curves and the marks, and the axes seldom), and an element whose make-up changed is
 * drawn afresh. Returns the node that shows `spec`.
 */
function patch(node, old, spec) {
  if (
    old.tag !== spec.tag ||
    old.children.length !== spec.children.length ||
    (old.text === undefined) !== (spec.text === undefined)
  ) {
    const fresh = build(spec);
    node.replaceWith(fresh);
    return fresh;
  }
  for (const [key, value] of Object.entries(spec.attrs)) if (old.attrs[key] !== value) node.setAttribute(key, value);
  for (const key of Object.keys(old.attrs)) if (!(key in spec.attrs)) node.removeAttribute(key);
  if (spec.text !== undefined && spec.text !== old.text) node.textContent = spec.text;
  let child = node.firstElementChild;
  spec.children.forEach((next, i) => {
    const following = child.nextElementSibling;
    patch(child, old.children[i], next);
    child = following;
  });
  return node;
}

/**
 * Draw a chart into `host`.
 * series: [{points: [[x, y], ...], kind: "value"|"payoff"|"portfolio"|..., label, dots?}]
 * marks:  [{x, label, kind}] vertical markers (e.g. break-even, spot)
 */
export function drawChart(host, { series, marks = [], xLabel = '', yLabel = '', height = 280 }) {
  const items = [
    ...series.filter((s) => s.label).map((s) => [`legend-item ${s.kind}`, s.label]),
    ...marks.filter((m) => m.legend).map((m) => [`legend-item mark ${m.kind}`, m.legend]),
  ];
  // a recompute redraws in place what changed in the drawing; the legend (when unchanged) and the table stay
  const spec = drawing({ series, marks, xLabel, yLabel, height });
  let svg = host.querySelector(':scope > svg');
  let legend = host.querySelector(':scope > .chart-legend');
  const data = host.querySelector(':scope > details.chart-data') ?? make('details', { className: 'chart-data' });
  if (!svg || !legend || !svg.drawn) {
    svg = build(spec);
    host.replaceChildren(svg, (legend = make('p', { className: 'chart-legend' })), data);
  } else {
    svg = patch(svg, svg.drawn, spec);
  }
  svg.drawn = spec;
  const key = JSON.stringify(items);
  if (legend.itemsKey !== key) {
    legend.replaceChildren(...items.map(([className, text]) => make('span', { className, text })));
    legend.itemsKey = key;
  }
  chartData(data, { series, marks, xLabel, name: host.getAttribute('aria-label') || yLabel });
}

/** The chart's SVG as data (shape): grid and axes, then the marks, then the series. */
function drawing({ series, marks, xLabel, yLabel, height }) {
  const width = 640;
  const pad = { left: 64, right: 16, top: 14, bottom: 44 };
  const xs = series.flatMap((s) => s.points.map((p) => p[0])).concat(marks.map((m) => m.x));
  const ys = series.flatMap((s) => s.points.map((p) => p[1]));
  const frame = { viewBox: `0 0 ${width} ${height}`, class: 'chart-svg', focusable: 'false', 'aria-hidden': 'true' };
  if (xs.length === 0 || ys.length === 0) return shape('svg', frame);
  let [x0, x1] = [Math.min(...xs), Math.max(...xs)];
  let [y0, y1] = [Math.min(...ys, 0), Math.max(...ys, 0)];
  if (x1 === x0) [x0, x1] = [x0 - 1, x1 + 1];
  if (y1 === y0) [y0, y1] = [y0 - 1, y1 + 1];
  const margin = (y1 - y0) * 0.06;
  y0 -= margin;
  y1 += margin;
  const sx = (x) => pad.left + ((x - x0) / (x1 - x0)) * (width - pad.left - pad.right);
  const sy = (y) => height - pad.bottom - ((y - y0) / (y1 - y0)) * (height - pad.top - pad.bottom);

  const grid = [];
  const yTicks = ticks(y0, y1, 5);
  const yDigits = digitsFor(yTicks);
  for (const t of yTicks) {
    grid.push(
      shape('line', { x1: pad.left, x2: width - pad.right, y1: sy(t), y2: sy(t), class: t === 0 ? 'zero' : '' }),
    );
    grid.push(shape('text', { x: pad.left - 6, y: sy(t) + 4, 'text-anchor': 'end' }, [], formatNumber(t, yDigits)));
  }
  const xTicks = ticks(x0, x1, 6);
  const xDigits = digitsFor(xTicks);
  for (const t of xTicks) {
    grid.push(shape('line', { x1: sx(t), x2: sx(t), y1: pad.top, y2: height - pad.bottom, class: 'vertical' }));
    grid.push(
      shape('text', { x: sx(t), y: height - pad.bottom + 16, 'text-anchor': 'middle' }, [], formatNumber(t, xDigits)),
    );
  }
  const middle = (pad.top + height - pad.bottom) / 2;
  grid.push(
    shape(
      'text',
      { x: (pad.left + width - pad.right) / 2, y: height - 6, 'text-anchor': 'middle', class: 'axis-label' },
      [],
      xLabel,
    ),
    shape(
      'text',
      { x: 12, y: middle, 'text-anchor': 'middle', class: 'axis-label', transform: `rotate(-90 12 ${middle})` },
      [],
      yLabel,
    ),
  );
  const parts = [shape('g', { class: 'chart-grid' }, grid)];
  for (const mark of marks) {
    parts.push(
      shape('g', { class: `chart-mark ${mark.kind || ''}` }, [
        shape('line', { x1: sx(mark.x), x2: sx(mark.x), y1: pad.top, y2: height - pad.bottom }),
        shape('text', { x: sx(mark.x) + 4, y: pad.top + 10 + (mark.row || 0) * 13 }, [], mark.label),
      ]),
    );
  }
  for (const s of series) {
    if (s.points.length === 0) continue;
    const d = s.points.map((p, i) => `${i ? 'L' : 'M'}${sx(p[0]).toFixed(1)},${sy(p[1]).toFixed(1)}`).join('');
    const lines = [shape('path', { d })];
    if (s.dots) {
      // every dot in one path (a circle of radius 3 is two arcs): one node, not one per point
      const dots = s.points
        .map((p) => `M${(sx(p[0]) - 3).toFixed(1)},${sy(p[1]).toFixed(1)}a3,3 0 1,0 6,0a3,3 0 1,0 -6,0`)
        .join('');
      lines.push(shape('path', { d: dots, class: 'dots' }));
    }
    parts.push(shape('g', { class: `chart-series ${s.kind}` }, lines));
  }
  return shape('svg', frame, parts);
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
