// Hedgeleaf page: a currency pair's figures on screen and on the client sheet, from the engine's
// `currency` section (docs/currency.md): the forward and forward points, the premium in the
// chosen convention (the others folded away), the delta in the chosen convention, the position's
// delta in the base currency and the pair's dates. The engine computes every figure; the page
// only words and rounds them.
import { byId, fillTable } from './dom.js';
import { formatDate, formatNumber } from './format.js';
import { deltaConventions, premiumConventions } from './currency.js';

/** Decimals a premium shows in each convention: pips to 2, percent to 4, a price to 6. */
const premiumDigits = {
  domestic_per_foreign: 6,
  domestic_pips: 2,
  percent_of_foreign: 4,
  percent_of_domestic: 4,
  foreign_pips: 2,
};

/** "144.91 USD pips per EUR", "1.3355 % of the EUR notional"; "–" where the engine gives none. */
export function premiumText(c, convention, scale = 1) {
  const value = c.premium.in_each_convention[convention];
  if (typeof value !== 'number') return '– (needs one strike)';
  const words = premiumConventions(c.base, c.quote).find(([key]) => key === convention)?.[1] ?? convention;
  return `${formatNumber(value * scale, premiumDigits[convention] ?? 4)} ${words}`;
}

/** The pair's dates as the desk names them. */
function dateRows(c) {
  const d = c.dates;
  return [
    ['Trade date', formatDate(d.trade)],
    ['Spot date', formatDate(d.spot)],
    ['Expiry date', formatDate(d.expiry)],
    ['Delivery date', formatDate(d.delivery)],
    ['Premium date', formatDate(d.premium)],
  ];
}

/** Decimals that show a pip as written: 0.0001 -> 4, 0.01 -> 2, 0.00005 -> 5. */
const pipDigits = (pip) => Math.min(8, Math.max(0, Math.ceil(-Math.log10(pip) - 1e-9)));

/** The forward "1.097247" and its points "122.47 pips" with the pip size. */
function forwardRows(c, digits) {
  return [
    ['Forward', `${formatNumber(c.forward, digits + 2)} ${c.quote} per ${c.base}`],
    [
      'Forward points',
      `${formatNumber(c.forward_points, 2)} pips (pip ${formatNumber(c.pip_size, pipDigits(c.pip_size))})`,
    ],
  ];
}

const deltaWords = (key) => deltaConventions.find(([k]) => k === key)?.[1] ?? key;

/** -1 for a sale: the engine's premium amount is the position's (signed by the side), the page's
 * totals are quantity × premium (signed by the premium alone: a structure can be a credit). */
const sideSign = (r) => (r.position?.side === 'sell' ? -1 : 1);

const pairFigureIds = [
  'pair-name',
  'pair-forward',
  'pair-forward-points',
  'pair-premium',
  'pair-premium-amount',
  'pair-delta',
  'pair-delta-position',
  'pair-date-line',
];

/** Fill the pair's figures on screen from a price result with a `currency` section (none: cleared). */
export function renderPairFigures(r, digits) {
  const c = r.currency;
  const set = (id, text) => {
    const node = byId(id);
    if (node.textContent !== text) node.textContent = text;
  };
  if (!c) {
    // a share's figures: the pair's, from an earlier trade, must not wait to be shown beside them
    // (a trade switched to a pair and not priced yet would show another pair's figures)
    for (const id of pairFigureIds) set(id, '–');
    for (const id of ['pair-premium', 'pair-forward-points']) delete byId(id).dataset.value;
    for (const id of ['pair-conventions', 'pair-dates']) byId(id).replaceChildren();
    return;
  }
  set('pair-name', `${c.pair}, spot ${formatNumber(r.spot, digits)}`);
  const [forward, points] = forwardRows(c, digits);
  set('pair-forward', forward[1]);
  set('pair-forward-points', points[1]);
  set('pair-premium', premiumText(c, c.premium.convention));
  // signed as the total premium beside it, by the premium and not by the side (see sideSign)
  set('pair-premium-amount', `${formatNumber(c.premium.amount * sideSign(r), 2)} ${c.premium.currency}`);
  set('pair-delta', `${formatNumber(c.delta.value, 4)} (${deltaWords(c.delta.convention)})`);
  set('pair-delta-position', `${formatNumber(c.delta[`position_${c.base}`], 0)} ${c.base}`);
  const d = c.dates;
  set(
    'pair-date-line',
    `spot ${formatDate(d.spot)} · expiry ${formatDate(d.expiry)} · delivery ${formatDate(d.delivery)} · premium ${formatDate(d.premium)}`,
  );
  byId('pair-premium').dataset.value = String(c.premium.value);
  byId('pair-forward-points').dataset.value = String(c.forward_points);
  const others = Object.keys(c.premium.in_each_convention).map((key) => [
    premiumConventions(c.base, c.quote).find(([k]) => k === key)?.[1] ?? key,
    premiumText(c, key),
  ]);
  const deltas = Object.entries(c.delta.in_each_convention).map(([key, value]) => [
    deltaWords(key),
    formatNumber(value, 4),
  ]);
  fillTable(
    byId('pair-conventions'),
    ['Convention', 'Per unit'],
    [...others, ...deltas],
    'Premium and delta in each convention',
  );
  fillTable(byId('pair-dates'), ['Date', ''], dateRows(c), 'The pair’s dates');
}

/** The pair's rows for the client sheet's terms: the pair, notional, forward and dates. */
export function pairSheetTerms(r, digits) {
  const c = r.currency;
  const n = c.notional;
  const other = n.currency === c.base ? c.quote : c.base;
  return [
    ['Currency pair', `${c.pair} (${c.quote} per ${c.base})`, 'pair'],
    ['Notional', `${formatNumber(n.amount, 0)} ${n.currency} (${formatNumber(n[other], 0)} ${other} at the strike)`],
    ['Spot', `${formatNumber(r.spot, digits)} ${c.quote} per ${c.base}`],
    ...forwardRows(c, digits),
    ...dateRows(c),
  ];
}

/**
 * The price the client deals at in the chosen convention and as an amount in the premium
 * currency, for the sheet's figures. Every convention is the premium times a factor of the
 * trade's (docs/currency.md), so the client price (the model value with the desk's margin) is
 * the engine's model figure scaled by client price / model value; without a client price the
 * model value stands, as the sheet's other figures do.
 */
export function pairSheetPremium(r) {
  const c = r.currency;
  const dealt = r.client_price ? r.client_price.per_unit : r.premium;
  if (r.premium === 0 && dealt !== 0) return []; // no factor to scale by; the per-unit rows stand
  const scale = r.premium === 0 ? 1 : dealt / r.premium;
  const label = r.client_price ? 'Client price' : 'Indicative premium';
  return [
    [`${label}, as quoted`, premiumText(c, c.premium.convention, scale), 'pair-premium'],
    [
      `${label} in ${c.premium.currency}`,
      // signed as the sheet's other totals, by the premium and not by the side (the side says who
      // pays): the engine's amount is the position's, negative for a sale
      `${formatNumber(c.premium.amount * scale * sideSign(r), 2)} ${c.premium.currency}, paid ${formatDate(c.dates.premium)}`,
    ],
  ];
}
