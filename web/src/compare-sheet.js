// Hedgeleaf page: the printed comparison, one client sheet for every alternative.
//
// Client-safe always: the alternatives' terms leg by leg, the client figures side by side, the
// payoffs on one chart, the outcomes at a few spot levels, who prepared it and until when it is
// indicative, the engine's notes and the cautions (the same list as the quote sheet's). Never the
// desk's model value, margin, Greeks or lattice. Three alternatives fit one A4 or Letter page.
import { byId, fillTable, make } from './dom.js';
import { formatDate, formatNumber, formatPercent, formatStamp, formatWhen, inputText } from './format.js';
import { alternativeLabel, drawComparison } from './compare-view.js';
import { priceText } from './render.js';
import { exerciseNames } from './form.js';
import { legTypeNames } from './sheet.js';

/** The first alternative's value of a sheet field (client, prepared_by, …) that has one. */
function firstOf(result, key) {
  for (const alt of result.alternatives)
    if (typeof alt.sheet[key] === 'string' && alt.sheet[key].trim()) return alt.sheet[key];
  return null;
}

function legRows(result, doc) {
  return result.alternatives.flatMap((alt, i) => {
    const trade = doc.comparison.alternatives[i];
    return alt.legs.map((leg, j) => [
      j === 0 ? alternativeLabel(trade, i) : '',
      `Client ${leg.side}`,
      legTypeNames[leg.type] ?? leg.type,
      leg.strike === null || leg.strike === undefined
        ? '–'
        : `${priceText(trade, leg.strike)} (${formatPercent(leg.strike_fraction_of_spot, 1)})`,
      leg.expiry_date
        ? formatDate(leg.expiry_date)
        : leg.expiry_years === undefined
          ? '–'
          : `${formatNumber(leg.expiry_years, 2)} y`,
      exerciseNames[leg.exercise] ?? leg.exercise ?? '–',
      inputText(leg.quantity),
    ]);
  });
}

function outcomeRows(result, doc, held) {
  const trade = doc.comparison.alternatives[0];
  return result.outcome_spots.map((spot, j) => {
    const first = result.alternatives[0].outcomes[j];
    return [
      priceText(trade, spot),
      formatPercent(first.spot_change, 0),
      ...result.alternatives.map((alt) =>
        formatNumber(held ? alt.outcomes[j].pnl_with_holding : alt.outcomes[j].pnl, 0),
      ),
      ...(held ? [formatNumber(first.holding_pnl, 0)] : []),
    ];
  });
}

/** Fill the print-only comparison sheet from the engine's `result` for the comparison `doc`. */
export function renderComparisonSheet(result, doc) {
  const ccy = result.currency ? ` ${result.currency}` : '';
  const names = result.alternatives.map((_, i) => alternativeLabel(doc.comparison.alternatives[i], i));
  byId('compare-sheet-title').textContent = result.title || 'Alternatives side by side';
  const meta = [
    ['Client', firstOf(result, 'client')],
    [
      'Valuation date',
      result.alternatives[0].valuation_date ? formatDate(result.alternatives[0].valuation_date) : null,
    ],
    ['Valued at', formatStamp(new Date())],
    ['Indicative until', formatWhen(firstOf(result, 'indicative_until')) ?? 'not stated: ask the desk before dealing'],
    ['Prepared by', firstOf(result, 'prepared_by')],
    ['Desk contact', firstOf(result, 'contact')],
    ['Spot today', `${priceText(doc.comparison.alternatives[0], result.spot)}${ccy}`],
  ].filter(([, value]) => value);
  const metaTable = byId('compare-sheet-meta');
  metaTable.replaceChildren(
    ...meta.map(([label, value]) =>
      make('tr', {}, [make('th', { scope: 'row', text: label }), make('td', { text: value })]),
    ),
  );
  drawComparison(byId('compare-sheet-figures'), byId('compare-sheet-chart'), result, doc, 330);
  fillTable(
    byId('compare-sheet-legs'),
    ['Alternative', 'Side', 'Type', 'Strike (% of spot)', 'Expiry', 'Exercise', 'Quantity'],
    legRows(result, doc),
    'Each alternative leg by leg',
  );
  const held = result.rows.some((r) => r.holding_shares !== null && r.holding_shares !== 0);
  fillTable(
    byId('compare-sheet-outcomes'),
    ['Spot at expiry', 'Change', ...names, ...(held ? ['Shares alone'] : [])],
    outcomeRows(result, doc, held),
    'Client P&L at expiry at each spot',
  );
  byId('compare-sheet-outcomes-head').textContent =
    `Client P&L at expiry${ccy ? ` in${ccy}` : ''}${held ? ', with the shares held' : ''}`;
  byId('compare-sheet-notes').replaceChildren(...result.notes.map((n) => make('li', { text: n })));
  const cautions = byId('compare-sheet-cautions');
  if (!cautions.firstChild)
    cautions.append(
      ...[...document.querySelectorAll('#quote-sheet .sheet-cautions > *')].map((n) => n.cloneNode(true)),
    );
}
