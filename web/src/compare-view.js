// Hedgeleaf page: a comparison's figures as a table and its payoffs on one chart.
//
// Every figure is the engine's (`compare`: its `rows` and each alternative's `curve`), only
// formatted here, in the locale the user picked (format.js). The same drawing serves the card on
// screen and the printed comparison sheet. Each alternative's line has its own dash pattern as
// well as its own colour, named in the legend, so the chart reads in black and white too.
import { drawChart } from './chart.js';
import { fillTable, make, setText } from './dom.js';
import { formatDate, formatNumber, formatPercent } from './format.js';
import { isPair } from './currency.js';
import { perUnitDigits, priceText } from './render.js';

/** An alternative's name: its quote.label, else "Alternative n". */
export function alternativeLabel(alt, i) {
  const label = alt?.quote?.label;
  return typeof label === 'string' && label.trim() ? label.trim() : `Alternative ${i + 1}`;
}

const money = (x) => (x === null ? null : formatNumber(x, 0));

/** The spot levels where the client breaks even, "none" when there are none. */
function evensText(doc, row) {
  const { break_even_low: low, break_even_high: high } = row;
  if (low === null && high === null) return 'none';
  if (low === high || high === null) return priceText(doc, low);
  if (low === null) return priceText(doc, high);
  return `${priceText(doc, low)} and ${priceText(doc, high)}`;
}

function protectionText(doc, row) {
  if (row.protection_from === null) return 'none';
  const floor = row.protection_down_to === null ? '' : ` down to ${priceText(doc, row.protection_down_to)}`;
  return `below ${priceText(doc, row.protection_from)}${floor}`;
}

/**
 * The comparison table's rows: [heading, text per alternative]. `held` says the figures include
 * the shares the client holds (the engine's worst and best outcomes and break-evens do).
 */
export function comparisonRows(result, doc) {
  const rows = result.rows;
  const first = doc.comparison.alternatives[0]; // prices with its decimals (render.js priceDigits)
  // to a hundredth of a pip for a pair, as on the price card (render.js perUnitDigits)
  const perUnit = (x) => formatNumber(x, perUnitDigits(first, result.pip_size ?? null, x));
  const ccy = result.currency ? ` ${result.currency}` : '';
  const held = rows.some((r) => r.holding_shares !== null && r.holding_shares !== 0);
  const withHolding = held ? ' †' : '';
  const out = [
    ['Client', rows.map((r) => r.client_side)],
    ['Quantity', rows.map((r) => formatNumber(r.quantity, 0))],
    [`Client price per unit${ccy}`, rows.map((r) => perUnit(r.client_price))],
    [`Client price in total${ccy}`, rows.map((r) => money(r.client_price_total))],
    ['Client price, % of notional', rows.map((r) => formatPercent(r.fraction_of_notional, 2))],
  ];
  if (rows.some((r) => r.bid !== null))
    out.push([
      `Bid / offer per unit${ccy}`,
      rows.map((r) => (r.bid === null ? '–' : `${perUnit(r.bid)} / ${perUnit(r.offer)}`)),
    ]);
  out.push(
    ['Protected', rows.map((r) => protectionText(first, r))],
    ['Gains capped above', rows.map((r) => (r.cap === null ? 'no cap' : priceText(first, r.cap)))],
    [`Break-even at expiry${withHolding}`, rows.map((r) => evensText(first, r))],
    [
      `Maximum loss at expiry${withHolding}${ccy}`,
      rows.map((r) => (r.worst_pnl === null ? 'unlimited' : money(r.worst_pnl))),
    ],
    [
      `Maximum gain at expiry${withHolding}${ccy}`,
      rows.map((r) => (r.best_pnl === null ? 'unlimited' : money(r.best_pnl))),
    ],
    // a pair's delta here is the plain spot delta, as in Sensitivities (its own convention is on the pair card)
    [
      isPair(first) ? 'Delta per unit (spot, not premium-adjusted)' : 'Delta per unit',
      rows.map((r) => formatNumber(r.delta, 4)),
    ],
  );
  return out;
}

/** The comparison's payoffs at expiry, one line each (client P&L in total, with the shares held). */
export function comparisonSeries(result, doc) {
  const held = result.rows.some((r) => r.holding_shares !== null && r.holding_shares !== 0);
  const series = result.alternatives.map((alt, i) => ({
    kind: `alt${i}`,
    label: alternativeLabel(doc.comparison.alternatives[i], i),
    points: alt.curve.map((p) => [p.spot, held ? p.pnl_with_holding : p.pnl]),
  }));
  // the shares alone, unprotected, where every alternative protects the same holding
  const shares = new Set(result.rows.map((r) => r.holding_shares));
  if (held && shares.size === 1)
    series.push({
      kind: 'held',
      label: 'Shares held, unprotected',
      points: result.alternatives[0].curve.map((p) => [p.spot, p.holding_pnl]),
    });
  return { series, held };
}

/** Fill `table` and draw `chart` (hosts on the card or the sheet) from the engine's `result`. */
export function drawComparison(table, chart, result, doc, height = 280) {
  const names = result.alternatives.map((_, i) => alternativeLabel(doc.comparison.alternatives[i], i));
  const { series, held } = comparisonSeries(result, doc);
  fillTable(
    table,
    ['Figure', ...names],
    comparisonRows(result, doc).map(([heading, cells]) => [heading, ...cells]),
    'Alternatives side by side, one column each',
  );
  let key = table.nextElementSibling;
  if (!key?.classList.contains('compare-key')) table.after((key = make('p', { className: 'hint compare-key' })));
  const shares = result.rows.find((r) => r.holding_shares)?.holding_shares;
  setText(key, held ? `† with the ${formatNumber(shares, 0)} shares the client holds (not part of the price)` : '');
  const horizon = result.alternatives[0]?.at_expiry.horizon_date;
  // totals in the hundreds of thousands read better, and fit the axis, in thousands
  const largest = Math.max(...series.flatMap((s) => s.points.map((p) => Math.abs(p[1]))));
  const thousands = largest >= 1e5;
  if (thousands) for (const s of series) s.points = s.points.map(([x, y]) => [x, y / 1000]);
  const unit = `${thousands ? ' thousand' : ''}${result.currency ? ` ${result.currency}` : ''}`;
  drawChart(chart, {
    series,
    marks: [{ x: result.spot, label: `spot ${priceText(doc.comparison.alternatives[0], result.spot)}`, kind: 'spot' }],
    xLabel: `Spot at expiry${horizon ? ` (${formatDate(horizon)})` : ''}`,
    yLabel: `Client P&L${held ? ' with the shares' : ''}${unit ? `,${unit}` : ''}`,
    height,
  });
}
