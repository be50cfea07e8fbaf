// Hedgeleaf page: a trade on a currency pair (docs/currency.md) — the underlying's kind, the
// pair's own fields and the words the page uses for it.
//
// A pair is {"underlying": {"kind": "currency_pair", "base", "quote"}}, with a notional instead of
// a quantity, a domestic and a foreign rate instead of a rate and a dividend yield, and the
// premium and delta conventions the desk quotes in. Switching the kind rewrites the document
// between the two forms; what only one form holds (dividends, borrow, conventions...) is put
// aside in this tab and comes back when that kind is chosen again, so nothing typed is lost.
// The pair's fields are ordinary bound inputs (form.js); this file builds their choices, picks
// where the rate inputs write (a number or a money-market quote's `rate`) and swaps the words.
import { byId, field, make, optionList } from './dom.js';
import { switchExpiryMode } from './form.js';
import { todayIso } from './dates.js';
import { tabObject } from './state.js';

/** True when the trade is on a currency pair. */
export function isPair(doc) {
  return doc?.underlying?.kind === 'currency_pair';
}

/** The pair's codes as typed (base = foreign, quote = domestic), with stand-ins for labels when blank. */
export function pairCodes(doc) {
  const u = doc?.underlying ?? {};
  const code = (x, fallback) => (typeof x === 'string' && x.trim() ? x.trim() : fallback);
  return { base: code(u.base, 'foreign'), quote: code(u.quote, 'domestic') };
}

/** The premium conventions of docs/currency.md, in words for the pair BASE/QUOTE. */
export function premiumConventions(base, quote) {
  return [
    ['domestic_per_foreign', `${quote} per ${base}`],
    ['domestic_pips', `${quote} pips per ${base}`],
    ['percent_of_foreign', `% of the ${base} notional`],
    ['percent_of_domestic', `% of the ${quote} notional`],
    ['foreign_pips', `${base} pips per ${quote}`],
  ];
}

/** The delta conventions of docs/currency.md. */
export const deltaConventions = [
  ['spot', 'spot delta'],
  ['forward', 'forward delta'],
  ['spot_premium_adjusted', 'spot delta, premium-adjusted'],
  ['forward_premium_adjusted', 'forward delta, premium-adjusted'],
];

// How a rate is quoted: a plain continuously compounded ACT/365F number, or a money-market quote.
const rateBases = [
  ['continuous-365F', 'continuous, ACT/365F'],
  ['ACT/360 simple', 'money market, ACT/360'],
  ['ACT/365 simple', 'money market, ACT/365'],
  ['ACT/360 annual', 'annual, ACT/360'],
  ['ACT/365 annual', 'annual, ACT/365'],
  ['ACT/360 continuous', 'continuous, ACT/360'],
];
const rateKeys = ['domestic_rate', 'foreign_rate'];

const isObject = (x) => x !== null && typeof x === 'object' && !Array.isArray(x);
/** A money-market quote {rate, day_count, compounding} (a curve is an object without `rate`). */
const isQuote = (x) => isObject(x) && 'rate' in x;

/** The rate basis a quote is written in ("ACT/360 simple"), or the plain number's. */
function basisOf(holder) {
  if (!isQuote(holder)) return 'continuous-365F';
  return `${holder.day_count ?? 'ACT/360'} ${holder.compounding ?? 'simple'}`;
}

/** The same rate written in `basis` (the number typed is kept; its meaning follows the basis). */
export function rebase(holder, basis) {
  const rate = isQuote(holder) ? holder.rate : holder;
  if (basis === 'continuous-365F') return rate;
  const [dayCount, compounding] = basis.split(' ');
  return { rate, day_count: dayCount, compounding };
}

/** Move `from` to `to` in `holder` (kept as it is: a number, a curve or a quote). */
function move(holder, from, to) {
  if (holder?.[from] === undefined) return;
  holder[to] = holder[from];
  delete holder[from];
}

/** Put `keys` of `holder` aside (under `prefix`) and take them out of it. */
function putAside(aside, holder, keys, prefix) {
  for (const key of keys) {
    if (holder?.[key] === undefined) continue;
    aside[`${prefix}${key}`] = holder[key];
    delete holder[key];
  }
}

/** Bring back what `putAside` kept for `prefix`. */
function bringBack(aside, holder, keys, prefix) {
  for (const key of keys) {
    if (aside[`${prefix}${key}`] === undefined) continue;
    if (holder[key] === undefined) holder[key] = aside[`${prefix}${key}`];
    delete aside[`${prefix}${key}`];
  }
}

const equityMarketKeys = ['dividends', 'borrow', 'underlying'];

/**
 * Rewrite an equity trade as a currency pair: the rate becomes the domestic rate, the dividend
 * yield the foreign rate, the quantity the notional in the base currency; the expiry becomes a
 * date (a pair's expiry is a date) and the trade date is today if the trade had none.
 */
export function toPair(doc, aside) {
  const market = (doc.market ??= {});
  putAside(aside, market, equityMarketKeys, 'market.');
  move(market, 'rate', 'domestic_rate');
  move(market, 'carry_yield', 'foreign_rate');
  for (const key of rateKeys) {
    market[key] ??= 0;
    // a quote the pair had comes back with its day count when its rate was not changed meanwhile
    const kept = aside[`market.${key}`];
    if (isQuote(kept) && kept.rate === market[key]) market[key] = kept;
    delete aside[`market.${key}`];
  }
  // a new pair is quoted in the currency the trade's client price is in, if it names one
  const quoteCode = /^[A-Z]{3}$/.test(doc.quote?.currency ?? '') ? { quote: doc.quote.currency } : {};
  doc.underlying = aside.underlying ?? { kind: 'currency_pair', ...quoteCode };
  doc.underlying.kind = 'currency_pair';
  delete aside.underlying;
  doc.valuation_date ??= todayIso();
  const amount = doc.quantity;
  delete doc.quantity;
  doc.notional = aside.notional ?? { amount: amount ?? 1000000 };
  // a quantity edited while the trade was a share's is the notional now (in its own currency)
  if (aside.notional !== undefined && amount !== undefined && amount !== aside.quantity)
    doc.notional = { ...aside.notional, amount };
  if (aside.notional === undefined && doc.underlying.base) doc.notional.currency = doc.underlying.base;
  delete aside.notional;
  delete aside.quantity;
  if (aside.conventions !== undefined) doc.conventions = aside.conventions;
  delete aside.conventions;
  switchExpiryMode(doc, 'date', aside);
}

/** The reverse of toPair: the pair's own fields are put aside, the equity's come back. */
export function toEquity(doc, aside) {
  const market = (doc.market ??= {});
  const quoted = (x) => (isQuote(x) ? x.rate : x);
  aside.underlying = doc.underlying;
  delete doc.underlying;
  for (const key of ['notional', 'conventions']) {
    if (doc[key] !== undefined) aside[key] = doc[key];
    delete doc[key];
  }
  for (const key of rateKeys) aside[`market.${key}`] = market[key];
  if (market.domestic_rate !== undefined) market.rate = quoted(market.domestic_rate);
  if (market.foreign_rate !== undefined) market.carry_yield = quoted(market.foreign_rate);
  delete market.domestic_rate;
  delete market.foreign_rate;
  bringBack(aside, market, equityMarketKeys, 'market.');
  const amount = aside.notional?.amount;
  doc.quantity = typeof amount === 'number' ? amount : 1;
  aside.quantity = doc.quantity; // the quantity as it came from the notional: edited if it differs
}

/**
 * The pair's part of the terms form over `state.doc`: the kind picker, the choices that name the
 * pair's currencies and the rate bases. `refill` draws the form again, `changed` recomputes.
 */
export function pairForm({ state, refill, changed }) {
  // What the other kind holds, kept in this tab (sessionStorage, so a reload keeps it too) while
  // the kind is switched.
  const { value: aside, keep: keepAside } = tabObject('hedgeleaf.pair.aside');
  byId('pair-rates').replaceChildren(
    rateRow('domestic_rate', 'Domestic rate', "the quote currency's rate, percent a year"),
    rateRow('foreign_rate', 'Foreign rate', "the base currency's rate, percent a year"),
  );

  /** Build the choices, point the rate inputs at their field, swap the words: before the form is filled. */
  function fill() {
    const pair = isPair(state.doc);
    byId('underlying-kind').value = pair ? 'currency_pair' : 'equity';
    showKind(pair);
    pairWords(state.doc);
    if (!pair) return;
    fillChoices();
    for (const key of rateKeys) {
      const holder = state.doc.market?.[key];
      const input = byId(`${key}-input`);
      const curve = isObject(holder) && !isQuote(holder);
      byId(`${key}-field`).hidden = curve;
      byId(`${key}-curve-note`).hidden = !curve;
      if (curve) delete input.dataset.path;
      else input.dataset.path = isQuote(holder) ? `market.${key}.rate` : `market.${key}`;
      byId(`${key}-basis`).value = basisOf(holder);
    }
  }

  /** The choices that name the pair's currencies, keeping any value the file has that they lack. */
  function fillChoices() {
    const { base, quote } = pairCodes(state.doc);
    const doc = state.doc;
    const codes = (current) => [...new Set([base, quote, ...(current ? [current] : [])])].map((c) => [c, c]);
    const notional = doc.notional?.currency;
    setOptions(byId('notional-currency'), [...(notional ? [] : [['', 'choose']]), ...codes(notional)], notional);
    setOptions(
      byId('premium-currency'),
      [['', `${quote} (default)`], ...codes(doc.conventions?.premium_currency)],
      doc.conventions?.premium_currency,
    );
    const premium = premiumConventions(base, quote);
    setOptions(byId('premium-convention'), [['', `${premium[0][1]} (default)`], ...premium], doc.conventions?.premium);
    setOptions(
      byId('delta-convention'),
      [['', 'spot, or premium-adjusted for a premium in the base currency (default)'], ...deltaConventions],
      doc.conventions?.delta,
    );
  }

  function setOptions(select, options, current) {
    const list =
      typeof current === 'string' && !options.some(([v]) => v === current) ? [...options, [current, current]] : options;
    select.replaceChildren(...list.map(([value, text]) => new Option(text, value)));
    select.value = current ?? list[0][0];
  }

  function switchKind(kind) {
    if (kind === 'currency_pair') toPair(state.doc, aside);
    else toEquity(state.doc, aside);
    keepAside();
    refill();
    changed(0);
  }

  function wire() {
    byId('underlying-kind').addEventListener('change', (event) => switchKind(event.target.value));
    for (const key of rateKeys) {
      byId(`${key}-basis`).addEventListener('change', (event) => {
        state.doc.market[key] = rebase(state.doc.market[key], event.target.value);
        refill();
        changed();
      });
    }
    // the currency codes name the choices: redraw them as a code is typed
    for (const path of ['underlying.base', 'underlying.quote'])
      document.querySelector(`[data-path="${path}"]`).addEventListener('input', () => {
        fillChoices();
        pairWords(state.doc);
      });
  }

  return { fill, wire };
}

/** A rate's row: its percent input (pointed at its field by `fill`), its basis and the note for a curve. */
function rateRow(key, name, title) {
  const label = make('span', {}, [`${name} `, make('abbr', { title, text: '% p.a.' })]);
  const input = make('input', { id: `${key}-input`, dataset: { kind: 'percent' }, inputMode: 'decimal' });
  const basis = make('select', { id: `${key}-basis` }, optionList(rateBases));
  return make('div', { className: 'row' }, [
    make('label', { className: 'field', id: `${key}-field` }, [label, input]),
    field(`${name} quoted as`, basis),
    make('p', {
      className: 'hint',
      id: `${key}-curve-note`,
      text: `${name}: a curve of zero rates, kept as the file gives it.`,
    }),
  ]);
}

/** Show the fields of the trade's kind and put the pair's words in place of the share's. */
function showKind(pair) {
  document.body.classList.toggle('pair-trade', pair);
  // the figures sit inside the price card, whose parts are shown or hidden (not left undrawn)
  for (const id of ['pair-figures', 'pair-more']) byId(id).hidden = !pair;
}

/**
 * Words that follow the kind: an element with data-pair-words="Foreign (Δ)" shows those words for
 * a pair and its own otherwise; "{base}" and "{quote}" stand for the pair's codes.
 */
export function pairWords(doc) {
  const pair = isPair(doc);
  const { base, quote } = pairCodes(doc);
  for (const node of document.querySelectorAll('[data-pair-words]')) {
    node.dataset.shareWords ??= node.textContent;
    const text = pair
      ? node.dataset.pairWords.replaceAll('{base}', base).replaceAll('{quote}', quote)
      : node.dataset.shareWords;
    if (node.textContent !== text) node.textContent = text;
  }
}
