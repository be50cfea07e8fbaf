// Hedgeleaf page: the market each leg was priced in, and the smile it came from.
//
// After each good price: a table of every option leg's volatility (and whether the smile was
// held flat beyond its grid), and its averages of the rate, yield and borrow curves to its
// expiry, from the engine's legs[i].market; and, while the trade has a grid, a small chart of
// the smile per expiry (volatility in % against the strike in the grid's basis) with each
// leg's strike marked at the volatility it was priced at. The chart's text alternative is
// its legend and the folded table of its figures (chart.js); the leg table is a table.
import { drawChart } from './chart.js';
import { byId, fillTable } from './dom.js';
import { formatNumber, formatPercent } from './format.js';
import { isTable } from './market-editor.js';
import { marketAsOfText } from './snapshot.js';

const basisWords = {
  percent_of_spot: 'strike, % of spot',
  percent_of_forward: 'strike, % of the forward',
  absolute: 'strike',
};

/**
 * Where a leg's strike sits on the grid's strike axis: as priced (absolute), as % of spot, or as
 * % of its forward (spot grown at the leg's average rate − yield − borrow; cash dividends, which
 * the engine takes off the forward, are left out of this mark, and the legend says so).
 */
function legOnAxis(leg, basis, spot) {
  if (basis === 'absolute') return leg.strike;
  if (basis !== 'percent_of_forward') return leg.strike_percent_of_spot ?? (100 * leg.strike) / spot;
  const m = leg.market;
  const forward = spot * Math.exp((m.rate - m.carry_yield - m.borrow) * leg.expiry_years);
  return (100 * leg.strike) / forward;
}

function expiryText(expiry) {
  return typeof expiry === 'number' ? `${formatNumber(expiry, expiry % 1 ? 2 : 0)} y` : String(expiry);
}

/** The smile per expiry (rows whose cells read as numbers), each leg's strike marked. */
function drawSmile(doc, price) {
  const host = byId('smile-chart');
  const grid = doc.market?.volatility;
  const lists = grid && Array.isArray(grid.expiries) && Array.isArray(grid.strikes) && Array.isArray(grid.vols);
  host.hidden = !lists;
  if (!lists) return;
  const basis = grid.strike_basis ?? 'percent_of_spot';
  const series = grid.expiries.map((expiry, i) => ({
    kind: `freq${i % 4}${i >= 4 ? ' later' : ''}`, // four colours, then dashed
    label: expiryText(expiry),
    dots: true,
    points: grid.strikes
      .map((k, j) => [k, 100 * grid.vols[i]?.[j]])
      .filter(([k, v]) => typeof k === 'number' && Number.isFinite(v)),
  }));
  const legs = (price?.legs ?? []).filter((leg) => leg.market && typeof leg.strike === 'number');
  const marks = legs.map((leg, n) => ({
    x: legOnAxis(leg, basis, price.spot),
    kind: 'leg',
    row: n,
    label: `Leg ${(price.legs.indexOf(leg) ?? n) + 1}: ${formatPercent(leg.market.volatility, 1)}`,
  }));
  if (marks.length && basis === 'percent_of_forward')
    marks[0].legend = 'legs at % of their forward (before cash dividends)';
  drawChart(host, { series, marks, xLabel: basisWords[basis] ?? 'strike', yLabel: 'volatility %', height: 220 });
}

/** The market each option leg was priced in (shown when the engine reports it: a smile, curves or a snapshot). */
function legMarketTable(price) {
  const holder = byId('leg-market');
  const legs = (price?.legs ?? []).map((leg, i) => ({ leg, n: i + 1 })).filter(({ leg }) => leg.market);
  holder.hidden = legs.length === 0;
  if (!legs.length) return;
  const rows = legs.map(({ leg, n }) => [
    `Leg ${n} ${leg.type}`,
    formatNumber(leg.strike, 2),
    `${formatNumber(leg.strike_percent_of_spot, 1)} %`,
    formatPercent(leg.market.volatility, 2) +
      (leg.market.volatility_extrapolated ? ' (held flat beyond the grid)' : ''),
    formatPercent(leg.market.rate, 2),
    formatPercent(leg.market.carry_yield, 2),
    formatPercent(leg.market.borrow, 2),
  ]);
  fillTable(
    byId('leg-market-table'),
    ['Leg', 'Strike', '% of spot', 'Volatility', 'Rate', 'Yield', 'Borrow'],
    rows,
    'The market each leg was priced in',
  );
}

/**
 * The cautions' words for the model's market (on screen and on the sheet): constant volatility and
 * rates, or, for a trade with a smile or a curve, the smile and curves given, held as they are (as
 * the engine's own caution says, core/commands/cautions.cpp).
 */
function cautionWords(doc) {
  const m = doc.market ?? {};
  const given = [m.volatility, m.rate, m.carry_yield, m.borrow].some(isTable);
  for (const node of document.querySelectorAll('.model-words')) {
    node.dataset.flatWords ??= node.textContent;
    const text = given ? node.dataset.termWords : node.dataset.flatWords;
    if (node.textContent !== text) node.textContent = text;
  }
}

/** Draw the leg market table, the market's as_of and the smile chart for `doc` priced at `price`. */
export function showMarketFigures(doc, price) {
  cautionWords(doc);
  legMarketTable(price);
  const asOf = marketAsOfText(price?.market ?? doc.market);
  const line = byId('leg-market-as-of');
  line.textContent = asOf
    ? `Market as of ${asOf}.`
    : 'Rates, yield and borrow: averages of the curves to each leg’s expiry.';
  drawSmile(doc, price);
}
