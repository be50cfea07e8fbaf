// Hedgeleaf page: the printed quote sheet, client-safe unless the internal switch is on.
//
// The client sheet carries what the client deals on: the trade leg by leg, the client price (one
// side, or the bid and the offer when the quote is two-way), the break-evens and outcomes at the
// client price (the engine's client_price, never recomputed here), the valuation and validity
// times, who prepared it and the cautions. The desk's model value, margin, Greeks and lattice
// figures are printed only on the internal sheet, which says so at its head.
import { byId, tableRow } from './dom.js';
import { formatDate, formatNumber, formatPercent, formatSmart, formatWhen, inputText } from './format.js';
import { exerciseNames } from './form.js';
import { describeContract, expiryText, methodName, perUnitDigits, priceDigits, priceText } from './render.js';
import { pairSheetPremium, pairSheetTerms } from './currency-figures.js';
import { marketAsOfText } from './snapshot.js';

/** Fill a sheet table with [label, value, name?] rows; a named value cell carries data-sheet="name". */
function rows(table, entries) {
  table.replaceChildren(
    ...entries.map(([label, value, name]) => {
      const tr = tableRow([label, value]);
      if (name) tr.cells[1].dataset.sheet = name;
      return tr;
    }),
  );
}

/** A table with a head row and body rows of cell texts. */
function grid(table, head, body) {
  const headRow = tableRow(head);
  headRow.cells[0].removeAttribute('scope');
  table.replaceChildren(headRow, ...body.map((cells) => tableRow(cells)));
}

/** Leg types as the sheets name them. */
export const legTypeNames = {
  call: 'Call',
  put: 'Put',
  'digital-call': 'Digital call',
  'digital-put': 'Digital put',
  stock: 'Shares',
};

/** The legs as the client deals them: side, type, strike (and % of spot), expiry, exercise, quantity, notional. */
function legRows(doc, r) {
  const clientSign = r.position.side === 'sell' ? -1 : 1;
  const q = r.position.quantity;
  return r.legs.map((leg) => {
    const signed = clientSign * leg.quantity * q;
    const strike =
      leg.type === 'stock' ? '–' : `${priceText(doc, leg.strike)} (${formatPercent(leg.strike / r.spot, 1)} of spot)`;
    return [
      signed > 0 ? 'Client buys' : 'Client sells',
      legTypeNames[leg.type] ?? leg.type,
      strike,
      leg.type === 'stock' ? '–' : expiryText(doc, { expiry_years: leg.expiry_years }),
      exerciseNames[leg.exercise] ?? leg.exercise ?? '–',
      inputText(Math.abs(signed)),
      formatNumber(Math.abs(signed) * r.spot, 0),
    ];
  });
}

/** The client's price: the side dealt on, or both sides of a two-way quote; the model value without a quote. */
function priceRows(doc, r, ccy) {
  const perUnit = (x) => `${formatNumber(x, perUnitDigits(doc, r.currency?.pip_size ?? null, x))}${ccy}`;
  const cp = r.client_price;
  if (!cp) {
    const q = r.position.quantity;
    return [
      ['Indicative price per unit', perUnit(r.premium)],
      ['Indicative price in total', `${formatNumber(q * r.premium, 2)}${ccy}`],
    ];
  }
  const out = [];
  if (cp.two_way) {
    out.push(['Bid per unit (the client sells at)', perUnit(cp.bid.per_unit), 'bid']);
    out.push(['Offer per unit (the client buys at)', perUnit(cp.offer.per_unit), 'offer']);
  }
  out.push([`Client price per unit (${cp.client_side})`, perUnit(cp.per_unit), 'client-price']);
  out.push(['Client price in total', `${formatNumber(cp.total, 2)}${ccy}`]);
  out.push(['Client price, % of notional', formatPercent(cp.fraction_of_notional, 2)]);
  return out;
}

/** Break-evens, protection and cap at the client price (with the holding, where there is one). */
function expiryRows(doc, cp) {
  const e = cp.at_expiry;
  const spots = (list) => list.map((x) => priceText(doc, x)).join(' and ') || 'none';
  const out = [['Break-even at expiry', spots(e.break_even.points)]];
  if (e.break_even_with_holding) out.push(['Break-even with the shares held', spots(e.break_even_with_holding.points)]);
  if (e.protection)
    out.push([
      'Protected below',
      `${priceText(doc, e.protection.from)}${e.protection.down_to === null ? '' : ` down to ${priceText(doc, e.protection.down_to)}`}`,
    ]);
  if (e.cap !== null) out.push(['Gains capped above', priceText(doc, e.cap)]);
  return out;
}

function outcomeRows(doc, cp, ccy) {
  const held = cp.holding !== null;
  const head = ['Spot at expiry', 'Change', `Trade P&L${ccy}`, ...(held ? [`With the shares held${ccy}`] : [])];
  const body = cp.outcomes.map((o) => [
    priceText(doc, o.spot),
    formatPercent(o.spot_change, 0),
    formatNumber(o.pnl, 0),
    ...(held ? [formatNumber(o.pnl_with_holding, 0)] : []),
  ]);
  return [head, body];
}

/** What only the desk sees: the model value, the margin, the Greeks and the lattice. */
function deskRows(doc, r, ccy) {
  const perUnit = (x) => formatNumber(x, perUnitDigits(doc, r.currency?.pip_size ?? null, x));
  const q = r.position.quantity;
  const out = [
    ['Model value per unit', `${perUnit(r.premium)}${ccy}`],
    ['Model value in total', `${formatNumber(q * r.premium, 2)}${ccy}`],
  ];
  if (r.client_price) out.push(['Desk margin in total', `${formatNumber(r.client_price.desk_margin_total, 2)}${ccy}`]);
  out.push(['Delta per unit', formatNumber(r.greeks.delta, 4)]);
  out.push([`Position delta (${r.currency ? r.currency.base : 'shares'})`, formatNumber(r.position.greeks.delta, 2)]);
  out.push(['Vega per vol point, position', `${formatNumber(r.position.greeks.vega / 100, 2)}${ccy}`]);
  out.push(['Theta per day, position', `${formatNumber(r.position.greeks.theta / 365, 2)}${ccy}`]);
  out.push(['European closed-form value', perUnit(r.closed_form.premium)]);
  if (r.early_exercise_premium !== null) out.push(['Early-exercise premium', perUnit(r.early_exercise_premium)]);
  out.push(['Lattice error estimate', `± ${formatSmart(r.lattice.error_estimate, 2, 4)}`]);
  out.push([
    'Engine',
    `Hedgeleaf ${r.engine_version}, ${methodName(r.lattice.method)} lattice, ${inputText(r.lattice.steps)} steps`,
  ]);
  return out;
}

const text = (x) => (typeof x === 'string' && x.trim() ? x : null);

/** Fill the print-only quote sheet; `internal` adds the desk's figures and marks the sheet INTERNAL. */
export function renderSheet(doc, r, { fingerprint, valuedAt, currency, internal }) {
  const ccy = currency ? ` ${currency}` : '';
  const quote = doc.quote && typeof doc.quote === 'object' ? doc.quote : {};
  const terms = [];
  if (text(quote.client)) terms.push(['Client', quote.client]);
  terms.push(['Trade', describeContract(doc)]);
  terms.push(['Client side', r.position.side === 'sell' ? 'sells' : 'buys']);
  if (r.currency) terms.push(...pairSheetTerms(r, priceDigits(doc)));
  else {
    terms.push(['Quantity', inputText(r.position.quantity)]);
    terms.push(['Notional (quantity × spot)', `${formatNumber(r.position.quantity * r.spot, 0)}${ccy}`]);
    terms.push(['Spot', `${priceText(doc, r.spot)}${ccy}`]);
  }
  if (r.client_price?.holding) terms.push(['Shares the client holds', inputText(r.client_price.holding.shares)]);
  rows(byId('sheet-terms'), terms);
  grid(
    byId('sheet-legs'),
    ['Side', 'Type', 'Strike', 'Expiry', 'Exercise', 'Quantity', `Notional${ccy}`],
    legRows(doc, r),
  );

  const cp = r.client_price;
  const quoted = r.currency ? pairSheetPremium(r) : [];
  rows(byId('sheet-figures'), [...quoted, ...priceRows(doc, r, ccy), ...(cp ? expiryRows(doc, cp) : [])]);
  const outcomes = byId('sheet-outcomes');
  if (cp) grid(outcomes, ...outcomeRows(doc, cp, ccy));
  else outcomes.replaceChildren();

  byId('sheet-notes').textContent = typeof quote.notes === 'string' ? quote.notes : '';
  rows(byId('sheet-meta'), [
    ['Valuation date', formatDate(doc.valuation_date) ?? 'not given (times in years)'],
    ['Valued at', valuedAt],
    ...(marketAsOfText(doc.market) ? [['Market as of', marketAsOfText(doc.market), 'market-as-of']] : []),
    [
      'Indicative until',
      formatWhen(text(quote.indicative_until)) ?? 'not stated: ask the desk before dealing',
      'indicative-until',
    ],
    ...(text(quote.prepared_by) ? [['Prepared by', quote.prepared_by]] : []),
    ...(text(quote.contact) ? [['Desk contact', quote.contact]] : []),
    [
      'Input fingerprint',
      fingerprint ? `${fingerprint} (first 12 hex digits of the SHA-256 of the saved trade file)` : '–',
      'fingerprint',
    ],
  ]);
  const sheet = byId('quote-sheet');
  sheet.classList.toggle('internal', internal);
  byId('sheet-title').textContent = internal ? 'INTERNAL – desk copy, not for the client' : 'Indicative option quote';
  const desk = byId('sheet-desk');
  if (internal) rows(desk, deskRows(doc, r, ccy));
  else desk.replaceChildren(); // never left in the page to print by mistake
}
