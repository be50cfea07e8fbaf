// Hedgeleaf page: result figures on screen and on the quote sheet.
//
// Every figure is written into elements marked data-result="<name>" (text for
// people, data-value with the engine's number in file units for automation;
// see docs/page contract). Text only ever goes in through textContent.
import { byId, tableRow } from './dom.js';
import { formatNumber, formatPercent, formatSmart, inputText } from './format.js';
import { contractExpiry, contractKey } from './form.js';

function writeFigure(nodes, text, value) {
  for (const node of nodes) {
    if (node.textContent !== text) node.textContent = text;
    if (typeof value === 'number') {
      if (node.dataset.value !== String(value)) node.dataset.value = String(value);
    } else if ('value' in node.dataset) delete node.dataset.value;
  }
}

/** Write one figure: shown text and, when numeric, the raw value. Unchanged text is left alone. */
export function setResult(name, text, value) {
  writeFigure(document.querySelectorAll(`[data-result="${name}"]`), text, value);
}

const typeNames = {
  call: 'call',
  put: 'put',
  'digital-call': 'digital call',
  'digital-put': 'digital put',
  stock: 'share',
};
const shapeNames = {
  'call-spread': 'call spread',
  'put-spread': 'put spread',
  collar: 'collar',
  'risk-reversal': 'risk reversal',
  straddle: 'straddle',
  strangle: 'strangle',
  seagull: 'seagull',
  'covered-call': 'covered call',
};

/** "American put, strike 46" and the like, in plain words. */
export function describeContract(doc) {
  const key = contractKey(doc);
  if (key === 'option') {
    const o = doc.option || {};
    const style =
      o.exercise && o.exercise !== 'european' ? `${o.exercise[0].toUpperCase()}${o.exercise.slice(1)} ` : 'European ';
    return `${style}${typeNames[o.type] ?? 'option'}, strike ${inputText(o.strike)}`;
  }
  if (key === 'structure') {
    const s = doc.structure || {};
    const style = s.exercise === 'american' ? 'American ' : '';
    return `${style}${shapeNames[s.shape] ?? 'structure'}, strikes ${(s.strikes || []).map(inputText).join(' / ')}`;
  }
  const legs = Array.isArray(doc.legs) ? doc.legs : [];
  return `${legs.length}-leg structure`;
}

function expiryText(doc, result) {
  const e = contractExpiry(doc);
  const years = result ? `${formatNumber(result.expiry_years, 2)} y` : '';
  return e.expiry_date ? `${e.expiry_date} (${years})` : years;
}

/** Decimals for a per-unit price: 4 below 100, else 2. */
function perUnitDigitsOf(x) {
  return Math.abs(x) < 100 ? 4 : 2;
}

/** Fill every price figure from a `price` result. */
export function renderPrice(doc, r) {
  // some thirty figures: find them all with one query of the page, not one query each
  const index = new Map();
  for (const node of document.querySelectorAll('[data-result]')) {
    const name = node.dataset.result;
    if (!index.has(name)) index.set(name, []);
    index.get(name).push(node);
  }
  writeFigures(doc, r, (name, text, value) => writeFigure(index.get(name) ?? [], text, value));
}

function writeFigures(doc, r, set) {
  const q = r.position.quantity;
  const sign = r.position.side === 'sell' ? -1 : 1;
  const perUnitDigits = perUnitDigitsOf(r.premium);
  set('premium', formatNumber(r.premium, perUnitDigits), r.premium);
  set('premium-total', formatNumber(q * r.premium, 2), q * r.premium);
  set('premium-percent-spot', formatPercent(r.premium / r.spot, 2), r.premium / r.spot);
  set('notional', formatNumber(q * r.spot, 2), q * r.spot);
  set('premium-percent-notional', formatPercent((q * r.premium) / (q * r.spot), 2), r.premium / r.spot);

  const cp = r.client_price;
  for (const node of document.querySelectorAll('.client-price')) node.hidden = !cp;
  if (cp) {
    set(
      'client-price',
      `${formatNumber(cp.per_unit, perUnitDigitsOf(cp.per_unit))}${cp.currency ? ` ${cp.currency}` : ''}`,
      cp.per_unit,
    );
    set('client-price-total', formatNumber(cp.total, 2), cp.total);
    set('desk-margin-total', formatNumber(cp.desk_margin_total, 2), cp.desk_margin_total);
    byId('client-side').textContent = `per unit, ${cp.client_side}`;
  }

  const g = r.greeks;
  const p = r.position.greeks;
  set('delta', formatNumber(g.delta, 4), g.delta);
  set('delta-position', formatNumber(p.delta, 2), p.delta);
  set('gamma', formatSmart(g.gamma, 4, 4), g.gamma);
  set('gamma-position', formatSmart(p.gamma, 4, 2), p.gamma);
  set('theta', formatNumber(g.theta, 4), g.theta);
  set('theta-position', formatNumber(p.theta, 2), p.theta);
  set('theta-day', formatSmart(g.theta / 365, 4, 4), g.theta / 365);
  set('theta-day-position', formatNumber(p.theta / 365, 2), p.theta / 365);
  set('vega', formatSmart(g.vega / 100, 4, 4), g.vega);
  set('vega-position', formatNumber(p.vega / 100, 2), p.vega);
  set('rho', formatSmart(g.rho / 100, 4, 4), g.rho);
  set('rho-position', formatNumber(p.rho / 100, 2), p.rho);

  const lattice = r.lattice;
  const method =
    { 'leisen-reimer': 'Leisen-Reimer', crr: 'Cox-Ross-Rubinstein', 'jarrow-rudd': 'Jarrow-Rudd', tian: 'Tian' }[
      lattice.method
    ] ?? lattice.method;
  set(
    'lattice',
    `${method}, ${inputText(lattice.steps)} steps${lattice.extrapolated ? `, extrapolated with ${inputText(lattice.coarse_steps)}` : ''}`,
  );
  set('closed-form-premium', formatNumber(r.closed_form.premium, perUnitDigits), r.closed_form.premium);
  set('error-estimate', `± ${formatSmart(lattice.error_estimate, 2, 4)}`, lattice.error_estimate);
  if (r.early_exercise_premium === null) set('early-exercise-premium', 'none (exercise only at expiry)');
  else set('early-exercise-premium', formatNumber(r.early_exercise_premium, perUnitDigits), r.early_exercise_premium);

  const rep = r.replication;
  set('replication-shares', formatNumber(rep.shares, 4), rep.shares);
  set('replication-cash', formatNumber(rep.cash, 4), rep.cash);
  set('replication-shares-position', formatNumber(sign * q * rep.shares, 2), sign * q * rep.shares);
  set('replication-cash-position', formatNumber(sign * q * rep.cash, 2), sign * q * rep.cash);
  set(
    'replication-check',
    `Δ·S + B = ${formatNumber(rep.shares, 4)} × ${formatNumber(rep.spot, 2)} + ${formatNumber(rep.cash, 4)} = ${formatNumber(rep.shares * rep.spot + rep.cash, 4)} = premium ${formatNumber(r.premium, 4)}`,
    rep.shares * rep.spot + rep.cash,
  );
  set('engine-version', r.engine_version);

  const side = r.position.side === 'sell' ? 'Client sells' : 'Client buys';
  set('trade-summary', '');
  byId('trade-summary').textContent =
    `${side} ${inputText(q)} × ${describeContract(doc)} · expiry ${expiryText(doc, r)} · spot ${inputText(r.spot)}`;
}

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

/** Fill the print-only quote sheet. */
export function renderSheet(doc, r, { fingerprint, valuedAt, currency }) {
  const ccy = currency ? ` ${currency}` : '';
  const m = doc.market || {};
  const q = r.position.quantity;
  const quote = doc.quote && typeof doc.quote === 'object' ? doc.quote : {};
  const terms = [];
  if (typeof quote.client === 'string') terms.push(['Client', quote.client]);
  terms.push(['Contract', describeContract(doc)]);
  terms.push(['Client side', r.position.side === 'sell' ? 'sells' : 'buys']);
  terms.push(['Quantity', inputText(q)]);
  terms.push(['Expiry', expiryText(doc, r)]);
  terms.push([
    'Spot',
    `${typeof m.spot === 'number' ? formatNumber(m.spot, Math.max(2, (String(m.spot).split('.')[1] ?? '').length)) : '–'}${ccy}`,
  ]);
  terms.push(['Volatility', formatPercent(m.volatility, 2)]);
  terms.push(['Interest rate', formatPercent(m.rate, 2)]);
  terms.push(['Dividend yield', formatPercent(m.carry_yield ?? 0, 2)]);
  if (Array.isArray(m.dividends) && m.dividends.length) {
    terms.push([
      'Cash dividends',
      m.dividends.map((d) => `${d.date ?? `${d.time_years} y`}: ${inputText(d.amount)}`).join('; '),
    ]);
  }
  rows(byId('sheet-terms'), terms);

  const figures = [
    ['Premium per unit', `${formatNumber(r.premium, 4)}${ccy}`],
    ['Premium in total', `${formatNumber(q * r.premium, 2)}${ccy}`],
    ['Premium, % of spot', formatPercent(r.premium / r.spot, 2)],
  ];
  if (r.client_price) {
    const cp = r.client_price;
    figures.push([`Client price per unit (${cp.client_side})`, `${formatNumber(cp.per_unit, 4)}${ccy}`]);
    figures.push(['Client price in total', `${formatNumber(cp.total, 2)}${ccy}`]);
    figures.push(['Client price, % of notional', formatPercent(cp.fraction_of_notional, 2)]);
  }
  figures.push(['Delta per unit', formatNumber(r.greeks.delta, 4)]);
  figures.push(['Position delta (shares)', formatNumber(r.position.greeks.delta, 2)]);
  figures.push(['Vega per vol point, position', `${formatNumber(r.position.greeks.vega / 100, 2)}${ccy}`]);
  figures.push(['Theta per day, position', `${formatNumber(r.position.greeks.theta / 365, 2)}${ccy}`]);
  figures.push(['European closed-form value', formatNumber(r.closed_form.premium, 4)]);
  if (r.early_exercise_premium !== null)
    figures.push(['Early-exercise premium', formatNumber(r.early_exercise_premium, 4)]);
  figures.push(['Lattice error estimate', `± ${formatSmart(r.lattice.error_estimate, 2, 4)}`]);
  rows(byId('sheet-figures'), figures);

  byId('sheet-notes').textContent = typeof quote.notes === 'string' ? quote.notes : '';
  rows(byId('sheet-meta'), [
    ['Valuation date', doc.valuation_date ?? 'not given (times in years)'],
    ['Valued at', valuedAt],
    ['Engine', `Hedgeleaf ${r.engine_version}, ${r.lattice.method} lattice, ${inputText(r.lattice.steps)} steps`],
    [
      'Input fingerprint',
      fingerprint ? `${fingerprint} (first 12 hex digits of the SHA-256 of the saved trade file)` : '–',
      'fingerprint',
    ],
  ]);
}
