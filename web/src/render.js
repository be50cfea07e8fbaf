// Hedgeleaf page: result figures on screen and on the quote sheet.
//
// Every figure is written into elements marked data-result="<name>" (text for
// people, data-value with the engine's number in file units for automation;
// see docs/page contract). Text only ever goes in through textContent.
import { byId } from './dom.js';
import { formatDate, formatNumber, formatPercent, formatSmart, inputText } from './format.js';
import { contractExpiry, contractKey } from './form.js';
import { isPair } from './currency.js';
import { renderPairFigures } from './currency-figures.js';

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

const methodNames = {
  'leisen-reimer': 'Leisen–Reimer',
  crr: 'Cox–Ross–Rubinstein (CRR)',
  'jarrow-rudd': 'Jarrow–Rudd',
  tian: 'Tian',
};

/** A lattice method as people write it: "leisen-reimer" -> "Leisen–Reimer" (the engine's word otherwise). */
export function methodName(method) {
  return methodNames[method] ?? method;
}

/** Decimals in a number as written: 1.085 -> 3, 0.0001 -> 4, 46 -> 0. */
function decimalsIn(x) {
  if (typeof x !== 'number' || !Number.isFinite(x)) return 0;
  const text = String(x);
  if (!/e/i.test(text)) return (text.split('.')[1] ?? '').length;
  return (Number(x.toFixed(12)).toString().split('.')[1] ?? '').length;
}

/**
 * Decimals for prices of this trade's underlying (spot, strikes, break-evens, scenario and hedge
 * spots), following the market: as many as the spot, the strikes and the client price's tick are
 * written with, and at least what the size of spot calls for (two from 10 up, as shares are
 * quoted; four from 1 to 10, as most exchange rates are, so 1.0850 shows 1.0850; four
 * significant figures below 1). At most 8.
 */
export function priceDigits(doc) {
  const spot = doc.market?.spot;
  const strikes = [doc.option?.strike, ...(doc.structure?.strikes ?? []), ...(doc.legs ?? []).map((l) => l?.strike)];
  let digits = 2;
  if (typeof spot === 'number' && spot > 0) digits = spot >= 10 ? 2 : spot >= 1 ? 4 : 3 - Math.floor(Math.log10(spot));
  for (const x of [spot, doc.quote?.tick, ...(Array.isArray(strikes) ? strikes : [])])
    digits = Math.max(digits, decimalsIn(x));
  return Math.min(8, digits);
}

/** A price of the underlying with the trade's decimals (priceDigits). */
export function priceText(doc, x) {
  return formatNumber(x, priceDigits(doc));
}

/** "American put, strike 46.00" and the like, in plain words (prices with the trade's decimals). */
export function describeContract(doc) {
  const key = contractKey(doc);
  const strike = (k) => (typeof k === 'number' ? priceText(doc, k) : inputText(k));
  if (key === 'option') {
    const o = doc.option || {};
    const style =
      o.exercise && o.exercise !== 'european' ? `${o.exercise[0].toUpperCase()}${o.exercise.slice(1)} ` : 'European ';
    return `${style}${typeNames[o.type] ?? 'option'}, strike ${strike(o.strike)}`;
  }
  if (key === 'structure') {
    const s = doc.structure || {};
    const style = s.exercise === 'american' ? 'American ' : '';
    return `${style}${shapeNames[s.shape] ?? 'structure'}, strikes ${(Array.isArray(s.strikes) ? s.strikes : []).map(strike).join(' / ')}`;
  }
  const legs = Array.isArray(doc.legs) ? doc.legs : [];
  return `${legs.length}-leg structure`;
}

export function expiryText(doc, result) {
  const e = contractExpiry(doc);
  const years = result ? `${formatNumber(result.expiry_years, 2)} y` : '';
  return e.expiry_date ? `${formatDate(e.expiry_date)} (${years})` : years;
}

/** Decimals for a per-unit price: 4 below 100, else 2. */
function perUnitDigitsOf(x) {
  return Math.abs(x) < 100 ? 4 : 2;
}

/**
 * Decimals for an amount per unit of the underlying `x` (a premium, a client price) of `doc`: 4
 * below 100, else 2, never fewer than the trade's prices have (priceDigits); for a currency pair,
 * whose pip the engine gives (`pip`, else null), two more than the pip has, so that the figure
 * agrees with the pips beside it (EUR/USD: 0.014491 USD per EUR, 144.91 pips). The screen, both
 * sheets and the comparison use it.
 */
export function perUnitDigits(doc, pip, x) {
  const pair = typeof pip === 'number' && pip > 0 ? decimalsIn(pip) + 2 : 0;
  return Math.min(8, Math.max(perUnitDigitsOf(x), priceDigits(doc), pair));
}

/**
 * The currency the trade's amounts are in, for their labels: the client price's (`quote.currency`)
 * when given, else a currency pair's quote currency (its amounts are in it), else none ('').
 */
export function amountCurrency(doc) {
  if (typeof doc.quote?.currency === 'string') return doc.quote.currency;
  const pair = isPair(doc) ? doc.underlying.quote : null;
  return typeof pair === 'string' && /^[A-Z]{3}$/.test(pair) ? pair : '';
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
  const pip = r.currency?.pip_size ?? null;
  const digits = perUnitDigits(doc, pip, r.premium);
  set('premium', formatNumber(r.premium, digits), r.premium);
  set('premium-total', formatNumber(q * r.premium, 2), q * r.premium);
  set('premium-percent-spot', formatPercent(r.premium / r.spot, 2), r.premium / r.spot);
  set('notional', formatNumber(q * r.spot, 2), q * r.spot);
  set('premium-percent-notional', formatPercent((q * r.premium) / (q * r.spot), 2), r.premium / r.spot);

  const cp = r.client_price;
  for (const node of document.querySelectorAll('.client-price')) node.hidden = !cp;
  for (const node of document.querySelectorAll('.two-way')) node.hidden = !cp?.two_way;
  if (cp?.two_way) {
    const side = (x) => formatNumber(x, perUnitDigits(doc, pip, x));
    set('bid-offer', `${side(cp.bid.per_unit)} / ${side(cp.offer.per_unit)}`, cp.offer.per_unit);
  }
  if (cp) {
    set(
      'client-price',
      `${formatNumber(cp.per_unit, perUnitDigits(doc, pip, cp.per_unit))}${cp.currency ? ` ${cp.currency}` : ''}`,
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
  set(
    'lattice',
    `${methodName(lattice.method)}, ${inputText(lattice.steps)} steps${lattice.extrapolated ? `, extrapolated with ${inputText(lattice.coarse_steps)}` : ''}`,
  );
  set('closed-form-premium', formatNumber(r.closed_form.premium, digits), r.closed_form.premium);
  set('error-estimate', `± ${formatSmart(lattice.error_estimate, 2, 4)}`, lattice.error_estimate);
  if (r.early_exercise_premium === null) set('early-exercise-premium', 'none (exercise only at expiry)');
  else set('early-exercise-premium', formatNumber(r.early_exercise_premium, digits), r.early_exercise_premium);

  // a pair's replication holds foreign currency where a share's holds shares (docs/currency.md)
  const rep = { ...r.replication, shares: r.replication.shares ?? r.replication.foreign };
  set('replication-shares', formatNumber(rep.shares, 4), rep.shares);
  set('replication-cash', formatNumber(rep.cash, 4), rep.cash);
  set('replication-shares-position', formatNumber(sign * q * rep.shares, 2), sign * q * rep.shares);
  set('replication-cash-position', formatNumber(sign * q * rep.cash, 2), sign * q * rep.cash);
  set('replication-check', replicationLine(rep, priceDigits(doc), r.premium, digits), rep.shares * rep.spot + rep.cash);
  set('engine-version', r.engine_version);

  const side = r.position.side === 'sell' ? 'Client sells' : 'Client buys';
  const size = r.currency ? `${r.currency.base} ${inputText(q)} of ${r.currency.pair}` : inputText(q);
  set('trade-summary', '');
  byId('trade-summary').textContent =
    `${side} ${size} × ${describeContract(doc)} · expiry ${expiryText(doc, r)} · spot ${priceText(doc, r.spot)}`;
  renderPairFigures(r, priceDigits(doc));
}

/** `big` (an integer in units of 10^-digits) as text: 12345n, 2 -> "123.45". */
function scaledText(big, digits) {
  return formatNumber(Number(big) / 10 ** digits, digits);
}

/** `big` (in units of 10^-from) rounded half away from zero to units of 10^-to (to <= from). */
function roundScaled(big, from, to) {
  const unit = 10n ** BigInt(from - to);
  const half = unit / 2n;
  return big >= 0n ? (big + half) / unit : -((-big + half) / unit);
}

/**
 * "Δ·S + B = −0.36616914 × 48.20 + 20.73149793 = 3.0821 = premium": the replication line with
 * its sum worked out exactly from the numbers as printed (decimal arithmetic), so that it adds
 * up as printed; shares and cash carry 8 decimals so the sum meets the premium as shown.
 */
function replicationLine(rep, spotDigits, premium, sumDigits) {
  const d = 8;
  const premiumText = formatNumber(premium, sumDigits);
  const shares = BigInt(Math.round(rep.shares * 10 ** d));
  const spot = BigInt(Math.round(rep.spot * 10 ** spotDigits));
  const cash = BigInt(Math.round(rep.cash * 10 ** d));
  const sum = roundScaled(shares * spot + cash * 10n ** BigInt(spotDigits), d + spotDigits, sumDigits);
  const total = scaledText(sum, sumDigits);
  const line = `Δ·S + B = ${scaledText(shares, d)} × ${scaledText(spot, spotDigits)} + ${scaledText(cash, d)} = ${total}`;
  return total === premiumText ? `${line} = premium` : `${line} ≈ premium ${premiumText} (rounding)`;
}
